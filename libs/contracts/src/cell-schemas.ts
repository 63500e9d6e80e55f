import { z } from 'zod';
import { CELL_KINDS, TRANSITION_CRITERIA, type CellKind, CELL_KIND_REGISTRY } from './cell-kinds';
import { engineResultSchema, type EngineResult } from './engine';
import { PRESSURE_TEXT_LIMIT, SWEEP_RANGES } from './limits';
import { bodyInviscidSchema, SECTION_LIMITS, sectionGeometrySchema, sectionInviscidSchema } from './section';

/**
 * The zod half of the cell-kind registry (the plain half is cell-kinds.ts): each kind's input schema,
 * whose defaults are a new cell's values, and its result schema. A cell's inputs are validated by its
 * kind's schema on the server at the edge, in the web app as the user types, and by the command line;
 * inputs keep exactly what the user typed (a pasted table stays as pasted).
 */

export const cellKindSchema = z.enum(CELL_KINDS);

const finite = (field: string) => z.number({ error: `${field} must be a number` }).finite(`${field} must be finite`);
const positive = (field: string) => finite(field).positive(`${field} must be greater than zero`);
const cellRef = (field: string) => z.string({ error: `${field} must name a cell` }).uuid(`${field} must name a cell`);

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
}).superRefine((flow, ctx) => {
  if (flow.mode === 'reynolds' && flow.reynolds === undefined) ctx.addIssue({ code: 'custom', path: ['reynolds'], message: 'reynolds is needed when the condition is given by Reynolds number' });
  if (flow.mode === 'altitude' && !(flow.mach > 0)) ctx.addIssue({ code: 'custom', path: ['mach'], message: 'mach must be greater than zero to give a Reynolds number from the altitude' });
  if (flow.turbulenceMode === 'intensity' && flow.turbulenceIntensity === undefined) {
    ctx.addIssue({ code: 'custom', path: ['turbulenceIntensity'], message: 'turbulenceIntensity is needed when N_crit comes from the turbulence level' });
  }
});
export type FlowInputs = z.infer<typeof flowInputsSchema>;

export { PRESSURE_TEXT_LIMIT, UPLOAD_LIMIT_BYTES, SWEEP_RANGES } from './limits';

/**
 * Pressure distribution: a pasted or uploaded table, one closed loop or one surface. A closed loop runs
 * `x [y] cp` from the trailing edge over one side to the other (the stagnation point is found); a
 * single surface starts at the attachment line. With `hasRadius` the table needs a header row naming
 * a radius column (`r`), e.g. `x r cp` (axisymmetric bodies, single surface only).
 */
export const pressureInputsSchema = z.object({
  /** The table exactly as pasted or as read from the uploaded file. */
  text: z.string().max(PRESSURE_TEXT_LIMIT, `the table is longer than ${PRESSURE_TEXT_LIMIT / 1_000_000} million characters`),
  uploadId: z.string().uuid().nullable().default(null),
  filename: z.string().nullable().default(null),
  layout: z.enum(['closedLoop', 'surface']).default('closedLoop'),
  /** For a single surface: its name (upper, lower, nacelle outer, …). */
  surfaceName: z.string().max(60).default('upper'),
  /** Whether the last column is a body radius (axisymmetric bodies such as nacelles). */
  hasRadius: z.boolean().default(false),
  /**
   * Smoothing of Ue(s) before it is differentiated (local least-squares quadratic): `off`, `auto` (the
   * width from the estimated scatter; absent means auto) or `width` (smoothingHalfWidth stations on each side).
   */
  smoothing: z.enum(['off', 'auto', 'width']).optional(),
  smoothingHalfWidth: z.number().int('smoothingHalfWidth must be a whole number').min(1, 'smoothingHalfWidth must be at least 1').max(50, 'smoothingHalfWidth must be at most 50').optional(),
}).superRefine((p, ctx) => {
  if (p.hasRadius && p.layout !== 'surface') ctx.addIssue({ code: 'custom', path: ['hasRadius'], message: 'a body radius is read only for a single surface (layout surface)' });
});
export type PressureInputs = z.infer<typeof pressureInputsSchema>;

