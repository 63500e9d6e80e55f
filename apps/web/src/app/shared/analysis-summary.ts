import { michelTransitionReTheta } from '@laminote/aero/michel';
import { TRANSITION_CAUSE_LABELS, type TransitionCriterion } from '@laminote/contracts/cell-kinds';
import type { CriterionMissingReason, EngineResult, EngineSurfaceResult } from '@laminote/contracts';
import { PLOT_COLOURS, type PlotFigure, type PlotMarker, type PlotTrace } from './plot';

/** Criterion and cause names as the tables and legends show them (one home, in the contracts). */
export { CRITERION_LABELS, TRANSITION_CAUSE_LABELS as CAUSE_LABELS } from '@laminote/contracts/cell-kinds';

/** Why a criterion has no location, in the words of the summary table. */
export const REASON_WORDS: Record<CriterionMissingReason, string> = {
  notReached: 'not reached',
  afterLaminarSeparation: 'separates first',
  noSweep: 'no sweep',
};

/**
 * A location along a surface, as x/c where the stations carry x, else as s/c from the attachment line;
 * on a body of revolution x/L, from the nose on the body's length.
 */
export interface Location {
  readonly value: number;
  readonly along: Along;
}

export type Along = 'x/c' | 's/c' | 'x/L';

/** Whether the analysis is of a body of revolution (a body cell named in place of a pressure cell). */
export function isBodyResult(result: EngineResult): boolean {
  return result.inviscid?.kind === 'body';
}

/** One surface's line in the summary table. */
export interface SurfaceSummary {
  readonly name: string;
  readonly criteria: Partial<Record<TransitionCriterion, Location | null>>;
  /** Why a criterion has no location, in words (engines from 1.2.0 give a reason). */
  readonly reasons: Partial<Record<TransitionCriterion, string>>;
  /** The earliest and the latest location of the criteria that have one (null with fewer than two). */
  readonly spread: { readonly from: Location; readonly to: Location } | null;
  /** Where the laminar solution, marched on, would separate; `afterTransition` when past the governing transition. */
  readonly wouldSeparate: { readonly at: Location; readonly afterTransition: boolean } | null;
  readonly governing: Location | null;
  readonly governingBy: string;
  readonly laminarSeparation: Location | null;
  readonly turbulentSeparation: Location | null;
  /** How far the flow stays laminar: to the governing transition, or the whole surface. */
  readonly laminarExtent: Location | null;
  readonly laminarToEnd: boolean;
  readonly cd: number | null;
  readonly cdFriction: number | null;
}

function interpolate(xs: readonly number[], ys: readonly number[], at: number): number {
  const n = xs.length;
  if (n === 0) return Number.NaN;
  if (at <= xs[0]) return ys[0];
  if (at >= xs[n - 1]) return ys[n - 1];
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (xs[mid] <= at) lo = mid;
    else hi = mid;
  }
  const t = (at - xs[lo]) / (xs[hi] - xs[lo]);
  return ys[lo] + t * (ys[hi] - ys[lo]);
}

/** The chordwise axis of a surface: x/c (x/L on a body) where the engine reports x, else the arc length. */
export function alongAxis(surface: EngineSurfaceResult, body = false): { values: number[]; along: Along } {
  const x = surface.stations.x;
  return x && x.length === surface.stations.s.length ? { values: x, along: body ? 'x/L' : 'x/c' } : { values: surface.stations.s, along: 's/c' };
}

export function locateOn(surface: EngineSurfaceResult, s: number | null | undefined, body = false): Location | null {
  if (s === null || s === undefined || !Number.isFinite(s)) return null;
  const axis = alongAxis(surface, body);
  return { value: axis.along === 's/c' ? s : interpolate(surface.stations.s, axis.values, s), along: axis.along };
}

export function summarise(result: EngineResult, criteria: readonly TransitionCriterion[]): SurfaceSummary[] {
  const body = isBodyResult(result);
  const locate = (surface: EngineSurfaceResult, s: number | null | undefined) => locateOn(surface, s, body);
  return result.surfaces.map((surface) => {
    const byCriterion: Partial<Record<TransitionCriterion, Location | null>> = {};
    const reasons: Partial<Record<TransitionCriterion, string>> = {};
    for (const id of criteria) {
      const entry = surface.transition.criteria[id];
      byCriterion[id] = locate(surface, entry?.s);
      if (entry && entry.s === null) reasons[id] = REASON_WORDS[entry.reason];
    }
    const located = Object.values(byCriterion).filter((at): at is Location => at !== null);
    const spread =
      located.length >= 2
        ? { from: located.reduce((a, b) => (b.value < a.value ? b : a)), to: located.reduce((a, b) => (b.value > a.value ? b : a)) }
        : null;
    const governing = locate(surface, surface.transition.s);
    const separationS = surface.transition.laminarSeparationS ?? surface.laminarSeparation?.s ?? null;
    const separationAt = locate(surface, separationS);
    const end = surface.stations.s[surface.stations.s.length - 1];
    return {
      name: surface.name,
      criteria: byCriterion,
      reasons,
      spread,
      wouldSeparate: separationAt && { at: separationAt, afterTransition: surface.transition.s !== null && separationS! > surface.transition.s },
      governing,
      governingBy: surface.transition.by ? TRANSITION_CAUSE_LABELS[surface.transition.by] : 'none: laminar to the end',
      laminarSeparation: locate(surface, surface.laminarSeparation?.s),
      turbulentSeparation: locate(surface, surface.turbulentSeparation?.s),
      laminarExtent: governing ?? locate(surface, end),
      laminarToEnd: governing === null,
      cd: surface.cd,
      cdFriction: surface.cdFriction,
    };
  });
}

