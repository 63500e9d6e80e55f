import {
  analyzeCase,
  attachmentLineCheck,
  CaseError,
  deriveFlowCondition,
  edgeVelocityRatio,
  flatPlateEstimate,
  loopArcLength,
  MACK_TURBULENCE_RANGE,
  mackCriticalN,
  parsePressureTable,
  POLL_CONTAMINATION_RE_BAR,
  POLL_INSTABILITY_RE_BAR,
  splitAtStagnation,
  stagnationPressureCoefficient,
  StagnationError,
  type PressureTableRow,
} from '@laminote/aero';
import type {
  AnalysisInputs,
  CellError,
  EngineCaseInput,
  EngineResult,
  FlatPlateInputs,
  FlatPlateResult,
  FlowInputs,
  FlowResult,
  LeadingEdgeInputs,
  LeadingEdgeResult,
  PressureInputs,
  PressureResult,
  SweepInputs,
  SweepResult,
} from '@laminote/contracts';

/**
 * What the engine worker threads compute, one function per cell kind. Pure: a task holds validated
 * inputs of the cell and of the cells it names; the answer is a result or the engine's one-line
 * message with the field at fault. Anything else thrown is a server fault and is not stored.
 */

export type EngineTask =
  | { kind: 'flow'; inputs: FlowInputs }
  | { kind: 'pressure'; inputs: PressureInputs }
  | { kind: 'analysis'; inputs: AnalysisInputs; flow: FlowInputs; pressure: PressureInputs }
  | { kind: 'sweep'; inputs: SweepInputs; analysis: AnalysisInputs; flow: FlowInputs; pressure: PressureInputs }
  | { kind: 'flatPlate'; inputs: FlatPlateInputs }
  | { kind: 'leadingEdge'; inputs: LeadingEdgeInputs; flow: FlowInputs | null };

export type EngineOutcome = { status: 'ok'; result: unknown; durationMs: number } | { status: 'error'; error: CellError; durationMs: number };

/** An outcome as a worker hands it back: the result already serialised, off the event loop. */
export interface ComputedOutput {
  status: 'ok' | 'error';
  /** JSON text of the result when status is ok. */
  resultJson: string | null;
  error: CellError | null;
  durationMs: number;
}

/** Bad input found here rather than by the engine; carries the field (and table line) at fault. */
class InputError extends Error {
  constructor(
    readonly field: string,
    message: string,
    readonly line?: number,
    readonly problems?: { line: number; message: string }[],
  ) {
    super(message);
  }
}

export function runTask(task: EngineTask): EngineOutcome {
  const started = performance.now();
  try {
    const result = compute(task);
    return { status: 'ok', result, durationMs: performance.now() - started };
  } catch (error) {
    const cellError = toCellError(error);
    if (!cellError) throw error;
    return { status: 'error', error: cellError, durationMs: performance.now() - started };
  }
}

/** Significant digits results are kept to: beyond single precision, far beyond what the methods resolve. */
export const RESULT_DIGITS = 7;

const rounded = (_key: string, v: unknown) => (typeof v === 'number' && !Number.isInteger(v) && Number.isFinite(v) ? Number(v.toPrecision(RESULT_DIGITS)) : v);

/** What the worker threads run: the outcome with its result as JSON text, numbers to RESULT_DIGITS. */
export function computeOutput(task: EngineTask): ComputedOutput {
  const outcome = runTask(task);
  return outcome.status === 'ok'
    ? { status: 'ok', resultJson: JSON.stringify(outcome.result, rounded), error: null, durationMs: outcome.durationMs }
    : { status: 'error', resultJson: null, error: outcome.error, durationMs: outcome.durationMs };
}

function compute(task: EngineTask): unknown {
  switch (task.kind) {
    case 'flow':
      return flowResult(task.inputs);
    case 'pressure':
      return pressureResult(task.inputs);
    case 'analysis':
      return analyze(task.inputs, task.flow, task.pressure);
    case 'sweep':
      return sweep(task.inputs, task.analysis, task.flow, task.pressure);
    case 'flatPlate':
      return flatPlate(task.inputs);
    case 'leadingEdge':
      return leadingEdge(task.inputs, task.flow);
  }
}

const LINE_FIELD = /^(?:pressureTable|text) line (\d+)$/;