/** Transition analysis: which flow and pressure cells, which criteria, trips, turbulent march. */
export const analysisInputsSchema = z.object({
  flowCellId: cellRef('flowCellId'),
  pressureCellId: cellRef('pressureCellId'),
  criteria: z.array(z.enum(TRANSITION_CRITERIA)).min(1, 'criteria: pick at least one transition criterion').default([...TRANSITION_CRITERIA]),
  /**
   * Forced transition per surface name (`upper`, `lower`, or a single surface's name) at this x/c of
   * the table; absent means free transition.
   */
  trips: z.record(z.string(), finite('trip').min(0, 'a trip location must not be negative')).default({}),
  turbulent: z.boolean().default(true),
  /**
   * Which criterion sets the governing transition: `auto` is the earlier of e^N and the crossflow
   * Reynolds number when e^N is chosen (the others are cross-checks), else the earliest; `earliest`
   * takes the shortest laminar run of the chosen ones.
   */
  governing: z.enum(['auto', 'earliest', ...TRANSITION_CRITERIA]).default('auto'),
});
export type AnalysisInputs = z.infer<typeof analysisInputsSchema>;

/** The most cases one sweep may have (a grid counts steps × steps of the second parameter). */
export const SWEEP_CASE_LIMIT = 2000;
/**
 * The limit as the messages write it ("2,000"), grouped here rather than by `toLocaleString`: these
 * schemas are built when the web app loads them, and a browser's first number formatting starts its
 * locale data (25–45 ms measured in headless chromium), all for this one text.
 */
const SWEEP_CASE_LIMIT_TEXT = String(SWEEP_CASE_LIMIT).replace(/\B(?=(\d{3})+$)/g, ',');

const sweepParameterSchema = z.enum(['reynolds', 'mach', 'nCrit', 'sweepDeg']);
const sweepSteps = (field: string) =>
  z.number({ error: `${field} must be a number` }).int(`${field} must be a whole number`).min(2, `${field} must be at least 2`).max(SWEEP_CASE_LIMIT, `${field} must be at most ${SWEEP_CASE_LIMIT_TEXT}`);

/**
 * Parameter sweep: one analysis cell re-run over `steps` evenly spaced values of one parameter of its
 * flow cell, or over a grid of two (`second`: every value of the second parameter at every value of the
 * first). Mach at a fixed altitude changes the Reynolds number too (V∞ = M a∞); a Reynolds-number
 * sweep keeps Mach as the flow cell has it. A long sweep runs as a job, its cases shared by the workers.
 */
export const sweepInputsSchema = z.object({
  analysisCellId: cellRef('analysisCellId'),
  parameter: sweepParameterSchema,
  from: finite('from'),
  to: finite('to'),
  steps: sweepSteps('steps'),
  second: z
    .object({ parameter: sweepParameterSchema, from: finite('second.from'), to: finite('second.to'), steps: sweepSteps('second.steps') })
    .nullable()
    .optional(),
}).superRefine((sweep, ctx) => {
  const check = (parameter: SweepInputs['parameter'], from: number, to: number, path: string[]) => {
    const range = SWEEP_RANGES[parameter];
    for (const [end, v] of [['from', from], ['to', to]] as const) {
      if (!(v >= range.min && v <= range.max)) ctx.addIssue({ code: 'custom', path: [...path, end], message: `${parameter} must lie between ${range.min} and ${range.max}${range.note}` });
    }
    if (from === to) ctx.addIssue({ code: 'custom', path: [...path, 'to'], message: `${path.length ? 'second.' : ''}to must differ from ${path.length ? 'second.' : ''}from` });
  };
  check(sweep.parameter, sweep.from, sweep.to, []);
  if (sweep.second) {
    check(sweep.second.parameter, sweep.second.from, sweep.second.to, ['second']);
    if (sweep.second.parameter === sweep.parameter) ctx.addIssue({ code: 'custom', path: ['second', 'parameter'], message: 'the second parameter must differ from the first' });
    const cases = sweep.steps * sweep.second.steps;
    if (cases > SWEEP_CASE_LIMIT) {
      ctx.addIssue({ code: 'custom', path: ['second', 'steps'], message: `the grid has ${cases.toLocaleString('en')} cases (steps × second.steps); at most ${SWEEP_CASE_LIMIT_TEXT}` });
    }
  }
});

