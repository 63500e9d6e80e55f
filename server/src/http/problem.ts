import type { ErrorRequestHandler, RequestHandler } from 'express';
import { z } from 'zod';
import type { Problem } from '@laminote/contracts';
import type { Logger } from '../logger';
import { DATABASE_RETRY_AFTER_S, isDatabaseUnavailable } from '../db/availability';

/**
 * Errors answer `application/problem+json` (RFC 9457) with a stable `type`, a human `title` and, for bad
 * input, the field or line at fault.
 */
export class ProblemError extends Error {
  constructor(
    readonly status: number,
    readonly slug: string,
    readonly title: string,
    readonly extra: Partial<Pick<Problem, 'detail' | 'field' | 'errors'>> & Record<string, unknown> = {},
  ) {
    super(extra.detail ?? title);
  }

  toProblem(): Problem & Record<string, unknown> {
    return { type: `/problems/${this.slug}`, title: this.title, status: this.status, ...this.extra };
  }
}

export const badRequest = (detail: string, field?: string, errors?: Problem['errors']) =>
  new ProblemError(400, 'invalid-input', 'The request has invalid input', { detail, ...(field ? { field } : {}), ...(errors ? { errors } : {}) });
export const unauthorized = () =>
  new ProblemError(401, 'unauthenticated', 'Sign-in required', { detail: 'Sign in to use Laminote.' });
export const forbidden = (detail: string) => new ProblemError(403, 'forbidden', 'Your role does not allow this', { detail });
export const notFound = (what: string) =>
  new ProblemError(404, 'not-found', 'Not found', { detail: `No ${what} here, or it is not shared with you.` });
/** The database is away for a moment (restarting); the client tries again after Retry-After seconds. */
export const databaseUnavailable = () =>
  new ProblemError(503, 'database-unavailable', 'The database is not reachable right now', {
    detail: `Nothing was changed. Laminote reconnects by itself; try again in ${DATABASE_RETRY_AFTER_S} seconds.`,
    retryAfter: DATABASE_RETRY_AFTER_S,
  });

export const conflict = (detail: string, extra: Record<string, unknown> = {}) =>
  new ProblemError(409, 'conflict', 'Someone else changed this first', { detail, ...extra });

/** A zod path as people write it: `cells[2].inputs.reynolds`. */
export function formatPath(path: readonly PropertyKey[]): string {
  return path.reduce<string>((out, key) => (typeof key === 'number' ? `${out}[${key}]` : out ? `${out}.${String(key)}` : String(key)), '');
}

export function fromZodError(error: z.ZodError): ProblemError {
  const errors = error.issues.map((i) => ({ field: formatPath(i.path) || 'body', message: i.message }));
  const first = errors[0] ?? { field: 'body', message: 'invalid input' };
  const detail = errors.length === 1 ? `${first.field}: ${first.message}` : `${errors.length} problems; first: ${first.field}: ${first.message}`;
  return badRequest(detail, first.field, errors);
}

/** Validate at the edge; a handler receives typed, validated data. */
export function parse<S extends z.ZodType>(schema: S, data: unknown): z.infer<S> {
  const result = schema.safeParse(data);
  if (!result.success) throw fromZodError(result.error);
  return result.data;
}

export function sendProblem(res: Parameters<RequestHandler>[1], problem: ProblemError): void {
  const retryAfter = problem.extra['retryAfter'];
  if (typeof retryAfter === 'number') res.setHeader('retry-after', String(retryAfter));
  res.status(problem.status).type('application/problem+json').send(JSON.stringify(problem.toProblem()));
}

export const notFoundHandler: RequestHandler = (req, _res, next) => {
  next(new ProblemError(404, 'not-found', 'Not found', { detail: `No route for ${req.method} ${req.path}.` }));
};

export function errorHandler(logger: Logger): ErrorRequestHandler {
  return (err: unknown, req, res, _next) => {
    if (res.headersSent) return;
    if (err instanceof ProblemError) return sendProblem(res, err);
    if (err instanceof z.ZodError) return sendProblem(res, fromZodError(err));
    const e = err as { type?: string; status?: number; message?: string };
    // body-parser and multer signal bad bodies with a status of their own.
    if (e?.type === 'entity.parse.failed') return sendProblem(res, badRequest('The request body is not valid JSON.', 'body'));
    if (e?.type === 'entity.too.large') return sendProblem(res, new ProblemError(413, 'too-large', 'The request is too large', { detail: e.message ?? '' }));
    if (err instanceof URIError || (e?.status === 400 && /^Failed to decode param/.test(e.message ?? ''))) {
      return sendProblem(res, badRequest('The address has broken percent-encoding (a % not followed by two hexadecimal digits of valid UTF-8).', 'address'));
    }
    // Other client errors raised by Express's own parts (body-parser: unsupported charset or encoding,
    // an aborted upload) keep their 4xx status.
    if (typeof e?.status === 'number' && e.status >= 400 && e.status < 500) {
      return sendProblem(res, new ProblemError(e.status, 'bad-request', 'The request cannot be read', { detail: e.message ?? '' }));
    }
    if (isDatabaseUnavailable(err)) {
      (req.log ?? logger).warn({ err: e?.message }, 'database unavailable; answered 503');
      return sendProblem(res, databaseUnavailable());
    }
    (req.log ?? logger).error({ err }, 'unhandled error');
    sendProblem(res, new ProblemError(500, 'internal', 'Something went wrong on the server', { detail: 'The error was logged.' }));
  };
}
