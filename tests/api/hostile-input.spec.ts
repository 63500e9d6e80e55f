import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../support/app';
import { testEnv } from '../support/env';
import { ACCESS_RULES, apiRoutes, CALLERS, expectedFor, fillPath, isStream, routeKey, sampleIds, sendOnce, type Caller } from '../support/routes';
import { signIn, type SignedIn } from '../support/sign-in';
import type { RouteEntry } from '../../server/src/http/edge';

/**
 * Hostile input on every route of the mounted app (the route table, not a list kept here): NUL,
 * unpaired surrogates, nesting thousands deep, numbers beyond a double, unknown keys, and path ids
 * that are malformed, broken percent-encoding or someone else's. Every answer is a 4xx problem+json
 * naming the field; none is a 5xx.
 */
let t: TestApp;
const as: Partial<Record<Caller, SignedIn>> = {};
let ids: Record<string, string>;
const tally = { tried: 0, fourxx: 0, fivexx: 0 };
const failures: string[] = [];

beforeAll(async () => {
  t = await createTestApp();
  for (const caller of CALLERS) if (caller !== 'anonymous') as[caller] = await signIn(t.app, caller, testEnv.publicUrl);
  ids = await sampleIds(t, as);
});
afterAll(async () => {
  process.stdout.write(`[hostile input] ${tally.tried} requests: ${tally.fourxx} answered 4xx, ${tally.fivexx} answered 5xx\n`);
  await t?.close();
});

const writes = () => apiRoutes(t).filter((r) => r.method !== 'GET' && r.path.startsWith('/api/'));

/** A caller the route lets through, so the hostile part is what gets judged, not the role. */
function callerFor(route: RouteEntry): SignedIn {
  const rule = ACCESS_RULES[routeKey(route)];
  const caller = (['lead', 'engineer', 'reviewer', 'admin', 'viewer'] as const).find((c) => rule && expectedFor(rule, c, route.path) === 'allowed');
  return as[caller ?? 'lead']!;
}

/** Sends a raw JSON text (so 1e309 and lone surrogates reach the server as written). */
async function send(route: RouteEntry, path: string, raw: string | null) {
  const who = callerFor(route);
  const method = route.method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete';
  let req = who.agent[method](path).set('x-xsrf-token', who.csrf);
  if (raw !== null) req = req.set('content-type', 'application/json').send(raw);
  const res = await sendOnce(req, isStream(route.path));
  tally.tried++;
  if (res.status >= 400 && res.status < 500) tally.fourxx++;
  if (res.status >= 500) tally.fivexx++;
  return res;
}

function check(label: string, res: request.Response, expected: number | 'any4xx', field?: RegExp) {
  const problem = /^application\/problem\+json/.test(String(res.headers['content-type'] ?? ''));
  const statusOk = expected === 'any4xx' ? res.status >= 400 && res.status < 500 : res.status === expected;
  if (!statusOk || (res.status >= 400 && !problem) || (field && !field.test(String(res.body?.field ?? '')))) {
    failures.push(`${label}: ${res.status} field=${res.body?.field} ${JSON.stringify(res.body).slice(0, 200)}`);
  }
}

const deep = (levels: number) => `${'['.repeat(levels)}1${']'.repeat(levels)}`;
const TEXT_KEYS = ['title', 'name', 'description', 'body', 'message', 'summary', 'email', 'markdown'];
const textBody = (value: string) => JSON.stringify(Object.fromEntries(TEXT_KEYS.map((k) => [k, value])));