const SURFACE_COLOURS = [PLOT_COLOURS[0], PLOT_COLOURS[1], PLOT_COLOURS[2], PLOT_COLOURS[3]];

function transitionMarkers(result: EngineResult): PlotMarker[] {
  const body = isBodyResult(result);
  return result.surfaces.flatMap((surface, i): PlotMarker[] => {
    const at = locateOn(surface, surface.transition.s, body);
    return at ? [{ at: at.value, axis: 'x', label: `${surface.name} transition`, color: SURFACE_COLOURS[i % 4], dash: 'dash' }] : [];
  });
}

function axisTitle(result: EngineResult): string {
  if (isBodyResult(result)) return 'x/L (from the nose, on the body length)';
  return result.surfaces.every((s) => alongAxis(s).along === 'x/c') ? 'x/c' : 's/c (arc length from the attachment line)';
}

function stationTraces(result: EngineResult, pick: (surface: EngineSurfaceResult, i: number) => (number | null)[]): PlotTrace[] {
  return result.surfaces.map((surface, i) => ({
    x: alongAxis(surface).values,
    y: pick(surface, i),
    name: surface.name,
    color: SURFACE_COLOURS[i % 4],
  }));
}

/**
 * The largest value of a quantity away from the attachment line (beyond the first 3 % of each surface),
 * where c_f grows without bound as Ue → 0; used to keep the rest of the curve readable.
 */
function awayFromAttachment(result: EngineResult, pick: (surface: EngineSurfaceResult) => (number | null)[]): number {
  let largest = 0;
  for (const surface of result.surfaces) {
    const s = surface.stations.s;
    const end = s[s.length - 1] ?? 0;
    pick(surface).forEach((value, k) => {
      if (value !== null && Number.isFinite(value) && s[k] > 0.03 * end) largest = Math.max(largest, value);
    });
  }
  return largest > 0 ? largest : 0.01;
}

/**
 * The plots of an analysis: N-factor envelope, on a swept section the crossflow Reynolds number against
 * its critical value, shape factor, Re_θ with Michel's line, skin friction.
 */
export function analysisFigures(result: EngineResult): { id: string; label: string; figure: PlotFigure }[] {
  const x = { title: axisTitle(result) };
  const markers = transitionMarkers(result);
  const reynolds = result.flow.reynolds;
  const nFigure: PlotFigure = {
    x,
    y: { title: 'N (envelope amplification exponent)' },
    traces: stationTraces(result, (s) => s.stations.n),
    markers: [...markers, { at: result.flow.nCrit, axis: 'y', label: `N_crit = ${result.flow.nCrit.toFixed(2)}`, color: '#ba1a1a', dash: 'dot' }],
  };
  const hFigure: PlotFigure = { x, y: { title: 'H = δ*/θ' }, traces: stationTraces(result, (s) => s.stations.H), markers };
  // On the local unit Reynolds number where the layer is compressible (as the criteria take it).
  const localRe = (surface: EngineSurfaceResult, k: number) => reynolds * (surface.stations.reynoldsRatio?.[k] ?? 1);
  const reThetaTraces: PlotTrace[] = stationTraces(result, (s) => s.stations.theta.map((theta, k) => (theta === null ? null : localRe(s, k) * s.stations.ue[k] * theta)));
  const michelTraces: PlotTrace[] = result.surfaces.map((surface, i) => ({
    x: alongAxis(surface).values,
    y: surface.stations.s.map((s, k) => {
      const reX = localRe(surface, k) * surface.stations.ue[k] * s;
      return reX >= 1e4 ? michelTransitionReTheta(reX) : null;
    }),
    name: `Michel line, ${surface.name}`,
    color: SURFACE_COLOURS[i % 4],
    dash: 'dot',
    width: 1.25,
  }));
  const reThetaFigure: PlotFigure = { x, y: { title: 'Re_θ = Ue θ / νe', log: true }, traces: [...reThetaTraces, ...michelTraces], markers };
  const cfFigure: PlotFigure = {
    x,
    y: { title: 'c_f (on local Ue)', range: [0, awayFromAttachment(result, (s) => s.stations.cf) * 1.15] },
    traces: stationTraces(result, (s) => s.stations.cf),
    markers,
  };
  const along = isBodyResult(result) ? 'along the body' : 'along the chord';
  const figures: { id: string; label: string; figure: PlotFigure }[] = [
    { id: 'n', label: `N-factor envelope ${along} against N_crit`, figure: nFigure },
    { id: 'h', label: `Shape factor H ${along}`, figure: hFigure },
    { id: 'retheta', label: `Momentum-thickness Reynolds number ${along} with Michel’s transition line`, figure: reThetaFigure },
    { id: 'cf', label: `Skin-friction coefficient ${along}`, figure: cfFigure },
  ];
  const swept = result.surfaces.some((surface) => surface.stations.reCf?.some((v) => v !== null && v > 0));
  if (swept) {
    const critical = result.flow.crossflowCritical;
    figures.splice(1, 0, {
      id: 'crossflow',
      label: 'Crossflow Reynolds number along the chord against its critical value',
      figure: {
        x,
        y: { title: 'R_cf = w_max δ₁₀ / ν (crossflow)' },
        traces: stationTraces(result, (s) => s.stations.reCf ?? []),
        markers: critical === undefined ? markers : [...markers, { at: critical, axis: 'y', label: `R_cf critical = ${critical}`, color: '#ba1a1a', dash: 'dot' }],
      },
    });
  }
  return figures;
}
