import type { DraftCellInput } from '@laminote/contracts';
import { sameJson } from '@laminote/contracts/values';
import type { CellKind } from '@laminote/contracts/cell-kinds';

/** The parts of a cell that a save carries. */
export interface SavedCell {
  readonly cellId: string;
  readonly kind: CellKind;
  readonly title: string;
  readonly collapsed: boolean;
  readonly inputs: Record<string, unknown>;
}

export function toSavedCell(cell: DraftCellInput): SavedCell {
  return { cellId: cell.cellId, kind: cell.kind, title: cell.title ?? '', collapsed: cell.collapsed ?? false, inputs: cell.inputs };
}

export type CellChangeKind = 'added' | 'removed' | 'edited' | 'moved';

/** One cell's change between two stacks, named by the title and kind a person recognises. */
export interface CellChange {
  readonly cellId: string;
  readonly kind: CellKind;
  readonly title: string;
  readonly change: CellChangeKind;
  /** For an edit: which parts changed (title, inputs, collapsed). */
  readonly parts: readonly ('title' | 'inputs' | 'collapsed' | 'kind')[];
}

/** What changed from `before` to `after`, cell by cell, in the order of `after` (removed cells last). */
export function diffStacks(before: readonly SavedCell[], after: readonly SavedCell[]): CellChange[] {
  const beforeById = new Map(before.map((cell, index) => [cell.cellId, { cell, index }]));
  const afterIds = new Set(after.map((cell) => cell.cellId));
  const changes: CellChange[] = [];
  // Order among the cells both stacks hold, to tell a real move from a shift caused by an insertion.
  const commonBefore = before.filter((cell) => afterIds.has(cell.cellId)).map((cell) => cell.cellId);
  const commonAfter = after.filter((cell) => beforeById.has(cell.cellId)).map((cell) => cell.cellId);
  const movedIds = movedCells(commonBefore, commonAfter);

  for (const cell of after) {
    const old = beforeById.get(cell.cellId)?.cell;
    if (!old) {
      changes.push({ cellId: cell.cellId, kind: cell.kind, title: cell.title, change: 'added', parts: [] });
      continue;
    }
    const parts: ('title' | 'inputs' | 'collapsed' | 'kind')[] = [];
    if (old.kind !== cell.kind) parts.push('kind');
    if (old.title !== cell.title) parts.push('title');
    if (!sameJson(old.inputs, cell.inputs)) parts.push('inputs');
    if (old.collapsed !== cell.collapsed) parts.push('collapsed');
    if (parts.length > 0) changes.push({ cellId: cell.cellId, kind: cell.kind, title: cell.title, change: 'edited', parts });
    else if (movedIds.has(cell.cellId)) changes.push({ cellId: cell.cellId, kind: cell.kind, title: cell.title, change: 'moved', parts: [] });
  }
  for (const cell of before) {
    if (!afterIds.has(cell.cellId)) changes.push({ cellId: cell.cellId, kind: cell.kind, title: cell.title, change: 'removed', parts: [] });
  }
  return changes;
}

/** Cells outside a longest common subsequence of the two orders: the fewest cells whose move explains the change. */
function movedCells(before: readonly string[], after: readonly string[]): Set<string> {
  const n = before.length;
  const m = after.length;
  const table: number[][] = Array.from({ length: n + 1 }, () => new Array<number>(m + 1).fill(0));
  for (let i = n - 1; i >= 0; i--) {
    for (let j = m - 1; j >= 0; j--) {
      table[i][j] = before[i] === after[j] ? table[i + 1][j + 1] + 1 : Math.max(table[i + 1][j], table[i][j + 1]);
    }
  }
  const kept = new Set<string>();
  for (let i = 0, j = 0; i < n && j < m; ) {
    if (before[i] === after[j]) {
      kept.add(before[i]);
      i++;
      j++;
    } else if (table[i + 1][j] >= table[i][j + 1]) i++;
    else j++;
  }
  return new Set(after.filter((id) => !kept.has(id)));
}
