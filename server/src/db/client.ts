import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import * as schema from './schema';

export type Db = NodePgDatabase<typeof schema>;
/** A database handle or an open transaction: services accept either. */
export type Tx = Db | Parameters<Parameters<Db['transaction']>[0]>[0];

export interface Database {
  pool: pg.Pool;
  db: Db;
  close(): Promise<void>;
}

/**
 * A connection pool that rides out database restarts. A client can be cut off (database restart,
 * administrator command) while idle in the pool or while checked out between two queries of a
 * transaction; node-postgres then emits 'error' on it, which ends the process when nobody listens. The
 * pool drops a broken client and makes a new one on demand; a request that was using it fails with an
 * error that isDatabaseUnavailable recognises (answered 503).
 */
/** Connections of the app server's pool (main.ts); benchmarks use the same. */
export const SERVER_POOL_SIZE = 10;

export function connect(url: string, max = SERVER_POOL_SIZE, onConnectionError?: (err: Error) => void): Database {
  const pool = new pg.Pool({
    connectionString: url,
    max,
    // A request waits at most this long for a connection (a refused one fails at once), then answers 503.
    connectionTimeoutMillis: 20_000,
    keepAlive: true,
  });
  pool.on('error', (err) => onConnectionError?.(err));
  pool.on('connect', (client) => client.on('error', (err) => onConnectionError?.(err)));
  const db = drizzle(pool, { schema });
  return { pool, db, close: () => pool.end() };
}
