import type { PressureInputs, PressureResult } from '@laminote/contracts';
import { automaticHalfWidth, estimateScatter, leastSquaresSlope, leastSquaresValue } from '../smoothing';
import { loopArcLength, splitAtStagnation } from '../stagnation';
import { oneSurfaceWarnings } from '../surface-checks';
import { fail, stagnationFailure } from './errors';
import { readCellTable } from './table';
import { warningNotes, type ResultTable, type TableValue } from './result-table';

/**
 * Pressure distribution: the table as read (pressure-table.ts) and, for a closed loop, split at the
 * stagnation point into upper and lower surfaces with their arc lengths (stagnation.ts), with the
 * smoothing the analysis will differentiate Ue with (smoothing.ts), shown at M = 0.
 */
export function computePressure(p: PressureInputs): PressureResult {
  const table = readCellTable(p);
  const { rows } = table;
  const x = rows.map((r) => r.x);
  const y = table.hasY ? rows.map((r) => r.y!) : null;
  const warnings: string[] = [];
  let cpMinIndex = 0;
  rows.forEach((r, i) => {
    if (r.cp < rows[cpMinIndex]!.cp) cpMinIndex = i;
  });
  let surfaces: PressureResult['surfaces'];
  let stagnation: PressureResult['stagnation'] = null;
  const nameOfRow = new Map<number, string>();
  if (p.layout === 'closedLoop') {
    // The stagnation point does not move with Mach number (Cp is largest there either way), so the
    // incompressible speed locates it; the analysis splits again with the flow's Mach number.
    const speed = rows.map((r) => Math.sqrt(Math.max(0, 1 - r.cp)));
    let split;
    try {
      split = splitAtStagnation(x, y, speed);
    } catch (error) {
      stagnationFailure(error, rows);
    }
    stagnation = { x: split.stagnation.x, y: split.stagnation.y, velocityGradient: split.stagnation.velocityGradient };
    surfaces = (['upper', 'lower'] as const).map((name) => {
      const b = split[name];
      const keep = [...b.source.keys()].filter((j) => b.source[j]! >= 0);
      for (const j of keep) nameOfRow.set(b.source[j]!, name);
      return {
        smoothing: smoothingView(p, b.s, b.ue, keep),
        name,
        x: keep.map((j) => b.x[j]!),
        y: b.y ? keep.map((j) => b.y![j]!) : null,
        cp: keep.map((j) => rows[b.source[j]!]!.cp),
        s: keep.map((j) => b.s[j]!),
        r: null,
        line: keep.map((j) => rows[b.source[j]!]!.line),
      };
    });
    if (!table.hasY) warnings.push('no y column: arc length is taken from x alone, which understates it round the leading edge; the first part of the loop is named upper');
  } else {
    let s: Float64Array;
    try {
      s = loopArcLength(x, y);
    } catch (error) {
      stagnationFailure(error, rows);
    }
    const speed = Float64Array.from(rows, (r) => Math.sqrt(Math.max(0, 1 - r.cp)));
    const all = rows.map((_, i) => i);
    surfaces = [
      { name: p.surfaceName, x, y, cp: rows.map((r) => r.cp), s: Array.from(s), r: table.radius, line: rows.map((r) => r.line), ...(rows.length >= 3 ? { smoothing: smoothingView(p, s, speed, all) } : {}) },
    ];
    for (let i = 0; i < rows.length; i++) nameOfRow.set(i, p.surfaceName);
    if (rows.length < 3) fail('text', 'a surface needs at least 3 rows');
    warnings.push(...oneSurfaceWarnings(rows));
  }
  const minRow = rows[cpMinIndex]!;
  return {
    layout: p.layout,
    rowCount: rows.length,
    hasY: table.hasY,
    headerLine: table.headerLine,
    surfaces,
    stagnation,
    cpMin: { x: minRow.x, cp: minRow.cp, surface: nameOfRow.get(cpMinIndex) ?? surfaces[0]!.name },
    warnings,
  };
}

/**
 * The cell's smoothing applied to the incompressible speed √(1 − Cp) along one surface: the half-width
 * (chosen, or from the estimated scatter), the fit's Cp, and dUe/ds smoothed and unsmoothed (h = 1),
 * at the stations `keep` (the table's points; a closed loop's split adds the stagnation point).
 */
function smoothingView(p: PressureInputs, s: Float64Array, ue: Float64Array, keep: number[]): NonNullable<PressureResult['surfaces'][number]['smoothing']> {
  const n = s.length;
  const chosen = p.smoothing ?? 'auto';
  const { halfWidth, scatter } =
    chosen === 'auto' ? automaticHalfWidth(s, ue) : { halfWidth: chosen === 'off' ? 1 : (p.smoothingHalfWidth ?? 2), scatter: estimateScatter(s, ue) };
  const value = leastSquaresValue(s, ue, new Float64Array(n), halfWidth);
  const slope = leastSquaresSlope(s, ue, new Float64Array(n), halfWidth);
  const raw = leastSquaresSlope(s, ue, new Float64Array(n), 1);
  return {
    halfWidth,
    scatter,
    cp: keep.map((j) => 1 - value[j]! * value[j]!),
    dUeds: keep.map((j) => slope[j]!),
    dUedsRaw: keep.map((j) => raw[j]!),
  };
}

/** A pressure distribution as a table: each surface's points from the stagnation point, with the line each came from. */
export function pressureTable(r: PressureResult): ResultTable {
  const rows: TableValue[][] = [];
  for (const surface of r.surfaces) {
    surface.x.forEach((x, i) => rows.push([surface.name, surface.line[i]!, x, surface.y?.[i] ?? null, surface.cp[i]!, surface.s[i]!, surface.r?.[i] ?? null]));
  }
  const notes = [`${r.layout === 'closedLoop' ? 'closed loop' : 'one surface'}, ${r.rowCount} rows`, `Cp minimum ${r.cpMin.cp} at x ${r.cpMin.x} (${r.cpMin.surface})`];
  return { fields: ['surface', 'line', 'x', 'y', 'cp', 's', 'r'], rows, notes: [...notes, ...warningNotes(r.warnings)] };
}
