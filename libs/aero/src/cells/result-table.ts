/**
 * A cell's result as one table, for a CSV file (the server's export) or any tool that wants rows:
 * named columns, one row per station, point or step, and a few lines saying what the rows do not
 * (lift of a section, the parameters of a sweep). Each kind's table is written beside its compute
 * module (`CELL_TABLES` in compute.ts).
 */
export type TableValue = string | number | null;

export interface ResultTable {
  /** Column names, as a script reading the file would address them. */
  fields: string[];
  rows: TableValue[][];
  /** One-line facts about the whole result, written above the table. */
  notes: string[];
}

/** A result with no table of its own: its scalar values, one per row (objects of numbers flattened by name). */
export function scalarTable(result: object): ResultTable {
  const rows: TableValue[][] = [];
  for (const [name, value] of Object.entries(result)) {
    if (typeof value === 'number' || typeof value === 'string' || value === null) rows.push([name, value]);
    else if (value && typeof value === 'object' && !Array.isArray(value)) {
      for (const [k, v] of Object.entries(value as Record<string, unknown>)) {
        if (typeof v === 'number' || typeof v === 'string' || v === null) rows.push([`${name}.${k}`, v]);
      }
    }
  }
  const warnings = (result as { warnings?: unknown }).warnings;
  return { fields: ['quantity', 'value'], rows, notes: warningNotes(Array.isArray(warnings) ? warnings.filter((w): w is string => typeof w === 'string') : []) };
}

/** Warnings of a result, for the notes. */
export function warningNotes(warnings: readonly string[]): string[] {
  return warnings.map((w) => `warning: ${w}`);
}