export type SweepInputs = z.infer<typeof sweepInputsSchema>;

/** Comparison: two to four pressure cells or analyses of the study, overlaid. */
export const comparisonInputsSchema = z.object({
  firstCellId: cellRef('firstCellId'),
  secondCellId: cellRef('secondCellId'),
  thirdCellId: cellRef('thirdCellId').nullable().default(null),
  fourthCellId: cellRef('fourthCellId').nullable().default(null),
});
export type ComparisonInputs = z.infer<typeof comparisonInputsSchema>;

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

/**
 * Leading-edge check: attachment-line Reynolds number (Poll) from sweep and LE radius or velocity
 * gradient. The Reynolds number comes from the named flow cell, else from `reynolds`; the sweep is this
 * cell's own.
 */
export const leadingEdgeInputsSchema = z.object({
  flowCellId: cellRef('flowCellId').nullable().default(null),
  sweepDeg: finite('sweepDeg').min(0).max(80).default(25),
  mode: z.enum(['radius', 'gradient']).default('radius'),
  /** Leading-edge radius divided by the reference length. */
  leadingEdgeRadius: positive('leadingEdgeRadius').default(0.01),
  /** dUe/ds at the attachment line, non-dimensional (V∞/L). */
  velocityGradient: positive('velocityGradient').optional(),
  /** Used when no flow cell is named. */
  reynolds: positive('reynolds').optional(),
}).superRefine((le, ctx) => {
  if (le.mode === 'gradient' && le.velocityGradient === undefined) ctx.addIssue({ code: 'custom', path: ['velocityGradient'], message: 'velocityGradient is needed in gradient mode' });
  if (le.flowCellId === null && le.reynolds === undefined) ctx.addIssue({ code: 'custom', path: ['reynolds'], message: 'give reynolds, or name a flow cell (flowCellId)' });
});
export type LeadingEdgeInputs = z.infer<typeof leadingEdgeInputsSchema>;

export const noteInputsSchema = z.object({ markdown: z.string().max(200_000, 'the note is longer than 200 000 characters') });
export type NoteInputs = z.infer<typeof noteInputsSchema>;

/**
 * Section: a NACA designation or pasted coordinates, and the panel method's solution at an incidence or
 * a lift coefficient (Mach number from the flow cell it names, else incompressible).
 */
export const sectionInputsSchema = z
  .object({
    source: z.enum(['naca', 'coordinates']).default('naca'),
    naca: z.string().max(24, 'naca: a NACA designation has 4 or 5 digits').default('2412'),
    /** Kept exactly as pasted. */
    coordinates: z.string().max(SECTION_LIMITS.maxCoordinateCharacters, `coordinates: longer than ${SECTION_LIMITS.maxCoordinateCharacters} characters (limit)`).default(''),
    flowCellId: cellRef('flowCellId').nullable().default(null),
    at: z.enum(['alpha', 'cl']).default('alpha'),
    alphaDeg: finite('alphaDeg').min(-25, 'alphaDeg must lie between −25° and 25°').max(25, 'alphaDeg must lie between −25° and 25°').default(2),
    cl: finite('cl').min(-3, 'cl must lie between −3 and 3').max(3, 'cl must lie between −3 and 3').default(0.4),
    panels: z.number().int('panels must be a whole number').min(SECTION_LIMITS.minPanels, `panels must be at least ${SECTION_LIMITS.minPanels}`).max(SECTION_LIMITS.maxPanels, `panels must be at most ${SECTION_LIMITS.maxPanels}`).default(160),
  })
  .superRefine((section, ctx) => {
    if (section.source === 'naca' && section.naca.trim() === '') ctx.addIssue({ code: 'custom', path: ['naca'], message: 'naca: give a designation such as 2412 or 23012' });
    if (section.source === 'coordinates' && section.coordinates.trim() === '') ctx.addIssue({ code: 'custom', path: ['coordinates'], message: 'coordinates: paste x y rows' });
  });
