import type { EngineResult, PolarResult, SectionResult, TransitionCriterion } from '@laminote/contracts';
import { CRITERION_LABELS, summarise } from '../../shared/analysis-summary';
import { PLOT_COLOURS, type PlotFigure, type PlotMarker, type PlotTrace } from '../../shared/plot';

/** The loop split at its foremost point: upper from the nose aft, lower from the nose aft. */
export function splitOutline(x: readonly number[], y: readonly number[]): { upper: { x: number[]; y: number[] }; lower: { x: number[]; y: number[] } } {
  let le = 0;
  for (let i = 1; i < x.length; i++) if (x[i]! < x[le]!) le = i;
  return {
    upper: { x: x.slice(0, le + 1).reverse(), y: y.slice(0, le + 1).reverse() },
    lower: { x: x.slice(le), y: y.slice(le) },
  };
}

function yAt(surface: { x: number[]; y: number[] }, at: number): number | null {
  for (let i = 1; i < surface.x.length; i++) {
    const a = surface.x[i - 1]!;
    const b = surface.x[i]!;
    if ((a <= at && at <= b) || (b <= at && at <= a)) {
      const f = b === a ? 0 : (at - a) / (b - a);
      return surface.y[i - 1]! + f * (surface.y[i]! - surface.y[i - 1]!);
    }
  }
  return null;
}

export interface OutlineMark {
  readonly surface: 'upper' | 'lower';
  readonly x: number;
  readonly label: string;
  readonly kind: 'transition' | 'criterion' | 'separation';
}

const MARK_STYLE: Record<OutlineMark['kind'], { symbol: string; colour: string; size: number }> = {
  transition: { symbol: 'diamond', colour: PLOT_COLOURS[1], size: 11 },
  criterion: { symbol: 'line-ns-open', colour: PLOT_COLOURS[2], size: 12 },
  separation: { symbol: 'x', colour: '#a33b2b', size: 10 },
};

/** The section outline on equal scales, with marks where transition (and separation) fall. */
export function outlineFigure(outline: { x: readonly number[]; y: readonly number[] }, marks: readonly OutlineMark[] = []): PlotFigure {
  const { upper, lower } = splitOutline(outline.x, outline.y);
  const traces: PlotTrace[] = [
    { x: [...upper.x].reverse().concat(lower.x.slice(1)), y: [...upper.y].reverse().concat(lower.y.slice(1)), name: 'Outline', mode: 'lines', color: PLOT_COLOURS[0], width: 1.5, showInLegend: false },
  ];
  for (const kind of ['transition', 'criterion', 'separation'] as const) {
    const these = marks.filter((m) => m.kind === kind);
    if (these.length === 0) continue;
    const xs: number[] = [];
    const ys: number[] = [];
    const text: string[] = [];
    for (const m of these) {
      const y = yAt(m.surface === 'upper' ? upper : lower, m.x);
      if (y === null) continue;
      xs.push(m.x);
      ys.push(y);
      text.push(m.label);
    }
    const style = MARK_STYLE[kind];
    traces.push({
      x: xs,
      y: ys,
      text,
      name: kind === 'transition' ? 'Transition (governing)' : kind === 'criterion' ? 'Other criteria' : 'Separation',
      mode: 'markers',
      markerSymbol: style.symbol,
      markerSize: style.size,
      color: style.colour,
    });
  }
  return { x: { title: 'x/c', range: [-0.02, 1.02] }, y: { title: 'y/c', range: [-0.22, 0.22] }, traces };
}

/**
 * The outline an analysis of a section cell carries (its panel solution's x, y), with where each
 * criterion puts transition on each surface, the governing one, and separation. Null when the analysis
 * names a pressure cell (no shape) or a surface is located along s/c rather than x/c.
 */
export function analysisOutlineFigure(result: EngineResult, criteria: readonly TransitionCriterion[]): PlotFigure | null {
  const inviscid = result.inviscid;
  if (!inviscid || inviscid.kind !== 'section') return null;
  const marks: OutlineMark[] = [];
  for (const s of summarise(result, criteria)) {
    if (s.name !== 'upper' && s.name !== 'lower') continue;
    const surface = s.name;
    const at = (v: { value: number; along: string } | null) => (v && v.along === 'x/c' ? v.value : null);
    const governing = at(s.governing);
    if (governing !== null) marks.push({ surface, x: governing, kind: 'transition', label: `${surface}: transition x/c ${governing.toFixed(3)} (${s.governingBy})` });
    for (const id of criteria) {
      const x = at(s.criteria[id] ?? null);
      if (x !== null && !(governing !== null && Math.abs(x - governing) < 1e-9)) marks.push({ surface, x, kind: 'criterion', label: `${surface}: ${CRITERION_LABELS[id]} x/c ${x.toFixed(3)}` });
    }
    const laminar = at(s.laminarSeparation);
    if (laminar !== null) marks.push({ surface, x: laminar, kind: 'separation', label: `${surface}: laminar separation x/c ${laminar.toFixed(3)}` });
    const turbulent = at(s.turbulentSeparation);
    if (turbulent !== null) marks.push({ surface, x: turbulent, kind: 'separation', label: `${surface}: turbulent separation x/c ${turbulent.toFixed(3)}` });
  }
  return outlineFigure({ x: inviscid.x, y: inviscid.y }, marks);
}

