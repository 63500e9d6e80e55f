import type { Request, RequestHandler, Response } from 'express';
import { ipKeyGenerator } from 'express-rate-limit';
import type pg from 'pg';
import { RateLimiterMemory, RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible';
import { ProblemError } from './problem';

/**
 * A request budget per caller, shared by every app server on the database (rate-limiter-flexible's
 * PostgreSQL store, table `rate_limits`): N servers behind a balancer give one budget, not N. While the
 * database is away, each server keeps the budget in memory on its own (the store's insurance limiter),
 * so a caller is still limited and nobody is refused for the outage. Beyond the budget: 429
 * problem+json with Retry-After, and the RateLimit headers of the IETF draft on every answer.
 */
export interface LimitOptions {
  pool: pg.Pool;
  /** Names the budget in the table (several budgets share it): "sign-in", "token". */
  name: string;
  perMinute: number;
  /** Who the caller is; by default the client address, IPv6 grouped by its /56 (express-rate-limit's rule). */
  key?: (req: Request) => string;
  skip?: (req: Request) => boolean;
  /** The 429's title and detail, given the budget. */
  refuse: (perMinute: number) => { title: string; detail: string };
}

const WINDOW_S = 60;

function setHeaders(res: Response, name: string, perMinute: number, state: { remainingPoints: number; msBeforeNext: number }) {
  const reset = Math.max(1, Math.ceil(state.msBeforeNext / 1000));
  res.setHeader('RateLimit-Policy', `"${name}";q=${perMinute};w=${WINDOW_S}`);
  res.setHeader('RateLimit', `"${name}";r=${Math.max(0, state.remainingPoints)};t=${reset}`);
}

export function limitRequests({ pool, name, perMinute, key, skip, refuse }: LimitOptions): RequestHandler {
  const limiter = new RateLimiterPostgres({
    storeClient: pool,
    storeType: 'pool',
    tableName: 'rate_limits',
    tableCreated: true,
    // Expired rows are pruned by the retention job, not by a timer in every server.
    clearExpiredByTimeout: false,
    keyPrefix: name,
    points: perMinute,
    duration: WINDOW_S,
    insuranceLimiter: new RateLimiterMemory({ keyPrefix: name, points: perMinute, duration: WINDOW_S }),
  });
  const callerOf = key ?? ((req: Request) => ipKeyGenerator(req.ip ?? 'unknown'));
  return async (req, res, next) => {
    if (skip?.(req)) return next();
    try {
      setHeaders(res, name, perMinute, await limiter.consume(callerOf(req)));
      next();
    } catch (outcome) {
      if (!(outcome instanceof RateLimiterRes)) return next(outcome);
      setHeaders(res, name, perMinute, outcome);
      const { title, detail } = refuse(perMinute);
      next(new ProblemError(429, 'rate-limited', title, { detail, retryAfter: Math.max(1, Math.ceil(outcome.msBeforeNext / 1000)) }));
    }
  };
}
