import * as client from 'openid-client';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_USERS } from '../src/users';
import { CookieBrowser, POST_LOGOUT_URI, REDIRECT_URI, startProvider, temporaryDataDir, type RunningProvider } from './browser';

/**
 * The provider against OpenID Connect Core 1.0 and RFC 7636 (PKCE), driven the way the app's server
 * drives it: openid-client v6 on the relying-party side, plain fetch with a cookie jar as the browser.
 */

const SECRET = 'laminote-dev-secret';
const dataDir = temporaryDataDir();
let running: RunningProvider;

beforeAll(async () => {
  running = await startProvider(dataDir.path);
});

afterAll(async () => {
  await running?.stop();
  dataDir.remove();
});

async function relyingParty(auth: client.ClientAuth = client.ClientSecretBasic(SECRET)): Promise<client.Configuration> {
  return client.discovery(new URL(running.issuer), 'laminote-web', SECRET, auth, { execute: [client.allowInsecureRequests] });
}

interface Attempt {
  authorizationUrl: URL;
  verifier: string;
  state: string;
  nonce: string;
}

async function startAttempt(config: client.Configuration): Promise<Attempt> {
  const verifier = client.randomPKCECodeVerifier();
  const state = client.randomState();
  const nonce = client.randomNonce();
  const authorizationUrl = client.buildAuthorizationUrl(config, {
    redirect_uri: REDIRECT_URI,
    scope: 'openid email profile',
    code_challenge: await client.calculatePKCECodeChallenge(verifier),
    code_challenge_method: 'S256',
    state,
    nonce,
  });
  return { authorizationUrl, verifier, state, nonce };
}

/** Authorize → sign-in page → choose `sub` → (consent, automatic) → the callback URL with a code. */
async function signIn(browser: CookieBrowser, attempt: Attempt, sub: string): Promise<URL> {
  const page = await browser.follow(attempt.authorizationUrl, running.issuer);
  expect(page.response?.status).toBe(200);
  expect(page.url.pathname).toMatch(/^\/interaction\/[\w-]+$/);
  const done = await browser.follow(new URL(`${page.url.pathname}/login`, running.issuer), running.issuer, { form: { sub } });
  expect(done.response).toBeUndefined();
  return done.url;
}

describe('discovery', () => {
  it('advertises the endpoints under the issuer, S256 PKCE, and the scopes the app asks for', async () => {
    const response = await fetch(`${running.issuer}/.well-known/openid-configuration`);
    expect(response.status).toBe(200);
    const metadata: Record<string, unknown> = await response.json();
    expect(metadata).toMatchObject({
      issuer: running.issuer,
      authorization_endpoint: `${running.issuer}/auth`,
      token_endpoint: `${running.issuer}/token`,
      userinfo_endpoint: `${running.issuer}/me`,
      jwks_uri: `${running.issuer}/jwks`,
      end_session_endpoint: `${running.issuer}/session/end`,
      response_types_supported: ['code'],
      id_token_signing_alg_values_supported: ['RS256'],
    });
    expect(metadata['code_challenge_methods_supported']).toContain('S256');
    expect(metadata['code_challenge_methods_supported']).not.toContain('plain');
    expect(metadata['scopes_supported']).toEqual(expect.arrayContaining(['openid', 'email', 'profile']));
    expect(metadata['token_endpoint_auth_methods_supported']).toEqual(
      expect.arrayContaining(['client_secret_basic', 'client_secret_post']),
    );
  });

  it('publishes only public key members in its JWKS', async () => {
    const { keys } = (await (await fetch(`${running.issuer}/jwks`)).json()) as { keys: Record<string, unknown>[] };
    expect(keys.length).toBeGreaterThan(0);
    for (const key of keys) {
      expect(key).toMatchObject({ kty: 'RSA', alg: 'RS256', use: 'sig' });
      for (const privateMember of ['d', 'p', 'q', 'dp', 'dq', 'qi']) {
        expect(key).not.toHaveProperty(privateMember);
      }
    }
  });
});