function toCellError(error: unknown): CellError | null {
  if (error instanceof InputError) {
    return { message: error.message, field: error.field, ...(error.line ? { line: error.line } : {}), ...(error.problems ? { problems: error.problems } : {}) };
  }
  if (error instanceof CaseError) {
    const line = LINE_FIELD.exec(error.field)?.[1];
    return { message: error.message, field: error.field, ...(line ? { line: Number(line) } : {}) };
  }
  if (error instanceof RangeError) return { message: error.message };
  return null;
}

// --- flow -------------------------------------------------------------------------------------------

/** The flow cell as the engine case's `flow`. */
export function engineFlow(flow: FlowInputs): EngineCaseInput['flow'] {
  const base =
    flow.mode === 'reynolds'
      ? { reynolds: flow.reynolds, mach: flow.mach }
      : { altitude_m: flow.altitude_m, referenceLength_m: flow.referenceLength_m, isaTemperatureOffset_K: flow.isaTemperatureOffset_K, mach: flow.mach };
  return flow.turbulenceMode === 'intensity' ? { ...base, turbulenceIntensity: flow.turbulenceIntensity } : { ...base, nCrit: flow.nCrit };
}

function flowResult(flow: FlowInputs): FlowResult {
  const c = deriveFlowCondition(flow.mode === 'reynolds' ? { reynolds: flow.reynolds, mach: flow.mach } : engineFlow(flow));
  const warnings: string[] = [];
  let nCrit = flow.nCrit;
  if (flow.turbulenceMode === 'intensity') {
    const tu = flow.turbulenceIntensity!;
    nCrit = mackCriticalN(tu);
    if (tu < MACK_TURBULENCE_RANGE[0] || tu > MACK_TURBULENCE_RANGE[1]) {
      warnings.push(`turbulenceIntensity ${tu} is outside the range of Mack's relation (${MACK_TURBULENCE_RANGE[0]} to ${MACK_TURBULENCE_RANGE[1]}); N_crit is extrapolated`);
    }
  }
  return {
    reynolds: c.reynolds,
    mach: c.mach,
    reynoldsPerMetre: c.reynoldsPerMetre ?? null,
    speed_mps: c.speed_ms ?? null,
    kinematicViscosity_m2s: c.kinematicViscosity_m2s ?? null,
    dynamicPressure_Pa: c.dynamicPressure_Pa ?? null,
    temperature_K: c.temperature_K ?? null,
    pressure_Pa: c.pressure_Pa ?? null,
    density_kgm3: c.density_kgm3 ?? null,
    speedOfSound_mps: c.speedOfSound_ms ?? null,
    nCrit,
    nCritFrom: flow.turbulenceMode === 'intensity' ? 'turbulenceIntensity' : 'given',
    sweepDeg: flow.sweepDeg,
    warnings,
  };
}

// --- pressure ---------------------------------------------------------------------------------------

interface ReadTable {
  rows: PressureTableRow[];
  hasY: boolean;
  headerLine: number | null;
  radius: number[] | null;
}

const FIELD_SEPARATOR = /\s*[,;\t]\s*|\s+/;
const RADIUS_NAMES = new Set(['r', 'r/c', 'rc', 'r/l', 'radius']);

