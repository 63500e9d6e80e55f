import type pg from 'pg';
import { Router, type Request, type RequestHandler } from 'express';
import * as client from 'openid-client';
import type { Config } from '../config';
import type { Db } from '../db/client';
import type { Logger } from '../logger';
import { ProblemError, unauthorized } from '../http/problem';
import { limitRequests } from '../http/rate-limit';
import { newCsrfToken, setCsrfCookie } from './csrf';
import type { OidcClient } from './oidc';
import { SESSION_COOKIE } from './session';
import { forgetSessionUser, sessionUserCache } from './session-cache';
import { EmailTakenError, findSessionUser, UnverifiedEmailError, upsertUserFromIdentity } from './users';

interface AuthDeps {
  config: Config;
  db: Db;
  /** The database's pool, where request budgets are kept. */
  pool: pg.Pool;
  oidc: OidcClient;
  logger: Logger;
}

/** How long a sign-in that was started may take to come back: its session row lives this long only. */
export const LOGIN_STATE_TTL_MS = 10 * 60_000;
/**
 * Set at sign-out: the next sign-in asks the provider to ask who is signing in (prompt=login), even
 * if the provider's own session outlived ours (a provider that kept it after the end-session page).
 */
export const SIGNED_OUT_COOKIE = 'laminote.signedout';

/** Only same-site paths may be a return target, so the login cannot be used as an open redirect. */
export function safeReturnTo(value: unknown): string {
  return typeof value === 'string' && value.startsWith('/') && !value.startsWith('//') && !value.startsWith('/\\') ? value : '/';
}

function regenerate(req: Request): Promise<void> {
  return new Promise((resolve, reject) => req.session.regenerate((err) => (err ? reject(err) : resolve())));
}
function save(req: Request): Promise<void> {
  return new Promise((resolve, reject) => req.session.save((err) => (err ? reject(err) : resolve())));
}
function destroy(req: Request): Promise<void> {
  return new Promise((resolve, reject) => req.session.destroy((err) => (err ? reject(err) : resolve())));
}

