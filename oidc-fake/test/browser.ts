import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pino } from 'pino';
import { createIdentityProvider, type IdentityProvider } from '../src/provider';

/**
 * What the tests drive the provider with: plain fetch plus a cookie jar that keeps path-scoped cookies
 * the way a browser does (oidc-provider scopes its interaction cookies to `/interaction/<uid>`).
 */
interface StoredCookie {
  value: string;
  path: string;
}

export class CookieBrowser {
  private readonly jar = new Map<string, StoredCookie>();

  async request(url: string | URL, init: { method?: string; form?: Record<string, string> } = {}): Promise<Response> {
    const target = new URL(url);
    const headers = new Headers();
    const cookie = [...this.jar]
      .filter(([, stored]) => target.pathname === stored.path || target.pathname.startsWith(stored.path.endsWith('/') ? stored.path : `${stored.path}/`))
      .map(([name, stored]) => `${name}=${stored.value}`)
      .join('; ');
    if (cookie) {
      headers.set('cookie', cookie);
    }
    let body: URLSearchParams | undefined;
    if (init.form) {
      body = new URLSearchParams(init.form);
      headers.set('content-type', 'application/x-www-form-urlencoded');
    }
    const response = await fetch(target, { method: init.method ?? (body ? 'POST' : 'GET'), headers, body, redirect: 'manual' });
    for (const line of response.headers.getSetCookie()) {
      this.store(line);
    }
    return response;
  }

  /**
   * Follows redirects the way a browser would until a page renders (2xx/4xx/5xx) or a redirect points
   * outside `within` (the application's callback). Returns the last response and the URL it came from,
   * or the outside URL that was not fetched.
   */
  async follow(url: string | URL, within: string, init: { method?: string; form?: Record<string, string> } = {}): Promise<{ response?: Response; url: URL }> {
    let current = new URL(url);
    let response = await this.request(current, init);
    for (let hop = 0; hop < 10; hop += 1) {
      const location = response.headers.get('location');
      if (response.status < 300 || response.status >= 400 || !location) {
        return { response, url: current };
      }
      const next = new URL(location, current);
      if (next.origin !== within) {
        return { url: next };
      }
      current = next;
      response = await this.request(current);
    }
    throw new Error(`more than 10 redirects from ${url.toString()}`);
  }

  private store(setCookie: string): void {
    const [pair = '', ...attributes] = setCookie.split(';').map((part) => part.trim());
    const split = pair.indexOf('=');
    const name = pair.slice(0, split);
    const value = pair.slice(split + 1);
    let path = '/';
    let expired = value === '';
    for (const attribute of attributes) {
      const [key = '', attributeValue = ''] = attribute.split('=');
      if (key.toLowerCase() === 'path') {
        path = attributeValue;
      } else if (key.toLowerCase() === 'expires' && Date.parse(attributeValue) <= Date.now()) {
        expired = true;
      } else if (key.toLowerCase() === 'max-age' && Number(attributeValue) <= 0) {
        expired = true;
      }
    }
    if (expired) {
      this.jar.delete(name);
    } else {
      this.jar.set(name, { value, path });
    }
  }
}

export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const address = server.address();
      server.close(() => (typeof address === 'object' && address ? resolve(address.port) : reject(new Error('no port'))));
    });
  });
}

export function temporaryDataDir(): { path: string; remove: () => void } {
  const path = mkdtempSync(join(tmpdir(), 'laminote-oidc-'));
  return { path, remove: () => rmSync(path, { recursive: true, force: true }) };
}

export const APP_ORIGIN = 'http://127.0.0.1:4200';
export const REDIRECT_URI = `${APP_ORIGIN}/auth/callback`;
export const POST_LOGOUT_URI = `${APP_ORIGIN}/`;

export interface RunningProvider {
  idp: IdentityProvider;
  issuer: string;
  stop: () => Promise<void>;
}

/** Starts a provider on a free loopback port with the default client settings. */
export async function startProvider(dataDir: string): Promise<RunningProvider> {
  const port = await freePort();
  const issuer = `http://127.0.0.1:${port}`;
  const idp = createIdentityProvider({
    issuer,
    dataDir,
    logger: pino({ level: 'silent' }),
    client: {
      clientId: 'laminote-web',
      clientSecret: 'laminote-dev-secret',
      redirectUris: [REDIRECT_URI],
      postLogoutRedirectUris: [POST_LOGOUT_URI],
    },
  });
  const stop = await idp.listen(port, '127.0.0.1');
  return { idp, issuer, stop };
}
