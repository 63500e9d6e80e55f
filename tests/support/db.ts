import { randomBytes } from 'node:crypto';
import pg from 'pg';
import { connect, type Database } from '../../server/src/db/client';
import { testEnv } from './env';

/**
 * A database of a test file's own: a copy of the migrated template, dropped afterwards.
 */
export interface TestDatabase extends Database {
  url: string;
  name: string;
  drop(): Promise<void>;
}

async function admin<T>(fn: (client: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: testEnv.pgAdminUrl });
  await client.connect();
  try {
    return await fn(client);
  } finally {
    await client.end();
  }
}

/** `poolSize`: connections of its pool (5 for a test; a benchmark takes the server's own). */
export async function createTestDatabase(poolSize = 5): Promise<TestDatabase> {
  const name = `t_${randomBytes(6).toString('hex')}`;
  await admin((c) => c.query(`create database ${name} template ${testEnv.templateDatabase}`));
  const url = new URL(testEnv.pgAdminUrl);
  url.pathname = `/${name}`;
  const database = connect(url.href, poolSize);
  return {
    ...database,
    url: url.href,
    name,
    async drop() {
      await database.close();
      await admin((c) => c.query(`drop database if exists ${name} with (force)`));
    },
  };
}
