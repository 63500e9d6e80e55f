import { z } from 'zod';
import { JOB_STATES } from './limits';
import { cellRunReportSchema } from './notebook';

/**
 * Runs as durable jobs: POST /api/branches/:branchId/run answers 202 with a job when something has to
 * be computed; GET /api/jobs/:jobId tells how far it is; GET /api/branches/:branchId/events streams the
 * same as server-sent events while the study is open.
 */

export { JOB_STATES, jobIsActive, type JobState } from './limits';
export const jobStateSchema = z.enum(JOB_STATES);

/** How far one cell of a job is: one unit for most cells, one per case for a sweep. */
export const jobCellSchema = z.object({
  cellId: z.string().uuid(),
  kind: z.string(),
  done: z.number().int(),
  total: z.number().int(),
});
export type JobCell = z.infer<typeof jobCellSchema>;

export const jobSchema = z.object({
  jobId: z.string().uuid(),
  branchId: z.string().uuid(),
  studyId: z.string().uuid(),
  state: jobStateSchema,
  done: z.number().int(),
  total: z.number().int(),
  error: z.string().optional(),
  cells: z.array(jobCellSchema),
  createdAt: z.string(),
  finishedAt: z.string().nullable(),
  createdBy: z.object({ id: z.string().uuid(), name: z.string() }).nullable(),
  /** What happened to each cell, once the job is finished. */
  ran: z.array(cellRunReportSchema).optional(),
});
export type Job = z.infer<typeof jobSchema>;

/** POST /api/branches/:branchId/run when work was queued (202). */
export const runQueuedSchema = z.object({ jobId: z.string().uuid(), job: jobSchema });
export type RunQueued = z.infer<typeof runQueuedSchema>;

/**
 * Server-sent events of GET /api/branches/:branchId/events, each `data:` one JSON object:
 * `jobs` (event `snapshot`) on connecting and after the server lost and regained the database: every
 * job of the branch that is active or finished in the last minutes; `job` on progress or a change of
 * state; `output` when a cell's output has landed (the draft has it: read the draft again).
 */
export const jobEventSchema = z.discriminatedUnion('type', [
  z.object({ type: z.literal('snapshot'), jobs: z.array(jobSchema) }),
  z.object({ type: z.literal('job'), job: jobSchema }),
  z.object({ type: z.literal('output'), jobId: z.string().uuid(), cellId: z.string().uuid() }),
]);
export type JobEvent = z.infer<typeof jobEventSchema>;
