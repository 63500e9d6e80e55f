import { type PressureTableProblem, edgeVelocityRatio, oneSurfaceWarnings, parsePressureTable, splitAtStagnation, StagnationError } from '@laminote/aero';
import type { PressureResult } from '@laminote/contracts';
import { PLOT_COLOURS, type PlotFigure, type PlotTrace } from '../../shared/plot';

/** A pasted table read here, as it is typed: its problems by line, or its points. */
export interface CpPreview {
  readonly problems: readonly PressureTableProblem[];
  readonly rowCount: number;
  readonly hasY: boolean;
  readonly figure: PlotFigure | null;
  /** The stagnation point found on a closed loop (incompressible estimate before the cell runs). */
  readonly stagnation: { readonly x: number; readonly cp: number } | null;
  /** Why the stagnation point could not be found (the table reads, but not as a closed loop). */
  readonly stagnationProblem: string | null;
  /** What looks wrong with a table that reads (a loop pasted as one surface; no stagnation point at its start). */
  readonly warnings: readonly string[];
}

const EMPTY: CpPreview = { problems: [], rowCount: 0, hasY: false, figure: null, stagnation: null, stagnationProblem: null, warnings: [] };

function cpAxis(): PlotFigure['y'] {
  return { title: 'Cp', reversed: true };
}

function stagnationTrace(x: number, cp: number): PlotTrace {
  return { x: [x], y: [cp], name: 'Stagnation point', mode: 'markers', color: PLOT_COLOURS[1], markerSize: 10, markerSymbol: 'diamond' };
}

/**
 * Reads a Cp table with the engine's own reader (the one the server computes with, body-radius column
 * included) and, for a closed loop, finds the stagnation point with
 * the engine's own split (at M = 0, so before the cell runs it is an incompressible estimate).
 */
export function previewCpTable(text: string, layout: 'closedLoop' | 'surface', surfaceName: string, hasRadius: boolean): CpPreview {
  if (text.trim() === '') return EMPTY;
  const parsed = parsePressureTable(text, { radius: hasRadius });
  if (!parsed.ok) return { ...EMPTY, problems: parsed.problems };
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

/**
 * The plot of a pressure cell's computed result: each surface as read, the Cp of the smoothing fit
 * the analysis differentiates (when it smooths), and the stagnation point the server found.
 */
export function resultFigure(result: PressureResult): PlotFigure {
  const traces: PlotTrace[] = result.surfaces.map((surface, i) => ({
    x: surface.x,
    y: surface.cp,
    name: surface.name,
    mode: 'lines+markers',
    markerSize: 3,
    color: PLOT_COLOURS[i === 0 ? 0 : 2],
    text: surface.line.map((line) => (line === null ? 'stagnation point' : `line ${line}`)),
  }));
  result.surfaces.forEach((surface, i) => {
    if (surface.smoothing && surface.smoothing.halfWidth > 1) {
      traces.push({ x: surface.x, y: surface.smoothing.cp, name: `${surface.name}, smoothed`, color: PLOT_COLOURS[i === 0 ? 1 : 3], width: 1.5 });
    }
  });
  const stagnation = resultStagnation(result);
  if (stagnation) traces.push(stagnationTrace(stagnation.x, stagnation.cp));
  return { x: { title: 'x/c' }, y: cpAxis(), traces };
}

/**
 * dUe/ds along each surface as the analysis takes it (the smoothing fit's slope) beside the unsmoothed
 * slope (the parabola through each point and its neighbours); null when the result has no smoothing.
 */
export function slopeFigure(result: PressureResult): PlotFigure | null {
  const traces: PlotTrace[] = [];
  result.surfaces.forEach((surface, i) => {
    const view = surface.smoothing;
    if (!view) return;
    traces.push({ x: surface.x, y: view.dUedsRaw, name: `${surface.name}, unsmoothed`, mode: 'markers', markerSize: 3, color: PLOT_COLOURS[i === 0 ? 0 : 2] });
    if (view.halfWidth > 1) traces.push({ x: surface.x, y: view.dUeds, name: `${surface.name}, smoothed`, color: PLOT_COLOURS[i === 0 ? 1 : 3], width: 1.5 });
  });
  if (traces.length === 0) return null;
  // The slope is unbounded at the attachment line; keep the rest of the curve readable.
  const values = result.surfaces.flatMap((surface) => (surface.smoothing?.dUeds ?? []).filter((_, k) => surface.s[k]! > 0.03 * (surface.s.at(-1) ?? 1)));
  const sorted = values.map(Math.abs).sort((a, b) => a - b);
  const span = sorted.length > 0 ? 1.5 * sorted[Math.floor(0.95 * (sorted.length - 1))]! : 1;
  return { x: { title: 'x/c' }, y: { title: 'dUe/ds (Ue/V∞ per s/c, at M = 0)', range: [-span, span] }, traces };
}

/** The stagnation point of a computed loop, with its Cp: the surfaces start at the interpolated point. */
export function resultStagnation(result: PressureResult): { x: number; cp: number } | null {
  if (!result.stagnation) return null;
  const first = result.surfaces.find((s) => s.line[0] === null);
  return { x: result.stagnation.x, cp: first ? first.cp[0] : 1 };
}
