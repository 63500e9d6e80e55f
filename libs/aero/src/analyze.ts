import {
  ENGINE_LIMITS,
  engineCaseSchema,
  type EngineCase,
  type EngineResult,
  type EngineSurfaceResult,
  type TransitionCause,
  type TransitionCriterion,
} from '@laminote/contracts';
import type { z } from 'zod';
import { attachmentLineCheck } from './attachment-line';
import { localMach, localMachFromVelocity } from './compressible';
import { compressibleThwaitesMarch } from './compressible-laminar';
import { arnalC1CriticalReDelta2, crossflowState, OWEN_RANDALL_CRITICAL, type CrossflowState } from './crossflow';
import { crossflowShapeAtLambda, emptyCrossflowShape } from './falkner-skan-cooke';
import { criticalReTheta, envelopeGrowthRate, MACK_TURBULENCE_RANGE, mackCriticalN } from './envelope-en';
import { deriveFlowCondition, type FlowCondition } from './flow-condition';
import { granvilleReThetaRise } from './granville';
import { headMarch, ludwiegTillmannCf, TURBULENT_START_SHAPE_FACTOR } from './head';
import { hRexTransitionLog10ReX } from './h-rex';
import { michelTransitionReTheta } from './michel';
import { keptPressureTable, type KeptPressureTableParse, type PressureTableRow } from './pressure-table';
import { bodyAt, inviscidTable, prepareSection, sectionAt } from './section-case';
import { ShapeInputError } from './shape-input';
import { leastSquaresSlope, smoothedSlope } from './smoothing';
import { splitAtStagnation, StagnationError } from './stagnation';
import { Scratch } from './scratch';
import { squireYoungDrag } from './squire-young';
import { attachmentLinePressureCoefficient, chordwiseVelocityRatio } from './swept-wing';
import { THWAITES_SEPARATION_LAMBDA, thwaitesMarch } from './thwaites';

/**
 * The engine's entry point: validate a case, march the boundary layer along each surface (Thwaites,
 * then Head after transition), evaluate the transition criteria, and estimate the drag (Squire–Young).
 * The API, the worker threads, the job queue and the command line all call `analyzeCase`.
 *
 * With leading-edge sweep Λ the section is taken as part of an infinite swept wing (simple sweep
 * theory, swept-wing.ts): the chordwise layer is marched on the chordwise edge velocity, and the
 * crossflow comes from the local Falkner–Skan–Cooke profile (falkner-skan-cooke.ts, crossflow.ts). With
 * M∞ > 0 the laminar layer is compressible (compressible-laminar.ts); the Tollmien–Schlichting envelope
 * and Head's turbulent layer stay incompressible, which the result says. Every chosen criterion is
 * located on the laminar solution marched on to its end (laminar separation or the last station),
 * whatever governs; the turbulent march starts at the governing transition.
 */

/** Bumped whenever a change alters the numbers the engine returns (outputs are cached on it). */
export const ENGINE_VERSION = '1.2.7';

export { ENGINE_CAUTION } from './caution';

/** Bad input: `field` names where, e.g. `surfaces[0].s[12]` or `pressureTable line 7`. */
export class CaseError extends Error {
  constructor(
    readonly field: string,
    readonly detail: string,
  ) {
    super(`${field}: ${detail}`);
    this.name = 'CaseError';
  }
}

const DEFAULT_N_CRIT = 9;
/** Cp may exceed the stagnation value by round-off in the input, not more. */
const STAGNATION_CP_TOLERANCE = 1e-6;
/** Half-width of the least-squares slope of a body radius (geometry, not measured scatter). */
const RADIUS_SMOOTHING_HALF_WIDTH = 2;
/** Free-stream temperature for Sutherland's law when the flow is given by Reynolds number: ISA sea level. */
const DEFAULT_TEMPERATURE_K = 288.15;
/** A Cp at the attachment-line (stagnation) value is accepted on the rear part of a surface only. */
const REAR_STAGNATION_FRACTION = 0.5;

interface PreparedSurface {
  name: string;
  s: Float64Array;
  ue: Float64Array;
  x: Float64Array | null;
  radius: Float64Array | null;
  trip: number | null;
  /** d(Ue/V∞)/ds at a stagnation-point start, when known better than from the stations. */
  stagnationGradient: number | null;
}

interface SurfaceContext {
  reynolds: number;
  mach: number;
  /** Leading-edge sweep in radians. */
  sweep: number;
  /** Free-stream static temperature for Sutherland's law. */
  temperature_K: number;
  nCrit: number;
  criteria: readonly TransitionCriterion[];
  /** How Ue(s) is smoothed before it is differentiated. */
  smoothing: EngineCase['smoothing'];
  /** The criteria whose earliest location governs. */
  governing: readonly TransitionCriterion[];
  turbulent: boolean;
  warnings: string[];
}

/**
 * The analysis's internal station arrays (a surface's copies of its input, its laminar and turbulent
 * states, the slopes) come from here; the result is built of plain arrays copied out of them. Kept up
 * to 2^16 doubles (512 kB), which holds an analysis of two surfaces of about 3 600 stations.
 */
const scratch = new Scratch(1 << 16);

