import type { Request, RequestHandler, Response } from 'express';
import helmet, { type HelmetOptions } from 'helmet';

/**
 * helmet's security headers, worked out once. With options that are plain values (no directive
 * computed per request, such as a CSP nonce) helmet sets the same headers on every answer, so its
 * dozen middlewares are run once at start against a recording response, and each request gets what
 * they set in one step (issue 15: they were a visible share of every API request's cost).
 */
export function securityHeaders(options: HelmetOptions): RequestHandler {
  assertStatic(options, 'options');
  const headers = new Map<string, string>();
  const removed = new Set<string>();
  const recorder = {
    setHeader(name: string, value: unknown) {
      headers.set(name, String(value));
      removed.delete(name);
    },
    removeHeader(name: string) {
      headers.delete(name);
      removed.add(name);
    },
  };
  let done = false;
  helmet(options)({} as Request, recorder as unknown as Response, (err?: unknown) => {
    if (err) throw err;
    done = true;
  });
  if (!done) throw new Error('helmet did not finish at once; its headers cannot be worked out ahead');
  const set = [...headers];
  const remove = [...removed];
  return (_req, res, next) => {
    for (const [name, value] of set) res.setHeader(name, value);
    for (const name of remove) res.removeHeader(name);
    next();
  };
}

/** Refuses an option that is a function: it would be asked per request, so its header is not fixed. */
function assertStatic(value: unknown, at: string): void {
  if (typeof value === 'function') throw new Error(`securityHeaders: ${at} is a function, so its header changes per request; use helmet() itself`);
  if (value && typeof value === 'object') for (const [key, inner] of Object.entries(value)) assertStatic(inner, `${at}.${key}`);
}
