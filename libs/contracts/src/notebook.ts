import { z } from 'zod';

/**
 * The study notebook: cell kinds with their input schemas, the branch draft, runs and outputs.
 * A cell's inputs are validated by its kind's schema here, on the server at the edge and in the web app
 * as the user types. Inputs keep exactly what the user typed (a pasted table stays as pasted).
 */

export const CELL_KINDS = ['flow', 'pressure', 'analysis', 'sweep', 'flatPlate', 'leadingEdge', 'note'] as const;
export const cellKindSchema = z.enum(CELL_KINDS);
export type CellKind = z.infer<typeof cellKindSchema>;

/** Human names of the kinds, as the notebook shows them. */
export const CELL_KIND_LABELS: Record<CellKind, string> = {
  flow: 'Flow condition',
  pressure: 'Pressure distribution',
  analysis: 'Transition analysis',
  sweep: 'Parameter sweep',
  flatPlate: 'Flat-plate estimate',
  leadingEdge: 'Leading-edge check',
  note: 'Note',
};

const finite = (field: string) => z.number({ error: `${field} must be a number` }).finite(`${field} must be finite`);
const positive = (field: string) => finite(field).positive(`${field} must be greater than zero`);
const cellRef = (field: string) => z.string({ error: `${field} must name a cell` }).uuid(`${field} must name a cell`);

export const TRANSITION_CRITERIA_IDS = ['eN', 'michel', 'hRx', 'granville'] as const;

/** Flow condition: ISA altitude + Mach + reference length, or a Reynolds number given directly. */
export const flowInputsSchema = z.object({
  mode: z.enum(['altitude', 'reynolds']),
  altitude_m: finite('altitude_m').min(-500, 'altitude_m must be at least −500 m').max(20000, 'altitude_m must be at most 20 000 m (ISA range)').default(11000),
  isaTemperatureOffset_K: finite('isaTemperatureOffset_K').min(-60).max(60).default(0),
  mach: finite('mach').min(0, 'mach must not be negative').lt(1, 'mach must be below 1 (subsonic free stream)').default(0.7),
  referenceLength_m: positive('referenceLength_m').default(2),
  reynolds: positive('reynolds').optional(),
  /** Either a free-stream turbulence level (N_crit from Mack's relation) or N_crit given directly. */
  turbulenceMode: z.enum(['intensity', 'nCrit']).default('nCrit'),
  turbulenceIntensity: finite('turbulenceIntensity').positive().max(0.05, 'turbulenceIntensity is a fraction, at most 0.05').optional(),
  nCrit: finite('nCrit').min(1).max(20).default(9),
  sweepDeg: finite('sweepDeg').min(0).max(70, 'sweepDeg must be at most 70°').default(0),
});
export type FlowInputs = z.infer<typeof flowInputsSchema>;

/** Pressure distribution: a pasted or uploaded table, one closed loop or one surface. */
export const pressureInputsSchema = z.object({
  /** The table exactly as pasted or as read from the uploaded file. */
  text: z.string().max(2_000_000, 'the pasted table is larger than 2 MB'),
  uploadId: z.string().uuid().nullable().default(null),
  filename: z.string().nullable().default(null),
  layout: z.enum(['closedLoop', 'surface']).default('closedLoop'),
  /** For a single surface: its name (upper, lower, nacelle outer, …). */
  surfaceName: z.string().max(60).default('upper'),
  /** Whether the last column is a body radius (axisymmetric bodies such as nacelles). */
  hasRadius: z.boolean().default(false),
});
export type PressureInputs = z.infer<typeof pressureInputsSchema>;

/** Transition analysis: which flow and pressure cells, which criteria, trips, turbulent march. */
export const analysisInputsSchema = z.object({
  flowCellId: cellRef('flowCellId'),
  pressureCellId: cellRef('pressureCellId'),
  criteria: z.array(z.enum(TRANSITION_CRITERIA_IDS)).min(1, 'criteria: pick at least one transition criterion').default(['eN', 'michel', 'hRx', 'granville']),
  /** Forced transition per surface name, as s or x/c; absent means free transition. */
  trips: z.record(z.string(), finite('trip').min(0)).default({}),
  turbulent: z.boolean().default(true),
});
export type AnalysisInputs = z.infer<typeof analysisInputsSchema>;

/** Parameter sweep: one analysis cell re-run over a range of one parameter. */
export const sweepInputsSchema = z.object({
  analysisCellId: cellRef('analysisCellId'),
  parameter: z.enum(['reynolds', 'mach', 'nCrit', 'sweepDeg']),
  from: finite('from'),
  to: finite('to'),
  steps: z.number().int('steps must be a whole number').min(2, 'steps must be at least 2').max(60, 'steps must be at most 60'),
});
export type SweepInputs = z.infer<typeof sweepInputsSchema>;

