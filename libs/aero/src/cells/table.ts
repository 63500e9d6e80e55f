import type { PressureInputs } from '@laminote/contracts';
import { parsePressureTable, type PressureTableRow } from '../pressure-table';
import { fail } from './errors';

export interface ReadTable {
  rows: PressureTableRow[];
  hasY: boolean;
  headerLine: number | null;
  /** The body radius per row when the cell says its table has one. */
  radius: number[] | null;
}

/** A pressure cell's table, read with the engine's one reader; its first problem is the cell's error. */
export function readCellTable(p: PressureInputs): ReadTable {
  const table = parsePressureTable(p.text, { radius: p.hasRadius });
  if (!table.ok) {
    const first = table.problems[0]!;
    const where = first.line > 0 ? `line ${first.line}: ` : '';
    return fail('text', `${where}${first.message}${table.problems.length > 1 ? ` (and ${table.problems.length - 1} more)` : ''}`, first.line || undefined, table.problems);
  }
  return { rows: table.rows, hasY: table.hasY, headerLine: table.headerLine, radius: p.hasRadius ? table.rows.map((row) => row.r!) : null };
}
