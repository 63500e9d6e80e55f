/**
 * Whether an error means the database is away for now (restarting, shutting down, unreachable) rather
 * than that the request or the code is wrong. Such a request is answered 503 with Retry-After: the
 * server rides out a database restart and serves again by itself once it is back.
 */

/**
 * SQLSTATE classes and codes of a database going away (PostgreSQL manual, Appendix A "PostgreSQL Error
 * Codes"): class 08 connection exception; 57P01 admin_shutdown, 57P02 crash_shutdown, 57P03
 * cannot_connect_now (starting up or shutting down); 53300 too_many_connections.
 */
const UNAVAILABLE_CODES = new Set(['57P01', '57P02', '57P03', '53300']);
const UNAVAILABLE_SYSCALL_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'EPIPE', 'ETIMEDOUT', 'EHOSTUNREACH', 'ENOTCONN', 'ECONNABORTED']);
/** Messages of node-postgres and its pool for a connection that ended or could not be made. */
const UNAVAILABLE_MESSAGES = [
  /^Connection terminated/,
  /not queryable/,
  /^timeout exceeded when trying to connect/,
  /^Client has encountered a connection error/,
];

/** How long a client should wait before trying again, in seconds (the Retry-After header). */
export const DATABASE_RETRY_AFTER_S = 5;

export function isDatabaseUnavailable(err: unknown): boolean {
  const seen = new Set<unknown>();
  let e: unknown = err;
  // Drizzle wraps the driver's error in DrizzleQueryError (cause); look down the chain.
  while (e && typeof e === 'object' && !seen.has(e)) {
    seen.add(e);
    const { code, message } = e as { code?: unknown; message?: unknown };
    if (typeof code === 'string' && (UNAVAILABLE_CODES.has(code) || code.startsWith('08') || UNAVAILABLE_SYSCALL_CODES.has(code))) return true;
    if (typeof message === 'string' && UNAVAILABLE_MESSAGES.some((re) => re.test(message))) return true;
    if (e instanceof AggregateError && e.errors.some((inner) => isDatabaseUnavailable(inner))) return true;
    e = (e as { cause?: unknown }).cause;
  }
  return false;
}
