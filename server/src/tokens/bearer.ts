import type { RequestHandler } from 'express';
import type pg from 'pg';
import type { TokenScope } from '@laminote/contracts';
import { audit } from '../audit/audit';
import type { Db } from '../db/client';
import { ProblemError } from '../http/problem';
import { limitRequests } from '../http/rate-limit';
import type { Logger } from '../logger';
import { findActiveToken, markUsed } from './service';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      /** Set when the request was authenticated by a personal API token rather than a session. */
      apiToken?: { id: string; scope: TokenScope; name: string };
    }
  }
}

const READ_METHODS = new Set(['GET', 'HEAD']);
/** What a `run` token may change besides reading: the draft's cells, uploaded tables, runs and their cancelling. */
const RUN_ROUTES: { method: string; path: RegExp }[] = [
  { method: 'PUT', path: /^\/branches\/[^/]+\/draft$/ },
  { method: 'POST', path: /^\/branches\/[^/]+\/run$/ },
  { method: 'POST', path: /^\/studies\/[^/]+\/uploads$/ },
  { method: 'DELETE', path: /^\/jobs\/[^/]+$/ },
];
/** Token management needs a signed-in person: a token never sees or makes tokens. */
const SESSION_ONLY = /^\/me\/tokens(\/|$)/;
/** Last use is written at most this often per token, not on every request. */
const LAST_USE_RESOLUTION_MS = 60_000;

const invalid = () =>
  new ProblemError(401, 'invalid-token', 'The API token is not valid', {
    detail: 'The token is unknown, revoked or expired. Make a new one under Settings → API tokens.',
  });

/** Whether a token of this scope may make this request (paths relative to /api). */
export function scopeAllows(scope: TokenScope, method: string, path: string): boolean {
  if (SESSION_ONLY.test(path)) return false;
  if (READ_METHODS.has(method)) return true;
  return scope === 'run' && RUN_ROUTES.some((r) => r.method === method && r.path.test(path));
}

/**
 * `Authorization: Bearer lmn_…` on /api: the token's owner becomes the caller (with their roles in
 * each project, narrowed by the token's scope), in place of any session. A bad token answers 401, a
 * request outside the scope 403, more than `perMinute` requests in a minute 429. Every change made
 * with a token is written to the audit log with the token named.
 */
export function bearerAuth({ db, pool, logger, perMinute }: { db: Db; pool: pg.Pool; logger: Logger; perMinute: number }): RequestHandler[] {
  const authenticate: RequestHandler = async (req, res, next) => {
    const header = req.get('authorization');
    if (!header) return next();
    const match = /^Bearer\s+(\S+)\s*$/i.exec(header);
    if (!match) return next(invalid());
    const found = await findActiveToken(db, match[1]!);
    res.setHeader('www-authenticate', 'Bearer realm="laminote"');
    if (!found) return next(invalid());
    const { token, user } = found;
    req.user = { ...user };
    req.apiToken = { id: token.id, scope: token.scope, name: token.name };
    if (!scopeAllows(token.scope, req.method, req.path)) {
      return next(
        new ProblemError(403, 'token-scope', 'This API token may not do that', {
          detail: SESSION_ONLY.test(req.path)
            ? 'API tokens are managed in the app, signed in, not with a token.'
            : token.scope === 'read'
              ? 'The token’s scope is Read: it may only read. Make a token with the scope Read and run to edit drafts and run cells.'
              : 'The token’s scope Read and run covers reading, editing a draft’s cells, uploading tables and running cells; this needs a signed-in person.',
        }),
      );
    }
    if (!token.lastUsedAt || Date.now() - token.lastUsedAt.getTime() > LAST_USE_RESOLUTION_MS) {
      await markUsed(db, token.id).catch((err: unknown) => logger.warn({ err }, 'could not record the token’s last use'));
    }
    if (!READ_METHODS.has(req.method)) {
      // The routers below strip their mount prefix from req.url; the audit names the whole path.
      const path = req.originalUrl.split('?')[0];
      res.on('finish', () => {
        audit(db, {
          actorId: user.id,
          action: 'api_token.request',
          targetType: 'api_token',
          targetId: token.id,
          detail: { method: req.method, path, status: res.statusCode, token: token.name },
        }).catch((err: unknown) => logger.error({ err }, 'could not audit a token request'));
      });
    }
    next();
  };
  const limit = limitRequests({
    pool,
    name: 'token',
    perMinute,
    skip: (req) => !req.apiToken,
    key: (req) => req.apiToken!.id,
    refuse: (n) => ({ title: 'Too many requests with this API token', detail: `A token may make ${n} requests a minute; wait and try again.` }),
  });
  return [authenticate, limit];
}
