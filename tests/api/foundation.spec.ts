import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../support/app';
import { testEnv } from '../support/env';
import { providerRoundTrip, signIn, type SignedIn, demoUser } from '../support/sign-in';

let t: TestApp;
const as: Record<string, SignedIn> = {};

beforeAll(async () => {
  t = await createTestApp();
  for (const role of ['lead', 'engineer', 'reviewer', 'viewer', 'admin', 'outsider'] as const) {
    as[role] = await signIn(t.app, role, testEnv.publicUrl);
  }
});
afterAll(async () => t?.close());

describe('anonymous and forged sessions', () => {
  it('answers 401 problem+json to an anonymous GET /api/me', async () => {
    const res = await request(t.app).get('/api/me').expect(401);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(res.body).toMatchObject({ status: 401, type: '/problems/unauthenticated' });
  });

  it('answers 401 to a forged session cookie', async () => {
    await request(t.app).get('/api/projects').set('cookie', 'laminote.sid=s%3Aforged.c2lnbmF0dXJl').expect(401);
  });

  it('answers 401, not 403, to an anonymous POST', async () => {
    await request(t.app).post('/api/projects').send({}).expect(401);
  });

  it('carries a content security policy', async () => {
    const res = await request(t.app).get('/healthz').expect(200);
    expect(res.headers['content-security-policy']).toContain("script-src 'self'");
    expect(res.body).toEqual({ status: 'ok' });
  });
});

describe('sign-in', () => {
  it('redirects /auth/login to the provider with PKCE and state', async () => {
    const res = await request(t.app).get('/auth/login').expect(302);
    const url = new URL(res.headers['location'] as string);
    expect(url.origin).toBe(testEnv.oidcIssuer);
    expect(url.searchParams.get('code_challenge')).toBeTruthy();
    expect(url.searchParams.get('code_challenge_method')).toBe('S256');
    expect(url.searchParams.get('state')).toBeTruthy();
    expect(url.searchParams.get('nonce')).toBeTruthy();
  });

  it('refuses a callback with a wrong state with 400 and starts no session', async () => {
    const agent = request.agent(t.app);
    const login = await agent.get('/auth/login').expect(302);
    const callback = new URL(await providerRoundTrip(login.headers['location'] as string, demoUser('engineer').sub, `${testEnv.publicUrl}/auth/callback`));
    callback.searchParams.set('state', 'not-the-state-we-sent');
    const res = await agent.get(callback.pathname + callback.search).expect(400);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    await agent.get('/api/me').expect(401);
  });

  it('returns the user and memberships from /api/me', async () => {
    const res = await as['engineer']!.get('/api/me').expect(200);
    expect(res.body.user).toMatchObject({ email: demoUser('engineer').email, siteAdmin: false });
    expect(res.body.memberships.map((m: { projectName: string; role: string }) => [m.projectName, m.role])).toContainEqual(['Larkspur T-62 wing', 'engineer']);
  });

  it('refuses a POST without the anti-forgery token', async () => {
    const res = await as['engineer']!.agent.post(`/api/projects/${t.demo.projectId}/studies`).send({ title: 'No token' }).expect(403);
    expect(res.body.type).toBe('/problems/csrf');
    await as['engineer']!.agent.post(`/api/projects/${t.demo.projectId}/studies`).set('x-xsrf-token', 'wrong').send({ title: 'Wrong token' }).expect(403);
  });

  it('signs out: the session ends and the provider end-session address is returned', async () => {
    const me = await signIn(t.app, 'viewer', testEnv.publicUrl);
    const res = await me.post('/auth/logout').expect(200);
    expect(res.body.redirectTo).toContain(testEnv.oidcIssuer);
    await me.get('/api/me').expect(401);
  });
});