export type SectionInputs = z.infer<typeof sectionInputsSchema>;

export const sectionResultSchema = z.object({
  title: z.string().nullable(),
  /** The shape as given, on unit chord (trailing edge → upper → nose → lower → trailing edge). */
  outline: z.object({ x: z.array(z.number()), y: z.array(z.number()) }),
  geometry: sectionGeometrySchema,
  inviscid: sectionInviscidSchema,
  warnings: z.array(z.string()),
});
export type SectionResult = z.infer<typeof sectionResultSchema>;

/**
 * Body of revolution at zero incidence (a nacelle's cowl closed at both ends, a fuselage, a pod): a
 * prolate spheroid of a given fineness ratio, or a pasted meridian `x r` from the nose to the tail, and
 * its Cp by the axisymmetric panel method (incompressible).
 */
export const bodyInputsSchema = z
  .object({
    source: z.enum(['spheroid', 'coordinates']).default('spheroid'),
    fineness: finite('fineness').min(1, 'fineness must be at least 1 (a sphere)').max(20, 'fineness must be at most 20').default(6),
    /** Kept exactly as pasted. */
    coordinates: z.string().max(SECTION_LIMITS.maxCoordinateCharacters, `coordinates: longer than ${SECTION_LIMITS.maxCoordinateCharacters} characters (limit)`).default(''),
    panels: z.number().int('panels must be a whole number').min(SECTION_LIMITS.minPanels, `panels must be at least ${SECTION_LIMITS.minPanels}`).max(SECTION_LIMITS.maxPanels, `panels must be at most ${SECTION_LIMITS.maxPanels}`).default(120),
  })
  .superRefine((body, ctx) => {
    if (body.source === 'coordinates' && body.coordinates.trim() === '') ctx.addIssue({ code: 'custom', path: ['coordinates'], message: 'coordinates: paste x r rows from the nose to the tail' });
  });
export type BodyInputs = z.infer<typeof bodyInputsSchema>;

export const bodyResultSchema = z.object({
  title: z.string().nullable(),
  /** The meridian as given, on unit length (nose at x = 0, r the radius). */
  outline: z.object({ x: z.array(z.number()), r: z.array(z.number()) }),
  geometry: z.object({
    /** Length over maximum diameter. */
    fineness: z.number(),
    /** Maximum radius over length, and where it is. */
    maxRadius: z.number(),
    maxRadiusAt: z.number(),
  }),
  inviscid: bodyInviscidSchema,
  warnings: z.array(z.string()),
});
export type BodyResult = z.infer<typeof bodyResultSchema>;

/** Polar: a section over a range of incidence or lift, with the boundary layer at each point. */
export const polarInputsSchema = z
  .object({
    flowCellId: cellRef('flowCellId'),
    sectionCellId: cellRef('sectionCellId'),
    by: z.enum(['alpha', 'cl']).default('alpha'),
    from: finite('from').min(-25, 'from must lie between −25 and 25').max(25, 'from must lie between −25 and 25').default(-4),
    to: finite('to').min(-25, 'to must lie between −25 and 25').max(25, 'to must lie between −25 and 25').default(10),
    points: z.number().int('points must be a whole number').min(2, 'points must be at least 2').max(SECTION_LIMITS.maxPolarPoints, `points must be at most ${SECTION_LIMITS.maxPolarPoints} (a longer polar waits for background jobs)`).default(15),
    criteria: z.array(z.enum(TRANSITION_CRITERIA)).min(1, 'criteria: pick at least one transition criterion').default([...TRANSITION_CRITERIA]),
    governing: z.enum(['auto', 'earliest', ...TRANSITION_CRITERIA]).default('auto'),
  })
  .superRefine((polar, ctx) => {
    if (!(polar.to > polar.from)) ctx.addIssue({ code: 'custom', path: ['to'], message: 'to must be above from' });
    if (polar.by === 'cl' && (Math.abs(polar.from) > 3 || Math.abs(polar.to) > 3)) ctx.addIssue({ code: 'custom', path: ['from'], message: 'a lift-coefficient range must lie between −3 and 3' });
  });