/** Sign-in, its callback and sign-out; mounted at /auth, so no other request walks these routes. */
export function authRouter({ config, db, pool, oidc, logger }: AuthDeps): Router {
  const router = Router();
  const redirectUri = `${config.PUBLIC_URL}/auth/callback`;
  const secure = config.PUBLIC_URL.startsWith('https://');

  const unavailable = (err: unknown) => {
    logger.error({ err }, 'identity provider unavailable');
    return new ProblemError(503, 'identity-provider-unavailable', 'The sign-in service cannot be reached', {
      detail: `Could not reach ${config.OIDC_ISSUER}; try again shortly.`,
    });
  };

  // Anonymous routes that write a session row: a budget per client address.
  const signInBudget = limitRequests({
    pool,
    name: 'sign-in',
    perMinute: config.SIGN_IN_RATE_PER_MINUTE,
    refuse: (n) => ({ title: 'Too many requests', detail: `At most ${n} sign-in attempts a minute from one place; wait a minute and try again.` }),
  });

  // Authorization code flow with PKCE; state and nonce are checked on the way back.
  router.get('/login', signInBudget, async (req, res) => {
    const configuration = await oidc.configuration().catch((err: unknown) => {
      throw unavailable(err);
    });
    const codeVerifier = client.randomPKCECodeVerifier();
    const state = client.randomState();
    const nonce = client.randomNonce();
    req.session.login = { codeVerifier, state, nonce, returnTo: safeReturnTo(req.query['returnTo']) };
    // A sign-in in progress is kept minutes, not the hours of a signed-in session (its row expires then).
    req.session.cookie.maxAge = LOGIN_STATE_TTL_MS;
    await save(req);
    const askWho = /(?:^|;\s*)laminote\.signedout=1(?:;|$)/.test(req.headers.cookie ?? '');
    const url = client.buildAuthorizationUrl(configuration, {
      redirect_uri: redirectUri,
      scope: config.OIDC_SCOPES,
      code_challenge: await client.calculatePKCECodeChallenge(codeVerifier),
      code_challenge_method: 'S256',
      state,
      nonce,
      ...(askWho ? { prompt: 'login' } : {}),
    });
    if (askWho) res.clearCookie(SIGNED_OUT_COOKIE, { path: '/' });
    res.redirect(url.href);
  });

  router.get('/callback', signInBudget, async (req, res) => {
    const pending = req.session.login;
    if (!pending) {
      throw new ProblemError(400, 'sign-in-expired', 'This sign-in was not started here or has expired', {
        detail: 'Start again from the sign-in button.',
      });
    }
    const configuration = await oidc.configuration().catch((err: unknown) => {
      throw unavailable(err);
    });
    let tokens: client.TokenEndpointResponse & client.TokenEndpointResponseHelpers;
    try {
      const currentUrl = new URL(req.originalUrl, config.PUBLIC_URL);
      tokens = await client.authorizationCodeGrant(configuration, currentUrl, {
        pkceCodeVerifier: pending.codeVerifier,
        expectedState: pending.state,
        expectedNonce: pending.nonce,
        idTokenExpected: true,
      });
    } catch (err) {
      req.log.warn({ err }, 'sign-in callback refused');
      delete req.session.login;
      await save(req);
      throw new ProblemError(400, 'sign-in-failed', 'Sign-in could not be completed', {
        detail: err instanceof Error ? err.message : 'The identity provider answer was not accepted.',
      });
    }
    const claims = tokens.claims();
    if (!claims || typeof claims['email'] !== 'string') {
      throw new ProblemError(400, 'sign-in-failed', 'Sign-in could not be completed', {
        detail: 'The identity provider did not give an e-mail address (scope "email").',
      });
    }
    const user = await db.transaction((tx) =>
      upsertUserFromIdentity(tx, {
        issuer: configuration.serverMetadata().issuer,
        subject: claims.sub,
        email: claims['email'] as string,
        emailVerified: claims['email_verified'] === true,
        name: typeof claims['name'] === 'string' ? claims['name'] : '',
      }),
    ).catch((err: unknown) => {
      if (err instanceof UnverifiedEmailError || err instanceof EmailTakenError) {
        throw new ProblemError(403, 'sign-in-refused', 'Sign-in could not be completed', { detail: err.message });
      }
      throw err;
    });
    forgetSessionUser(db, user.id);
    const returnTo = pending.returnTo;
    // A fresh session id at sign-in prevents session fixation.
    await regenerate(req);
    req.session.userId = user.id;
    req.session.csrfToken = newCsrfToken();
    if (tokens.id_token) req.session.idToken = tokens.id_token;
    await save(req);
    setCsrfCookie(res, req.session.csrfToken, secure);
    res.redirect(returnTo);
  });

  // Ends our session and hands the browser the provider's end-session address.
  router.post('/logout', async (req, res) => {
    const idToken = req.session.idToken;
    await destroy(req);
    res.clearCookie(SESSION_COOKIE, { path: '/' });
    res.cookie(SIGNED_OUT_COOKIE, '1', { httpOnly: true, sameSite: 'lax', secure, path: '/', maxAge: 30 * 24 * 3600_000 });
    let redirectTo = '/';
    try {
      const configuration = await oidc.configuration();
      if (configuration.serverMetadata().end_session_endpoint) {
        redirectTo = client.buildEndSessionUrl(configuration, {
          post_logout_redirect_uri: `${config.PUBLIC_URL}/`,
          ...(idToken ? { id_token_hint: idToken } : {}),
        }).href;
      }
    } catch (err) {
      req.log.warn({ err }, 'no end-session address; signed out locally only');
    }
    res.json({ redirectTo });
  });

  return router;
}

/** Attach the signed-in user, if any, to the request. */
export function loadUser(db: Db): RequestHandler {
  const recent = sessionUserCache(db);
  return async (req, _res, next) => {
    const id = req.session?.userId;
    if (id) {
      let user = recent.get(id) ?? null;
      if (!user) {
        user = await findSessionUser(db, id);
        if (user) recent.set(id, user);
      }
      if (user) req.user = { ...user };
    }
    next();
  };
}

/** Anonymous calls to any /api route answer 401. */
export const requireUser: RequestHandler = (req, _res, next) => {
  next(req.user ? undefined : unauthorized());
};
