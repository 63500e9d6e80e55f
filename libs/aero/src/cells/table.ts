import type { PressureInputs } from '@laminote/contracts';
import { keptPressureTable, type PressureTableRow } from '../pressure-table';
import { fail } from './errors';

export interface ReadTable {
  /** Shared with the next reads of the same text: not to be changed. */
  rows: readonly Readonly<PressureTableRow>[];
  hasY: boolean;
  headerLine: number | null;
  /** The body radius per row when the cell says its table has one. */
  radius: number[] | null;
}

/** A pressure cell's table, read with the engine's one reader; its first problem is the cell's error. */
export function readCellTable(p: PressureInputs): ReadTable {
  const table = keptPressureTable(p.text, { radius: p.hasRadius });
  if (!table.ok) {
    const first = table.problems[0]!;
    const where = first.line > 0 ? `line ${first.line}: ` : '';
    return fail('text', `${where}${first.message}${table.problems.length > 1 ? ` (and ${table.problems.length - 1} more)` : ''}`, first.line || undefined, table.problems.map((problem) => ({ ...problem })));
  }
  return { rows: table.rows, hasY: table.hasY, headerLine: table.headerLine, radius: p.hasRadius ? table.rows.map((row) => row.r!) : null };
}
