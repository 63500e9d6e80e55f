import { and, eq, inArray, sql } from 'drizzle-orm';
import { drizzle } from 'drizzle-orm/node-postgres';
import type PgBoss from 'pg-boss';
import type pg from 'pg';
import type { Job } from '@laminote/contracts';
import { audit } from '../audit/audit';
import type { SessionUser } from '../auth/types';
import type { Db } from '../db/client';
import * as schema from '../db/schema';
import { drafts, runJobs } from '../db/schema';
import type { BranchContext } from '../access/branch';
import type { NotebookService, PlannedRun } from '../notebook/service';
import { WORK_QUEUE, type WorkMessage } from './queue';
import { jobView, notifyJob, type RunJobRow } from './store';
import { planWork, unitsOf, type JobWork } from './work';

/**
 * The app server's side of run jobs: planning a run, queueing it (the job's row and its queue entry in
 * one transaction, so neither exists without the other), and cancelling.
 */
export class JobService {
  constructor(
    private readonly db: Db,
    private readonly pool: pg.Pool,
    private readonly boss: PgBoss,
    private readonly notebook: NotebookService,
  ) {}

  /** What a planned run takes, in run order, each cell with whether its output is stored already. */
  work({ stored, plans, targets, known }: PlannedRun): JobWork[] {
    // The plans are in run order: every cell after the cells it uses.
    const order = [...plans.keys()].filter((id) => targets.has(id));
    return planWork(order, plans, new Set(known.keys()), stored.map((c) => c.cellId));
  }

  /**
   * Queues the run, or answers the job already running the very same work on this branch (a second
   * click, a second tab), so the same cells are not computed twice over.
   */
  async enqueue(ctx: BranchContext, actor: SessionUser, work: JobWork[]): Promise<Job> {
    const signature = JSON.stringify(work.map((w) => w.key));
    const active = await this.db
      .select()
      .from(runJobs)
      .where(and(eq(runJobs.branchId, ctx.branch.id), inArray(runJobs.state, ['queued', 'running'])));
    const same = active.find((row) => JSON.stringify((row.work as JobWork[]).map((w) => w.key)) === signature);
    if (same) return jobView(this.db, same);

    const client = await this.pool.connect();
    let row: RunJobRow;
    try {
      await client.query('begin');
      const tx = drizzle(client, { schema });
      [row] = (await tx
        .insert(runJobs)
        .values({ branchId: ctx.branch.id, studyId: ctx.study.id, projectId: ctx.projectId, createdBy: actor.id, total: work.reduce((n, w) => n + unitsOf(w), 0), work })
        .returning()) as [RunJobRow];
      const message: WorkMessage = { type: 'run', jobId: row.id };
      await this.boss.send(WORK_QUEUE, message, { id: row.id, db: { executeSql: (text, values) => client.query(text, values) } });
      await audit(tx, { actorId: actor.id, projectId: ctx.projectId, action: 'job.queue', targetType: 'branch', targetId: ctx.branch.id, detail: { jobId: row.id, studyId: ctx.study.id, cellIds: work.map((w) => w.cellId), total: row.total } });
      await client.query('commit');
    } catch (err) {
      await client.query('rollback').catch(() => undefined);
      throw err;
    } finally {
      client.release();
    }
    await notifyJob(this.db, { type: 'job', jobId: row.id, branchId: row.branchId });
    return jobView(this.db, row);
  }

  /** Cancels a queued or running job: workers stop taking its pieces; what has landed stays stored. */
  async cancel(row: RunJobRow, actor: SessionUser): Promise<RunJobRow | null> {
    const [updated] = await this.db.transaction(async (tx) => {
      const rows = await tx
        .update(runJobs)
        .set({ state: 'cancelled', finishedAt: sql`now()` })
        .where(and(eq(runJobs.id, row.id), inArray(runJobs.state, ['queued', 'running'])))
        .returning();
      if (rows.length) await audit(tx, { actorId: actor.id, projectId: row.projectId, action: 'job.cancel', targetType: 'branch', targetId: row.branchId, detail: { jobId: row.id, studyId: row.studyId } });
      return rows;
    });
    if (updated) await notifyJob(this.db, { type: 'job', jobId: row.id, branchId: row.branchId });
    return updated ?? null;
  }
}