/** Analyse a case (any JSON value); throws CaseError for bad input. */
export function analyzeCase(input: unknown): EngineResult {
  scratch.reset();
  const parsed = engineCaseSchema.safeParse(input);
  if (!parsed.success) throw caseErrorFromIssue(parsed.error.issues[0]);
  const engineCase: EngineCase = parsed.data;
  const warnings: string[] = [];

  let flow: FlowCondition;
  try {
    flow = deriveFlowCondition(engineCase.flow);
  } catch (error) {
    throw new CaseError('flow', error instanceof Error ? error.message : String(error));
  }
  const { nCrit, nCritFrom } = criticalN(engineCase.flow, warnings);
  const sweep = (engineCase.sweepDeg * Math.PI) / 180;
  const compressibleLaminar = flow.mach > 0;
  if (flow.mach >= 0.3) {
    warnings.push(
      `mach ${flow.mach}: the laminar layer is computed compressible; the Tollmien–Schlichting growth (eᴺ envelope), the single-point criteria and the turbulent layer (Head) are incompressible correlations applied to it`,
    );
  }

  let inviscid: EngineResult['inviscid'];
  let leadingEdgeRadius = engineCase.leadingEdgeRadius;
  let surfaces: PreparedSurface[];
  if (engineCase.section !== undefined || engineCase.body !== undefined) {
    const shape = surfacesFromShape(engineCase, flow.mach, sweep, warnings);
    surfaces = shape.surfaces;
    inviscid = shape.inviscid;
    leadingEdgeRadius ??= shape.leadingEdgeRadius;
  } else {
    surfaces =
      engineCase.pressureTable !== undefined && engineCase.pressureTable.trim() !== ''
        ? surfacesFromTable(engineCase.pressureTable, flow.mach, sweep, warnings)
        : engineCase.surfaces!.map((surface, index) => surfaceFromArrays(surface, index, flow.mach, sweep, warnings));
  }

  const criteria = [...new Set(engineCase.criteria)];
  // The envelope e^N method is the primary criterion of laminar-flow design practice, and on a swept
  // wing crossflow may end the laminar run first: by default the earlier of the two governs, and the
  // single-point correlations are shown beside them as cross-checks.
  const governing: TransitionCriterion[] =
    engineCase.governing === 'earliest'
      ? criteria
      : engineCase.governing !== undefined
        ? [engineCase.governing]
        : criteria.includes('eN')
          ? criteria.filter((c) => c === 'eN' || c === 'crossflow')
          : criteria;
  const temperature_K = flow.temperature_K ?? DEFAULT_TEMPERATURE_K;
  const context: SurfaceContext = {
    reynolds: flow.reynolds,
    mach: flow.mach,
    sweep,
    temperature_K,
    nCrit,
    criteria,
    governing,
    turbulent: engineCase.turbulent,
    smoothing: engineCase.smoothing,
    warnings,
  };
  const gradients: number[] = [];
  const results = surfaces.map((surface) => analyzeSurface(surface, context, gradients));

  let cd: number | null = 0;
  for (const r of results) cd = cd === null || r.cd === null ? null : cd + r.cd;
  if (engineCase.body !== undefined) {
    // Squire–Young's wake formula and the friction integral are the plane forms (drag per unit span);
    // on a body of revolution they give no drag coefficient, so none is reported.
    cd = null;
    for (const r of results) {
      r.cd = null;
      r.cdFriction = null;
    }
    warnings.push('body: no drag coefficient is given for a body of revolution (Squire–Young and the friction integral are plane forms, per unit span); transition and separation are given as on any surface');
  }

  let attachmentLine: EngineResult['attachmentLine'] = null;
  if (engineCase.sweepDeg !== 0) {
    const velocityGradient = gradients.length > 0 ? gradients.reduce((a, b) => a + b, 0) / gradients.length : null;
    attachmentLine = attachmentLineCheck({ reynolds: flow.reynolds, sweepDeg: engineCase.sweepDeg, velocityGradient, leadingEdgeRadius });
    if (attachmentLine === null) {
      warnings.push('attachment line not checked: give leadingEdgeRadius, or surfaces that start at the attachment line (Ue = 0)');
    } else if (attachmentLine.verdict !== 'laminar') {
      warnings.push(
        attachmentLine.verdict === 'unstable'
          ? `attachment line: R̄ = ${attachmentLine.reBar.toFixed(0)} is above Poll's instability value (about 580); the leading edge is expected to be turbulent`
          : `attachment line: R̄ = ${attachmentLine.reBar.toFixed(0)} is above Poll's contamination value (about 245); turbulence from a wing–body junction would spread along the leading edge`,
      );
    }
  }

  return {
    engineVersion: ENGINE_VERSION,
    flow: { reynolds: flow.reynolds, mach: flow.mach, nCrit, nCritFrom, sweepDeg: engineCase.sweepDeg, compressibleLaminar, ...(compressibleLaminar ? { temperature_K } : {}), ...(sweep !== 0 ? { crossflowCritical: OWEN_RANDALL_CRITICAL } : {}) },
    surfaces: results,
    ...(inviscid ? { inviscid } : {}),
    cd,
    attachmentLine,
    warnings,
  };
}

/**
 * A section's or a body's surfaces from the panel methods (section-case.ts): the section's Cp loop is
 * read as a pasted table would be; the body is one surface from the nose with its radius (Mangler).
 */