export type PolarInputs = z.infer<typeof polarInputsSchema>;

const polarSurfaceSchema = z.object({
  name: z.string(),
  transitionX: z.number().nullable(),
  transitionBy: z.string().nullable(),
  criteria: z.record(z.string(), z.number().nullable()),
  laminarSeparationX: z.number().nullable(),
  turbulentSeparationX: z.number().nullable(),
  cd: z.number().nullable(),
});

export const polarResultSchema = z.object({
  reynolds: z.number(),
  mach: z.number(),
  nCrit: z.number(),
  outline: z.object({ x: z.array(z.number()), y: z.array(z.number()) }),
  points: z.array(
    z.object({
      /** null only at a point the engine refused (see problem). */
      alphaDeg: z.number().nullable(),
      cl: z.number().nullable(),
      cm: z.number().nullable(),
      cd: z.number().nullable(),
      surfaces: z.array(polarSurfaceSchema),
      /** Why the point has no result (the engine refused it), else null. */
      problem: z.string().nullable(),
    }),
  ),
  warnings: z.array(z.string()),
});
export type PolarResult = z.infer<typeof polarResultSchema>;

export const CELL_INPUT_SCHEMAS = {
  flow: flowInputsSchema,
  pressure: pressureInputsSchema,
  section: sectionInputsSchema,
  body: bodyInputsSchema,
  analysis: analysisInputsSchema,
  polar: polarInputsSchema,
  sweep: sweepInputsSchema,
  comparison: comparisonInputsSchema,
  flatPlate: flatPlateInputsSchema,
  leadingEdge: leadingEdgeInputsSchema,
  note: noteInputsSchema,
} as const satisfies Record<CellKind, z.ZodType>;

export type CellInputs = { [K in CellKind]: z.infer<(typeof CELL_INPUT_SCHEMAS)[K]> };

/**
 * Why a run failed: the engine's one-line message and the field at fault (`flow.mach`,
 * `pressureTable line 7`, `flowCellId` when something upstream failed); a table's parse problems each
 * with their line.
 */
export const cellErrorSchema = z.object({
  message: z.string(),
  field: z.string().optional(),
  line: z.number().int().optional(),
  problems: z.array(z.object({ line: z.number().int(), message: z.string() })).optional(),
});
export type CellError = z.infer<typeof cellErrorSchema>;

// ---------------------------------------------------------------------------------------------------
// Results per kind (CellOutput.result when status is ok)

/** Flow condition: the derived free stream. Dimensional values are null when Re is given directly. */
export const flowResultSchema = z.object({
  reynolds: z.number(),
  mach: z.number(),
  /** Reynolds number per metre, V∞/ν∞. */
  reynoldsPerMetre: z.number().nullable(),
  speed_mps: z.number().nullable(),
  kinematicViscosity_m2s: z.number().nullable(),
  dynamicPressure_Pa: z.number().nullable(),
  temperature_K: z.number().nullable(),
  pressure_Pa: z.number().nullable(),
  density_kgm3: z.number().nullable(),
  speedOfSound_mps: z.number().nullable(),
  nCrit: z.number(),
  nCritFrom: z.enum(['given', 'turbulenceIntensity']),
  sweepDeg: z.number(),
  warnings: z.array(z.string()),
});
export type FlowResult = z.infer<typeof flowResultSchema>;

