import { CELL_KIND_LABELS, type CellError, type CellInputs, type CellKind, type CellResults, type ComputedKind } from '@laminote/contracts';
import { analysisTable, computeAnalysis } from './analysis';
import { bodyTable, computeBody } from './body';
import { comparisonTable, computeComparison } from './comparison';
import { toCellError } from './errors';
import { computeFlatPlate } from './flat-plate';
import { computeFlow } from './flow';
import { computeLeadingEdge } from './leading-edge';
import { computePolar, polarTable } from './polar';
import { computePressure, pressureTable } from './pressure';
import { scalarTable, type ResultTable } from './result-table';
import { computeSection, sectionTable } from './section';
import { resultBytes, resultJson } from './result-json';
import { computeSweep, sweepTable } from './sweep';
import type { Upstream } from './types';

/**
 * Every cell kind's computation, one module a kind: `computeCell(kind, inputs, upstream)` is what the
 * server's worker threads, the job workers and the command line call, so all of them compute a cell
 * alike. Pure and synchronous; inputs are validated by the kind's schema (defaults applied).
 */

type Compute<K extends ComputedKind> = (inputs: CellInputs[K], upstream: Upstream) => CellResults[K];

/** One entry per kind that computes (the registry's `runs`); a test checks the two agree. */
export const CELL_COMPUTE: { readonly [K in ComputedKind]: Compute<K> } = {
  flow: (inputs) => computeFlow(inputs),
  pressure: (inputs) => computePressure(inputs),
  section: computeSection,
  body: (inputs) => computeBody(inputs),
  analysis: computeAnalysis,
  polar: computePolar,
  sweep: computeSweep,
  comparison: computeComparison,
  flatPlate: (inputs) => computeFlatPlate(inputs),
  leadingEdge: computeLeadingEdge,
};

/** Each computing kind's result as one table (a CSV export); kinds without rows give their scalar values. */
export const CELL_TABLES: { readonly [K in ComputedKind]: (result: CellResults[K]) => ResultTable } = {
  flow: scalarTable,
  pressure: pressureTable,
  section: sectionTable,
  body: bodyTable,
  analysis: analysisTable,
  polar: polarTable,
  sweep: sweepTable,
  comparison: comparisonTable,
  flatPlate: scalarTable,
  leadingEdge: scalarTable,
};

/** A computed result as one table. */
export function resultTable<K extends ComputedKind>(kind: K, result: CellResults[K]): ResultTable {
  return (CELL_TABLES[kind] as (r: CellResults[K]) => ResultTable)(result);
}

export function isComputedKind(kind: CellKind): kind is ComputedKind {
  return Object.hasOwn(CELL_COMPUTE, kind);
}

/** Compute one cell. Throws CellInputError (or the engine's CaseError) for input the engine refuses. */
export function computeCell<K extends ComputedKind>(kind: K, inputs: CellInputs[K], upstream: Upstream = {}): CellResults[K] {
  return (CELL_COMPUTE[kind] as Compute<K>)(inputs, upstream);
}

/** A computation to hand to a worker: plain data, copied across threads. */
export interface CellTask {
  kind: ComputedKind;
  inputs: CellInputs[ComputedKind];
  upstream: Upstream;
}

/** A computed output with its result as JSON text, numbers kept to RESULT_DIGITS. */
export interface ComputedOutput<Json extends string | Uint8Array = string> {
  status: 'ok' | 'error';
  /** JSON text of the result when status is ok (or, computed with `'bytes'`, its UTF-8 bytes). */
  resultJson: Json | null;
  error: CellError | null;
  durationMs: number;
}

export { RESULT_DIGITS, resultBytes, resultJson, roundedCopy, roundedNumber, roundToResultDigits } from './result-json';

/**
 * Compute a cell into its stored form: the result as JSON text, or the one-line message with the
 * field at fault. A fault that is not the input's (a defect) is thrown, not stored.
 */
export function computeCellOutput(task: CellTask): ComputedOutput;
/** The same with the result's JSON as its UTF-8 bytes (resultBytes), for a caller that sends bytes on. */
export function computeCellOutput(task: CellTask, form: 'bytes'): ComputedOutput<Uint8Array>;
export function computeCellOutput(task: CellTask, form: 'text' | 'bytes' = 'text'): ComputedOutput<string | Uint8Array> {
  const started = performance.now();
  try {
    const result = computeCell(task.kind, task.inputs, task.upstream);
    return { status: 'ok', resultJson: form === 'bytes' ? resultBytes(result) : resultJson(result), error: null, durationMs: performance.now() - started };
  } catch (error) {
    const cellError = toCellError(error);
    if (!cellError) throw error;
    return { status: 'error', resultJson: null, error: cellError, durationMs: performance.now() - started };
  }
}

/** The error a cell stores when a cell it uses failed: named by the input that uses it. */
export function upstreamFailedError(upstreamKind: CellKind, field: string, upstreamError: CellError | null): CellError {
  return { message: `the ${CELL_KIND_LABELS[upstreamKind].toLowerCase()} it uses (${field}) failed: ${upstreamError?.message ?? 'see that cell'}`, field };
}

