import { loadConfigOrExit } from '../config';
import { connect } from '../db/client';
import { createLogger } from '../logger';
import { startJobWorker } from './start';

/**
 * `npm run worker`: a job worker process. It needs only DATABASE_URL (the database the app servers
 * use); run as many as you like, on as many machines as reach it. Each takes pieces of work from the
 * queue and computes them on its threads (ENGINE_THREADS, default one per core). SIGINT/SIGTERM stop
 * it after the pieces under way; a worker killed outright loses nothing (its pieces are handed out
 * again once JOB_EXPIRE_SECONDS have passed).
 */
async function main(): Promise<void> {
  const config = loadConfigOrExit();
  const logger = createLogger(config.LOG_LEVEL, 'laminote-worker');
  const database = connect(config.DATABASE_URL, 10, (err) => logger.warn({ err: err.message }, 'a database connection was closed; the pool makes a new one when needed'));
  const worker = await startJobWorker(config, database, logger);
  logger.info({ threads: worker.compute.threads, pid: process.pid }, 'job worker is running');
  let stopping = false;
  const stop = (signal: string) => {
    if (stopping) return;
    stopping = true;
    logger.info({ signal }, 'job worker stopping');
    setTimeout(() => process.exit(1), 15_000).unref();
    void worker
      .stop()
      .then(() => database.close())
      .finally(() => process.exit(0));
  };
  process.on('SIGINT', () => stop('SIGINT'));
  process.on('SIGTERM', () => stop('SIGTERM'));
}

main().catch((err: unknown) => {
  process.stderr.write(`Laminote worker failed to start: ${err instanceof Error ? err.message : String(err)}\n`);
  process.exit(1);
});
