import { edgeVelocityRatio } from '@laminote/aero/compressible';
import { parsePressureTable } from '@laminote/aero/pressure-table';
import { StagnationError, splitAtStagnation } from '@laminote/aero/stagnation';
import { oneSurfaceWarnings } from '@laminote/aero/surface-checks';
import { PLOT_COLOURS, type PlotTrace } from '../../shared/plot';
import { type CpPreview, EMPTY_PREVIEW, cpAxis, stagnationTrace } from './cp-preview';

/*
 * The pressure cell's reading of a table as it is typed, with the engine's own reader and stagnation
 * split. Loaded apart from the first screen (the split's least-squares fit brings ml-matrix): the cell
 * imports it dynamically and keeps its table read-only until it is here.
 */


/**
 * Reads a Cp table with the engine's own reader (the one the server computes with, body-radius column
 * included) and, for a closed loop, finds the stagnation point with
 * the engine's own split (at M = 0, so before the cell runs it is an incompressible estimate).
 */
export function previewCpTable(text: string, layout: 'closedLoop' | 'surface', surfaceName: string, hasRadius: boolean): CpPreview {
  if (text.trim() === '') return EMPTY_PREVIEW;
  const parsed = parsePressureTable(text, { radius: hasRadius });
  if (!parsed.ok) return { ...EMPTY_PREVIEW, problems: parsed.problems };
  const rows = parsed.rows;
  const x = rows.map((r) => r.x);
  const cp = rows.map((r) => r.cp);
  const lines = rows.map((r) => `line ${r.line}`);
  const base = { problems: [], rowCount: rows.length, hasY: parsed.hasY, warnings: [] as string[] };
  if (layout === 'surface') {
    return {
      ...base,
      warnings: oneSurfaceWarnings(rows),
      figure: { x: { title: 'x/c' }, y: cpAxis(), traces: [{ x, y: cp, name: surfaceName || 'surface', mode: 'lines+markers', markerSize: 3, text: lines }] },
      stagnation: null,
      stagnationProblem: null,
    };
  }
  try {
    const speed = cp.map((c) => edgeVelocityRatio(c, 0));
    const bad = speed.findIndex((s) => Number.isNaN(s));
    if (bad >= 0) throw new StagnationError(bad, `Cp = ${cp[bad]} is above the stagnation value 1`);
    const y = parsed.hasY ? rows.map((r) => r.y ?? 0) : null;
    const split = splitAtStagnation(x, y, speed);
    // Cp at the stagnation point, incompressible (the estimate is made at M = 0).
    const stagnationCp = 1;
    const side = (branch: typeof split.upper, name: string, colour: string): PlotTrace => {
      const indices = Array.from(branch.source);
      return {
        x: Array.from(branch.x),
        y: indices.map((i) => (i < 0 ? stagnationCp : cp[i])),
        name,
        mode: 'lines+markers',
        markerSize: 3,
        color: colour,
        text: indices.map((i) => (i < 0 ? 'stagnation point' : lines[i])),
      };
    };
    return {
      ...base,
      figure: {
        x: { title: 'x/c' },
        y: cpAxis(),
        traces: [side(split.upper, 'upper', PLOT_COLOURS[0]), side(split.lower, 'lower', PLOT_COLOURS[2]), stagnationTrace(split.stagnation.x, stagnationCp)],
      },
      stagnation: { x: split.stagnation.x, cp: stagnationCp },
      stagnationProblem: null,
    };
  } catch (error) {
    const row = error instanceof StagnationError ? rows[Math.min(Math.max(error.row, 0), rows.length - 1)] : null;
    const message = error instanceof Error ? error.message : String(error);
    return {
      ...base,
      figure: { x: { title: 'x/c' }, y: cpAxis(), traces: [{ x, y: cp, name: 'table', mode: 'lines+markers', markerSize: 3, text: lines }] },
      stagnation: null,
      stagnationProblem: row ? `line ${row.line}: ${message}` : message,
    };
  }
}
