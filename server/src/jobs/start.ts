import { setTimeout as sleep } from 'node:timers/promises';
import type PgBoss from 'pg-boss';
import type { Config } from '../config';
import type { Database } from '../db/client';
import { isDatabaseUnavailable } from '../db/availability';
import type { Logger } from '../logger';
import { createComputePool, type ComputePool } from './compute-pool';
import { JobEvents } from './events';
import { createBoss, ensureQueues, RETENTION_QUEUE, type QueueTiming } from './queue';
import { JobRunner } from './runner';

const timingOf = (config: Config): QueueTiming => ({ expireSeconds: config.JOB_EXPIRE_SECONDS, maintenanceSeconds: config.JOB_MAINTENANCE_SECONDS });

/** Starts pg-boss, waiting for the database should it be away (a worker may start before it). */
async function startBoss(boss: PgBoss, timing: QueueTiming, logger: Logger): Promise<void> {
  // pg-boss reports errors of its background work (maintenance, schedules) here; a database restart
  // is one of them and passes by itself.
  boss.on('error', (err) => (isDatabaseUnavailable(err) ? logger.warn({ err: err.message }, 'job queue: the database is away') : logger.error({ err }, 'job queue error')));
  for (let attempt = 0; ; attempt++) {
    try {
      await boss.start();
      await ensureQueues(boss, timing);
      return;
    } catch (err) {
      if (!isDatabaseUnavailable(err) || attempt >= 120) throw err;
      if (attempt === 0) logger.warn({ err: (err as Error).message }, 'job queue: waiting for the database');
      await sleep(1000);
    }
  }
}

export interface JobSender {
  boss: PgBoss;
  events: JobEvents;
  stop(): Promise<void>;
}

/** An app server's part: it queues runs and tells browsers how they go. */
export async function startJobSender(config: Config, database: Database, logger: Logger): Promise<JobSender> {
  const boss = createBoss(database.pool, 'sender', timingOf(config));
  await startBoss(boss, timingOf(config), logger);
  const events = new JobEvents(config.DATABASE_URL, logger);
  events.start();
  return {
    boss,
    events,
    async stop() {
      await events.close();
      await boss.stop({ graceful: false, close: false, wait: false }).catch(() => undefined);
    },
  };
}

export interface JobWorker {
  runner: JobRunner;
  compute: ComputePool;
  stop(): Promise<void>;
}

/** A worker's part: compute threads, the runner fetching work (woken by the job channel), and the scheduled clean-up. */
export async function startJobWorker(config: Config, database: Database, logger: Logger, options: { threads?: number } = {}): Promise<JobWorker> {
  const timing = timingOf(config);
  const boss = createBoss(database.pool, 'worker', timing);
  await startBoss(boss, timing, logger);
  await boss.schedule(RETENTION_QUEUE, config.RETENTION_CRON, {}, {});
  const compute = createComputePool(options.threads ?? config.ENGINE_THREADS);
  const runner = new JobRunner(database, boss, compute, logger, {
    retention: { outputAgeDays: config.RETENTION_OUTPUT_DAYS, mailAgeDays: config.RETENTION_MAIL_DAYS },
  });
  // Runs asked for and chunks fanned out are notified on the job channel: idle slots take them at once.
  const events = new JobEvents(config.DATABASE_URL, logger);
  events.onNotice((notice) => {
    if (notice.type === 'job') runner.wake();
  });
  events.start();
  runner.start();
  return {
    runner,
    compute,
    async stop() {
      await events.close();
      await runner.stop();
      await boss.stop({ graceful: false, close: false, wait: false }).catch(() => undefined);
      await compute.close();
    },
  };
}
