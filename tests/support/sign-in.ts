import type { Express } from 'express';
import request from 'supertest';
import { DEMO_USERS } from '../../oidc-fake/src/users';

/**
 * Signs a demo person in through the real identity provider fake: /auth/login on the app, the
 * provider's authorize endpoint and its sign-in form, then the app's callback. No session is faked.
 */
export interface SignedIn {
  agent: ReturnType<typeof request.agent>;
  csrf: string;
  /** Sends the anti-forgery header with a state-changing request. */
  post(url: string, body?: object): request.Test;
  patch(url: string, body?: object): request.Test;
  put(url: string, body?: object): request.Test;
  delete(url: string): request.Test;
  get(url: string): request.Test;
}

class Jar {
  private cookies = new Map<string, string>();
  take(res: Response): void {
    for (const line of res.headers.getSetCookie()) {
      const [pair] = line.split(';');
      const eq = pair!.indexOf('=');
      this.cookies.set(pair!.slice(0, eq).trim(), pair!.slice(eq + 1).trim());
    }
  }
  header(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
  }
}

export function demoUser(role: 'lead' | 'engineer' | 'reviewer' | 'viewer' | 'admin' | 'outsider') {
  const user =
    role === 'admin' ? DEMO_USERS.find((u) => u.siteAdmin) : role === 'outsider' ? DEMO_USERS.find((u) => !u.siteAdmin && !u.role) : DEMO_USERS.find((u) => u.role === role);
  if (!user) throw new Error(`no demo user for ${role}`);
  return user;
}

/** Walks the provider's redirects from an authorize URL to the app's callback URL with the code. */
export async function providerRoundTrip(authorizeUrl: string, sub: string, callbackPrefix: string): Promise<string> {
  const jar = new Jar();
  let url = authorizeUrl;
  for (let hop = 0; hop < 12; hop++) {
    if (url.startsWith(callbackPrefix)) return url;
    let res = await fetch(url, { redirect: 'manual', headers: { cookie: jar.header() } });
    jar.take(res);
    if (res.status === 200 && new URL(url).pathname.startsWith('/interaction/')) {
      // The sign-in page: choose the person.
      const action = `${new URL(url).pathname.replace(/\/$/, '')}/login`;
      res = await fetch(new URL(action, url), {
        method: 'POST',
        redirect: 'manual',
        headers: { cookie: jar.header(), 'content-type': 'application/x-www-form-urlencoded' },
        body: new URLSearchParams({ sub }),
      });
      jar.take(res);
    }
    const location = res.headers.get('location');
    if (!location) throw new Error(`identity provider answered ${res.status} at ${url} without a redirect: ${(await res.text()).slice(0, 300)}`);
    url = new URL(location, url).href;
  }
  throw new Error('too many redirects at the identity provider');
}

export async function signIn(app: Express, role: Parameters<typeof demoUser>[0], publicUrl: string): Promise<SignedIn> {
  const agent = request.agent(app);
  const login = await agent.get('/auth/login').expect(302);
  const callback = await providerRoundTrip(login.headers['location'] as string, demoUser(role).sub, `${publicUrl}/auth/callback`);
  const u = new URL(callback);
  const done = await agent.get(u.pathname + u.search).expect(302);
  const cookies = ([] as string[]).concat(done.headers['set-cookie'] ?? []);
  const csrf = cookies.map((c) => /^XSRF-TOKEN=([^;]+)/.exec(c)?.[1]).find(Boolean);
  if (!csrf) throw new Error('no XSRF-TOKEN cookie after sign-in');
  const withCsrf = (t: request.Test) => t.set('x-xsrf-token', csrf);
  return {
    agent,
    csrf,
    get: (url) => agent.get(url),
    post: (url, body) => withCsrf(agent.post(url)).send(body ?? {}),
    patch: (url, body) => withCsrf(agent.patch(url)).send(body ?? {}),
    put: (url, body) => withCsrf(agent.put(url)).send(body ?? {}),
    delete: (url) => withCsrf(agent.delete(url)),
  };
}