function surfacesFromShape(
  engineCase: EngineCase,
  mach: number,
  sweep: number,
  warnings: string[],
): { surfaces: PreparedSurface[]; inviscid: NonNullable<EngineResult['inviscid']>; leadingEdgeRadius: number | undefined } {
  const key = engineCase.section !== undefined ? 'section' : 'body';
  try {
    if (engineCase.section !== undefined) {
      const prepared = prepareSection(engineCase.section);
      warnings.push(...prepared.warnings.map((w) => `section: ${w}`));
      const inviscid = sectionAt(prepared, engineCase.section, mach);
      const table = inviscidTable(inviscid);
      const radius = prepared.geometry.leadingEdgeRadius;
      return { surfaces: surfacesFromTable(table, mach, sweep, warnings), inviscid, leadingEdgeRadius: Number.isFinite(radius) && radius > 0 ? radius : undefined };
    }
    const body = bodyAt(engineCase.body!);
    if (mach > 0) warnings.push(`body: the surface speeds are incompressible; the Mach number (${mach}) enters only through the boundary layer`);
    const surface = surfaceFromArrays({ name: 'body', s: [0, ...body.s], ue: [0, ...body.speed.map(Math.abs)], r: [0, ...body.r] }, 0, mach, sweep, warnings);
    surface.x = Float64Array.from([0, ...body.x]);
    const { s: _s, speed: _speed, ...inviscid } = body;
    return { surfaces: [surface], inviscid, leadingEdgeRadius: undefined };
  } catch (error) {
    if (error instanceof ShapeInputError) throw new CaseError(`${key}.${error.field}${error.line ? ` line ${error.line}` : ''}`, error.message.replace(/^line \d+: /, ''));
    throw error;
  }
}

function criticalN(flow: EngineCase['flow'], warnings: string[]): { nCrit: number; nCritFrom: EngineResult['flow']['nCritFrom'] } {
  if (flow.nCrit !== undefined) {
    if (flow.turbulenceIntensity !== undefined) warnings.push('flow.nCrit is given, so flow.turbulenceIntensity is not used');
    return { nCrit: flow.nCrit, nCritFrom: 'given' };
  }
  if (flow.turbulenceIntensity !== undefined) {
    const tu = flow.turbulenceIntensity;
    if (tu < MACK_TURBULENCE_RANGE[0] || tu > MACK_TURBULENCE_RANGE[1]) {
      warnings.push(`turbulenceIntensity ${tu} is outside the range of Mack's relation (about ${MACK_TURBULENCE_RANGE[0]} to ${MACK_TURBULENCE_RANGE[1]}); N_crit is extrapolated`);
    }
    return { nCrit: mackCriticalN(tu), nCritFrom: 'turbulenceIntensity' };
  }
  return { nCrit: DEFAULT_N_CRIT, nCritFrom: 'default' };
}

function caseErrorFromIssue(issue: z.core.$ZodIssue): CaseError {
  let field = '';
  for (const key of issue.path) {
    field += typeof key === 'number' ? `[${key}]` : field === '' ? String(key) : `.${String(key)}`;
  }
  if (issue.code === 'unrecognized_keys') {
    const key = issue.keys[0];
    return new CaseError(field === '' ? key : `${field}.${key}`, 'unknown field');
  }
  if (issue.code === 'invalid_type' && / received undefined$/.test(issue.message)) {
    return new CaseError(field === '' ? 'case' : field, 'missing');
  }
  if (field === '' && issue.code === 'invalid_type') return new CaseError('case', 'must be a JSON object with flow and surfaces or pressureTable');
  return new CaseError(field === '' ? 'case' : field, issue.message);
}

function surfaceFromArrays(surface: NonNullable<EngineCase['surfaces']>[number], index: number, mach: number, sweep: number, warnings: string[]): PreparedSurface {
  let n = surface.s.length;
  const s = scratch.take(n);
  for (let i = 0; i < n; i++) s[i] = surface.s[i];
  const ue = scratch.take(n);
  const prefix = `surfaces[${index}]`;
  let maxLocalMach = 0;
  if (surface.cp !== undefined) {
    const cp0 = attachmentLinePressureCoefficient(mach, sweep);
    const where = sweep === 0 ? 'stagnation' : 'attachment-line';
    for (let i = 0; i < n; i++) {
      const cp = surface.cp[i];
      if (cp > cp0 + STAGNATION_CP_TOLERANCE) {
        throw new CaseError(`${prefix}.cp[${i}]`, `Cp ${cp} is above the ${where} value ${cp0.toFixed(4)} at mach ${mach}${sweep === 0 ? '' : ` and ${round((sweep * 180) / Math.PI)}° sweep (Cp is taken on the free stream of a wing at this sweep)`}`);
      }
      const u = cp >= cp0 ? 0 : chordwiseVelocityRatio(cp, mach, sweep);
      if (Number.isNaN(u)) throw new CaseError(`${prefix}.cp[${i}]`, `Cp ${cp} is below the vacuum limit at mach ${mach}`);
      ue[i] = u;
      if (mach > 0) maxLocalMach = Math.max(maxLocalMach, localMach(cp, mach));
    }
  } else {
    const given = surface.ue!;
    for (let i = 0; i < n; i++) ue[i] = given[i];
    if (mach > 0) for (let i = 0; i < n; i++) maxLocalMach = Math.max(maxLocalMach, localMachFromVelocity(Math.hypot(ue[i], Math.sin(sweep)), mach));
  }
  const end = rearStagnation(s, ue);
  if (end.zeroAt > 0) {
    if (!end.rear) throw new CaseError(`${prefix}.${surface.cp !== undefined ? 'cp' : 'ue'}[${end.zeroAt}]`, 'the edge velocity falls to zero (stagnation) ahead of the rear half of the surface');
    warnings.push(`${surface.name}: rear stagnation point at s = ${round(s[end.zeroAt])}; the march ends at the station before it`);
    n = end.zeroAt;
  }
  if (maxLocalMach > 1) {
    warnings.push(`${surface.name}: local Mach number up to ${maxLocalMach.toFixed(2)} (supersonic pocket); the methods assume subsonic attached flow, results there are doubtful`);
  }
  if (s[0] > 0 && ue[0] > 0) {
    warnings.push(`${surface.name}: the first station is at s = ${s[0]} with Ue > 0; the boundary layer is taken to start there`);
  }
  return {
    name: surface.name,
    s: s.subarray(0, n),
    ue: ue.subarray(0, n),
    x: null,
    radius: surface.r === undefined ? null : copyOf(surface.r).subarray(0, n),
    trip: surface.trip !== undefined && surface.trip <= s[n - 1] ? surface.trip : null,
    stagnationGradient: null,
  };
}