/** Flat-plate estimate: quick skin-friction sizing for nacelles and fairings. */
export const flatPlateInputsSchema = z.object({
  mode: z.enum(['reynolds', 'dimensional']).default('reynolds'),
  reynolds: positive('reynolds').default(1e7),
  length_m: positive('length_m').default(2),
  speed_mps: positive('speed_mps').default(200),
  kinematicViscosity_m2s: positive('kinematicViscosity_m2s').default(3.9e-5),
  transitionMode: z.enum(['reynolds', 'location']).default('reynolds'),
  transitionReynolds: positive('transitionReynolds').default(3e6),
  /** Transition position as a fraction of the length, 0…1. */
  transitionLocation: finite('transitionLocation').min(0).max(1, 'transitionLocation is a fraction of the length, 0 to 1').default(0.3),
});
export type FlatPlateInputs = z.infer<typeof flatPlateInputsSchema>;

/** Leading-edge check: attachment-line Reynolds number (Poll) from sweep and LE radius or velocity gradient. */
export const leadingEdgeInputsSchema = z.object({
  flowCellId: cellRef('flowCellId').nullable().default(null),
  sweepDeg: finite('sweepDeg').min(0).max(80).default(25),
  mode: z.enum(['radius', 'gradient']).default('radius'),
  /** Leading-edge radius divided by the reference length. */
  leadingEdgeRadius: positive('leadingEdgeRadius').default(0.01),
  /** dUe/ds at the attachment line, non-dimensional (V∞/L). */
  velocityGradient: positive('velocityGradient').optional(),
  reynolds: positive('reynolds').optional(),
});
export type LeadingEdgeInputs = z.infer<typeof leadingEdgeInputsSchema>;

export const noteInputsSchema = z.object({ markdown: z.string().max(200_000, 'the note is longer than 200 000 characters') });
export type NoteInputs = z.infer<typeof noteInputsSchema>;

export const CELL_INPUT_SCHEMAS = {
  flow: flowInputsSchema,
  pressure: pressureInputsSchema,
  analysis: analysisInputsSchema,
  sweep: sweepInputsSchema,
  flatPlate: flatPlateInputsSchema,
  leadingEdge: leadingEdgeInputsSchema,
  note: noteInputsSchema,
} as const satisfies Record<CellKind, z.ZodType>;

export type CellInputs = { [K in CellKind]: z.infer<(typeof CELL_INPUT_SCHEMAS)[K]> };

/** The cells a cell's inputs name (its upstream), in order. */
export function upstreamCellIds(kind: CellKind, inputs: Record<string, unknown>): string[] {
  const ids: unknown[] =
    kind === 'analysis' ? [inputs['flowCellId'], inputs['pressureCellId']] : kind === 'sweep' ? [inputs['analysisCellId']] : kind === 'leadingEdge' ? [inputs['flowCellId']] : [];
  return ids.filter((x): x is string => typeof x === 'string' && x.length > 0);
}

/** A cell as the client sends it in a draft save. Inputs are validated by kind when the cell runs. */
export const draftCellInputSchema = z.object({
  cellId: z.string().uuid('cellId must be a UUID'),
  kind: cellKindSchema,
  title: z.string().max(200, 'title must be at most 200 characters').default(''),
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

export const cellOutputSchema = z.object({
  key: z.string(),
  status: z.enum(['ok', 'error']),
  result: z.unknown().nullable(),
  error: z.object({ message: z.string(), field: z.string().optional() }).nullable(),
  engineVersion: z.string(),
  durationMs: z.number(),
  computedAt: z.string(),
});
export type CellOutput = z.infer<typeof cellOutputSchema>;

export const draftCellSchema = draftCellInputSchema.extend({
  runState: z.enum(RUN_STATES),
  /** Validation problems of the inputs as they stand (shown inline; the cell can still be saved). */
  problems: z.array(z.object({ field: z.string(), message: z.string() })),
  /** The last output, even when outdated or after a failed run (the last good one stays visible). */
  output: cellOutputSchema.nullable(),
  /** The last good output when the newest run failed. */
  lastGoodOutput: cellOutputSchema.nullable(),
});
export type DraftCell = z.infer<typeof draftCellSchema>;

export const draftSchema = z.object({
  branchId: z.string().uuid(),
  studyId: z.string().uuid(),
  revision: z.number().int(),
  cells: z.array(draftCellSchema),
  trash: z.array(draftCellInputSchema.extend({ deletedAt: z.string(), deletedBy: z.string().nullable() })),
  basedOnVersionId: z.string().uuid().nullable(),
  updatedAt: z.string(),
  updatedBy: z.object({ id: z.string(), name: z.string() }).nullable(),
});
export type Draft = z.infer<typeof draftSchema>;

/** POST /api/branches/:branchId/run { cellIds?: string[] } — omitted means the whole study, in dependency order. */
export const runRequestSchema = z.object({ cellIds: z.array(z.string().uuid()).optional() });
export type RunRequest = z.infer<typeof runRequestSchema>;
