import { randomBytes, timingSafeEqual } from 'node:crypto';
import type { RequestHandler, Response } from 'express';
import { ProblemError } from '../http/problem';

/**
 * Anti-forgery: a random token kept in the session and mirrored in a readable `XSRF-TOKEN` cookie that
 * the web app echoes in the `X-XSRF-TOKEN` header (Angular's HttpClient does this by itself). Another
 * site can make the browser send our cookies, but cannot read them to set the header.
 */
export const CSRF_COOKIE = 'XSRF-TOKEN';
export const CSRF_HEADER = 'x-xsrf-token';
const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

export function newCsrfToken(): string {
  return randomBytes(32).toString('base64url');
}

export function setCsrfCookie(res: Response, token: string, secure: boolean): void {
  res.cookie(CSRF_COOKIE, token, { httpOnly: false, sameSite: 'strict', secure, path: '/' });
}

/**
 * `publicUrl`: where people reach the app. A state-changing request that a browser says comes from
 * another origin (the Origin header, or Sec-Fetch-Site: cross-site) is refused before the token is
 * looked at; a request without either header (a script, an old browser) is judged by the token alone.
 */
export function csrfProtection(publicUrl?: string): RequestHandler {
  const ownOrigin = publicUrl ? new URL(publicUrl).origin : null;
  return (req, _res, next) => {
    // A request made with a personal API token carries no cookie another site could make a browser send.
    if (SAFE.has(req.method) || req.apiToken) return next();
    const origin = req.get('origin');
    if ((ownOrigin && origin && origin !== ownOrigin) || req.get('sec-fetch-site') === 'cross-site') {
      return next(
        new ProblemError(403, 'csrf', 'This request comes from another site', {
          detail: `State-changing requests are accepted only from ${ownOrigin ?? 'this site'}; open Laminote there and try again.`,
        }),
      );
    }
    const expected = req.session?.csrfToken;
    const given = req.get(CSRF_HEADER);
    if (!expected || !given || !equal(expected, given)) {
      return next(
        new ProblemError(403, 'csrf', 'Missing or wrong anti-forgery token', {
          detail: `State-changing requests must carry the ${CSRF_HEADER} header from the ${CSRF_COOKIE} cookie; reload the page.`,
        }),
      );
    }
    next();
  };
}

function equal(a: string, b: string): boolean {
  const x = Buffer.from(a);
  const y = Buffer.from(b);
  return x.length === y.length && timingSafeEqual(x, y);
}
