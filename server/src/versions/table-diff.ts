import { parsePressureTable, type PressureTableRow } from '@laminote/aero';
import type { PressureTableDiff } from '@laminote/contracts';

/**
 * A changed pressure table as numbers, not text: both tables are read with the engine's own parser,
 * split into their surfaces, and rows are matched by x on the same surface. A designer sees ΔCp at
 * each x both tables have, the largest |ΔCp| and where it is, and the rows only one table has.
 */

/** x positions closer than this (fraction of the reference length) are the same station. */
const X_TOLERANCE = 1e-6;
/** Matched rows listed in full up to this many; the extremes are always computed over all of them. */
const MAX_LISTED = 2000;

export interface TableInputs {
  text: string;
  layout: 'closedLoop' | 'surface';
  surfaceName: string;
}

interface Side {
  name: string;
  rows: PressureTableRow[];
}

function meanY(rows: PressureTableRow[]): number {
  return rows.reduce((sum, r) => sum + (r.y ?? 0), 0) / Math.max(rows.length, 1);
}

/**
 * The surfaces of a table. A closed loop runs from the trailing edge over one side to the other; it
 * is split at its smallest x (the leading edge, which stays with the first side). The side with the
 * larger mean y is the upper one; without y the first side is, as the engine names them.
 */
export function tableSurfaces(rows: PressureTableRow[], inputs: Pick<TableInputs, 'layout' | 'surfaceName'>, hasY: boolean): Side[] {
  if (inputs.layout === 'surface' || rows.length < 3) return [{ name: inputs.surfaceName || 'surface', rows }];
  let leadingEdge = 0;
  for (let i = 1; i < rows.length; i++) if (rows[i]!.x < rows[leadingEdge]!.x) leadingEdge = i;
  const first = rows.slice(0, leadingEdge + 1);
  const second = rows.slice(leadingEdge + 1);
  if (second.length === 0) return [{ name: 'upper', rows: first }];
  const upperFirst = !hasY || meanY(first) >= meanY(second);
  return upperFirst
    ? [
        { name: 'upper', rows: first },
        { name: 'lower', rows: second },
      ]
    : [
        { name: 'upper', rows: second },
        { name: 'lower', rows: first },
      ];
}

const key = (x: number) => Math.round(x / X_TOLERANCE);

function compareSide(name: string, a: PressureTableRow[], b: PressureTableRow[]): PressureTableDiff['surfaces'][number] {
  const byX = new Map<number, PressureTableRow[]>();
  for (const row of b) {
    const k = key(row.x);
    const list = byX.get(k);
    if (list) list.push(row);
    else byX.set(k, [row]);
  }
  const matched: PressureTableDiff['surfaces'][number]['matched'] = [];
  const removed: PressureTableRow[] = [];
  let maxAbs = -1;
  let maxAt: number | null = null;
  let sumSq = 0;
  let count = 0;
  for (const row of a) {
    const candidates = byX.get(key(row.x));
    const partner = candidates?.shift();
    if (!partner) {
      removed.push(row);
      continue;
    }
    const deltaCp = partner.cp - row.cp;
    count++;
    sumSq += deltaCp * deltaCp;
    if (Math.abs(deltaCp) > maxAbs) {
      maxAbs = Math.abs(deltaCp);
      maxAt = row.x;
    }
    if (matched.length < MAX_LISTED) matched.push({ x: row.x, cpA: row.cp, cpB: partner.cp, deltaCp });
  }
  const added = [...byX.values()].flat().sort((p, q) => p.line - q.line);
  const strip = (r: PressureTableRow) => ({ x: r.x, cp: r.cp, line: r.line });
  return {
    name,
    matched,
    maxAbsDeltaCp: count ? maxAbs : null,
    maxAt: count ? maxAt : null,
    rmsDeltaCp: count ? Math.sqrt(sumSq / count) : null,
    rowsAdded: added.map(strip),
    rowsRemoved: removed.map(strip),
  };
}

export function diffPressureTables(a: TableInputs, b: TableInputs): PressureTableDiff {
  const parsedA = parsePressureTable(a.text);
  const parsedB = parsePressureTable(b.text);
  const problems: PressureTableDiff['problems'] = [];
  if (!parsedA.ok) problems.push(...parsedA.problems.slice(0, 5).map((p) => ({ side: 'a' as const, ...p })));
  if (!parsedB.ok) problems.push(...parsedB.problems.slice(0, 5).map((p) => ({ side: 'b' as const, ...p })));
  if (!parsedA.ok || !parsedB.ok) {
    return { rowCountA: parsedA.ok ? parsedA.rows.length : 0, rowCountB: parsedB.ok ? parsedB.rows.length : 0, problems, surfaces: [] };
  }
  const sidesA = tableSurfaces(parsedA.rows, a, parsedA.hasY);
  const sidesB = tableSurfaces(parsedB.rows, b, parsedB.hasY);
  const names = [...new Set([...sidesA.map((s) => s.name), ...sidesB.map((s) => s.name)])];
  return {
    rowCountA: parsedA.rows.length,
    rowCountB: parsedB.rows.length,
    problems,
    surfaces: names.map((name) => compareSide(name, sidesA.find((s) => s.name === name)?.rows ?? [], sidesB.find((s) => s.name === name)?.rows ?? [])),
  };
}

/** How many data rows a table has, for a one-line summary; null when it does not parse. */
export function tableRowCount(text: string): number | null {
  const parsed = parsePressureTable(text);
  return parsed.ok ? parsed.rows.length : null;
}
