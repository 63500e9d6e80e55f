import { z } from 'zod';
import { branchSchema, problemSchema } from './api';
import type { CellKind } from './cell-kinds';
import { cellKindSchema } from './cell-schemas';
import { cellOutputSchema } from './notebook';
import { safeText } from './text';

/**
 * Versions, branches and comparison (DESIGN.md "Notebook model"): a branch has a working draft and a
 * chain of immutable versions; a version is an ordered list of cell revisions; a cell keeps its id
 * across versions and branches, so two versions are compared cell by cell.
 */

const id = z.string().uuid();
const isoDate = z.string();
const person = z.object({ id, name: z.string() }).nullable();

const text = (field: string, max: number) =>
  safeText(field)
    .trim()
    .min(1, `${field} must not be empty`)
    .max(max, `${field} must be at most ${max} characters`);

/** POST /api/branches/:branchId/versions (engineers, leads) */
export const saveVersionSchema = z.object({
  message: text('message', 2000),
  /** The branch head the client last saw; null when it saw no version on the branch yet. */
  expectedHeadVersionId: id.nullable(),
  /** The draft revision the client last saw; when given, a newer draft on the server answers 409. */
  draftRevision: z.number().int().min(0).optional(),
});
export type SaveVersion = z.input<typeof saveVersionSchema>;

/**
 * A version's review state, filled in by the review part of the product; null while no review was
 * requested (and until review lands).
 */
export const versionReviewSchema = z.object({
  state: z.enum(['requested', 'approved', 'changesRequested']),
  updatedAt: isoDate,
});
export type VersionReview = z.infer<typeof versionReviewSchema>;

/** One entry of a branch's history. */
export const versionSummarySchema = z.object({
  id,
  studyId: id,
  branchId: id,
  branchName: z.string(),
  /** 1, 2, 3 … along its branch. */
  number: z.number().int(),
  message: z.string(),
  author: person,
  createdAt: isoDate,
  /** The previous version on the branch, or the version the branch was made from. */
  parentVersionId: id.nullable(),
  cellCount: z.number().int(),
  isBaseline: z.boolean(),
  review: versionReviewSchema.nullable(),
});
export type VersionSummary = z.infer<typeof versionSummarySchema>;

/** A cell as a version holds it: read-only, with the output it had when the version was saved. */
export const versionCellSchema = z.object({
  cellId: id,
  position: z.number().int(),
  kind: cellKindSchema,
  title: z.string(),
  collapsed: z.boolean(),
  inputs: z.record(z.string(), z.unknown()),
  revisionId: id,
  contentHash: z.string(),
  /** The output the cell had when the version was saved (null: not run, or outdated and not kept). */
  outputKey: z.string().nullable(),
  output: cellOutputSchema.nullable(),
});
export type VersionCell = z.infer<typeof versionCellSchema>;

/** GET /api/versions/:versionId */
export const versionDetailSchema = versionSummarySchema.extend({ cells: z.array(versionCellSchema) });
export type VersionDetail = z.infer<typeof versionDetailSchema>;

/** A branch with what its history looks like: head number, count, and where it came from. */
export const branchOverviewSchema = branchSchema.extend({
  headNumber: z.number().int().nullable(),
  versionCount: z.number().int(),
  draftRevision: z.number().int(),
  /** The version the draft was started from or last saved as. */
  draftBasedOnVersionId: id.nullable(),
  forkedFrom: z.object({ versionId: id, branchId: id, branchName: z.string(), number: z.number().int() }).nullable(),
});
export type BranchOverview = z.infer<typeof branchOverviewSchema>;

/** GET /api/studies/:studyId/versions — the study's branches and every version, newest first. */
export const studyHistorySchema = z.object({
  studyId: id,
  baselineVersionId: id.nullable(),
  /** What the caller may do here (the project's settings included), so the web app offers only that. */
  permissions: z.object({ saveVersion: z.boolean(), branch: z.boolean(), markBaseline: z.boolean(), editStudy: z.boolean() }),
  branches: z.array(branchOverviewSchema),
  versions: z.array(versionSummarySchema),
});
export type StudyHistory = z.infer<typeof studyHistorySchema>;

/** POST /api/branches/:branchId/draft/restore — puts a version's cells into the draft (a draft change). */
export const restoreDraftSchema = z.object({
  versionId: id,
  /** The draft revision the client last saw (optimistic concurrency, as for a draft save). */
  baseRevision: z.number().int().min(0),
});
export type RestoreDraft = z.input<typeof restoreDraftSchema>;

/** What a restore answers: the draft's new revision; cells the version lacks went to the draft's trash. */
export const restoreResultSchema = z.object({
  branchId: id,
  revision: z.number().int(),
  restoredFromVersionId: id,
  cellCount: z.number().int(),
  movedToTrash: z.array(z.object({ cellId: id, title: z.string(), kind: cellKindSchema })),
});
export type RestoreResult = z.infer<typeof restoreResultSchema>;