/** The table as the engine reads it, with the body radius column when the cell says there is one. */
function readTable(p: PressureInputs): ReadTable {
  const table = parsePressureTable(p.text);
  if (!table.ok) {
    const first = table.problems[0]!;
    const where = first.line > 0 ? `line ${first.line}: ` : '';
    return fail('text', `${where}${first.message}${table.problems.length > 1 ? ` (and ${table.problems.length - 1} more)` : ''}`, first.line || undefined, table.problems);
  }
  if (!p.hasRadius) return { rows: table.rows, hasY: table.hasY, headerLine: table.headerLine, radius: null };
  const lines = p.text.split(/\r\n|\r|\n/);
  const fields = (line: number) => lines[line - 1]!.replace(/#.*$/, '').trim().split(FIELD_SEPARATOR);
  if (table.headerLine === null) return fail('text', 'with a body radius the table needs a header row naming its columns, e.g. "x r cp"', 1);
  const column = fields(table.headerLine).findIndex((name) => RADIUS_NAMES.has(name.toLowerCase()));
  if (column < 0) return fail('text', `line ${table.headerLine}: the header names no radius column (call it r)`, table.headerLine);
  const radius = table.rows.map((row) => {
    const value = Number(fields(row.line)[column]);
    if (!Number.isFinite(value) || value < 0) fail('text', `line ${row.line}: the radius is not a non-negative number`, row.line);
    return value;
  });
  return { rows: table.rows, hasY: table.hasY, headerLine: table.headerLine, radius };
}

function fail(field: string, message: string, line?: number, problems?: { line: number; message: string }[]): never {
  throw new InputError(field, message, line, problems);
}

function stagnationFailure(error: unknown, rows: PressureTableRow[]): never {
  if (error instanceof StagnationError) {
    const row = rows[Math.min(Math.max(error.row, 0), rows.length - 1)];
    return fail('text', row ? `line ${row.line}: ${error.message}` : error.message, row?.line);
  }
  throw error;
}

function pressureResult(p: PressureInputs): PressureResult {
  const table = readTable(p);
  const { rows } = table;
  const x = rows.map((r) => r.x);
  const y = table.hasY ? rows.map((r) => r.y!) : null;
  const warnings: string[] = [];
  let cpMinIndex = 0;
  rows.forEach((r, i) => {
    if (r.cp < rows[cpMinIndex]!.cp) cpMinIndex = i;
  });
  let surfaces: PressureResult['surfaces'];
  let stagnation: PressureResult['stagnation'] = null;
  const nameOfRow = new Map<number, string>();
  if (p.layout === 'closedLoop') {
    // The stagnation point does not move with Mach number (Cp is largest there either way), so the
    // incompressible speed locates it; the analysis splits again with the flow's Mach number.
    const speed = rows.map((r) => Math.sqrt(Math.max(0, 1 - r.cp)));
    let split;
    try {
      split = splitAtStagnation(x, y, speed);
    } catch (error) {
      stagnationFailure(error, rows);
    }
    stagnation = { x: split.stagnation.x, y: split.stagnation.y, velocityGradient: split.stagnation.velocityGradient };
    surfaces = (['upper', 'lower'] as const).map((name) => {
      const b = split[name];
      const keep = [...b.source.keys()].filter((j) => b.source[j]! >= 0);
      for (const j of keep) nameOfRow.set(b.source[j]!, name);
      return {
        name,
        x: keep.map((j) => b.x[j]!),
        y: b.y ? keep.map((j) => b.y![j]!) : null,
        cp: keep.map((j) => rows[b.source[j]!]!.cp),
        s: keep.map((j) => b.s[j]!),
        r: null,
        line: keep.map((j) => rows[b.source[j]!]!.line),
      };
    });
    if (!table.hasY) warnings.push('no y column: arc length is taken from x alone, which understates it round the leading edge; the first part of the loop is named upper');
  } else {
    let s: Float64Array;
    try {
      s = loopArcLength(x, y);
    } catch (error) {
      stagnationFailure(error, rows);
    }
    surfaces = [{ name: p.surfaceName, x, y, cp: rows.map((r) => r.cp), s: Array.from(s), r: table.radius, line: rows.map((r) => r.line) }];
    for (let i = 0; i < rows.length; i++) nameOfRow.set(i, p.surfaceName);
    if (rows.length < 3) fail('text', 'a surface needs at least 3 rows');
  }
  const minRow = rows[cpMinIndex]!;
  return {
    layout: p.layout,
    rowCount: rows.length,
    hasY: table.hasY,
    headerLine: table.headerLine,
    surfaces,
    stagnation,
    cpMin: { x: minRow.x, cp: minRow.cp, surface: nameOfRow.get(cpMinIndex) ?? surfaces[0]!.name },
    warnings,
  };
}

// --- analysis ---------------------------------------------------------------------------------------

/** Where a surface passes x (first crossing), as arc length; null when it never does. */
function arcAtX(s: ArrayLike<number>, x: ArrayLike<number>, at: number): number | null {
  for (let i = 1; i < s.length; i++) {
    const a = x[i - 1]!;
    const b = x[i]!;
    if ((a - at) * (b - at) <= 0 && a !== b) return s[i - 1]! + ((at - a) / (b - a)) * (s[i]! - s[i - 1]!);
  }
  return null;
}

/** x at an arc length along stations (linear), or null without x. */
export function xAtArc(s: readonly number[], x: readonly number[] | undefined, at: number | null): number | null {
  if (at === null || !x || x.length !== s.length || s.length === 0) return null;
  if (at <= s[0]!) return x[0]!;
  for (let i = 1; i < s.length; i++) {
    if (s[i]! >= at) return x[i - 1]! + ((at - s[i - 1]!) / (s[i]! - s[i - 1]!)) * (x[i]! - x[i - 1]!);
  }
  return x[x.length - 1]!;
}

interface PreparedCase {
  engineCase: EngineCaseInput;
  /** x per surface to put back on the stations when the case is given as surfaces. */
  xBySurface: Map<string, number[]> | null;
}

/**
 * The engine case of an analysis: flow from the flow cell, the table (or surfaces) from the pressure
 * cell, criteria, trips and the turbulent march from the analysis. Trips are given at x/c; the case
 * takes them at s on surfaces, so a table with trips is split here (with the engine's own reader and
 * stagnation finder) and handed over as surfaces.
 */
function prepareCase(a: AnalysisInputs, flow: FlowInputs, p: PressureInputs): PreparedCase {
  const common = {
    flow: engineFlow(flow),
    criteria: a.criteria,
    ...(a.governing === 'auto' ? {} : { governing: a.governing }),
    turbulent: a.turbulent,
    sweepDeg: flow.sweepDeg,
  };
  const trips = Object.entries(a.trips);
  if (p.layout === 'closedLoop' && trips.length === 0 && !p.hasRadius) return { engineCase: { ...common, pressureTable: p.text }, xBySurface: null };

  const table = readTable(p);
  const mach = flow.mach;
  const cp0 = stagnationPressureCoefficient(mach);
  const speedOf = (row: PressureTableRow) => {
    if (row.cp > cp0 + 1e-6) fail('text', `line ${row.line}: Cp ${row.cp} is above the stagnation value ${cp0.toFixed(4)} at mach ${mach}`, row.line);
    return row.cp >= cp0 ? 0 : edgeVelocityRatio(row.cp, mach);
  };
  const x = table.rows.map((r) => r.x);
  const y = table.hasY ? table.rows.map((r) => r.y!) : null;
  let surfaces: { name: string; s: number[]; x: number[]; ue?: number[]; cp?: number[]; r?: number[] }[];
  if (p.layout === 'closedLoop') {
    let split;
    try {
      split = splitAtStagnation(x, y, table.rows.map(speedOf));
    } catch (error) {
      stagnationFailure(error, table.rows);
    }
    surfaces = (['upper', 'lower'] as const).map((name) => ({ name, s: Array.from(split[name].s), x: Array.from(split[name].x), ue: Array.from(split[name].ue) }));
  } else {
    let s: Float64Array;
    try {
      s = loopArcLength(x, y);
    } catch (error) {
      stagnationFailure(error, table.rows);
    }
    surfaces = [{ name: p.surfaceName, s: Array.from(s), x, cp: table.rows.map((r) => r.cp), ...(table.radius ? { r: table.radius } : {}) }];
  }
  const names = surfaces.map((surface) => surface.name);
  for (const [name] of trips) {
    if (!names.includes(name)) fail(`trips.${name}`, `there is no surface named "${name}" (the table gives ${names.join(' and ')})`);
  }
  const xBySurface = new Map(surfaces.map((surface) => [surface.name, surface.x]));
  return {
    engineCase: {
      ...common,
      surfaces: surfaces.map(({ x: xs, ...surface }) => {
        const trip = a.trips[surface.name];
        if (trip === undefined) return surface;
        const s = arcAtX(surface.s, xs, trip);
        if (s === null) fail(`trips.${surface.name}`, `x/c ${trip} is not on the ${surface.name} surface (x from ${Math.min(...xs)} to ${Math.max(...xs)})`);
        return { ...surface, trip: s };
      }),
    },
    xBySurface,
  };
}

function analyze(a: AnalysisInputs, flow: FlowInputs, p: PressureInputs): EngineResult {
  const prepared = prepareCase(a, flow, p);
  const result = analyzeCase(prepared.engineCase);
  if (prepared.xBySurface) {
    for (const surface of result.surfaces) {
      const x = prepared.xBySurface.get(surface.name);
      if (x && x.length === surface.stations.s.length) surface.stations.x = x;
    }
  }
  return result;
}

// --- sweep ------------------------------------------------------------------------------------------

function sweptFlow(flow: FlowInputs, parameter: SweepInputs['parameter'], value: number): FlowInputs {
  switch (parameter) {
    case 'reynolds':
      return { ...flow, mode: 'reynolds', reynolds: value };
    case 'mach':
      return { ...flow, mach: value };
    case 'nCrit':
      return { ...flow, turbulenceMode: 'nCrit', nCrit: value };
    case 'sweepDeg':
      return { ...flow, sweepDeg: value };
  }
}

function sweep(sw: SweepInputs, a: AnalysisInputs, flow: FlowInputs, p: PressureInputs): SweepResult {
  const values = Array.from({ length: sw.steps }, (_, i) => sw.from + ((sw.to - sw.from) * i) / (sw.steps - 1));
  const warnings = new Set<string>();
  const steps = values.map((value): SweepResult['steps'][number] => {
    const outcome = runTask({ kind: 'analysis', inputs: a, flow: sweptFlow(flow, sw.parameter, value), pressure: p });
    if (outcome.status === 'error') return { value, status: 'error', error: outcome.error, reynolds: null, cd: null, surfaces: [], attachmentLine: null };
    const r = outcome.result as EngineResult;
    for (const w of r.warnings) warnings.add(w);
    return {
      value,
      status: 'ok',
      error: null,
      reynolds: r.flow.reynolds,
      cd: r.cd,
      surfaces: r.surfaces.map((surface) => ({
        name: surface.name,
        transitionS: surface.transition.s,
        transitionX: xAtArc(surface.stations.s, surface.stations.x, surface.transition.s),
        by: surface.transition.by,
        laminarSeparationS: surface.laminarSeparation?.s ?? null,
        cd: surface.cd,
      })),
      attachmentLine: r.attachmentLine ? { reBar: r.attachmentLine.reBar, verdict: r.attachmentLine.verdict } : null,
    };
  });
  if (steps.every((step) => step.status === 'error')) {
    const first = steps[0]!.error!;
    throw new InputError(first.field ?? 'analysisCellId', `every step failed; at ${sw.parameter} = ${values[0]}: ${first.message}`, first.line);
  }
  return { parameter: sw.parameter, values, steps, warnings: [...warnings] };
}

// --- quick estimates --------------------------------------------------------------------------------

function flatPlate(f: FlatPlateInputs): FlatPlateResult {
  const reynolds = f.mode === 'reynolds' ? f.reynolds : (f.speed_mps * f.length_m) / f.kinematicViscosity_m2s;
  const warnings: string[] = [];
  let fraction = f.transitionMode === 'location' ? f.transitionLocation : f.transitionReynolds / reynolds;
  if (fraction > 1) {
    warnings.push(`the transition Reynolds number ${f.transitionReynolds.toExponential(2)} is beyond the end of the plate (Re ${reynolds.toExponential(2)}): the plate is laminar throughout`);
    fraction = 1;
  }
  if (reynolds > 1e9) warnings.push('Re above 1e9: the turbulent laws are extrapolated');
  const e = flatPlateEstimate(reynolds, fraction);
  const length = f.mode === 'dimensional' ? f.length_m : null;
  return {
    ...e,
    transitionLocation: fraction,
    deltaLaminar_m: length === null ? null : e.deltaLaminar * length,
    deltaTurbulent_m: length === null ? null : e.deltaTurbulent * length,
    warnings,
  };
}

function leadingEdge(le: LeadingEdgeInputs, flow: FlowInputs | null): LeadingEdgeResult {
  const reynolds = flow ? flowResult(flow).reynolds : le.reynolds!;
  const check = attachmentLineCheck({
    reynolds,
    sweepDeg: le.sweepDeg,
    leadingEdgeRadius: le.mode === 'radius' ? le.leadingEdgeRadius : null,
    velocityGradient: le.mode === 'gradient' ? le.velocityGradient : null,
  });
  if (!check) fail(le.mode === 'radius' ? 'leadingEdgeRadius' : 'velocityGradient', 'give a leading-edge radius or a velocity gradient greater than zero');
  const warnings = le.sweepDeg === 0 ? ['no sweep: the attachment line carries no spanwise flow, so the check does not apply'] : [];
  return {
    reynolds,
    sweepDeg: le.sweepDeg,
    reBar: check.reBar,
    verdict: check.verdict,
    from: check.from,
    thresholds: { contamination: POLL_CONTAMINATION_RE_BAR, instability: POLL_INSTABILITY_RE_BAR },
    warnings,
  };
}