describe('role matrix', () => {
  // Each role × read project, create study, manage members (DESIGN.md "Who uses it").
  const matrix = [
    ['lead', 200, 201, 201],
    ['engineer', 200, 201, 403],
    ['reviewer', 200, 403, 403],
    ['viewer', 200, 403, 403],
    ['admin', 200, 403, 201],
    ['outsider', 404, 404, 404],
  ] as const;

  it.each(matrix)('%s: read %i, create study %i, add member %i', async (role, read, create, manage) => {
    const p = `/api/projects/${t.demo.projectId}`;
    await as[role]!.get(p).expect(read);
    await as[role]!.get(`${p}/studies`).expect(read);
    await as[role]!.post(`${p}/studies`, { title: `Study by ${role}` }).expect(create);
    await as[role]!.post(`${p}/members`, { email: `new.${role}@tamsk.example`, role: 'viewer' }).expect(manage);
  });

  it('hides a project from a non-member everywhere (404, never 403)', async () => {
    const p = `/api/projects/${t.demo.projectId}`;
    const outsider = as['outsider']!;
    for (const res of [
      await outsider.get(p),
      await outsider.get(`${p}/members`),
      await outsider.patch(p, { name: 'x' }),
      await outsider.get(`/api/studies/${t.demo.studyId}`),
      await outsider.patch(`/api/studies/${t.demo.studyId}`, { title: 'x' }),
    ]) {
      expect(res.status).toBe(404);
      expect(res.body.type).toBe('/problems/not-found');
    }
    const list = await outsider.get('/api/projects').expect(200);
    expect(list.body).toEqual([]);
  });

  it('lets the lead change a role and remove a member, and keeps the last lead', async () => {
    const p = `/api/projects/${t.demo.projectId}`;
    const lead = as['lead']!;
    const added = await lead.post(`${p}/members`, { email: 'guest.aero@tamsk.example', role: 'viewer' }).expect(201);
    expect(added.body).toMatchObject({ email: 'guest.aero@tamsk.example', role: 'viewer', hasSignedIn: false });
    await lead.post(`${p}/members`, { email: 'guest.aero@tamsk.example', role: 'viewer' }).expect(409);
    await lead.patch(`${p}/members/${added.body.userId}`, { role: 'reviewer' }).expect(200);
    await lead.delete(`${p}/members/${added.body.userId}`).expect(204);
    const me = await lead.get('/api/me').expect(200);
    const res = await lead.patch(`${p}/members/${me.body.user.id}`, { role: 'engineer' }).expect(400);
    expect(res.body.field).toBe('role');
  });

  it('names the field at fault in bad input', async () => {
    const res = await as['lead']!.post(`/api/projects/${t.demo.projectId}/members`, { email: 'not-an-address', role: 'pilot' }).expect(400);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(res.body.errors.map((e: { field: string }) => e.field).sort()).toEqual(['email', 'role']);
  });

  it('lets engineers rename and archive a study; viewers cannot', async () => {
    const s = await as['engineer']!.post(`/api/projects/${t.demo.projectId}/studies`, { title: 'Root section' }).expect(201);
    await as['engineer']!.patch(`/api/studies/${s.body.id}`, { title: 'Root section, climb' }).expect(200);
    await as['viewer']!.patch(`/api/studies/${s.body.id}`, { archived: true }).expect(403);
    const archived = await as['engineer']!.patch(`/api/studies/${s.body.id}`, { archived: true }).expect(200);
    expect(archived.body).toMatchObject({ title: 'Root section, climb', archived: true });
    const list = await as['viewer']!.get(`/api/projects/${t.demo.projectId}/studies?archived=true`).expect(200);
    expect(list.body.map((x: { id: string }) => x.id)).toContain(s.body.id);
  });

  it('writes an audit event for every change', async () => {
    const { rows } = await t.database.pool.query<{ action: string }>('select action from audit_events');
    const actions = new Set(rows.map((r) => r.action));
    for (const a of ['study.create', 'study.update', 'study.archive', 'member.add', 'member.role', 'member.remove', 'user.signIn']) expect(actions).toContain(a);
    await expect(t.database.pool.query('update audit_events set action = $1', ['tampered'])).rejects.toThrow(/immutable/);
  });
});

describe('branches', () => {
  it('gives every new study a main branch, readable by every member', async () => {
    const res = await as['viewer']!.get(`/api/studies/${t.demo.studyId}/branches`).expect(200);
    expect(res.body).toHaveLength(1);
    expect(res.body[0]).toMatchObject({ name: 'main', studyId: t.demo.studyId, headVersionId: null, archived: false });
    await as['outsider']!.get(`/api/studies/${t.demo.studyId}/branches`).expect(404);
  });
});