describe('hostile input on every write route', () => {
  it('refuses NUL, unpaired surrogates, deep nesting and numbers beyond a double with 400 naming the field', async () => {
    expect(writes().length).toBeGreaterThan(20);
    for (const route of writes()) {
      const path = fillPath(route, ids);
      const key = routeKey(route);
      check(`${key} NUL`, await send(route, path, textBody('Outboard wing\u0000')), 400, /^(title|name|description|body|message|summary|email|markdown)$/);
      // JSON.stringify writes a lone surrogate as the escape \ud800, which JSON.parse turns back into one.
      check(`${key} lone high surrogate`, await send(route, path, textBody('Cp \ud800 peak')), 400, /^(title|name|description|body|message|summary|email|markdown)$/);
      check(`${key} lone low surrogate`, await send(route, path, textBody('\udc00')), 400, /./);
      check(`${key} 5000 levels deep`, await send(route, path, `{"cells":${deep(5000)}}`), 400, /^cells/);
      check(`${key} 1e309`, await send(route, path, '{"baseRevision":1e309,"reynolds":-1e309,"title":"x"}'), 400, /^(baseRevision|reynolds)$/);
      check(`${key} NUL in a key`, await send(route, path, '{"ti\\u0000tle":"x"}'), 400);
    }
    expect(failures).toEqual([]);
  }, 120_000);

  it('never answers 5xx to unknown keys, and refuses unknown or oversized cell inputs in a draft', async () => {
    for (const route of writes()) {
      const res = await send(route, fillPath(route, ids), JSON.stringify({ zzUnknown: 'x'.repeat(1000), nested: { also: [1, 2, 3] } }));
      check(`${routeKey(route)} unknown keys`, res, route.method === 'DELETE' || res.status < 300 ? res.status : 'any4xx');
    }
    const draftRoute = writes().find((r) => r.method === 'PUT' && r.path.endsWith('/draft'))!;
    const draft = (await as.engineer!.get(fillPath({ ...draftRoute, method: 'GET' }, ids)).expect(200)).body as { revision: number };
    const blob = { baseRevision: draft.revision, cells: [{ cellId: randomUUID(), kind: 'note', title: 'Blob', inputs: { markdown: 'hello', attachment: 'x'.repeat(1_000_000) } }] };
    const unknown = await send(draftRoute, fillPath(draftRoute, ids), JSON.stringify(blob));
    check('draft with an unknown note input', unknown, 400, /^cells\[0\]\.inputs\.attachment$/);
    expect(unknown.body.detail).toMatch(/^Cell 1 · /);
    const big = { baseRevision: draft.revision, cells: [{ cellId: randomUUID(), kind: 'note', title: 'Big', inputs: { markdown: 'x'.repeat(3_000_000) } }] };
    check('draft with a note of 3 million characters (its limit is 200 000)', await send(draftRoute, fillPath(draftRoute, ids), JSON.stringify(big)), 400, /^cells\[0\]\.inputs$/);
    expect(failures).toEqual([]);
  }, 120_000);

  it('answers malformed path ids 400 naming the parameter, and ids that name nothing 404', async () => {
    const routes = apiRoutes(t).filter((r) => r.path.startsWith('/api/') && r.params.length > 0);
    for (const route of routes) {
      for (const param of route.params) {
        const key = `${routeKey(route)} :${param}`;
        check(`${key} not an id`, await send(route, fillPath(route, ids, { param, value: 'not-a-uuid' }), route.method === 'GET' ? null : '{}'), 400, new RegExp(`^${param}$`));
        check(`${key} NUL`, await send(route, fillPath(route, ids, { param, value: '%00' }), route.method === 'GET' ? null : '{}'), 400, new RegExp(`^${param}$`));
        check(`${key} broken percent-encoding`, await send(route, fillPath(route, ids, { param, value: '%E0%A4%A' }), route.method === 'GET' ? null : '{}'), 400, /^address$/);
        check(`${key} overlong`, await send(route, fillPath(route, ids, { param, value: 'a'.repeat(5000) }), route.method === 'GET' ? null : '{}'), 400);
        // An id that names nothing is 404, as one from another project is; a route that reads its
        // body before looking the id up may say first that the (empty) body is wrong, about the body.
        const random = await send(route, fillPath(route, ids, { param, value: randomUUID() }), route.method === 'GET' ? null : '{}');
        if (random.status === 400 && !route.params.includes(String(random.body.field))) continue;
        check(`${key} random id`, random, 404);
      }
    }
    expect(failures).toEqual([]);
  }, 120_000);

  it('refuses NUL and broken Unicode in the query of every route', async () => {
    for (const route of apiRoutes(t).filter((r) => r.path.startsWith('/api/'))) {
      const path = fillPath(route, ids);
      check(`${routeKey(route)} ?q=%00`, await send(route, `${path}?q=%00`, route.method === 'GET' ? null : '{}'), 400, /^q$/);
      if (route.method !== 'GET') continue;
      // The UTF-8 bytes of a lone surrogate do not decode; the query keeps them as written.
      const res = await send(route, `${path}?q=%ED%A0%80`, null);
      if (res.status >= 500) failures.push(`${routeKey(route)} ?q=%ED%A0%80: ${res.status}`);
    }
    expect(failures).toEqual([]);
  }, 180_000);

  it('answers a version of a project the caller is not in exactly as an id that names nothing', async () => {
    const nacelle = (await as.engineer!.get('/api/projects').expect(200)).body.find((p: { id: string }) => p.id !== ids['projectId']);
    const study = await as.engineer!.post(`/api/projects/${nacelle.id}/studies`, { title: 'Lip study (invented)' }).expect(201);
    const branch = (await as.engineer!.get(`/api/studies/${study.body.id}/branches`).expect(200)).body[0];
    const foreign = await as.engineer!.post(`/api/branches/${branch.id}/versions`, { message: 'first', expectedHeadVersionId: null }).expect(201);
    // The viewer is in the wing project only.
    const viewer = as.viewer!;
    const seen = await viewer.get(`/api/compare?a=${foreign.body.id}&b=${ids['versionId']}`);
    const random = await viewer.get(`/api/compare?a=${randomUUID()}&b=${ids['versionId']}`);
    expect(seen.status).toBe(404);
    expect(seen.body).toEqual(random.body);
    tally.tried += 2;
    tally.fourxx += 2;
  });

  it('refuses a NUL in an uploaded file name with 400 and keeps nothing', async () => {
    const before = await t.database.pool.query('select count(*)::int as n from uploads');
    const res = await as
      .engineer!.agent.post(`/api/studies/${ids['studyId']}/uploads`)
      .set('x-xsrf-token', as.engineer!.csrf)
      .attach('file', Buffer.from('x cp\n0 1\n1 0\n'), 'cp\u0000.txt');
    tally.tried++;
    if (res.status >= 400 && res.status < 500) tally.fourxx++;
    expect(res.status).toBe(400);
    expect(res.body.field).toBe('file');
    const after = await t.database.pool.query('select count(*)::int as n from uploads');
    expect(after.rows[0].n).toBe(before.rows[0].n);
  });
});