/** Pressure distribution: the table as read, split at the stagnation point for a closed loop. */
export const pressureResultSchema = z.object({
  layout: z.enum(['closedLoop', 'surface']),
  rowCount: z.number().int(),
  hasY: z.boolean(),
  headerLine: z.number().int().nullable(),
  /** Upper and lower for a closed loop (from the stagnation point to the trailing edge), or the one surface. */
  surfaces: z.array(
    z.object({
      name: z.string(),
      x: z.array(z.number()),
      y: z.array(z.number()).nullable(),
      cp: z.array(z.number()),
      /** Arc length from the stagnation point (attachment line), divided by the reference length. */
      s: z.array(z.number()),
      r: z.array(z.number()).nullable(),
      /** 1-based line of the table each point came from. */
      line: z.array(z.number().int()),
      /**
       * The smoothing the analysis differentiates Ue with, at M = 0: its half-width, the estimated
       * scatter of Ue/V∞, Cp of the local least-squares fit, and dUe/ds of the fit beside the unsmoothed
       * one (the parabola through each point and its neighbours), all at the points above.
       */
      smoothing: z
        .object({ halfWidth: z.number().int(), scatter: z.number(), cp: z.array(z.number()), dUeds: z.array(z.number()), dUedsRaw: z.array(z.number()) })
        .optional(),
    }),
  ),
  /**
   * The stagnation point found between two rows of a closed loop (null for a single surface);
   * `velocityGradient` is d(Ue/V∞)/d(s/L) there, from the incompressible speed √(1 − Cp). The analysis
   * finds it again with the flow cell's Mach number.
   */
  stagnation: z.object({ x: z.number(), y: z.number().nullable(), velocityGradient: z.number() }).nullable(),
  cpMin: z.object({ x: z.number(), cp: z.number(), surface: z.string() }),
  warnings: z.array(z.string()),
});
export type PressureResult = z.infer<typeof pressureResultSchema>;

/** Transition analysis: the engine's result (see engine.ts), as it answered. */
export const analysisResultSchema = engineResultSchema;

/** Parameter sweep: one row per step, the governing transition per surface and the drag. */
export const sweepResultSchema = z.object({
  parameter: sweepParameterSchema,
  values: z.array(z.number()),
  /** A grid's second parameter and its values; the steps then run over it at each value of the first (row by row). */
  second: z.object({ parameter: sweepParameterSchema, values: z.array(z.number()) }).optional(),
  steps: z.array(
    z.object({
      value: z.number(),
      /** The second parameter's value, in a grid. */
      value2: z.number().optional(),
      status: z.enum(['ok', 'error']),
      error: cellErrorSchema.nullable(),
      reynolds: z.number().nullable(),
      cd: z.number().nullable(),
      surfaces: z.array(
        z.object({
          name: z.string(),
          transitionS: z.number().nullable(),
          /** x/c of the transition where the table gives x. */
          transitionX: z.number().nullable(),
          by: z.string().nullable(),
          laminarSeparationS: z.number().nullable(),
          cd: z.number().nullable(),
          /** Where each evaluated criterion puts transition, x/c where the table gives x (else s); null when not reached. */
          criteria: z.record(z.string(), z.number().nullable()).optional(),
          /** Where the laminar run ends (governing transition, or the end of the surface), x/c as above. */
          laminarExtent: z.number().nullable().optional(),
        }),
      ),
      attachmentLine: z.object({ reBar: z.number(), verdict: z.string() }).nullable(),
    }),
  ),
  warnings: z.array(z.string()),
});
export type SweepResult = z.infer<typeof sweepResultSchema>;

/** A comparison's overlay: per named cell (by its input field), each surface's curves and, for analyses, transition and drag. */
export const comparisonResultSchema = z.object({
  entries: z.array(
    z.object({
      field: z.string(),
      kind: z.enum(['pressure', 'analysis']),
      flow: z.object({ reynolds: z.number(), mach: z.number(), nCrit: z.number() }).nullable(),
      cd: z.number().nullable(),
      surfaces: z.array(
        z.object({
          name: z.string(),
          /** x/c where the table gives x, else arc length s. */
          x: z.array(z.number()),
          cp: z.array(z.number().nullable()),
          n: z.array(z.number().nullable()).nullable(),
          H: z.array(z.number().nullable()).nullable(),
          transitionX: z.number().nullable(),
          by: z.string().nullable(),
          cd: z.number().nullable(),
        }),
      ),
    }),
  ),
  warnings: z.array(z.string()),
});
export type ComparisonResult = z.infer<typeof comparisonResultSchema>;

