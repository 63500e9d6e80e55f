import { createRequire } from 'node:module';
import * as client from 'openid-client';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PAGE_TITLE } from '../src/pages';
import { DEMO_USERS } from '../src/users';
import { APP_ORIGIN, CookieBrowser, REDIRECT_URI, startProvider, temporaryDataDir, type RunningProvider } from './browser';

// jsdom (a pinned devDependency) ships no type declarations; only its JSDOM constructor is used.
interface JsdomModule {
  JSDOM: new (html: string) => { window: { document: Document } };
}
const { JSDOM } = createRequire(import.meta.url)('jsdom') as JsdomModule;

const dataDir = temporaryDataDir();
let running: RunningProvider;
let response: Response;
let document: Document;

beforeAll(async () => {
  running = await startProvider(dataDir.path);
  const config = await client.discovery(new URL(running.issuer), 'laminote-web', 'laminote-dev-secret', undefined, {
    execute: [client.allowInsecureRequests],
  });
  const authorizationUrl = client.buildAuthorizationUrl(config, {
    redirect_uri: REDIRECT_URI,
    scope: 'openid email profile',
    code_challenge: await client.calculatePKCECodeChallenge(client.randomPKCECodeVerifier()),
    code_challenge_method: 'S256',
    state: client.randomState(),
  });
  const page = await new CookieBrowser().follow(authorizationUrl, running.issuer);
  if (!page.response) {
    throw new Error(`expected the sign-in page, was sent to ${page.url.href}`);
  }
  response = page.response;
  document = new JSDOM(await response.text()).window.document;
});

afterAll(async () => {
  await running?.stop();
  dataDir.remove();
});

const text = (element: Element | null | undefined) => (element?.textContent ?? '').replace(/\s+/g, ' ').trim();

describe('the sign-in page', () => {
  it('is the provider\'s own page, titled and saying what it is', () => {
    expect(response.status).toBe(200);
    expect(document.title).toBe(PAGE_TITLE);
    expect(document.documentElement.lang).toBe('en');
    expect(text(document.body)).toContain('A local development identity provider with invented users.');
    expect(text(document.querySelector('h1'))).toBe('Choose who to sign in as');
  });

  it('offers one real submit button per demo user, named "Sign in as <name>", inside a POST form', () => {
    const buttons = Array.from(document.querySelectorAll('button[name="sub"]'));
    expect(buttons).toHaveLength(DEMO_USERS.length);
    DEMO_USERS.forEach((user, index) => {
      const button = buttons[index];
      expect(button?.getAttribute('type')).toBe('submit');
      expect(button?.getAttribute('value')).toBe(user.sub);
      expect(button?.hasAttribute('tabindex')).toBe(false);
      const form = button?.closest('form');
      expect(form?.getAttribute('method')).toBe('post');
      expect(form?.getAttribute('action')).toMatch(/^\/interaction\/[\w-]+\/login$/);

      // Accessible name from aria-labelledby (WAI-ARIA 1.2, accessible name computation step 2B).
      const labelIds = (button?.getAttribute('aria-labelledby') ?? '').split(' ').filter(Boolean);
      expect(labelIds.map((id) => text(document.getElementById(id))).join(' ')).toBe(`Sign in as ${user.name}`);
      const description = (button?.getAttribute('aria-describedby') ?? '').split(' ').map((id) => text(document.getElementById(id))).join(' ');
      expect(description).toContain(user.title);
      expect(description).toContain(user.email);
      expect(text(button)).toContain(user.email);
    });
  });

  it('needs nothing inline or from elsewhere: its stylesheet is served by the provider under a strict policy', async () => {
    expect(document.querySelectorAll('style, [style]')).toHaveLength(0);
    expect(Array.from(document.querySelectorAll('script')).every((script) => script.getAttribute('src')?.startsWith('/'))).toBe(true);
    const stylesheet = document.querySelector('link[rel="stylesheet"]')?.getAttribute('href') ?? '';
    expect(stylesheet).toMatch(/^\/assets\//);

    const policy = response.headers.get('content-security-policy') ?? '';
    expect(policy).toContain("default-src 'none'");
    expect(policy).toContain("style-src 'self'");
    expect(policy).toContain("frame-ancestors 'none'");
    // Browsers check form-action against the redirect back to the app after the form is posted.
    expect(policy).toMatch(new RegExp(`form-action 'self' ${APP_ORIGIN.replace(/[.]/g, '\\.')}(;|$)`));
    expect(response.headers.get('cache-control')).toBe('no-store');

    const css = await fetch(new URL(stylesheet, running.issuer));
    expect(css.status).toBe(200);
    expect(css.headers.get('content-type')).toMatch(/^text\/css/);
    expect(await css.text()).toContain('.person');
    expect((await fetch(new URL('/assets/nothing-here.css', running.issuer))).status).toBe(404);
  });
});
