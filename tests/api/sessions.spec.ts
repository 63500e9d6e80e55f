import { mkdtempSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { freePort } from '../../scripts/lib/proc';
import { UnverifiedEmailError, upsertUserFromIdentity } from '../../server/src/auth/users';
import { startSink } from '../../server/src/mail/sink';
import { createTestApp, type TestApp } from '../support/app';
import { testEnv } from '../support/env';
import { signIn, type SignedIn } from '../support/sign-in';

/**
 * Sessions and the guard rails around sign-in: a sign-in that was only started keeps its row minutes,
 * the sign-in routes have a budget per client, signing out makes the next sign-in ask who is signing
 * in, a browser request from another origin is refused, a pre-added person is bound by e-mail only
 * when the provider verified it, and the mail sink's copies are private.
 */
let t: TestApp;
let lead: SignedIn;

beforeAll(async () => {
  t = await createTestApp({ SIGN_IN_RATE_PER_MINUTE: '8' });
  lead = await signIn(t.app, 'lead', testEnv.publicUrl);
});
afterAll(async () => t?.close());

describe('sessions', () => {
  it('keeps the row of a sign-in that was only started for minutes, not the hours of a session', async () => {
    const res = await request(t.app).get('/auth/login').expect(302);
    const sid = decodeURIComponent(/laminote\.sid=s%3A([^.;]+)/.exec(String(res.headers['set-cookie']))![1]!);
    const { rows } = await t.database.pool.query<{ seconds: number }>('select extract(epoch from expire - now())::float as seconds from session where sid = $1', [sid]);
    expect(rows[0]!.seconds).toBeGreaterThan(0);
    expect(rows[0]!.seconds).toBeLessThanOrEqual(10 * 60 + 5);
    // A completed sign-in gets the full session time (12 h by default).
    const { rows: signedIn } = await t.database.pool.query<{ hours: number }>(
      `select max(extract(epoch from expire - now()) / 3600)::float as hours from session where sess::text like '%"userId"%'`,
    );
    expect(signedIn[0]!.hours).toBeGreaterThan(11);
  });

  it('answers 429 with Retry-After once a client has used its sign-in budget', async () => {
    const statuses: number[] = [];
    let last: request.Response | null = null;
    for (let i = 0; i < 10; i++) {
      last = await request(t.app).get('/auth/login');
      statuses.push(last.status);
    }
    expect(statuses).toContain(429);
    expect(statuses.filter((s) => s === 302).length).toBeLessThanOrEqual(8);
    expect(last!.status).toBe(429);
    expect(last!.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(Number(last!.headers['retry-after'])).toBeGreaterThan(0);
  });

  it('keeps one sign-in budget for every app server on the database, not one each', async () => {
    // A database of its own, so the attempts of the tests before do not count; 8 a minute across both servers.
    const shared = await createTestApp({ SIGN_IN_RATE_PER_MINUTE: '8' }, { worker: false });
    try {
      const other = shared.anotherServer();
      const statuses: number[] = [];
      for (let i = 0; i < 6; i++) {
        statuses.push((await request(shared.app).get('/auth/login')).status);
        statuses.push((await request(other).get('/auth/login')).status);
      }
      expect(statuses.slice(0, 8).every((s) => s === 302)).toBe(true);
      expect(statuses.slice(8).every((s) => s === 429)).toBe(true);
      const refused = await request(other).get('/auth/login');
      expect(refused.status).toBe(429);
      expect(refused.headers['ratelimit-policy']).toBe('"sign-in";q=8;w=60');
      expect(Number(refused.headers['retry-after'])).toBeGreaterThan(0);
    } finally {
      await shared.close();
    }
  });

  it("asks who is signing in after a sign-out, and sends the browser to the provider's end-session page", async () => {
    const app = await createTestApp();
    try {
      const me = await signIn(app.app, 'viewer', testEnv.publicUrl);
      const out = await me.post('/auth/logout').expect(200);
      expect(out.body.redirectTo).toContain(`${testEnv.oidcIssuer}/`);
      expect(new URL(out.body.redirectTo).searchParams.get('id_token_hint')).toBeTruthy();
      const again = await me.agent.get('/auth/login').expect(302);
      expect(new URL(again.headers['location'] as string).searchParams.get('prompt')).toBe('login');
      // Only once: the sign-in after that is as usual.
      const later = await me.agent.get('/auth/login').expect(302);
      expect(new URL(later.headers['location'] as string).searchParams.get('prompt')).toBeNull();
    } finally {
      await app.close();
    }
  });

  it('refuses a state-changing request a browser says comes from another site, whatever its token', async () => {
    const url = `/api/projects/${t.demo.projectId}/studies`;
    const evil = await lead.agent.post(url).set('x-xsrf-token', lead.csrf).set('origin', 'https://evil.example').send({ title: 'From elsewhere' });
    expect(evil.status).toBe(403);
    expect(evil.body.type).toBe('/problems/csrf');
    const crossSite = await lead.agent.post(url).set('x-xsrf-token', lead.csrf).set('sec-fetch-site', 'cross-site').send({ title: 'From elsewhere' });
    expect(crossSite.status).toBe(403);
    await lead.agent.post(url).set('x-xsrf-token', lead.csrf).set('origin', new URL(testEnv.publicUrl).origin).send({ title: 'From here' }).expect(201);
  });
});

describe('binding a first sign-in to a person added by e-mail', () => {
  it('binds only when the provider says the e-mail is verified', async () => {
    await lead.post(`/api/projects/${t.demo.projectId}/members`, { email: 'new.hire@tamsk.example', role: 'viewer' }).expect(201);
    const identity = { issuer: testEnv.oidcIssuer, subject: 'sub-new-hire', email: 'new.hire@tamsk.example', name: 'New Hire' };
    await expect(t.database.db.transaction((tx) => upsertUserFromIdentity(tx, { ...identity, emailVerified: false }))).rejects.toBeInstanceOf(UnverifiedEmailError);
    const user = await t.database.db.transaction((tx) => upsertUserFromIdentity(tx, { ...identity, emailVerified: true }));
    expect(user.email).toBe('new.hire@tamsk.example');
    // Once bound, the subject identifies the person whatever the claim says later.
    const again = await t.database.db.transaction((tx) => upsertUserFromIdentity(tx, { ...identity, emailVerified: false }));
    expect(again.id).toBe(user.id);
  });
});

describe('the development mail sink', () => {
  it('keeps its copies readable by its own account only', async () => {
    const dir = mkdtempSync(path.join(tmpdir(), 'laminote-sink-'));
    const file = path.join(dir, 'mail', 'mail-sink.json');
    const sink = await startSink({ smtpPort: await freePort(), file });
    try {
      sink.clear();
      expect(statSync(file).mode & 0o777).toBe(0o600);
    } finally {
      await sink.stop();
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
