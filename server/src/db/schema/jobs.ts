import { index, integer, jsonb, pgTable, primaryKey, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { users } from './identity';
import { projects } from './projects';
import { branches, studies } from './studies';

/**
 * Runs of a branch's cells as durable jobs. The queue itself is pg-boss's (schema `pgboss`); a row here
 * is what people see of a run: its state, what it has to compute (planned when it was asked for, so a
 * later edit of the draft does not change a run under way) and, once finished, one report per cell.
 * Progress is not counted here but read from the outputs and sweep cases that have landed, so a case
 * computed twice after a retry is still counted once.
 */
export const runJobs = pgTable(
  'run_jobs',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    branchId: uuid('branch_id')
      .notNull()
      .references(() => branches.id, { onDelete: 'cascade' }),
    studyId: uuid('study_id')
      .notNull()
      .references(() => studies.id, { onDelete: 'cascade' }),
    projectId: uuid('project_id')
      .notNull()
      .references(() => projects.id, { onDelete: 'cascade' }),
    createdBy: uuid('created_by').references(() => users.id),
    state: text('state').$type<'queued' | 'running' | 'completed' | 'failed' | 'cancelled'>().notNull().default('queued'),
    /** Units of work: one per cell, one per case of a sweep. */
    total: integer('total').notNull(),
    /** The planned work, in run order (JobWork[] in server/src/jobs/work.ts). */
    work: jsonb('work').notNull(),
    /** One report per cell once the job is finished (CellRunReport[]). */
    reports: jsonb('reports'),
    error: text('error'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    startedAt: timestamp('started_at', { withTimezone: true }),
    finishedAt: timestamp('finished_at', { withTimezone: true }),
  },
  (t) => [index('run_jobs_branch_idx').on(t.branchId, t.createdAt)],
);

/**
 * The cases of a sweep as they land, keyed by the sweep's output key and the case's index: a chunk
 * computed again after a worker died writes nothing twice. The sweep's output is put together from
 * these once every case is in.
 */
export const sweepCases = pgTable(
  'sweep_cases',
  {
    sweepKey: text('sweep_key').notNull(),
    index: integer('index').notNull(),
    /** One step of the sweep's result (SweepResult['steps'][number]). */
    step: jsonb('step').notNull(),
    computedAt: timestamp('computed_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.sweepKey, t.index] })],
);
