import { and, desc, eq, gt, inArray, or, sql } from 'drizzle-orm';
import type { CellRunReport, Job, JobCell, JobState } from '@laminote/contracts';
import type { Tx } from '../db/client';
import { outputs, runJobs, sweepCases, users } from '../db/schema';
import { unitsOf, type JobWork } from './work';

/**
 * Reading jobs as people see them. Progress is counted from what has landed (outputs by key, sweep
 * cases by their sweep's key), never kept as a counter, so a retried piece of work is counted once
 * and a page that connects late sees the true state.
 */

export type RunJobRow = typeof runJobs.$inferSelect;

/** The channel workers notify (pg_notify) when a job moves; app servers LISTEN and tell browsers. */
export const JOB_CHANNEL = 'laminote_jobs';

export type JobNotice = { type: 'job'; jobId: string; branchId: string } | { type: 'output'; jobId: string; branchId: string; cellId: string };

export async function notifyJob(tx: Tx, notice: JobNotice): Promise<void> {
  await notifyJobs(tx, [notice]);
}

/** Several notices in one statement (delivered in this order). */
export async function notifyJobs(tx: Tx, notices: readonly JobNotice[]): Promise<void> {
  if (notices.length === 0) return;
  await tx.execute(sql`select pg_notify(${JOB_CHANNEL}, n) from json_array_elements_text(${JSON.stringify(notices.map((n) => JSON.stringify(n)))}::json) as n`);
}

export async function loadJob(tx: Tx, jobId: string): Promise<RunJobRow | null> {
  const [row] = await tx.select().from(runJobs).where(eq(runJobs.id, jobId));
  return row ?? null;
}

/** Per cell of the job: how many of its units have landed. */
export async function jobProgress(tx: Tx, work: readonly JobWork[]): Promise<JobCell[]> {
  const keys = work.flatMap((w) => (w.key ? [w.key] : []));
  const present = new Set(
    keys.length ? (await tx.select({ key: outputs.key }).from(outputs).where(inArray(outputs.key, keys))).map((r) => r.key) : [],
  );
  const sweepKeys = work.filter((w) => w.cases > 0 && w.key && !present.has(w.key)).map((w) => w.key!);
  const counts = new Map<string, number>();
  if (sweepKeys.length) {
    const rows = await tx
      .select({ key: sweepCases.sweepKey, n: sql<number>`count(*)::int` })
      .from(sweepCases)
      .where(inArray(sweepCases.sweepKey, sweepKeys))
      .groupBy(sweepCases.sweepKey);
    for (const r of rows) counts.set(r.key, r.n);
  }
  return work.map((w) => {
    const total = unitsOf(w);
    // A cell that cannot run has nothing left to do.
    const done = w.key === null || present.has(w.key) ? total : Math.min(total, counts.get(w.key) ?? 0);
    return { cellId: w.cellId, kind: w.kind, done, total };
  });
}

/** The job as the API answers it. */
export async function jobView(tx: Tx, row: RunJobRow): Promise<Job> {
  const work = row.work as JobWork[];
  const cells = await jobProgress(tx, work);
  const [creator] = row.createdBy ? await tx.select({ id: users.id, name: users.name }).from(users).where(eq(users.id, row.createdBy)) : [];
  return {
    jobId: row.id,
    branchId: row.branchId,
    studyId: row.studyId,
    state: row.state as JobState,
    done: cells.reduce((n, c) => n + c.done, 0),
    total: row.total,
    ...(row.error ? { error: row.error } : {}),
    cells,
    createdAt: row.createdAt.toISOString(),
    finishedAt: row.finishedAt?.toISOString() ?? null,
    createdBy: creator ?? null,
    ...(row.reports ? { ran: row.reports as CellRunReport[] } : {}),
  };
}

/** A branch's jobs worth showing: every active one, and those finished in the last ten minutes. */
export async function branchJobs(tx: Tx, branchId: string): Promise<RunJobRow[]> {
  return tx
    .select()
    .from(runJobs)
    .where(
      and(
        eq(runJobs.branchId, branchId),
        or(inArray(runJobs.state, ['queued', 'running']), gt(runJobs.finishedAt, sql`now() - interval '10 minutes'`)),
      ),
    )
    .orderBy(desc(runJobs.createdAt))
    .limit(20);
}
