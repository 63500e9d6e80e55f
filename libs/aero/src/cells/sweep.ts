import type { AnalysisInputs, CellError, EngineResult, FlowInputs, SweepInputs, SweepResult } from '@laminote/contracts';
import { xAtArc } from '../arc-position';
import { AnalysisShare, computeAnalysis } from './analysis';
import { CellInputError, toCellError } from './errors';
import { upstreamOf, type Upstream } from './types';
import { warningNotes, type ResultTable, type TableValue } from './result-table';

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

function analyzeStep(a: AnalysisInputs, upstream: Upstream, share: AnalysisShare | undefined): { result: EngineResult } | { error: CellError } {
  try {
    return { result: computeAnalysis(a, upstream, share) };
  } catch (error) {
    const cellError = toCellError(error);
    if (!cellError) throw error;
    return { error: cellError };
  }
}

/** One case of a sweep: its step of the result and the analysis's warnings. */
export interface SweepCase {
  step: SweepResult['steps'][number];
  warnings: string[];
}

/** The values a sweep runs over: `steps` evenly spaced from `from` to `to`. */
export function sweepValues(sw: { from: number; to: number; steps: number }): number[] {
  return Array.from({ length: sw.steps }, (_, i) => valueAt(sw, i));
}

/** The i-th of `steps` evenly spaced values; sweepValues and a case computed alone agree exactly. */
function valueAt(sw: { from: number; to: number; steps: number }, i: number): number {
  return sw.from + ((sw.to - sw.from) * i) / (sw.steps - 1);
}

/** How many cases a sweep has: its steps, times the second parameter's in a grid. */
export function sweepCaseCount(sw: SweepInputs): number {
  return sw.steps * (sw.second ? sw.second.steps : 1);
}

/**
 * One case of a sweep, on its own: the named analysis at the case's value (in a grid, case
 * i × second.steps + j is the i-th value of the first parameter and the j-th of the second). A long
 * sweep is computed a chunk of cases at a time (by the job workers) and put together by assembleSweep,
 * exactly as computeSweep gives it whole.
 */
export function computeSweepCase(sw: SweepInputs, upstream: Upstream, index: number): SweepCase {
  return sweepCase(sw, upstream, index, undefined);
}

/**
 * Several cases of one sweep (a job worker's chunk), each exactly as computeSweepCase gives it alone.
 * What the cases share is prepared once: a section named as the analysis's pressure is solved once per
 * Mach number (AnalysisShare), and the pressure table, read by the engine's kept reader, is parsed once.
 */
export function computeSweepCases(sw: SweepInputs, upstream: Upstream, indices: readonly number[]): SweepCase[] {
  const share = new AnalysisShare();
  return indices.map((index) => sweepCase(sw, upstream, index, share));
}

function sweepCase(sw: SweepInputs, upstream: Upstream, index: number, share: AnalysisShare | undefined): SweepCase {
  const analysis = upstreamOf(upstream, 'analysisCellId', 'analysis');
  const flowCell = upstreamOf(analysis.upstream, 'flowCellId', 'flow');
  const flow = flowCell.inputs;
  if (!(Number.isInteger(index) && index >= 0 && index < sweepCaseCount(sw))) throw new RangeError(`the sweep has no case ${index}`);
  const columns = sw.second ? sw.second.steps : 1;
  const value = valueAt(sw, Math.floor(index / columns));
  const value2 = sw.second ? valueAt(sw.second, index % columns) : undefined;
  const swept = sw.second ? sweptFlow(sweptFlow(flow, sw.parameter, value), sw.second.parameter, value2!) : sweptFlow(flow, sw.parameter, value);
  const at = value2 === undefined ? { value } : { value, value2 };
  // The analysis as it is, with the flow cell at this case's values (a section or body named as its
  // pressure is solved again, so a Mach step moves the section's Cp too).
  const outcome = analyzeStep(analysis.inputs, { ...analysis.upstream, flowCellId: { ...flowCell, inputs: swept } }, share);
  if ('error' in outcome) return { step: { ...at, status: 'error', error: outcome.error, reynolds: null, cd: null, surfaces: [], attachmentLine: null }, warnings: [] };
  const r = outcome.result;
  return {
    step: {
      ...at,
      status: 'ok',
      error: null,
      reynolds: r.flow.reynolds,
      cd: r.cd,
      surfaces: r.surfaces.map((surface) => {
        const { s, x } = surface.stations;
        const along = (at: number | null | undefined): number | null => (at === null || at === undefined ? null : (xAtArc(s, x, at) ?? at));
        const end = s.length ? s[s.length - 1]! : null;
        return {
          name: surface.name,
          transitionS: surface.transition.s,
          transitionX: xAtArc(s, x, surface.transition.s),
          by: surface.transition.by,
          laminarSeparationS: surface.laminarSeparation?.s ?? null,
          cd: surface.cd,
          criteria: Object.fromEntries(Object.entries(surface.transition.criteria).map(([criterion, found]) => [criterion, along(found?.s)])),
          laminarExtent: along(surface.transition.s ?? end),
        };
      }),
      attachmentLine: r.attachmentLine ? { reBar: r.attachmentLine.reBar, verdict: r.attachmentLine.verdict } : null,
    },
    warnings: r.warnings,
  };
}