/**
 * The first station after the start where the edge velocity is zero, and whether it lies on the rear
 * part of the surface (a rear stagnation point: the trailing edge of a closed body, a blunt trailing
 * edge), where the march may stop ahead of it. zeroAt is −1 when there is none.
 */
function rearStagnation(s: ArrayLike<number>, ue: ArrayLike<number>): { zeroAt: number; rear: boolean } {
  const n = s.length;
  for (let i = 1; i < n; i++) {
    if (!(ue[i] > 0)) {
      const rear = s[i] - s[0] >= REAR_STAGNATION_FRACTION * (s[n - 1] - s[0]) && i >= 3;
      return { zeroAt: i, rear };
    }
  }
  return { zeroAt: -1, rear: false };
}

/**
 * The surfaces of the table read last, at the Mach number and sweep they were prepared for, with the
 * warnings their preparation gave: a study run again with another Reynolds number or N_crit, or a sweep
 * over them, prepares the same surfaces from the same (kept) table. Their arrays are the split's own,
 * never the scratch buffer's, and nothing writes into a prepared surface's arrays.
 */
let lastTableSurfaces: { table: KeptPressureTableParse; mach: number; sweep: number; surfaces: readonly PreparedSurface[]; warnings: readonly string[] } | null = null;

function surfacesFromTable(text: string, mach: number, sweep: number, warnings: string[]): PreparedSurface[] {
  const table = keptPressureTable(text, { maxRows: ENGINE_LIMITS.maxTableRows });
  if (!table.ok) {
    const problem = table.problems[0];
    throw new CaseError(problem.line > 0 ? `pressureTable line ${problem.line}` : 'pressureTable', problem.message);
  }
  const last = lastTableSurfaces;
  if (last !== null && last.table === table && last.mach === mach && last.sweep === sweep) {
    warnings.push(...last.warnings);
    return last.surfaces.map((surface) => ({ ...surface }));
  }
  const added: string[] = [];
  const surfaces = splitTable(table.rows, table.hasY, mach, sweep, added);
  warnings.push(...added);
  lastTableSurfaces = { table, mach, sweep, surfaces: surfaces.map((surface) => ({ ...surface })), warnings: added };
  return surfaces;
}

/** A closed loop's rows as two surfaces from the stagnation point, at this Mach number and sweep. */
function splitTable(rows: readonly Readonly<PressureTableRow>[], hasY: boolean, mach: number, sweep: number, warnings: string[]): PreparedSurface[] {
  const n = rows.length;
  const x = scratch.take(n);
  const y = hasY ? scratch.take(n) : null;
  const speed = scratch.take(n);
  const cp0 = attachmentLinePressureCoefficient(mach, sweep);
  const where = sweep === 0 ? 'stagnation' : 'attachment-line';
  let maxLocalMach = 0;
  for (let i = 0; i < n; i++) {
    const row = rows[i];
    x[i] = row.x;
    if (y !== null) y[i] = row.y!;
    if (row.cp > cp0 + STAGNATION_CP_TOLERANCE) {
      throw new CaseError(`pressureTable line ${row.line}`, `Cp ${row.cp} is above the ${where} value ${cp0.toFixed(4)} at mach ${mach}${sweep === 0 ? '' : ` and ${round((sweep * 180) / Math.PI)}° sweep (Cp is taken on the free stream of a wing at this sweep)`}`);
    }
    const u = row.cp >= cp0 ? 0 : chordwiseVelocityRatio(row.cp, mach, sweep);
    if (Number.isNaN(u)) throw new CaseError(`pressureTable line ${row.line}`, `Cp ${row.cp} is below the vacuum limit at mach ${mach}`);
    speed[i] = u;
    if (mach > 0) maxLocalMach = Math.max(maxLocalMach, localMach(row.cp, mach));
  }
  let split;
  try {
    split = splitAtStagnation(x, y, speed);
  } catch (error) {
    if (error instanceof StagnationError) {
      throw new CaseError(error.row > 0 || n === 0 ? `pressureTable line ${rows[Math.min(error.row, n - 1)].line}` : 'pressureTable', error.message);
    }
    throw error;
  }
  if (y === null) {
    warnings.push('pressureTable has no y column: arc length is taken from x alone, which understates it round the leading edge; the first part of the loop is named upper');
  }
  if (maxLocalMach > 1) {
    warnings.push(`pressureTable: local Mach number up to ${maxLocalMach.toFixed(2)} (supersonic pocket); the methods assume subsonic attached flow, results there are doubtful`);
  }
  const prepared: PreparedSurface[] = [];
  for (const [name, branch] of [['upper', split.upper] as const, ['lower', split.lower] as const]) {
    if (branch.s.length < 3) {
      throw new CaseError('pressureTable', `the ${name} surface has fewer than 3 points after the stagnation point`);
    }
    let count = branch.s.length;
    // The split's first station is the stagnation point itself; a zero just after it is round-off.
    const end = rearStagnation(branch.s.subarray(1), branch.ue.subarray(1));
    if (end.zeroAt > 0) {
      const at = end.zeroAt + 1;
      if (!end.rear) {
        throw new CaseError(`pressureTable line ${rows[branch.source[at]].line}`, `Cp reaches the ${where} value on the ${name} surface away from the leading edge and ahead of its rear half`);
      }
      warnings.push(`${name}: rear stagnation point at x = ${round(branch.x[at])}; the march ends at the station before it`);
      count = at;
    }
    prepared.push({
      name,
      s: branch.s.subarray(0, count),
      ue: branch.ue.subarray(0, count),
      x: branch.x.subarray(0, count),
      radius: null,
      trip: null,
      stagnationGradient: split.stagnation.velocityGradient,
    });
  }
  return prepared;
}

