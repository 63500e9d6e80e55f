import { inArray } from 'drizzle-orm';
import { COMPARISON_CAUTION, type Comparison, type VersionCell } from '@laminote/contracts';
import type { Tx } from '../db/client';
import { versions } from '../db/schema';
import { diffCells, summarise } from './cell-diff';
import { compareAnalysis, sideOf } from './result-diff';
import { toSnapshot, versionCellsOf, versionSummary } from './service';

/**
 * Two versions of one study, compared: cells matched by id with field-level differences, and the
 * results of every analysis cell side by side with their deltas and overlay data.
 */
export async function compareVersions(tx: Tx, aId: string, bId: string): Promise<Comparison> {
  const [a, b] = [await versionSummary(tx, aId), await versionSummary(tx, bId)];
  const cellsOf = await versionCellsOf(tx, [...new Set([aId, bId])], ['analysis']);
  const cellsA = cellsOf.get(aId) ?? [];
  const cellsB = cellsOf.get(bId) ?? [];
  const cells = diffCells(toSnapshot(cellsA), toSnapshot(cellsB));
  const byId = (list: VersionCell[]) => new Map(list.map((c) => [c.cellId, c]));
  const mapA = byId(cellsA);
  const mapB = byId(cellsB);
  const results = cells
    .filter((d) => d.kind === 'analysis')
    .map((d) => {
      const x = mapA.get(d.cellId);
      const y = mapB.get(d.cellId);
      return compareAnalysis(d.cellId, d.titleB ?? d.titleA ?? 'Transition analysis', sideOf(!!x, x?.output ?? null), sideOf(!!y, y?.output ?? null));
    });
  return { studyId: a.studyId, a, b, summary: summarise(cells), cells, results, caution: COMPARISON_CAUTION };
}

/** The study of each version, to check access before comparing. */
export async function studiesOf(tx: Tx, ids: string[]): Promise<Map<string, string>> {
  const rows = await tx.select({ id: versions.id, studyId: versions.studyId }).from(versions).where(inArray(versions.id, ids));
  return new Map(rows.map((r) => [r.id, r.studyId]));
}