/** Flat-plate estimate: mean skin-friction coefficients per side on the free-stream dynamic pressure. */
export const flatPlateResultSchema = z.object({
  reynolds: z.number(),
  transitionReynolds: z.number(),
  /** Transition position as a fraction of the length. */
  transitionLocation: z.number(),
  cfLaminar: z.number(),
  cfTurbulent: z.number(),
  cfTurbulentPrandtl: z.number(),
  cfMixed: z.number(),
  /** Boundary-layer thickness at the end, divided by the length. */
  deltaLaminar: z.number(),
  deltaTurbulent: z.number(),
  /** Boundary-layer thickness at the end in metres, when the length is known. */
  deltaLaminar_m: z.number().nullable(),
  deltaTurbulent_m: z.number().nullable(),
  /** Friction drag saved by the laminar run, as a fraction of the all-turbulent value. */
  laminarSaving: z.number(),
  warnings: z.array(z.string()),
});
export type FlatPlateResult = z.infer<typeof flatPlateResultSchema>;

/** Leading-edge check: Poll's attachment-line Reynolds number and its verdict. */
export const leadingEdgeResultSchema = z.object({
  reynolds: z.number(),
  sweepDeg: z.number(),
  reBar: z.number(),
  verdict: z.enum(['laminar', 'contaminationRisk', 'unstable']),
  from: z.enum(['velocityGradient', 'leadingEdgeRadius']),
  /** Poll's thresholds used for the verdict. */
  thresholds: z.object({ contamination: z.number(), instability: z.number() }),
  warnings: z.array(z.string()),
});
export type LeadingEdgeResult = z.infer<typeof leadingEdgeResultSchema>;


/** Transition analysis: the engine's result (engine.ts), as it answered. */
export type AnalysisResult = EngineResult;

/** Each kind's schemas: its inputs, and its result when it computes something (a note does not). */
export const CELL_SCHEMAS = {
  flow: { inputs: flowInputsSchema, result: flowResultSchema },
  pressure: { inputs: pressureInputsSchema, result: pressureResultSchema },
  section: { inputs: sectionInputsSchema, result: sectionResultSchema },
  body: { inputs: bodyInputsSchema, result: bodyResultSchema },
  analysis: { inputs: analysisInputsSchema, result: analysisResultSchema },
  polar: { inputs: polarInputsSchema, result: polarResultSchema },
  sweep: { inputs: sweepInputsSchema, result: sweepResultSchema },
  comparison: { inputs: comparisonInputsSchema, result: comparisonResultSchema },
  flatPlate: { inputs: flatPlateInputsSchema, result: flatPlateResultSchema },
  leadingEdge: { inputs: leadingEdgeInputsSchema, result: leadingEdgeResultSchema },
  note: { inputs: noteInputsSchema, result: null },
} as const satisfies { [K in CellKind]: { inputs: z.ZodType; result: z.ZodType | null } };

/** The kinds that compute something, with a result schema. */
export type ComputedKind = { [K in CellKind]: (typeof CELL_SCHEMAS)[K]['result'] extends null ? never : K }[CellKind];

/** The result shape of each kind that computes something. */
export type CellResults = { [K in ComputedKind]: z.infer<NonNullable<(typeof CELL_SCHEMAS)[K]['result']>> };

/**
 * Inputs of a new cell: the kind's starter values (registry) with every other field at its schema
 * default, so the cell shows every value it will compute with. Fields without a default and not in
 * the starter stay out (they are optional).
 */
export function newCellInputs(kind: CellKind): Record<string, unknown> {
  const schema = CELL_SCHEMAS[kind].inputs as unknown as z.ZodObject;
  const inputs: Record<string, unknown> = {};
  for (const [field, fieldSchema] of Object.entries(schema.shape)) {
    const fallback = (fieldSchema as z.ZodType).safeParse(undefined);
    if (fallback.success && fallback.data !== undefined) inputs[field] = fallback.data;
  }
  return { ...inputs, ...structuredClone(CELL_KIND_REGISTRY[kind].starter) };
}