describe('authorization code flow with PKCE', () => {
  it.each([
    ['client_secret_basic', () => client.ClientSecretBasic(SECRET)],
    ['client_secret_post', () => client.ClientSecretPost(SECRET)],
  ])('signs Dev Arjunan in and issues an ID token with his e-mail (%s)', async (_method, auth) => {
    const config = await relyingParty(auth());
    const attempt = await startAttempt(config);
    const callback = await signIn(new CookieBrowser(), attempt, 'tamsk-dev');
    expect(`${callback.origin}${callback.pathname}`).toBe(REDIRECT_URI);
    expect(callback.searchParams.get('state')).toBe(attempt.state);
    expect(callback.searchParams.get('code')).toBeTruthy();

    const tokens = await client.authorizationCodeGrant(config, callback, {
      pkceCodeVerifier: attempt.verifier,
      expectedState: attempt.state,
      expectedNonce: attempt.nonce,
    });
    expect(tokens.claims()).toMatchObject({
      iss: running.issuer,
      aud: 'laminote-web',
      sub: 'tamsk-dev',
      email: 'dev.arjunan@tamsk.example',
      email_verified: true,
      name: 'Dev Arjunan',
      nonce: attempt.nonce,
    });
    const userinfo = await client.fetchUserInfo(config, tokens.access_token, 'tamsk-dev');
    expect(userinfo).toMatchObject({ sub: 'tamsk-dev', email: 'dev.arjunan@tamsk.example', name: 'Dev Arjunan' });
  });

  it('gives every demo user their own subject, e-mail and name', async () => {
    const config = await relyingParty();
    for (const user of DEMO_USERS) {
      const attempt = await startAttempt(config);
      const callback = await signIn(new CookieBrowser(), attempt, user.sub);
      const tokens = await client.authorizationCodeGrant(config, callback, {
        pkceCodeVerifier: attempt.verifier,
        expectedState: attempt.state,
        expectedNonce: attempt.nonce,
      });
      expect(tokens.claims()).toMatchObject({ sub: user.sub, email: user.email, name: user.name });
    }
  });

  it('refuses an authorization request without a PKCE challenge', async () => {
    const config = await relyingParty();
    const url = client.buildAuthorizationUrl(config, { redirect_uri: REDIRECT_URI, scope: 'openid', state: client.randomState() });
    const result = await new CookieBrowser().follow(url, running.issuer);
    expect(result.url.searchParams.get('error')).toBe('invalid_request');
    expect(result.url.searchParams.get('error_description')).toMatch(/PKCE/);
    expect(result.url.searchParams.get('code')).toBeNull();
  });

  it('refuses the code exchange with the wrong verifier or the wrong secret', async () => {
    const config = await relyingParty();
    const attempt = await startAttempt(config);
    const callback = await signIn(new CookieBrowser(), attempt, 'tamsk-mara');
    await expect(
      client.authorizationCodeGrant(config, callback, {
        pkceCodeVerifier: client.randomPKCECodeVerifier(),
        expectedState: attempt.state,
        expectedNonce: attempt.nonce,
      }),
    ).rejects.toMatchObject({ error: 'invalid_grant' });

    const impostor = await client.discovery(new URL(running.issuer), 'laminote-web', 'not-the-secret', undefined, {
      execute: [client.allowInsecureRequests],
    });
    const second = await startAttempt(impostor);
    const secondCallback = await signIn(new CookieBrowser(), second, 'tamsk-mara');
    await expect(
      client.authorizationCodeGrant(impostor, secondCallback, {
        pkceCodeVerifier: second.verifier,
        expectedState: second.state,
        expectedNonce: second.nonce,
      }),
    ).rejects.toMatchObject({ error: 'invalid_client' });
  });

  it('returns access_denied to the app when the person cancels', async () => {
    const config = await relyingParty();
    const attempt = await startAttempt(config);
    const browser = new CookieBrowser();
    const page = await browser.follow(attempt.authorizationUrl, running.issuer);
    const result = await browser.follow(new URL(`${page.url.pathname}/abort`, running.issuer), running.issuer, { form: {} });
    expect(`${result.url.origin}${result.url.pathname}`).toBe(REDIRECT_URI);
    expect(result.url.searchParams.get('error')).toBe('access_denied');
    expect(result.url.searchParams.get('state')).toBe(attempt.state);
  });
});

