import type { Request, RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { ProblemError } from './problem';

/**
 * A request budget per caller (express-rate-limit, in memory per server process): beyond it, 429
 * problem+json with Retry-After. `key` says who the caller is (by default the client address, with
 * IPv6 addresses grouped by their /56 as express-rate-limit advises).
 */
export interface LimitOptions {
  perMinute: number;
  /** What the caller tried too often, for the message: "sign-in attempts". */
  what: string;
  key?: (req: Request) => string;
  skip?: (req: Request) => boolean;
}

export function limitRequests({ perMinute, what, key, skip }: LimitOptions): RequestHandler {
  return rateLimit({
    windowMs: 60_000,
    limit: perMinute,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    ...(skip ? { skip } : {}),
    keyGenerator: key ?? ((req) => ipKeyGenerator(req.ip ?? 'unknown')),
    handler: (_req, _res, next, options) =>
      next(
        new ProblemError(429, 'rate-limited', 'Too many requests', {
          detail: `At most ${options.limit} ${what} a minute from one place; wait a minute and try again.`,
          retryAfter: Math.ceil(options.windowMs / 1000),
        }),
      ),
  });
}