/** POST /api/versions/:versionId/branches (leads; engineers when the project allows) */
export const createBranchSchema = z.object({
  name: text('name', 80).regex(/^[^\s/][^/]*$/, 'name must not start with a space or contain "/"'),
  purpose: safeText('purpose').trim().max(2000, 'purpose must be at most 2000 characters').default(''),
});
export type CreateBranch = z.input<typeof createBranchSchema>;

/** PATCH /api/branches/:branchId: rename, say what it is for, archive or restore */
export const updateBranchSchema = z
  .object({
    name: text('name', 80).regex(/^[^\s/][^/]*$/, 'name must not start with a space or contain "/"').optional(),
    purpose: safeText('purpose').trim().max(2000, 'purpose must be at most 2000 characters').optional(),
    archived: z.boolean().optional(),
  })
  .refine((v) => Object.keys(v).length > 0, { message: 'nothing to change: give name, purpose or archived' });
export type UpdateBranch = z.input<typeof updateBranchSchema>;

/** POST /api/studies/:studyId/baseline (leads); null clears the mark. */
export const markBaselineSchema = z.object({ versionId: id.nullable() });
export type MarkBaseline = z.infer<typeof markBaselineSchema>;

// ---------------------------------------------------------------------------------------------------
// Compare

/** Whether a change helps the design: transition aft and drag down are favourable. */
export const EFFECTS = ['favourable', 'adverse', 'neutral'] as const;
export type Effect = (typeof EFFECTS)[number];

/** One input that differs between the two versions: `reynolds` 6e6 → 9e6. */
export const fieldChangeSchema = z.object({
  /** Path in the inputs, as people write it: `reynolds`, `trips.upper`. */
  path: z.string(),
  /** What the notebook calls the field. */
  label: z.string(),
  old: z.unknown(),
  new: z.unknown(),
  /** The two values as the notebook shows them (numbers rounded, cell references by title). */
  oldText: z.string(),
  newText: z.string(),
  /** For numbers: (new − old) / |old|, when old is not zero. */
  relative: z.number().nullable(),
});
export type FieldChange = z.infer<typeof fieldChangeSchema>;

const tableRowSchema = z.object({ x: z.number(), cp: z.number(), line: z.number().int() });

/** A changed pressure table, as numbers: ΔCp at each x present in both, and rows only in one. */
export const pressureTableDiffSchema = z.object({
  rowCountA: z.number().int(),
  rowCountB: z.number().int(),
  /** Tables that do not parse are named with their line; no numeric difference is made then. */
  problems: z.array(z.object({ side: z.enum(['a', 'b']), line: z.number().int(), message: z.string() })),
  surfaces: z.array(
    z.object({
      name: z.string(),
      matched: z.array(z.object({ x: z.number(), cpA: z.number(), cpB: z.number(), deltaCp: z.number() })),
      /** Largest |ΔCp| over the matched rows and where; null when no row matched. */
      maxAbsDeltaCp: z.number().nullable(),
      maxAt: z.number().nullable(),
      /** Root-mean-square ΔCp over the matched rows. */
      rmsDeltaCp: z.number().nullable(),
      rowsAdded: z.array(tableRowSchema),
      rowsRemoved: z.array(tableRowSchema),
    }),
  ),
});
export type PressureTableDiff = z.infer<typeof pressureTableDiffSchema>;

/** A note's text, as lines added and removed (a few shown). */
export const textDiffSchema = z.object({
  linesAdded: z.number().int(),
  linesRemoved: z.number().int(),
  excerpt: z.array(z.object({ op: z.enum(['+', '-']), text: z.string() })),
});
export type TextDiff = z.infer<typeof textDiffSchema>;

export const CELL_CHANGES = ['added', 'removed', 'changed', 'moved', 'unchanged'] as const;
export type CellChange = (typeof CELL_CHANGES)[number];

export const cellDiffSchema = z.object({
  cellId: id,
  kind: cellKindSchema,
  /** added / removed; else changed when inputs or title differ, moved when only its place did. */
  change: z.enum(CELL_CHANGES),
  /** Its order among the cells both versions have is different (it may also have changed). */
  moved: z.boolean(),
  titleA: z.string().nullable(),
  titleB: z.string().nullable(),
  positionA: z.number().int().nullable(),
  positionB: z.number().int().nullable(),
  fields: z.array(fieldChangeSchema),
  table: pressureTableDiffSchema.nullable(),
  text: textDiffSchema.nullable(),
  /** The stored outputs differ (a re-run with changed inputs or upstream). */
  outputChanged: z.boolean(),
});
export type CellDiff = z.infer<typeof cellDiffSchema>;

/** A value in both versions and what the change means for the design. */
export const deltaSchema = z.object({
  a: z.number().nullable(),
  b: z.number().nullable(),
  /** b − a; null when either is missing. */
  delta: z.number().nullable(),
  effect: z.enum(EFFECTS),
});
export type Delta = z.infer<typeof deltaSchema>;