/** First upward crossing of g through zero between stations i−1 and i, as a fraction of the interval. */
function crossing(gPrev: number, g: number): number {
  return Number.isFinite(gPrev) && gPrev < g ? Math.min(1, Math.max(0, gPrev / (gPrev - g))) : 1;
}

type CriterionEntry = NonNullable<EngineSurfaceResult['transition']['criteria'][TransitionCriterion]>;

function analyzeSurface(surface: PreparedSurface, context: SurfaceContext, gradients: number[]): EngineSurfaceResult {
  const { s, ue, radius } = surface;
  const { reynolds, nCrit, criteria, warnings } = context;
  const n = s.length;

  const dUeds = scratch.take(n);
  const smoothing = smoothedSlope(s, ue, context.smoothing === 'off' ? 1 : context.smoothing, dUeds);
  const stagnationStart = ue[0] === 0;
  if (stagnationStart && surface.stagnationGradient !== null) dUeds[0] = surface.stagnationGradient;
  if (stagnationStart && dUeds[0] > 0) gradients.push(dUeds[0]);
  let dRds: Float64Array | null = null;
  if (radius !== null) dRds = leastSquaresSlope(s, radius, scratch.take(n), RADIUS_SMOOTHING_HALF_WIDTH);

  const theta = scratch.take(n);
  const lambda = scratch.take(n);
  // The kinematic shape factor, which the transition correlations take; `physicalShape` is δ*/θ.
  const shape = scratch.take(n);
  const cf = scratch.take(n);
  const wallShear = scratch.take(n);
  const laminar = { theta, lambda, shapeFactor: shape, skinFriction: cf, wallShear };
  // Local unit Reynolds number over the free-stream one (ρe μ∞ / ρ∞ μe): 1 in incompressible flow.
  let reynoldsRatio: Float64Array | null = null;
  let physicalShape = shape;
  if (context.mach > 0) {
    reynoldsRatio = scratch.take(n);
    physicalShape = scratch.take(n);
    compressibleThwaitesMarch(s, ue, dUeds, reynolds, radius, { mach: context.mach, sweep: context.sweep, temperature_K: context.temperature_K }, laminar, {
      reynoldsRatio,
      densityRatio: scratch.take(n),
      shapeFactor: physicalShape,
    });
  } else {
    thwaitesMarch(s, ue, dUeds, reynolds, radius, laminar);
  }
  if (!(theta[0] >= 0)) {
    // A stagnation start without a positive velocity gradient: take the state of the next station.
    theta[0] = theta[1];
    lambda[0] = lambda[1];
    shape[0] = shape[1];
    if (physicalShape !== shape) physicalShape[0] = physicalShape[1];
    wallShear[0] = 0;
    warnings.push(`${surface.name}: Ue rises too slowly from the stagnation point to set the start of the laminar layer; the second station's state is used`);
  }

  // Laminar separation of the laminar solution: first station where λ falls to −0.09.
  let separationIndex = n;
  let laminarSeparationS: number | null = null;
  for (let i = 1; i < n; i++) {
    if (lambda[i] <= THWAITES_SEPARATION_LAMBDA) {
      const f = crossing(THWAITES_SEPARATION_LAMBDA - lambda[i - 1], THWAITES_SEPARATION_LAMBDA - lambda[i]);
      laminarSeparationS = s[i - 1] + f * (s[i] - s[i - 1]);
      separationIndex = i;
      break;
    }
  }

  // Every chosen criterion along the laminar solution, marched on to laminar separation or the end of
  // the surface whatever governs.
  const localRe = (i: number) => (reynoldsRatio === null ? reynolds : reynolds * reynoldsRatio[i]);
  const nFactor = scratch.take(n);
  const spanwise = Math.sin(Math.abs(context.sweep));
  const swept = spanwise > 0;
  const reCf = swept ? scratch.take(n) : null;
  const wantEN = criteria.includes('eN');
  const wantMichel = criteria.includes('michel');
  const wantHRx = criteria.includes('hRx');
  const wantGranville = criteria.includes('granville');
  const wantCrossflow = swept && criteria.includes('crossflow');
  const wantC1 = swept && criteria.includes('crossflowC1');
  const found: Partial<Record<TransitionCriterion, { s: number; reTheta: number; reS: number; reCf?: number; reDelta2?: number } | null>> = {};
  for (const c of criteria) found[c] = null;
  const record = (criterion: TransitionCriterion, i: number, f: number, extra?: { reCf?: number; reDelta2?: number }) => {
    const si = s[i - 1] + f * (s[i] - s[i - 1]);
    const reThetaPrev = localRe(i - 1) * ue[i - 1] * theta[i - 1];
    const reThetaHere = localRe(i) * ue[i] * theta[i];
    const uAt = ue[i - 1] + f * (ue[i] - ue[i - 1]);
    const reAt = localRe(i - 1) + f * (localRe(i) - localRe(i - 1));
    if (laminarSeparationS !== null && si > laminarSeparationS) return;
    found[criterion] = { s: si, reTheta: reThetaPrev + f * (reThetaHere - reThetaPrev), reS: reAt * uAt * si, ...extra };
    located++;
  };
  let located = 0;
  let gEN = -Infinity;
  let gMichel = -Infinity;
  let gHRx = -Infinity;
  let gGranville = -Infinity;
  let gCrossflow = -Infinity;
  let gC1 = -Infinity;
  let reCfPrev = 0;
  let reDelta2Prev = 0;
  let rate = 0;
  let instabilityS = NaN;
  let instabilityReTheta = NaN;
  let lambdaIntegral = 0;
  const fsc = emptyCrossflowShape();
  const cross: CrossflowState = { reCf: 0, reDelta2: 0, streamwiseShapeFactor: 0 };
  // Stations are evaluated up to the first one past laminar separation; a criterion met beyond the
  // separation point is not reported (the laminar solution ends there).
  const last = Math.min(n - 1, separationIndex);
  for (let i = 0; i <= last; i++) {
    const reTheta = localRe(i) * ue[i] * theta[i];
    const reS = localRe(i) * ue[i] * s[i];
    const h = shape[i];
    const critical = criticalReTheta(h);
    // Envelope N by the trapezoidal rule on dN/ds.
    const rateHere = reTheta > critical ? envelopeGrowthRate(h, theta[i]) : 0;
    if (i > 0) nFactor[i] = nFactor[i - 1] + 0.5 * (rate + rateHere) * (s[i] - s[i - 1]);
    rate = rateHere;
    if (reCf !== null) {
      if (ue[i] > 0 && theta[i] > 0) {
        crossflowState(ue[i], spanwise, theta[i], localRe(i), crossflowShapeAtLambda(lambda[i], fsc), cross);
      } else {
        cross.reCf = 0;
        cross.reDelta2 = 0;
      }
      reCf[i] = cross.reCf;
    }
    if (i === 0) continue;
    if (wantEN && found.eN === null) {
      const g = nFactor[i] - nCrit;
      if (g >= 0) record('eN', i, crossing(gEN, g));
      gEN = g;
    }
    if (wantMichel && found.michel === null && reS > 0) {
      const g = reTheta - michelTransitionReTheta(reS);
      if (g >= 0) record('michel', i, crossing(gMichel, g));
      gMichel = g;
    }
    if (wantHRx && found.hRx === null && reS > 0) {
      // In logarithms, with the correlation's own log10: no power and no second logarithm per station.
      const g = Math.log(reS) - Math.LN10 * hRexTransitionLog10ReX(h);
      if (g >= 0) record('hRx', i, crossing(gHRx, g));
      gHRx = g;
    }
    if (wantGranville && found.granville === null) {
      if (Number.isNaN(instabilityS)) {
        if (reTheta >= critical) {
          const reThetaPrev = localRe(i - 1) * ue[i - 1] * theta[i - 1];
          const criticalPrev = criticalReTheta(shape[i - 1]);
          const f = crossing(reThetaPrev - criticalPrev, reTheta - critical);
          instabilityS = s[i - 1] + f * (s[i] - s[i - 1]);
          instabilityReTheta = reThetaPrev + f * (reTheta - reThetaPrev);
          const lambdaAt = lambda[i - 1] + f * (lambda[i] - lambda[i - 1]);
          lambdaIntegral = 0.5 * (lambdaAt + lambda[i]) * (s[i] - instabilityS);
        }
      } else {
        lambdaIntegral += 0.5 * (lambda[i - 1] + lambda[i]) * (s[i] - s[i - 1]);
      }
      if (!Number.isNaN(instabilityS)) {
        const meanLambda = s[i] > instabilityS ? lambdaIntegral / (s[i] - instabilityS) : lambda[i];
        const g = reTheta - instabilityReTheta - granvilleReThetaRise(meanLambda);
        if (g >= 0) record('granville', i, crossing(gGranville, g));
        gGranville = g;
      }
    }
    if (wantCrossflow && found.crossflow === null) {
      const g = cross.reCf - OWEN_RANDALL_CRITICAL;
      if (g >= 0) {
        const f = crossing(gCrossflow, g);
        record('crossflow', i, f, { reCf: reCfPrev + f * (cross.reCf - reCfPrev) });
      }
      gCrossflow = g;
    }
    if (wantC1 && found.crossflowC1 === null) {
      const g = cross.reDelta2 - arnalC1CriticalReDelta2(cross.streamwiseShapeFactor);
      if (g >= 0) {
        const f = crossing(gC1, g);
        record('crossflowC1', i, f, { reDelta2: reDelta2Prev + f * (cross.reDelta2 - reDelta2Prev) });
      }
      gC1 = g;
    }
    reCfPrev = cross.reCf;
    reDelta2Prev = cross.reDelta2;
    // Every chosen criterion is located at or before this station, so the governing transition is too,
    // and the N and crossflow curves end no later than the next station (curveEnd): nothing further
    // down the laminar solution is shown, and the loop stops.
    if (located === criteria.length && located > 0) break;
  }

  // The governing transition: the earliest of the governing criteria, then a trip or laminar
  // separation ahead of it.
  let transitionS: number | null = null;
  let transitionBy: TransitionCause | null = null;
  for (const c of context.governing) {
    const r = found[c];
    if (r != null && (transitionS === null || r.s < transitionS)) {
      transitionS = r.s;
      transitionBy = c;
    }
  }
  if (surface.trip !== null && (transitionS === null || surface.trip < transitionS) && (laminarSeparationS === null || surface.trip <= laminarSeparationS)) {
    transitionS = surface.trip;
    transitionBy = 'trip';
  }
  let laminarSeparation: { s: number } | null = null;
  if (laminarSeparationS !== null && (transitionS === null || laminarSeparationS < transitionS)) {
    transitionS = laminarSeparationS;
    transitionBy = 'laminarSeparation';
    laminarSeparation = { s: laminarSeparationS };
    warnings.push(
      `${surface.name}: laminar separation at s = ${round(laminarSeparationS)} ahead of natural transition; the layer is assumed to reattach turbulent at once (a short bubble), which a long bubble or stall would not do`,
    );
  }
  if (found.michel != null && (found.michel.reS < 1e5 || found.michel.reS > 4e7)) {
    warnings.push(`${surface.name}: Michel's criterion is applied at Re_s = ${found.michel.reS.toExponential(2)}, outside the range it was fitted to (1e5 to 4e7)`);
  }
  const entries: Partial<Record<TransitionCriterion, CriterionEntry>> = {};
  for (const c of criteria) {
    const r = found[c];
    entries[c] =
      r != null
        ? r
        : { s: null, reason: (c === 'crossflow' || c === 'crossflowC1') && !swept ? 'noSweep' : laminarSeparationS !== null ? 'afterLaminarSeparation' : 'notReached' };
  }

  // Station values: laminar up to transition, then overwritten by the turbulent march.
  let turbulentSeparation: { s: number } | null = null;
  let cd: number | null;
  let cdFriction: number | null;
  const transitionAt = transitionS ?? Infinity;
  let firstTurbulent = 0;
  while (firstTurbulent < n && s[firstTurbulent] <= transitionAt) firstTurbulent++;
  if (firstTurbulent >= n) {
    // Laminar to the last station (transition, if any, is at the trailing edge itself).
    cd = squireYoungDrag(theta[n - 1], ue[n - 1], shape[n - 1]);
    cdFriction = integrateShear(s, wallShear, n - 1, null);
  } else {
    if (!context.turbulent) {
      for (const a of [theta, shape, cf]) markFrom(a, firstTurbulent, n);
      cd = null;
      cdFriction = null;
      warnings.push(`${surface.name}: the turbulent march is switched off, so the drag after transition at s = ${round(transitionAt)} is not estimated`);
    } else {
      // The laminar state at transition, interpolated in the interval that holds it.
      const k = Math.max(0, firstTurbulent - 1);
      const k1 = Math.min(n - 1, k + 1);
      const w = k1 > k ? Math.min(1, Math.max(0, (transitionAt - s[k]) / (s[k1] - s[k]))) : 0;
      let start = {
        s: transitionAt,
        index: k,
        theta: theta[k] + w * (theta[k1] - theta[k]),
        ue: ue[k] + w * (ue[k1] - ue[k]),
        laminarShear: Number.isFinite(wallShear[k]) ? wallShear[k] + w * (wallShear[k1] - wallShear[k]) : wallShear[k1],
      };
      if (!(start.ue > 0 && start.theta > 0)) {
        // Transition forced at the leading edge or the stagnation point itself: the turbulent layer
        // starts from the laminar state at the next station.
        start = { s: s[1], index: 1, theta: theta[1], ue: ue[1], laminarShear: wallShear[1] };
      }
      const turbulentShear = ludwiegTillmannCf(TURBULENT_START_SHAPE_FACTOR, reynolds * start.ue * start.theta) * start.ue * start.ue;
      const march = headMarch(
        { s, ue, dUeds, radius, dRds, reynolds, startS: start.s, startTheta: start.theta },
        { theta: theta, shapeFactor: shape, skinFriction: cf },
      );
      for (let j = start.index + 1; j < n; j++) wallShear[j] = cf[j] * ue[j] * ue[j];
      if (march.separationS !== null) {
        turbulentSeparation = { s: march.separationS };
        warnings.push(`${surface.name}: turbulent separation at s = ${round(march.separationS)}; the march stops there and the drag is only indicative (Squire–Young at separation)`);
      }
      cd = squireYoungDrag(march.endTheta, march.endUe, march.endShapeFactor);
      cdFriction = integrateShear(s, wallShear, march.lastIndex, { s: start.s, index: start.index, laminar: start.laminarShear, turbulent: turbulentShear });
    }
  }

  // The N and crossflow curves of the laminar solution run on past the governing transition to where
  // their own criterion is met, so each meets its critical value at its mark; nothing after the end of
  // the laminar solution.
  markFrom(nFactor, curveEnd(s, last, transitionS, found.eN?.s ?? null), n);
  if (reCf !== null) markFrom(reCf, curveEnd(s, last, transitionS, found.crossflow?.s ?? null), n);
  let outputShape = shape;
  if (physicalShape !== shape) {
    outputShape = copyOf(shape);
    for (let i = 0; i < Math.min(firstTurbulent, n); i++) outputShape[i] = physicalShape[i];
  }
  const stations: EngineSurfaceResult['stations'] = {
    s: numbers(s),
    ue: numbers(ue),
    theta: nullable(theta, n),
    deltaStar: product(theta, outputShape, n),
    H: nullable(outputShape, n),
    cf: nullable(cf, n),
    n: nullable(nFactor, n),
    reCf: reCf === null ? new Array<null>(n).fill(null) : nullable(reCf, n),
  };
  if (surface.x !== null) stations.x = numbers(surface.x);
  if (reynoldsRatio !== null) stations.reynoldsRatio = numbers(reynoldsRatio);
  return {
    name: surface.name,
    stations,
    transition: { s: transitionS, by: transitionBy, criteria: entries, laminarSeparationS },
    laminarSeparation,
    turbulentSeparation,
    cd,
    cdFriction,
    smoothing,
  };
}

