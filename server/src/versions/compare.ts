import { inArray } from 'drizzle-orm';
import { COMPARISON_CAUTION, type Comparison, type VersionCell } from '@laminote/contracts';
import type { Tx } from '../db/client';
import { outputs, versions } from '../db/schema';
import { diffCells, summarise } from './cell-diff';
import { compareAnalysis, sideOf, type Side, type StoredOutput } from './result-diff';
import { compareSweep, type SweepSide, sweepSideOf } from './sweep-diff';
import { toSnapshot, versionCellsOf, versionSummary } from './service';

/**
 * Two versions of one study, compared: cells matched by id with field-level differences, and the
 * results of every analysis cell side by side with their deltas and overlay data.
 */
export async function compareVersions(tx: Tx, aId: string, bId: string): Promise<Comparison> {
  const [a, b] = [await versionSummary(tx, aId), await versionSummary(tx, bId)];
  const cellsOf = await versionCellsOf(tx, [...new Set([aId, bId])]);
  const cellsA = cellsOf.get(aId) ?? [];
  const cellsB = cellsOf.get(bId) ?? [];
  const cells = diffCells(toSnapshot(cellsA), toSnapshot(cellsB));
  const byId = (list: VersionCell[]) => new Map(list.map((c) => [c.cellId, c]));
  const mapA = byId(cellsA);
  const mapB = byId(cellsB);
  const analyses = cells.filter((d) => d.kind === 'analysis');
  const sides = await analysisSides(
    tx,
    analyses.flatMap((d) => [mapA.get(d.cellId)?.outputKey, mapB.get(d.cellId)?.outputKey]),
  );
  const side = (cell: VersionCell | undefined): Side => (!cell ? { state: 'absent' } : (sides.get(cell.outputKey ?? '') ?? { state: 'notRun' }));
  const results = analyses.map((d) => compareAnalysis(d.cellId, d.titleB ?? d.titleA ?? 'Transition analysis', side(mapA.get(d.cellId)), side(mapB.get(d.cellId))));
  const sweepCells = cells.filter((d) => d.kind === 'sweep');
  const sweepOutputs = await storedOutputs(tx, sweepCells.flatMap((d) => [mapA.get(d.cellId)?.outputKey, mapB.get(d.cellId)?.outputKey]));
  const sweepSide = (cell: VersionCell | undefined): SweepSide => {
    if (!cell) return { state: 'absent' };
    const stored = cell.outputKey ? sweepOutputs.get(cell.outputKey) : undefined;
    return sweepSideOf(true, stored ?? null);
  };
  const sweeps = sweepCells.map((d) => compareSweep(d.cellId, d.titleB ?? d.titleA ?? 'Parameter sweep', sweepSide(mapA.get(d.cellId)), sweepSide(mapB.get(d.cellId))));
  return { studyId: a.studyId, a, b, summary: summarise(cells), cells, results, sweeps, caution: COMPARISON_CAUTION };
}

/**
 * Analysis outputs read and checked against the engine's result schema, by output key. A stored
 * output never changes (its key hashes everything it was computed from), so one read and checked
 * once serves later comparisons; the oldest go first beyond this many.
 */
const SIDE_CACHE_ENTRIES = 400;
const checkedSides = new Map<string, Side>();

/**
 * The side each stored output key gives a comparison. Whether the output is still stored is asked
 * every time (a key without its row reads as not run, as before); only the result itself is reused.
 */
async function analysisSides(tx: Tx, keyList: (string | null | undefined)[]): Promise<Map<string, Side>> {
  const keys = [...new Set(keyList.filter((k): k is string => !!k))];
  const out = new Map<string, Side>();
  if (keys.length === 0) return out;
  const present = await tx.select({ key: outputs.key }).from(outputs).where(inArray(outputs.key, keys));
  const missing: string[] = [];
  for (const { key } of present) {
    const hit = checkedSides.get(key);
    if (hit) {
      checkedSides.delete(key);
      checkedSides.set(key, hit);
      out.set(key, hit);
    } else missing.push(key);
  }
  if (missing.length) {
    const rows = await tx.select({ key: outputs.key, status: outputs.status, result: outputs.result, error: outputs.error }).from(outputs).where(inArray(outputs.key, missing));
    for (const row of rows) {
      const checked = sideOf(true, { status: row.status, result: row.result, error: row.error ?? null });
      out.set(row.key, checked);
      checkedSides.set(row.key, checked);
      while (checkedSides.size > SIDE_CACHE_ENTRIES) checkedSides.delete(checkedSides.keys().next().value!);
    }
  }
  return out;
}

/** Stored outputs by key (sweeps are few and small: read each time). */
async function storedOutputs(tx: Tx, keyList: (string | null | undefined)[]): Promise<Map<string, StoredOutput>> {
  const keys = [...new Set(keyList.filter((k): k is string => !!k))];
  if (keys.length === 0) return new Map();
  const rows = await tx.select({ key: outputs.key, status: outputs.status, result: outputs.result, error: outputs.error }).from(outputs).where(inArray(outputs.key, keys));
  return new Map(rows.map((row) => [row.key, { status: row.status, result: row.result, error: row.error ?? null }]));
}

/** The study of each version, to check access before comparing. */
export async function studiesOf(tx: Tx, ids: string[]): Promise<Map<string, string>> {
  const rows = await tx.select({ id: versions.id, studyId: versions.studyId }).from(versions).where(inArray(versions.id, ids));
  return new Map(rows.map((r) => [r.id, r.studyId]));
}
