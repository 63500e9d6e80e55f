import type { DraftOutputKeys, drafts } from '../db/schema';
import type { StoredCell } from './plan';

/**
 * A draft's cells are kept in two columns: drafts.cells (and drafts.trash) hold what the author edits,
 * drafts.output_keys the keys of the outputs the cells' runs recorded. A run writes only the keys, so
 * it does not rewrite the cells' inputs (a pasted table is tens of kB). In memory the server works with
 * cells that carry their keys (StoredCell), as they were kept before: these join and split the two.
 */

type DraftRow = typeof drafts.$inferSelect;
type Keyed = { cellId: string; lastOutputKey?: string | null; lastGoodOutputKey?: string | null };

function withKeys<T extends { cellId: string }>(cells: readonly T[], keys: DraftOutputKeys): (T & { lastOutputKey: string | null; lastGoodOutputKey: string | null })[] {
  return cells.map((cell) => {
    const k = Object.hasOwn(keys, cell.cellId) ? keys[cell.cellId] : undefined;
    return { ...cell, lastOutputKey: k?.last ?? null, lastGoodOutputKey: k?.good ?? null };
  });
}

/** The draft's cells, each with its output keys. */
export function storedCells(row: Pick<DraftRow, 'cells' | 'outputKeys'>): StoredCell[] {
  return withKeys(row.cells as StoredCell[], row.outputKeys ?? {});
}

/** The draft's trash, each cell with the output keys it had (so a cell brought back keeps them). */
export function storedTrash(row: Pick<DraftRow, 'trash' | 'outputKeys'>): (DraftRow['trash'][number] & { lastGoodOutputKey: string | null })[] {
  return withKeys(row.trash, row.outputKeys ?? {});
}

function withoutKeys<T extends Keyed>(cells: readonly T[]): Omit<T, 'lastOutputKey' | 'lastGoodOutputKey'>[] {
  return cells.map((cell) => {
    const { lastOutputKey: _last, lastGoodOutputKey: _good, ...rest } = cell;
    return rest;
  });
}

/**
 * Cells and trash as they are written: the cells without their keys, and the keys of every cell in
 * either (a cell with no key has no entry). Keys of cells in neither are not kept.
 */
export function splitOutputKeys<C extends Keyed, T extends Keyed>(cells: readonly C[], trash: readonly T[] = []): { cells: Omit<C, 'lastOutputKey' | 'lastGoodOutputKey'>[]; trash: Omit<T, 'lastOutputKey' | 'lastGoodOutputKey'>[]; outputKeys: DraftOutputKeys } {
  const outputKeys: DraftOutputKeys = {};
  // A cell in both (not expected) keeps the keys it has in the cells.
  for (const cell of [...trash, ...cells]) {
    const last = cell.lastOutputKey ?? null;
    const good = cell.lastGoodOutputKey ?? null;
    if (last !== null || good !== null) outputKeys[cell.cellId] = { last, good };
    else delete outputKeys[cell.cellId];
  }
  return { cells: withoutKeys(cells), trash: withoutKeys(trash), outputKeys };
}