/**
 * ∫ τw ds / (½ ρ V∞² L) by the trapezoidal rule up to station `end`, splitting the interval that holds
 * the transition, and integrating a sharp leading edge's τ ∝ s^−½ exactly.
 */
function integrateShear(
  s: Float64Array,
  shear: Float64Array,
  end: number,
  transition: { s: number; index: number; laminar: number; turbulent: number } | null,
): number {
  let total = 0;
  for (let i = 1; i <= end; i++) {
    const ds = s[i] - s[i - 1];
    if (transition !== null && i - 1 === transition.index) {
      const a = Number.isFinite(shear[i - 1]) ? 0.5 * (shear[i - 1] + transition.laminar) * (transition.s - s[i - 1]) : 2 * transition.laminar * (transition.s - s[i - 1]);
      total += a + 0.5 * (transition.turbulent + shear[i]) * (s[i] - transition.s);
    } else if (!Number.isFinite(shear[i - 1])) {
      total += 2 * shear[i] * ds;
    } else {
      total += 0.5 * (shear[i - 1] + shear[i]) * ds;
    }
  }
  return total;
}

/**
 * Where a laminar-solution curve ends (exclusive): after the first station at or past both the
 * governing transition and the curve's own criterion, and never past `last`, the end of the laminar
 * solution. Without a transition the curve runs to `last`.
 */
