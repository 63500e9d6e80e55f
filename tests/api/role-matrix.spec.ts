import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../support/app';
import { testEnv } from '../support/env';
import { ACCESS_RULES, apiRoutes, CALLERS, expectedFor, fillPath, isStream, routeKey, sampleIds, sendOnce, type Caller } from '../support/routes';
import { signIn, type SignedIn } from '../support/sign-in';

/**
 * The role matrix, generated from the mounted app's route table: every route × every caller (anonymous,
 * a non-member, each project role, a site admin who is not a member). A member whose role does not
 * allow the route gets 403, a non-member 404 (the project does not exist for them), an anonymous
 * caller 401; a route without an access rule fails here.
 */
let t: TestApp;
const as: Partial<Record<Caller, SignedIn>> = {};
let ids: Record<string, string>;

beforeAll(async () => {
  t = await createTestApp();
  for (const caller of CALLERS) if (caller !== 'anonymous') as[caller] = await signIn(t.app, caller, testEnv.publicUrl);
  ids = await sampleIds(t, as);
});
afterAll(async () => t?.close());

/** Statuses that say "access passed": anything but 401/403/404 and no server error. */
const passed = (status: number) => status < 500 && ![401, 403, 404].includes(status);

describe('role matrix from the route table', () => {
  it('has an access rule for every route the app mounts', () => {
    const missing = apiRoutes(t).map(routeKey).filter((key) => !(key in ACCESS_RULES));
    expect(missing, 'routes without an access rule in tests/support/routes.ts').toEqual([]);
  });

  it('answers every route × caller as the rules say', async () => {
    // Signing out ends the caller's session: those requests go last.
    const routes = apiRoutes(t).sort((a, b) => Number(a.path === '/auth/logout') - Number(b.path === '/auth/logout'));
    const wrong: string[] = [];
    let tried = 0;
    for (const route of routes) {
      const rule = ACCESS_RULES[routeKey(route)];
      if (!rule) continue;
      for (const caller of CALLERS) {
        if (route.method === 'DELETE' && route.params.includes('userId')) {
          // Put the guest back, so each caller's removal has someone to remove.
          await t.database.pool.query(`insert into memberships (project_id, user_id, role) values ($1, $2, 'viewer') on conflict do nothing`, [ids['projectId'], ids['userId']]);
        }
        const url = fillPath(route, ids);
        const who = as[caller];
        const method = route.method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete';
        const req =
          who === undefined
            ? request(t.app)[method](url)
            : method === 'get'
              ? who.get(url)
              : method === 'delete'
                ? who.delete(url)
                : who[method](url, {});
        const res = await sendOnce(req, isStream(route.path));
        tried++;
        const expected = expectedFor(rule, caller, route.path);
        const ok = expected === 'allowed' ? passed(res.status) : res.status === expected;
        if (!ok) wrong.push(`${routeKey(route)} as ${caller}: ${res.status} (expected ${expected}) ${JSON.stringify(res.body).slice(0, 160)}`);
        if (res.status >= 400) expect(res.headers['content-type'], `${routeKey(route)} as ${caller}`).toMatch(/^application\/problem\+json/);
      }
    }
    process.stdout.write(`[role matrix] ${tried} requests over ${routes.length} routes × ${CALLERS.length} callers; ${wrong.length} wrong\n`);
    expect(wrong).toEqual([]);
    expect(tried).toBe(routes.length * CALLERS.length);
  }, 180_000);
});