/** A transition location in both versions; x/c where the stations carry x, else arc length s. */
export const transitionDeltaSchema = deltaSchema.extend({
  /** Which coordinate a and b are in. */
  coordinate: z.enum(['x', 's']),
  /** aft = later transition, a longer laminar run. */
  shift: z.enum(['aft', 'forward', 'none', 'appeared', 'vanished']),
  byA: z.string().nullable(),
  byB: z.string().nullable(),
});
export type TransitionDelta = z.infer<typeof transitionDeltaSchema>;

const seriesSchema = z.object({
  /** Chordwise x where known, else arc length s. */
  x: z.array(z.number()),
  cp: z.array(z.number().nullable()),
  n: z.array(z.number().nullable()),
  H: z.array(z.number().nullable()),
});
export type OverlaySeries = z.infer<typeof seriesSchema>;

export const surfaceComparisonSchema = z.object({
  name: z.string(),
  /** The governing transition location (what set it in by). */
  transition: transitionDeltaSchema,
  criteria: z.array(transitionDeltaSchema.extend({ criterion: z.string() })),
  /** Share of the surface's run that is laminar, 0 … 1. */
  laminarExtent: deltaSchema,
  cd: deltaSchema,
  cdFriction: deltaSchema,
  laminarSeparation: deltaSchema,
  turbulentSeparation: deltaSchema,
  overlay: z.object({ coordinate: z.enum(['x', 's']), a: seriesSchema.nullable(), b: seriesSchema.nullable() }),
});
export type SurfaceComparison = z.infer<typeof surfaceComparisonSchema>;

export const analysisComparisonSchema = z.object({
  cellId: id,
  title: z.string(),
  /** What each version holds for the cell: a result, a failed run, no run stored, or no such cell. */
  statusA: z.enum(['ok', 'error', 'notRun', 'absent']),
  statusB: z.enum(['ok', 'error', 'notRun', 'absent']),
  errorA: z.string().nullable(),
  errorB: z.string().nullable(),
  flow: z.object({ reynolds: deltaSchema, mach: deltaSchema, nCrit: deltaSchema }),
  cd: deltaSchema,
  surfaces: z.array(surfaceComparisonSchema),
  warningsA: z.array(z.string()),
  warningsB: z.array(z.string()),
});
export type AnalysisComparison = z.infer<typeof analysisComparisonSchema>;

/**
 * A parameter sweep's results in two versions, step by step: compared by result, so a sweep whose own
 * inputs did not change still shows what a change upstream (its analysis, flow or table) did to it.
 */
export const sweepComparisonSchema = z.object({
  cellId: id,
  title: z.string(),
  parameter: z.string().nullable(),
  statusA: z.enum(['ok', 'error', 'notRun', 'absent']),
  statusB: z.enum(['ok', 'error', 'notRun', 'absent']),
  errorA: z.string().nullable(),
  errorB: z.string().nullable(),
  /** Whether any step's transition or drag differs between A and B. */
  resultsDiffer: z.boolean(),
  /** The swept values of either side, in order; a value only one side has shows null on the other. */
  steps: z.array(
    z.object({
      value: z.number(),
      cd: deltaSchema,
      surfaces: z.array(z.object({ name: z.string(), transition: transitionDeltaSchema })),
    }),
  ),
});
export type SweepComparison = z.infer<typeof sweepComparisonSchema>;

/** GET /api/compare?a=<versionId>&b=<versionId> — any two versions of one study. */
export const comparisonSchema = z.object({
  studyId: id,
  a: versionSummarySchema,
  b: versionSummarySchema,
  summary: z.object({
    added: z.number().int(),
    removed: z.number().int(),
    changed: z.number().int(),
    moved: z.number().int(),
    unchanged: z.number().int(),
  }),
  cells: z.array(cellDiffSchema),
  results: z.array(analysisComparisonSchema),
  sweeps: z.array(sweepComparisonSchema).default([]),
  caution: z.string(),
});
export type Comparison = z.infer<typeof comparisonSchema>;

export const compareQuerySchema = z.object({
  a: z.string({ error: 'a must name a version' }).uuid('a must name a version'),
  b: z.string({ error: 'b must name a version' }).uuid('b must name a version'),
});
export type CompareQuery = z.infer<typeof compareQuerySchema>;

/**
 * The 409 a stale save answers: the head the server has now, what that save changed against the head
 * the client saw, cell by cell, and the draft untouched on the server.
 */
export const saveConflictSchema = problemSchema.extend({
  reason: z.enum(['headMoved', 'draftChanged']),
  currentHead: versionSummarySchema.nullable(),
  /** Versions saved on the branch since the one the client saw, oldest first. */
  newerVersions: z.array(versionSummarySchema),
  changes: z.array(cellDiffSchema),
  draftRevision: z.number().int(),
});
export type SaveConflict = z.infer<typeof saveConflictSchema>;

/** Engineering-estimate caution shown with every comparison of results (DESIGN.md "Cautions"). */
export const COMPARISON_CAUTION =
  'Differences between engineering estimates from integral boundary-layer methods and empirical transition criteria. ' +
  'Validated tools, test data and the design and certification practice that governs your work decide.';