/** A sweep's result from all its cases in order; every case failing is the sweep failing, named by the first. */
export function assembleSweep(sw: SweepInputs, cases: readonly SweepCase[]): SweepResult {
  const count = sweepCaseCount(sw);
  if (cases.length !== count) throw new RangeError(`the sweep has ${count} cases, ${cases.length} were given`);
  const values = sweepValues(sw);
  const steps = cases.map((c) => c.step);
  if (steps.every((step) => step.status === 'error')) {
    const first = steps[0]!.error!;
    const at = sw.second ? `${sw.parameter} = ${values[0]}, ${sw.second.parameter} = ${sw.second.from}` : `${sw.parameter} = ${values[0]}`;
    throw new CellInputError(first.field ?? 'analysisCellId', `every step failed; at ${at}: ${first.message}`, first.line);
  }
  return {
    parameter: sw.parameter,
    values,
    ...(sw.second ? { second: { parameter: sw.second.parameter, values: sweepValues(sw.second) } } : {}),
    steps,
    warnings: gatherSweepWarnings(warningsByStep(cases), count),
  };
}

/** Each distinct warning of a sweep's cases, in the order the cases first give it, with the cases that give it. */
function warningsByStep(cases: readonly SweepCase[]): SweepWarning[] {
  const seen = new Map<string, number[]>();
  cases.forEach((c, index) => {
    for (const warning of new Set(c.warnings)) {
      const steps = seen.get(warning);
      if (steps) steps.push(index);
      else seen.set(warning, [index]);
    }
  });
  return [...seen].map(([warning, steps]) => ({ warning, steps }));
}

/** A distinct warning of a sweep and the cases (indices) that give it. */
export interface SweepWarning {
  warning: string;
  steps: readonly number[];
}

/** A number as a warning writes it (a sign, digits, a fraction, an exponent). */
const NUMBER_IN_TEXT = /-?\d+(?:\.\d+)?(?:e[+-]?\d+)?/gi;

/**
 * A sweep's warnings as its reader needs them: a warning that names the step's own value (a Mach
 * number, a local Mach number, a Reynolds number) would otherwise come once per step, a thousand
 * near-identical lines. Warnings alike but for their numbers, each from other cases than the rest, are
 * said once, each number that varies as its range, with how many cases gave it: "mach 0.6–0.85: the
 * laminar layer is computed compressible; … (in 1,200 of 2,000 cases)". Warnings alike that come from one
 * case (two pressure-table lines) say different things and stay apart. Otherwise in the order first given.
 */
export function gatherSweepWarnings(seen: readonly SweepWarning[], cases: number): string[] {
  const groups = new Map<string, SweepWarning[]>();
  for (const w of seen) {
    const shape = w.warning.replace(NUMBER_IN_TEXT, '#');
    const group = groups.get(shape);
    if (group) group.push(w);
    else groups.set(shape, [w]);
  }
  const out: string[] = [];
  for (const group of groups.values()) {
    const steps = new Set(group.flatMap((w) => w.steps));
    const apart = group.reduce((n, w) => n + w.steps.length, 0) === steps.size;
    if (group.length === 1 || !apart) {
      out.push(...group.map((w) => w.warning));
      continue;
    }
    const numbers = group.map((w) => w.warning.match(NUMBER_IN_TEXT)!);
    let slot = 0;
    const text = group[0]!.warning.replace(NUMBER_IN_TEXT, (first) => {
      const values = numbers.map((n) => n[slot]!);
      slot += 1;
      const low = values.reduce((a, b) => (Number(b) < Number(a) ? b : a));
      const high = values.reduce((a, b) => (Number(b) > Number(a) ? b : a));
      return Number(low) === Number(high) ? first : `${shortNumber(low)}–${shortNumber(high)}`;
    });
    out.push(`${text} (in ${steps.size.toLocaleString('en-US')} of ${cases.toLocaleString('en-US')} cases)`);
  }
  return out;
}

/** A number as written, or to 4 significant digits when it has more than 6 (a step's value 0.43141578…). */
function shortNumber(text: string): string {
  const digits = text.replace(/e.*$/i, '').replace(/[^\d]/g, '').replace(/^0+/, '').length;
  return digits > 6 ? String(Number(Number(text).toPrecision(4))) : text;
}

/**
 * Parameter sweep: the named analysis re-run over `steps` evenly spaced values of one parameter of its
 * flow cell (whatever gives its pressures: a pressure, section or body cell); a step that fails keeps
 * its message and the others go on.
 */
export function computeSweep(sw: SweepInputs, upstream: Upstream): SweepResult {
  return assembleSweep(
    sw,
    computeSweepCases(
      sw,
      upstream,
      Array.from({ length: sweepCaseCount(sw) }, (_, index) => index),
    ),
  );
}

/** A sweep as a table: a row per step and surface (a grid's second parameter beside the first). */
export function sweepTable(r: SweepResult): ResultTable {
  const grid = r.second !== undefined;
  const rows: TableValue[][] = [];
  for (const step of r.steps) {
    const head: TableValue[] = grid ? [step.value, step.value2 ?? null] : [step.value];
    if (step.status === 'error') rows.push([...head, null, null, null, null, null, null, null, step.error?.message ?? 'failed']);
    for (const s of step.surfaces) rows.push([...head, s.name, s.transitionS, s.transitionX, s.by, s.laminarSeparationS, s.cd, step.cd, null]);
  }
  const params = grid ? [r.parameter, r.second!.parameter] : [r.parameter];
  return {
    fields: [...params, 'surface', 'transitionS', 'transitionX', 'transitionBy', 'laminarSeparationS', 'cdSurface', 'cd', 'error'],
    rows,
    notes: [`${r.steps.length} steps over ${params.join(' and ')}`, ...warningNotes(r.warnings)],
  };
}
