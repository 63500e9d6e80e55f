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

export function connect(url: string, max = 10, onIdleError?: (err: Error) => void): Database {
  const pool = new pg.Pool({ connectionString: url, max });
  // An idle client can be cut off (database restart, administrator command); the pool drops it and
  // makes a new one on demand. Without a listener that would crash the process.
  pool.on('error', (err) => onIdleError?.(err));
  const db = drizzle(pool, { schema });
  return { pool, db, close: () => pool.end() };
}
