/**
 * The cells: `computeCell(kind, inputs, upstream)` and what surrounds it (see compute.ts); one module
 * per kind beside it.
 */
export { CELL_COMPUTE, CELL_TABLES, computeCell, resultTable, computeCellOutput, isComputedKind, RESULT_DIGITS, resultBytes, resultJson, roundedCopy, roundedNumber, roundToResultDigits, upstreamFailedError, type CellTask, type ComputedOutput } from './compute';
export { CellInputError, toCellError } from './errors';
export type { ResultTable, TableValue } from './result-table';
export { engineFlow } from './flow';
export { planCells, sourceOf, type CellPlan, type PlannableCell } from './plan';
export { computeStudy } from './study';
export { assembleSweep, computeSweepCase, computeSweepCases, gatherSweepWarnings, sweepCaseCount, sweepValues, type SweepCase, type SweepWarning } from './sweep';
export type { CellSource, Upstream } from './types';
