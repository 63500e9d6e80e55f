import { inArray } from 'drizzle-orm';
import { COMPARISON_CAUTION, type Comparison, type VersionCell } from '@laminote/contracts';
import type { Tx } from '../db/client';
import { outputs, versions } from '../db/schema';
import { diffCells, summarise } from './cell-diff';
import { compareAnalysis, sideOf, type Side, type StoredOutput } from './result-diff';
import { compareSweep, type SweepSide, sweepSideOf } from './sweep-diff';
import { toSnapshot, versionCellsOf, versionSummary } from './service';

/** A pair of analysis sides and what they name: the stored output's key, or the state without one. */
interface AnalysisPair {
  cellId: string;
  title: string;
  a: Side;
  b: Side;
  /** What the pair is computed from, as text: the cell, its title and each side's output key or state. */
  key: string;
}

/** Everything of a comparison but its analyses' results, and the analyses' sides to compare. */
async function gather(tx: Tx, aId: string, bId: string): Promise<{ rest: Omit<Comparison, 'results'>; pairs: AnalysisPair[] }> {
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
  // A side is its stored output's when that output is there, else the state it is in.
  const sideOfCell = (cell: VersionCell | undefined): { side: Side; key: string } => {
    if (!cell) return { side: { state: 'absent' }, key: 'absent' };
    const stored = sides.get(cell.outputKey ?? '');
    return stored ? { side: stored, key: `output ${cell.outputKey}` } : { side: { state: 'notRun' }, key: 'notRun' };
  };
  const pairs = analyses.map((d) => {
    const title = d.titleB ?? d.titleA ?? 'Transition analysis';
    const a = sideOfCell(mapA.get(d.cellId));
    const b = sideOfCell(mapB.get(d.cellId));
    return { cellId: d.cellId, title, a: a.side, b: b.side, key: JSON.stringify([d.cellId, title, a.key, b.key]) };
  });
  const sweepCells = cells.filter((d) => d.kind === 'sweep');
  const sweepOutputs = await storedOutputs(tx, sweepCells.flatMap((d) => [mapA.get(d.cellId)?.outputKey, mapB.get(d.cellId)?.outputKey]));
  const sweepSide = (cell: VersionCell | undefined): SweepSide => {
    if (!cell) return { state: 'absent' };
    const stored = cell.outputKey ? sweepOutputs.get(cell.outputKey) : undefined;
    return sweepSideOf(true, stored ?? null);
  };
  const sweeps = sweepCells.map((d) => compareSweep(d.cellId, d.titleB ?? d.titleA ?? 'Parameter sweep', sweepSide(mapA.get(d.cellId)), sweepSide(mapB.get(d.cellId))));
  return { rest: { studyId: a.studyId, a, b, summary: summarise(cells), cells, sweeps, caution: COMPARISON_CAUTION }, pairs };
}

/**
 * Two versions of one study, compared: cells matched by id with field-level differences, and the
 * results of every analysis cell side by side with their deltas and overlay data.
 */
export async function compareVersions(tx: Tx, aId: string, bId: string): Promise<Comparison> {
  const { rest, pairs } = await gather(tx, aId, bId);
  const { studyId, a, b, summary, cells, sweeps, caution } = rest;
  return { studyId, a, b, summary, cells, results: pairs.map((p) => compareAnalysis(p.cellId, p.title, p.a, p.b)), sweeps, caution };
}

/**
 * The same comparison as JSON text, for GET /api/compare. An analysis compared is written once per
 * pair of sides and its text reused: a stored output never changes (its key hashes everything it was
 * computed from), so the same cell, title and outputs compare the same. For a 200-cell study the 75
 * analyses are 94 % of the answer's megabyte, and comparing and writing them took about 20 ms of
 * every ask. The results come last in the text; everything else is written afresh each time.
 */
export async function compareVersionsJson(tx: Tx, aId: string, bId: string): Promise<string> {
  const { rest, pairs } = await gather(tx, aId, bId);
  const results = pairs.map((p) => {
    const kept = comparedAnalyses.get(p.key);
    if (kept !== undefined) {
      comparedAnalyses.delete(p.key);
      comparedAnalyses.set(p.key, kept);
      return kept;
    }
    const text = JSON.stringify(compareAnalysis(p.cellId, p.title, p.a, p.b));
    comparedAnalyses.set(p.key, text);
    while (comparedAnalyses.size > COMPARED_ANALYSES) comparedAnalyses.delete(comparedAnalyses.keys().next().value!);
    return text;
  });
  return `${JSON.stringify(rest).slice(0, -1)},"results":[${results.join(',')}]}`;
}

/** Analyses compared, as JSON text, by what they are computed from; the least recently asked go first beyond this many (a 2 × 70-station analysis is about 13 kB: some 5 MB at most). */
const COMPARED_ANALYSES = 400;
const comparedAnalyses = new Map<string, string>();

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
