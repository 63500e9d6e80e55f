import type { CellError } from '@laminote/contracts';
import { CaseError } from '../analyze';
import type { PressureTableRow } from '../pressure-table';
import { StagnationError } from '../stagnation';

/** Bad input found by a cell's computation: the field at fault (and table line), in the engine's words. */
export class CellInputError extends Error {
  constructor(
    readonly field: string,
    message: string,
    readonly line?: number,
    readonly problems?: { line: number; message: string }[],
  ) {
    super(message);
    this.name = 'CellInputError';
  }
}

export function fail(field: string, message: string, line?: number, problems?: { line: number; message: string }[]): never {
  throw new CellInputError(field, message, line, problems);
}

/** A stagnation-point failure named by the table line it happened at. */
export function stagnationFailure(error: unknown, rows: readonly PressureTableRow[]): never {
  if (error instanceof StagnationError) {
    const row = rows[Math.min(Math.max(error.row, 0), rows.length - 1)];
    return fail('text', row ? `line ${row.line}: ${error.message}` : error.message, row?.line);
  }
  throw error;
}

const LINE_FIELD = /^(?:pressureTable|text) line (\d+)$/;

/** The message a failed computation stores; null for a fault that is not the input's (a defect, not stored). */
export function toCellError(error: unknown): CellError | null {
  if (error instanceof CellInputError) {
    return { message: error.message, field: error.field, ...(error.line ? { line: error.line } : {}), ...(error.problems ? { problems: error.problems } : {}) };
  }
  if (error instanceof CaseError) {
    const line = LINE_FIELD.exec(error.field)?.[1];
    return { message: error.message, field: error.field, ...(line ? { line: Number(line) } : {}) };
  }
  if (error instanceof RangeError) return { message: error.message };
  return null;
}