function curveEnd(s: Float64Array, last: number, transitionS: number | null, criterionS: number | null): number {
  if (transitionS === null) return last + 1;
  const until = Math.max(transitionS, criterionS ?? -Infinity);
  let i = 0;
  while (i < last && s[i] < until) i++;
  return i + 1;
}

function markFrom(a: Float64Array, from: number, n: number): void {
  for (let i = from; i < n; i++) a[i] = NaN;
}

/** A scratch copy of `values`. */
function copyOf(values: ArrayLike<number>): Float64Array {
  const out = scratch.take(values.length);
  for (let i = 0; i < values.length; i++) out[i] = values[i];
  return out;
}

/** A plain array of a typed one's values (an indexed copy: `Array.from` goes through the iterator). */
function numbers(a: Float64Array): number[] {
  const n = a.length;
  const out = new Array<number>(n);
  for (let i = 0; i < n; i++) out[i] = a[i];
  return out;
}

// The result arrays: where every value is finite, a loop that stores numbers only (V8 keeps the array
// unboxed and the store site simple); the loop with nulls otherwise. One loop for both cases was twice
// as slow for either (its store site saw both kinds), a few per cent of an analysis at 300 stations.
function nullable(a: Float64Array, n: number): (number | null)[] {
  let finite = 0;
  while (finite < n && Number.isFinite(a[finite])) finite++;
  const out = new Array<number | null>(n);
  if (finite === n) {
    for (let i = 0; i < n; i++) out[i] = a[i];
  } else {
    for (let i = 0; i < n; i++) out[i] = Number.isFinite(a[i]) ? a[i] : null;
  }
  return out;
}

function product(a: Float64Array, b: Float64Array, n: number): (number | null)[] {
  let finite = 0;
  while (finite < n && Number.isFinite(a[finite] * b[finite])) finite++;
  const out = new Array<number | null>(n);
  if (finite === n) {
    for (let i = 0; i < n; i++) out[i] = a[i] * b[i];
  } else {
    for (let i = 0; i < n; i++) {
      const v = a[i] * b[i];
      out[i] = Number.isFinite(v) ? v : null;
    }
  }
  return out;
}

function round(value: number): string {
  return Number(value.toPrecision(4)).toString();
}
