import connectPgSimple from 'connect-pg-simple';
import session from 'express-session';
import type pg from 'pg';
import type { Config } from '../config';
import { cachedSessionStore } from './session-cache';

export const SESSION_COOKIE = 'laminote.sid';

/** Server-side sessions in PostgreSQL; the browser holds only an httpOnly, SameSite=Lax cookie. */
export function sessionMiddleware(config: Config, pool: pg.Pool) {
  // Reads are answered from memory for a few seconds (session-cache.ts); writes and sign-out go through.
  const PgStore = cachedSessionStore(connectPgSimple(session));
  const secure = config.PUBLIC_URL.startsWith('https://');
  return session({
    name: SESSION_COOKIE,
    secret: config.SESSION_SECRET,
    // No write per request: a session lasts SESSION_TTL_HOURS from sign-in, and reads stay reads.
    store: new PgStore({ pool, tableName: 'session', createTableIfMissing: false, pruneSessionInterval: 15 * 60, disableTouch: true }),
    resave: false,
    saveUninitialized: false,
    rolling: false,
    proxy: secure,
    cookie: { httpOnly: true, sameSite: 'lax', secure, maxAge: config.SESSION_TTL_HOURS * 3600_000, path: '/' },
  });
}
