import type { BodyResult } from '@laminote/contracts';
import { PLOT_COLOURS, type PlotFigure } from '../../shared/plot';

/** The meridian drawn both sides of the axis, r/L against x/L, with room round it. */
export function bodyOutlineFigure(outline: BodyResult['outline']): PlotFigure {
  const top = Math.max(...outline.r, 0.01);
  return {
    x: { title: 'x/L', range: [-0.02, 1.02] },
    y: { title: 'r/L', range: [-1.4 * top, 1.4 * top] },
    traces: [
      { x: [...outline.x, ...[...outline.x].reverse()], y: [...outline.r, ...[...outline.r].reverse().map((r) => (r === 0 ? 0 : -r))], name: 'Meridian', mode: 'lines', color: PLOT_COLOURS[0], width: 1.5, showInLegend: false },
    ],
  };
}

/** Cp along x/L from the axisymmetric panel solution, negative up. */
export function bodyCpFigure(result: BodyResult): PlotFigure {
  const inv = result.inviscid;
  return {
    x: { title: 'x/L' },
    y: { title: 'Cp', reversed: true },
    traces: [{ x: inv.x, y: inv.cp, name: 'Cp (incompressible)', mode: 'lines', color: PLOT_COLOURS[0] }],
  };
}
