import type { Express } from 'express';
import type { DestinationStream } from 'pino';
import { createApp } from '../../server/src/app';
import { createEnginePool, type EnginePool } from '../../server/src/engine/pool';
import { createOidcClient } from '../../server/src/auth/oidc';
import { loadConfig, type Config } from '../../server/src/config';
import { createLogger } from '../../server/src/logger';
import { startJobSender, startJobWorker, type JobWorker } from '../../server/src/jobs/start';
import { seedDemo } from '../../server/src/seed/demo';
import { demoNacelleFillers, demoStudyFillers } from '../../server/src/seed/fillers';
import { createTestDatabase, type TestDatabase } from './db';
import { testEnv } from './env';

export interface TestApp {
  app: Express;
  config: Config;
  database: TestDatabase;
  demo: Awaited<ReturnType<typeof seedDemo>>;
  engine: EnginePool;
  /** The job worker running in this process (null when started without one). */
  worker: JobWorker | null;
  /** Another app server on the same database (as a second machine behind a balancer would run it). */
  anotherServer(): Express;
  close(): Promise<void>;
}

/** The real app on a database of its own with the demo scenario seeded, mounted without a port. */
export async function createTestApp(
  overrides: Record<string, string> = {},
  options: {
    worker?: boolean;
    /** Connections of the app's database pool (a test's 5 when absent). */
    poolSize?: number;
    /** Where the app's log lines go (at the config's LOG_LEVEL): standard output when absent. */
    logDestination?: DestinationStream;
  } = {},
): Promise<TestApp> {
  const database = await createTestDatabase(options.poolSize);
  const config = loadConfig({
    ...process.env,
    NODE_ENV: 'test',
    DATABASE_URL: database.url,
    PUBLIC_URL: testEnv.publicUrl,
    OIDC_ISSUER: testEnv.oidcIssuer,
    LOG_LEVEL: process.env['TEST_LOG_LEVEL'] ?? 'silent',
    WEB_DIST: '/nonexistent',
    ...overrides,
  });
  const demo = await seedDemo(database.db, demoStudyFillers, demoNacelleFillers);
  const engine = createEnginePool({ threads: 2 });
  const logger = createLogger(config.LOG_LEVEL, undefined, options.logDestination);
  const jobs = await startJobSender(config, database, logger);
  // Runs are jobs: a worker takes them, here in the test's own process (fault tests start real ones).
  const worker = options.worker === false ? null : await startJobWorker(config, database, logger, { threads: 2 });
  const app = createApp({ config, database, logger, oidc: createOidcClient(config), engine, jobs });
  return {
    app,
    config,
    database,
    demo,
    engine,
    worker,
    anotherServer: () => createApp({ config, database, logger, oidc: createOidcClient(config), engine, jobs }),
    close: async () => {
      await worker?.stop();
      await jobs.stop();
      await engine.close();
      await database.drop();
    },
  };
}
