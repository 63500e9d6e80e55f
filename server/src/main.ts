import type { Server } from 'node:http';
import { createApp } from './app';
import { loadConfigOrExit } from './config';
import { connect, SERVER_POOL_SIZE } from './db/client';
import { applyMigrations } from './db/migrate';
import { createLogger } from './logger';
import { createOidcClient } from './auth/oidc';
import { createEnginePool } from './engine/pool';
import { startJobSender } from './jobs/start';
import { startMailOutbox } from './mail/start';

/** Starts the server: configuration, migrations, listen, and a clean shutdown on SIGINT/SIGTERM. */
async function main(): Promise<void> {
  const config = loadConfigOrExit();
  const logger = createLogger(config.LOG_LEVEL);
  const database = connect(config.DATABASE_URL, SERVER_POOL_SIZE, (err) => logger.warn({ err: err.message }, 'a database connection was closed; the pool makes a new one when needed'));
  await applyMigrations(database.db);
  const engine = createEnginePool({ threads: config.ENGINE_THREADS });
  const jobs = await startJobSender(config, database, logger);
  const app = createApp({ config, database, logger, oidc: createOidcClient(config), engine, jobs });
  const outbox = startMailOutbox(database.db, config, logger);
  const server: Server = app.listen(config.PORT, config.HOST, () => {
    logger.info({ url: config.PUBLIC_URL, host: config.HOST, port: config.PORT }, 'Laminote is listening');
  });
  let stopping = false;
  const stop = (signal: string) => {
    if (stopping) return;
    stopping = true;
    logger.info({ signal }, 'shutting down');
    server.close(() => {
      void Promise.allSettled([outbox.stop(), engine.close(), jobs.stop()])
        .then(() => database.close())
        .finally(() => process.exit(0));
    });
    server.closeAllConnections?.();
    setTimeout(() => process.exit(1), 10_000).unref();
  };
  process.on('SIGINT', () => stop('SIGINT'));
  process.on('SIGTERM', () => stop('SIGTERM'));
}

main().catch((err: unknown) => {
  process.stderr.write(`Laminote server failed to start: ${err instanceof Error ? err.message : String(err)}\n`);
  process.exit(1);
});
