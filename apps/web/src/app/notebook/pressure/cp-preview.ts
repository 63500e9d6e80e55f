import { type PressureTableProblem, edgeVelocityRatio, parsePressureTable, splitAtStagnation, StagnationError } from '@laminote/aero';
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
}

const EMPTY: CpPreview = { problems: [], rowCount: 0, hasY: false, figure: null, stagnation: null, stagnationProblem: null };

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
  const base = { problems: [], rowCount: rows.length, hasY: parsed.hasY };
  if (layout === 'surface') {
    return {
      ...base,
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

/** The plot of a pressure cell's computed result: each surface, and the stagnation point the server found. */
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
  const stagnation = resultStagnation(result);
  if (stagnation) traces.push(stagnationTrace(stagnation.x, stagnation.cp));
  return { x: { title: 'x/c' }, y: cpAxis(), traces };
}

/** The stagnation point of a computed loop, with its Cp: the surfaces start at the interpolated point. */
export function resultStagnation(result: PressureResult): { x: number; cp: number } | null {
  if (!result.stagnation) return null;
  const first = result.surfaces.find((s) => s.line[0] === null);
  return { x: result.stagnation.x, cp: first ? first.cp[0] : 1 };
}
