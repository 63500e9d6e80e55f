import type { PressureTableProblem } from '@laminote/aero/pressure-table';
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

/** A table with nothing to read (or not read yet). */
export const EMPTY_PREVIEW: CpPreview = { problems: [], rowCount: 0, hasY: false, figure: null, stagnation: null, stagnationProblem: null, warnings: [] };

export function cpAxis(): PlotFigure['y'] {
  return { title: 'Cp', reversed: true };
}

export function stagnationTrace(x: number, cp: number): PlotTrace {
  return { x: [x], y: [cp], name: 'Stagnation point', mode: 'markers', color: PLOT_COLOURS[1], markerSize: 10, markerSymbol: 'diamond' };
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