describe('sign-in refusals', () => {
  it('refuses an unknown user with a message naming the identifier, and keeps the sign-in usable', async () => {
    const config = await relyingParty();
    const attempt = await startAttempt(config);
    const browser = new CookieBrowser();
    const page = await browser.follow(attempt.authorizationUrl, running.issuer);
    const loginUrl = new URL(`${page.url.pathname}/login`, running.issuer);

    const refused = await browser.request(loginUrl, { form: { sub: 'tamsk-nobody' } });
    expect(refused.status).toBe(400);
    const html = await refused.text();
    expect(html).toContain('role="alert"');
    expect(html).toContain('Nobody with the identifier &quot;tamsk-nobody&quot; is registered with this development provider.');
    expect(html).toContain('Sign in as </span>Dev Arjunan');

    const empty = await browser.request(loginUrl, { form: {} });
    expect(empty.status).toBe(400);
    expect(await empty.text()).toContain('Choose one of the people below to sign in as.');

    const done = await browser.follow(loginUrl, running.issuer, { form: { sub: 'tamsk-lotte' } });
    expect(done.url.searchParams.get('code')).toBeTruthy();
    const tokens = await client.authorizationCodeGrant(config, done.url, {
      pkceCodeVerifier: attempt.verifier,
      expectedState: attempt.state,
      expectedNonce: attempt.nonce,
    });
    expect(tokens.claims()?.email).toBe('lotte.brandvik@tamsk.example');
  });

  it('escapes what was posted instead of echoing it as markup', async () => {
    const config = await relyingParty();
    const browser = new CookieBrowser();
    const page = await browser.follow((await startAttempt(config)).authorizationUrl, running.issuer);
    const refused = await browser.request(new URL(`${page.url.pathname}/login`, running.issuer), {
      form: { sub: '<script>alert(1)</script>' },
    });
    const html = await refused.text();
    expect(refused.status).toBe(400);
    expect(html).not.toContain('<script>alert(1)</script>');
    expect(html).toContain('&lt;script&gt;alert(1)&lt;/script&gt;');
  });

  it('answers a form posted without the interaction cookie with an explanation, not a sign-in', async () => {
    const config = await relyingParty();
    const page = await new CookieBrowser().follow((await startAttempt(config)).authorizationUrl, running.issuer);
    const stranger = await new CookieBrowser().request(new URL(`${page.url.pathname}/login`, running.issuer), {
      form: { sub: 'tamsk-ines' },
    });
    expect(stranger.status).toBe(400);
    expect(stranger.headers.get('location')).toBeNull();
    expect(await stranger.text()).toContain('This sign-in has expired');
  });
});

describe('single sign-on and logout', () => {
  it('keeps the provider session for a second sign-in, and ends it at RP-initiated logout', async () => {
    const config = await relyingParty();
    const browser = new CookieBrowser();
    const first = await startAttempt(config);
    const tokens = await client.authorizationCodeGrant(config, await signIn(browser, first, 'tamsk-pim'), {
      pkceCodeVerifier: first.verifier,
      expectedState: first.state,
      expectedNonce: first.nonce,
    });

    // While the session lives, a new authorization needs no page at all.
    const again = await browser.follow((await startAttempt(config)).authorizationUrl, running.issuer);
    expect(again.response).toBeUndefined();
    expect(again.url.searchParams.get('code')).toBeTruthy();

    const logoutState = client.randomState();
    const endSession = client.buildEndSessionUrl(config, {
      id_token_hint: tokens.id_token ?? '',
      post_logout_redirect_uri: POST_LOGOUT_URI,
      state: logoutState,
    });
    const confirmation = await browser.follow(endSession, running.issuer);
    expect(confirmation.response?.status).toBe(200);
    const html = (await confirmation.response?.text()) ?? '';
    expect(html).toContain('<button type="submit" form="op.logoutForm" name="logout" value="yes" id="sign-out"');
    expect(html).toContain('src="/assets/sign-out.js"');
    const action = /<form id="op\.logoutForm" method="post" action="([^"]+)">/.exec(html)?.[1];
    const xsrf = /name="xsrf" value="([^"]+)"/.exec(html)?.[1];
    expect(action).toBeTruthy();
    expect(xsrf).toBeTruthy();

    // What the served script does: press the sign-out button, which posts the form with logout=yes.
    const back = await browser.follow(new URL(action ?? '', running.issuer), running.issuer, {
      form: { xsrf: xsrf ?? '', logout: 'yes' },
    });
    expect(back.response).toBeUndefined();
    expect(`${back.url.origin}${back.url.pathname}`).toBe(POST_LOGOUT_URI);
    expect(back.url.searchParams.get('state')).toBe(logoutState);

    const afterLogout = await browser.follow((await startAttempt(config)).authorizationUrl, running.issuer);
    expect(afterLogout.response?.status).toBe(200);
    expect(afterLogout.url.pathname).toMatch(/^\/interaction\//);
    expect(await afterLogout.response?.text()).toContain('Choose who to sign in as');
  });

  it('refuses a logout confirmation without the anti-forgery token', async () => {
    const config = await relyingParty();
    const browser = new CookieBrowser();
    const attempt = await startAttempt(config);
    await signIn(browser, attempt, 'tamsk-mara');
    const confirmation = await browser.follow(client.buildEndSessionUrl(config, { client_id: 'laminote-web' }), running.issuer);
    const html = (await confirmation.response?.text()) ?? '';
    const action = /<form id="op\.logoutForm" method="post" action="([^"]+)">/.exec(html)?.[1] ?? '';
    const forged = await browser.request(new URL(action, running.issuer), { form: { xsrf: 'forged', logout: 'yes' } });
    expect(forged.status).toBe(400);
    expect(await forged.text()).toContain('xsrf token invalid');

    // The session survived the forged request.
    const again = await browser.follow((await startAttempt(config)).authorizationUrl, running.issuer);
    expect(again.url.searchParams.get('code')).toBeTruthy();
  });
});
