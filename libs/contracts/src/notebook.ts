import { z } from 'zod';
import { cellErrorSchema, cellKindSchema } from './cell-schemas';
import { branchSchema, studySchema } from './api';
import { safeText } from './text';

/**
 * The study notebook: the branch draft, runs and outputs. What each kind of cell holds and computes
 * is in the cell-kind registry (cell-kinds.ts, cell-schemas.ts).
 */

/** A cell as the client sends it in a draft save. Inputs are validated by kind when the cell runs. */
export const draftCellInputSchema = z.object({
  cellId: z.string().uuid('cellId must be a UUID'),
  kind: cellKindSchema,
  title: safeText('title').max(200, 'title must be at most 200 characters').default(''),
  collapsed: z.boolean().default(false),
  inputs: z.record(z.string(), z.unknown()),
});
export type DraftCellInput = z.input<typeof draftCellInputSchema>;

/** PUT /api/branches/:branchId/draft — autosave; `baseRevision` is the revision the client last saw. */
export const saveDraftSchema = z.object({
  baseRevision: z.number().int().min(0),
  cells: z.array(draftCellInputSchema).max(200, 'a study holds at most 200 cells'),
});
export type SaveDraft = z.input<typeof saveDraftSchema>;

/**
 * The run state of a cell in a draft:
 * - `idle`: never run; - `current`: its last output matches its inputs and upstream;
 * - `outdated`: its inputs or something upstream changed since; - `failed`: the last run failed.
 */
export const RUN_STATES = ['idle', 'current', 'outdated', 'failed'] as const;
export type RunState = (typeof RUN_STATES)[number];

/** One problem with a cell: the input field at fault (`reynolds`, `trips.upper`, `text`) and, for a table, its line. */
export const cellProblemSchema = z.object({ field: z.string(), message: z.string(), line: z.number().int().optional() });
export type CellProblem = z.infer<typeof cellProblemSchema>;

/**
 * A computed output, content-addressed: `key` is the SHA-256 of the kind, the canonical inputs, the
 * keys of the outputs it depends on and the engine version. `result` has the kind's result shape
 * (`CellResults` below) when `status` is ok, its numbers kept to 7 significant digits.
 */
export const cellOutputSchema = z.object({
  key: z.string(),
  status: z.enum(['ok', 'error']),
  result: z.unknown().nullable(),
  error: cellErrorSchema.nullable(),
  engineVersion: z.string(),
  durationMs: z.number(),
  computedAt: z.string(),
});
export type CellOutput = z.infer<typeof cellOutputSchema>;

export const draftCellSchema = draftCellInputSchema.extend({
  runState: z.enum(RUN_STATES),
  /** Validation problems of the inputs as they stand (shown inline; the cell can still be saved). */
  problems: z.array(cellProblemSchema),
  /** The last output, even when outdated or after a failed run (the last good one stays visible). */
  output: cellOutputSchema.nullable(),
  /** The last good output when the newest run failed. */
  lastGoodOutput: cellOutputSchema.nullable(),
});
export type DraftCell = z.infer<typeof draftCellSchema>;

/** How many deleted cells a draft keeps to bring back ("Recently removed"), newest first. */
export const TRASH_LIMIT = 30;

export const draftSchema = z.object({
  branchId: z.string().uuid(),
  studyId: z.string().uuid(),
  revision: z.number().int(),
  cells: z.array(draftCellSchema),
  /** Recently deleted cells, newest first (the last TRASH_LIMIT); saving one back into `cells` restores it with its outputs. */
  trash: z.array(draftCellInputSchema.extend({ deletedAt: z.string(), deletedBy: z.string().nullable(), deletedByName: z.string().nullable().optional() })),
  basedOnVersionId: z.string().uuid().nullable(),
  updatedAt: z.string(),
  updatedBy: z.object({ id: z.string(), name: z.string() }).nullable(),
});
export type Draft = z.infer<typeof draftSchema>;

/** GET /api/studies/:studyId/opening?branch= */
export const studyOpeningQuerySchema = z.object({
  branch: safeText('branch').max(200, 'branch must be at most 200 characters').optional(),
});
export type StudyOpeningQuery = z.infer<typeof studyOpeningQuerySchema>;

/**
 * What the notebook shows first, in one read: the study, its branches, and the draft of the branch it
 * opens on (`pickBranch`: the one named, else main); the draft is null when the name matches no branch.
 */
export const studyOpeningSchema = z.object({ study: studySchema, branches: z.array(branchSchema), draft: draftSchema.nullable() });
export type StudyOpening = z.infer<typeof studyOpeningSchema>;

/** POST /api/branches/:branchId/run { cellIds?: string[] } — omitted means the whole study, in dependency order. */
export const runRequestSchema = z.object({ cellIds: z.array(z.string().uuid('cellIds must hold cell ids')).max(200, 'at most 200 cells per run').optional() });
export type RunRequest = z.infer<typeof runRequestSchema>;

/** What happened to one cell in a run. */
export const cellRunReportSchema = z.object({
  cellId: z.string().uuid(),
  kind: cellKindSchema,
  /** ok / error: an output was stored (or found); invalid: its inputs have problems, nothing ran; internal: the server failed, nothing stored. */
  status: z.enum(['ok', 'error', 'invalid', 'internal']),
  /** True when an output with this key already existed, so nothing was computed. */
  reused: z.boolean(),
  key: z.string().nullable(),
  durationMs: z.number(),
  error: cellErrorSchema.nullable(),
});
export type CellRunReport = z.infer<typeof cellRunReportSchema>;

/**
 * The answer to a run computed at once (200): what ran, and the cells whose recorded outputs the run
 * changed, as the draft now holds them (in draft order); every other cell is as it was. A run is not
 * an edit: `revision` is the draft's, unchanged by the run. When it is newer than the revision the
 * client holds, someone saved meanwhile and the client reads the draft.
 */
export const runResponseSchema = draftSchema.pick({ branchId: true, studyId: true, revision: true, cells: true }).extend({ ran: z.array(cellRunReportSchema) });
export type RunResponse = z.infer<typeof runResponseSchema>;

/** POST /api/studies/:studyId/uploads (multipart, field `file`) → the file as stored. */
export const uploadResponseSchema = z.object({
  uploadId: z.string().uuid(),
  filename: z.string(),
  size: z.number().int(),
  /** SHA-256 of the bytes as received, hex. */
  sha256: z.string(),
  contentType: z.string(),
  /** How the bytes were read into `text`: UTF-8 when they are valid UTF-8, else Latin-1. */
  encoding: z.enum(['utf-8', 'latin1']),
  text: z.string(),
});
export type UploadResponse = z.infer<typeof uploadResponseSchema>;

