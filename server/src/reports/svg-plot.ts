import { scaleLinear } from 'd3-scale';
import { line } from 'd3-shape';

/**
 * Static vector plots for reports, drawn on the server as SVG text (d3-scale for the axes and ticks,
 * d3-shape for the lines). No script, no fonts fetched: a report opens the same offline and prints
 * sharp at any size.
 */
export interface PlotSeries {
  name: string;
  x: readonly number[];
  /** null leaves a gap (e.g. N after transition). */
  y: readonly (number | null)[];
}

export interface PlotSpec {
  title: string;
  xLabel: string;
  yLabel: string;
  series: PlotSeries[];
  /** Cp plots put negative values up, as aerodynamicists read them. */
  reverseY?: boolean;
  /** Vertical marks, e.g. transition locations. */
  markers?: { x: number; label: string }[];
}

export const PLOT_WIDTH = 640;
export const PLOT_HEIGHT = 300;
const MARGIN = { top: 28, right: 16, bottom: 42, left: 64 };
const COLOURS = ['#1f5f8b', '#c0562a', '#2f7d4f', '#7b4f9d', '#9a7b1c', '#4d4d4d'];

function escapeXml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

function tickText(value: number): string {
  if (value === 0) return '0';
  const magnitude = Math.abs(value);
  return magnitude >= 1e5 || magnitude < 1e-3 ? value.toExponential(1) : Number(value.toPrecision(4)).toString();
}

function extent(values: Iterable<number>): [number, number] | null {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    if (!Number.isFinite(v)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (lo === Infinity) return null;
  if (lo === hi) return [lo - (Math.abs(lo) || 1) * 0.05, hi + (Math.abs(hi) || 1) * 0.05];
  return [lo, hi];
}

/** The plot as a standalone SVG document (with its own width, height and viewBox). */
export function renderSvgPlot(spec: PlotSpec): string {
  const xs = extent(spec.series.flatMap((s) => s.x));
  const ys = extent(spec.series.flatMap((s) => s.y.filter((v): v is number => v !== null)));
  const innerW = PLOT_WIDTH - MARGIN.left - MARGIN.right;
  const innerH = PLOT_HEIGHT - MARGIN.top - MARGIN.bottom;
  const out: string[] = [];
  out.push(
    `<svg xmlns="http://www.w3.org/2000/svg" width="${PLOT_WIDTH}" height="${PLOT_HEIGHT}" viewBox="0 0 ${PLOT_WIDTH} ${PLOT_HEIGHT}" font-family="Lato, 'DejaVu Sans', Helvetica, Arial, sans-serif" font-size="11" role="img" aria-label="${escapeXml(spec.title)}">`,
  );
  out.push(`<title>${escapeXml(spec.title)}</title>`);
  out.push(`<rect x="0" y="0" width="${PLOT_WIDTH}" height="${PLOT_HEIGHT}" fill="#ffffff"/>`);
  out.push(`<text x="${MARGIN.left}" y="16" font-size="12" font-weight="bold" fill="#1b1b1f">${escapeXml(spec.title)}</text>`);
  if (!xs || !ys) {
    out.push(`<text x="${PLOT_WIDTH / 2}" y="${PLOT_HEIGHT / 2}" text-anchor="middle" fill="#555">no values to plot</text></svg>`);
    return out.join('');
  }
  const x = scaleLinear().domain(xs).range([MARGIN.left, MARGIN.left + innerW]).nice();
  const y = scaleLinear()
    .domain(ys)
    .range(spec.reverseY ? [MARGIN.top, MARGIN.top + innerH] : [MARGIN.top + innerH, MARGIN.top])
    .nice();
  // Grid and ticks.
  for (const t of x.ticks(8)) {
    const px = x(t).toFixed(1);
    out.push(`<line x1="${px}" x2="${px}" y1="${MARGIN.top}" y2="${MARGIN.top + innerH}" stroke="#e3e3e8"/>`);
    out.push(`<text x="${px}" y="${MARGIN.top + innerH + 14}" text-anchor="middle" fill="#44474e">${tickText(t)}</text>`);
  }
  for (const t of y.ticks(6)) {
    const py = y(t).toFixed(1);
    out.push(`<line x1="${MARGIN.left}" x2="${MARGIN.left + innerW}" y1="${py}" y2="${py}" stroke="#e3e3e8"/>`);
    out.push(`<text x="${MARGIN.left - 6}" y="${py}" dy="0.32em" text-anchor="end" fill="#44474e">${tickText(t)}</text>`);
  }
  out.push(`<rect x="${MARGIN.left}" y="${MARGIN.top}" width="${innerW}" height="${innerH}" fill="none" stroke="#74777f"/>`);
  out.push(`<text x="${MARGIN.left + innerW / 2}" y="${PLOT_HEIGHT - 8}" text-anchor="middle" fill="#1b1b1f">${escapeXml(spec.xLabel)}</text>`);
  out.push(
    `<text transform="translate(14 ${MARGIN.top + innerH / 2}) rotate(-90)" text-anchor="middle" fill="#1b1b1f">${escapeXml(spec.yLabel)}</text>`,
  );
  // Lines.
  const path = line<[number, number | null]>()
    .defined((d) => d[1] !== null && Number.isFinite(d[1]) && Number.isFinite(d[0]))
    .x((d) => x(d[0]))
    .y((d) => y(d[1] as number));
  spec.series.forEach((s, i) => {
    const points: [number, number | null][] = s.x.map((xv, j) => [xv, s.y[j] ?? null]);
    const d = path(points);
    if (d) out.push(`<path d="${d}" fill="none" stroke="${COLOURS[i % COLOURS.length]}" stroke-width="1.6" stroke-linejoin="round"/>`);
  });
  // Marks close together (upper and lower transition) put their labels on successive lines.
  (spec.markers ?? []).forEach((m, k) => {
    if (!Number.isFinite(m.x) || m.x < x.domain()[0] || m.x > x.domain()[1]) return;
    const px = x(m.x).toFixed(1);
    out.push(`<line x1="${px}" x2="${px}" y1="${MARGIN.top}" y2="${MARGIN.top + innerH}" stroke="#1b1b1f" stroke-dasharray="4 3"/>`);
    out.push(`<text x="${px}" y="${MARGIN.top + 11 + 12 * k}" dx="3" fill="#1b1b1f" font-size="10">${escapeXml(m.label)}</text>`);
  });
  // Legend.
  if (spec.series.length > 1) {
    let lx = MARGIN.left + innerW;
    [...spec.series].reverse().forEach((s, k) => {
      const i = spec.series.length - 1 - k;
      const width = 26 + s.name.length * 6;
      lx -= width;
      out.push(`<line x1="${lx}" x2="${lx + 16}" y1="12" y2="12" stroke="${COLOURS[i % COLOURS.length]}" stroke-width="2"/>`);
      out.push(`<text x="${lx + 20}" y="15" fill="#1b1b1f">${escapeXml(s.name)}</text>`);
    });
  }
  out.push('</svg>');
  return out.join('');
}
