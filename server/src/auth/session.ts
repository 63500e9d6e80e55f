import { createHmac, timingSafeEqual } from 'node:crypto';
import connectPgSimple from 'connect-pg-simple';
import type { RequestHandler } from 'express';
import session from 'express-session';
import type pg from 'pg';
import type { Config } from '../config';
import { cachedSessionStore, ExpiringCache } from './session-cache';

export const SESSION_COOKIE = 'laminote.sid';

/** The paths that write the session (sign-in, its callback, sign-out): /auth/… */
const WRITES_SESSION = /^\/auth(\/|$)/;

/**
 * Server-side sessions in PostgreSQL; the browser holds only an httpOnly, SameSite=Lax cookie.
 *
 * Only the sign-in routes (/auth/…) change a session, and they go through express-session. Every other
 * request only reads it (who is signed in, the anti-forgery token), so it gets `readSession`: the same
 * signed cookie checked against the same secret, the same store (the same expiry, and a signed-out
 * session is gone from its cache at once), without express-session's per-request work for a session
 * that will not be written (hashing it twice, wrapping the answer to save or touch it).
 */
export function sessionMiddleware(config: Config, pool: pg.Pool): RequestHandler {
  // Reads are answered from memory for a few seconds (session-cache.ts); writes and sign-out go through.
  const PgStore = cachedSessionStore(connectPgSimple(session));
  const secure = config.PUBLIC_URL.startsWith('https://');
  // No write per request: a session lasts SESSION_TTL_HOURS from sign-in, and reads stay reads.
  const store = new PgStore({ pool, tableName: 'session', createTableIfMissing: false, pruneSessionInterval: 15 * 60, disableTouch: true });
  const writable = session({
    name: SESSION_COOKIE,
    secret: config.SESSION_SECRET,
    store,
    resave: false,
    saveUninitialized: false,
    rolling: false,
    proxy: secure,
    cookie: { httpOnly: true, sameSite: 'lax', secure, maxAge: config.SESSION_TTL_HOURS * 3600_000, path: '/' },
  });
  const readOnly = readSession(SESSION_COOKIE, config.SESSION_SECRET, store);
  return (req, res, next) => (WRITES_SESSION.test(req.path) ? writable(req, res, next) : readOnly(req, res, next));
}

/**
 * Sets `req.session` to the stored session named by the signed cookie, read-only, or leaves it unset
 * (no cookie, a bad signature, an unknown or expired session). The cookie is read as express-session
 * writes it: `s:` + the session id + `.` + its HMAC-SHA256 under the secret, base64 without padding
 * (cookie-signature), URI-encoded.
 */
export function readSession(cookieName: string, secret: string, store: session.Store): RequestHandler {
  // Cookies whose signature has been checked, with the id they carry: equal text verifies equal.
  const verified = new ExpiringCache<string>(10 * 60_000);
  return (req, _res, next) => {
    const raw = cookieValue(req.headers.cookie, cookieName);
    if (raw === undefined) return next();
    let sid = verified.get(raw);
    if (sid === undefined) {
      const checked = raw.startsWith('s:') ? unsign(raw.slice(2), secret) : null;
      if (checked === null) return next();
      verified.set(raw, (sid = checked));
    }
    store.get(sid, (err: unknown, data?: session.SessionData | null) => {
      // As express-session: a store that cannot answer is an error, a session it lacks is no session.
      if (err && (err as { code?: string }).code !== 'ENOENT') return next(err);
      if (data) req.session = Object.assign(data, { id: sid }) as unknown as typeof req.session;
      next();
    });
  };
}

/** The value of one cookie in a Cookie header, URI-decoded (as the `cookie` package parses it). */
function cookieValue(header: string | undefined, name: string): string | undefined {
  if (!header) return undefined;
  for (const part of header.split(';')) {
    const eq = part.indexOf('=');
    if (eq < 0 || part.slice(0, eq).trim() !== name) continue;
    let value = part.slice(eq + 1).trim();
    if (value.startsWith('"') && value.endsWith('"') && value.length >= 2) value = value.slice(1, -1);
    if (!value.includes('%')) return value;
    try {
      return decodeURIComponent(value);
    } catch {
      return value;
    }
  }
  return undefined;
}

/** The signed value without its signature, or null when the signature is not the secret's. */
function unsign(signed: string, secret: string): string | null {
  const dot = signed.lastIndexOf('.');
  if (dot < 0) return null;
  const value = signed.slice(0, dot);
  const expected = Buffer.from(`${value}.${createHmac('sha256', secret).update(value).digest('base64').replace(/=+$/, '')}`);
  const given = Buffer.from(signed);
  return expected.length === given.length && timingSafeEqual(expected, given) ? value : null;
}
