import { eq } from 'drizzle-orm';
import type { Db } from '../db/client';
import { drafts } from '../db/schema';
import { storedCells } from '../notebook/draft-keys';
import { planCells } from '../notebook/plan';

/**
 * Shows landed outputs in the branch's draft: a cell gets the output's key only when its inputs (and
 * those of the cells it uses) still give that key, so a job that finishes late, or runs again after a
 * worker died, never puts an older result over a newer one. The draft row is locked meanwhile, like an
 * autosave; the revision stays (a run is not an edit), and only the draft's output keys are written.
 * Returns the cells that changed.
 */
export async function markDraftCells(db: Db, branchId: string, marks: { cellId: string; key: string; ok: boolean }[]): Promise<string[]> {
  if (marks.length === 0) return [];
  return db.transaction(async (tx) => {
    const [row] = await tx.select({ cells: drafts.cells, outputKeys: drafts.outputKeys }).from(drafts).where(eq(drafts.branchId, branchId)).for('update');
    if (!row) return [];
    const stored = storedCells(row);
    const wanted = new Map(marks.map((m) => [m.cellId, m]));
    if (!stored.some((c) => wanted.has(c.cellId))) return [];
    const plans = planCells(stored);
    const changed: string[] = [];
    const outputKeys = { ...row.outputKeys };
    for (const cell of stored) {
      const mark = wanted.get(cell.cellId);
      if (!mark || plans.get(cell.cellId)?.key !== mark.key || cell.lastOutputKey === mark.key) continue;
      changed.push(cell.cellId);
      outputKeys[cell.cellId] = { last: mark.key, good: mark.ok ? mark.key : (cell.lastGoodOutputKey ?? null) };
    }
    if (changed.length) await tx.update(drafts).set({ outputKeys }).where(eq(drafts.branchId, branchId));
    return changed;
  });
}