/** Cp along x/c for each surface, negative up; Prandtl–Glauert dashed beside Kármán–Tsien; Cp* marked. */
export function cpFigure(result: SectionResult): PlotFigure {
  const inv = result.inviscid;
  const loop = splitOutline(inv.x, inv.cp);
  const traces: PlotTrace[] = [
    { x: loop.upper.x, y: loop.upper.y, name: inv.mach > 0 ? 'upper (Kármán–Tsien)' : 'upper', mode: 'lines', color: PLOT_COLOURS[0] },
    { x: loop.lower.x, y: loop.lower.y, name: inv.mach > 0 ? 'lower (Kármán–Tsien)' : 'lower', mode: 'lines', color: PLOT_COLOURS[2] },
  ];
  if (inv.cpPrandtlGlauert) {
    const pg = splitOutline(inv.x, inv.cpPrandtlGlauert);
    traces.push({ x: pg.upper.x, y: pg.upper.y, name: 'upper (Prandtl–Glauert)', mode: 'lines', dash: 'dash', color: PLOT_COLOURS[0], width: 1 });
    traces.push({ x: pg.lower.x, y: pg.lower.y, name: 'lower (Prandtl–Glauert)', mode: 'lines', dash: 'dash', color: PLOT_COLOURS[2], width: 1 });
  }
  const markers: PlotMarker[] = inv.criticalCp !== null ? [{ at: inv.criticalCp, axis: 'y', label: `Cp* = ${inv.criticalCp.toFixed(3)} (sonic)`, color: '#a33b2b', dash: 'dot' }] : [];
  return { x: { title: 'x/c' }, y: { title: 'Cp', reversed: true }, traces, markers };
}

type PolarPoint = PolarResult['points'][number];
const ok = (p: PolarPoint): p is PolarPoint & { cl: number; alphaDeg: number } => p.problem === null && p.cl !== null && p.alphaDeg !== null;

/** Drag against lift: the low-drag bucket. */
export function dragPolarFigure(result: PolarResult): PlotFigure {
  const points = result.points.filter(ok);
  return {
    x: { title: 'cd' },
    y: { title: 'cl' },
    traces: [{ x: points.map((p) => p.cd ?? Number.NaN), y: points.map((p) => p.cl), name: 'cd (Squire–Young)', mode: 'lines+markers', markerSize: 5, color: PLOT_COLOURS[0], text: points.map((p) => `α ${p.alphaDeg.toFixed(2)}°`) }],
  };
}

export function liftCurveFigure(result: PolarResult): PlotFigure {
  const points = result.points.filter(ok);
  return {
    x: { title: 'α (°)' },
    y: { title: 'cl' },
    traces: [{ x: points.map((p) => p.alphaDeg), y: points.map((p) => p.cl), name: 'cl (inviscid)', mode: 'lines+markers', markerSize: 5, color: PLOT_COLOURS[0] }],
  };
}

/** Transition x/c against lift for each surface (governing criterion solid, separation where it comes first). */
export function transitionFigure(result: PolarResult): PlotFigure {
  const points = result.points.filter(ok);
  const names = [...new Set(points.flatMap((p) => p.surfaces.map((s) => s.name)))];
  const traces: PlotTrace[] = names.map((name, k) => ({
    x: points.map((p) => p.surfaces.find((s) => s.name === name)?.transitionX ?? null).map((v) => v ?? Number.NaN),
    y: points.map((p) => p.cl),
    name: `${name} surface`,
    mode: 'lines+markers',
    markerSize: 5,
    color: PLOT_COLOURS[k === 0 ? 0 : 2],
    text: points.map((p) => `by ${p.surfaces.find((s) => s.name === name)?.transitionBy ?? '—'}`),
  }));
  return { x: { title: 'transition x/c', range: [0, 1] }, y: { title: 'cl' }, traces };
}
