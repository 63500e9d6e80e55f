import { createHash } from 'node:crypto';
import PgBoss from 'pg-boss';
import type pg from 'pg';

/**
 * The durable queue: pg-boss 10 in the application's own database (schema `pgboss`), on the
 * application's connection pool, so it rides out a database restart the same way the rest does.
 * App servers only send; `npm run worker` processes fetch and run.
 */

/** Run jobs and the sweep chunks they fan out into. */
export const WORK_QUEUE = 'laminote-work';
/** The scheduled clean-up (retention.ts). */
export const RETENTION_QUEUE = 'laminote-retention';

export type WorkMessage = { type: 'run'; jobId: string } | { type: 'cases'; jobId: string; cellId: string; from: number; to: number };

export interface QueueTiming {
  /**
   * A fetched job not completed within this many seconds is taken to be lost (its worker died) and is
   * handed out again. Every piece of work is far shorter (a run's light cells, or one chunk of cases).
   */
  expireSeconds: number;
  /** How often expired jobs are looked for (pg-boss maintenance). */
  maintenanceSeconds: number;
}

export const DEFAULT_QUEUE_TIMING: QueueTiming = { expireSeconds: 60, maintenanceSeconds: 10 };

/** Tries for a lost piece of work: enough to outlast several worker deaths and database restarts. */
const RETRY_LIMIT = 20;

export function createBoss(pool: pg.Pool, role: 'sender' | 'worker', timing: QueueTiming = DEFAULT_QUEUE_TIMING): PgBoss {
  const boss = new PgBoss({
    db: { executeSql: (text, values) => pool.query(text, values) },
    schema: 'pgboss',
    migrate: true,
    // Expiry, archiving and schedules are the workers' business; an app server only sends.
    supervise: role === 'worker',
    schedule: role === 'worker',
    maintenanceIntervalSeconds: timing.maintenanceSeconds,
    // Finished queue rows are kept for a day, then archived and dropped a week later (run_jobs keeps the record).
    archiveCompletedAfterSeconds: 24 * 3600,
    deleteAfterDays: 7,
  });
  return boss;
}

export async function ensureQueues(boss: PgBoss, timing: QueueTiming = DEFAULT_QUEUE_TIMING): Promise<void> {
  await boss.createQueue(WORK_QUEUE, { name: WORK_QUEUE, retryLimit: RETRY_LIMIT, retryDelay: 1, expireInSeconds: timing.expireSeconds });
  await boss.createQueue(RETENTION_QUEUE, { name: RETENTION_QUEUE, retryLimit: 3, retryDelay: 60, expireInSeconds: 15 * 60 });
}

/** A job id made from its parts, so sending the same piece of work twice queues it once. */
export function stableJobId(...parts: (string | number)[]): string {
  // A UUID-shaped digest (pg-boss ids are uuid).
  const hex = createHashHex(parts.join('\u0000'));
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-5${hex.slice(13, 16)}-8${hex.slice(17, 20)}-${hex.slice(20, 32)}`;
}

const createHashHex = (text: string) => createHash('sha256').update(text).digest('hex');
