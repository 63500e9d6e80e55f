import { pressureCoefficientFromVelocity, roundToResultDigits, xAtArc } from '@laminote/aero';
import {
  engineResultSchema,
  type AnalysisComparison,
  type Delta,
  type Effect,
  type EngineResult,
  type EngineSurfaceResult,
  type OverlaySeries,
  type SurfaceComparison,
  type TransitionDelta,
} from '@laminote/contracts';

/**
 * Results of one analysis cell in two versions, side by side: per surface and criterion the
 * transition location in both and the shift, laminar extent, cd, and overlay data (Cp, N-factor
 * envelope, H). The sign a designer cares about is spelled out as an effect: transition moving aft
 * is a longer laminar run (favourable); cd going up is a drag penalty (adverse).
 */

/** Smaller differences than these are "no change" (x/c; share of the run; cd). */
const LOCATION_TOLERANCE = 1e-4;
const EXTENT_TOLERANCE = 1e-4;
export const CD_TOLERANCE = 1e-7;
/** Points per overlaid curve; longer station lists are thinned evenly (ends kept). */
const MAX_OVERLAY_POINTS = 400;

export interface StoredOutput {
  status: 'ok' | 'error';
  result: unknown;
  error: { message: string } | null;
}

export type Side = { state: 'absent' } | { state: 'notRun' } | { state: 'error'; message: string } | { state: 'ok'; result: EngineResult };

/** What a version holds for an analysis cell. A result that is not an engine result counts as an error. */
export function sideOf(present: boolean, output: StoredOutput | null): Side {
  if (!present) return { state: 'absent' };
  if (!output) return { state: 'notRun' };
  if (output.status === 'error') return { state: 'error', message: output.error?.message ?? 'the run failed' };
  const parsed = engineResultSchema.safeParse(output.result);
  return parsed.success ? { state: 'ok', result: parsed.data } : { state: 'error', message: 'the stored output is not an analysis result' };
}

function effectOf(delta: number | null, tolerance: number, goodWhen: 'up' | 'down' | 'neither'): Effect {
  if (delta === null || Math.abs(delta) <= tolerance || goodWhen === 'neither') return 'neutral';
  return (delta > 0) === (goodWhen === 'up') ? 'favourable' : 'adverse';
}

export function delta(a: number | null | undefined, b: number | null | undefined, tolerance: number, goodWhen: 'up' | 'down' | 'neither'): Delta {
  const x = a ?? null;
  const y = b ?? null;
  const d = x !== null && y !== null ? y - x : null;
  return { a: x, b: y, delta: d, effect: effectOf(d, tolerance, goodWhen) };
}

type Coordinate = 'x' | 's';

function locate(surface: EngineSurfaceResult | undefined, s: number | null | undefined, coordinate: Coordinate): number | null {
  if (!surface || s === null || s === undefined) return null;
  return coordinate === 'x' ? xAtArc(surface.stations.s, surface.stations.x, s) : s;
}

/**
 * A location in both versions. Null means "not reached on the surface": a transition that appears
 * is a forward move from the end of the run (adverse); one that vanishes is favourable.
 */
export function transitionDelta(a: number | null, b: number | null, coordinate: Coordinate, byA: string | null, byB: string | null, present: { a: boolean; b: boolean }): TransitionDelta {
  const base = delta(a, b, LOCATION_TOLERANCE, 'up');
  let shift: TransitionDelta['shift'] = 'none';
  if (base.delta !== null) shift = base.effect === 'neutral' ? 'none' : base.delta > 0 ? 'aft' : 'forward';
  else if (present.a && present.b && a === null && b !== null) shift = 'appeared';
  else if (present.a && present.b && a !== null && b === null) shift = 'vanished';
  const effect: Effect = shift === 'appeared' ? 'adverse' : shift === 'vanished' ? 'favourable' : base.effect;
  return { ...base, effect, coordinate, shift, byA, byB };
}

function laminarExtent(surface: EngineSurfaceResult | undefined): number | null {
  if (!surface) return null;
  const s = surface.stations.s;
  if (s.length < 2) return null;
  const start = s[0]!;
  const end = s[s.length - 1]!;
  const at = surface.transition.s ?? surface.laminarSeparation?.s ?? end;
  return Math.min(Math.max((at - start) / (end - start), 0), 1);
}

function overlay(surface: EngineSurfaceResult | undefined, coordinate: Coordinate, mach: number): OverlaySeries | null {
  if (!surface) return null;
  const st = surface.stations;
  const n = st.s.length;
  const along = coordinate === 'x' && st.x && st.x.length === n ? st.x : st.s;
  const step = Math.max(1, Math.ceil(n / MAX_OVERLAY_POINTS));
  const picks: number[] = [];
  for (let i = 0; i < n; i += step) picks.push(i);
  if (n > 0 && picks[picks.length - 1] !== n - 1) picks.push(n - 1);
  // Cp is worked out here from the stored edge velocity; it is kept to the digits of every stored
  // result (RESULT_DIGITS), as the stored numbers beside it are (unrounded, each took about 18
  // characters: the versions bench's 200-cell comparison answered 1233 KiB, now 1027 KiB).
  const cpAt = (i: number) => {
    const cp = pressureCoefficientFromVelocity(st.ue[i]!, mach);
    return !Number.isFinite(cp) ? null : Number.isInteger(cp) ? cp : roundToResultDigits(cp);
  };
  return {
    x: picks.map((i) => along[i]!),
    cp: picks.map(cpAt),
    n: picks.map((i) => st.n[i] ?? null),
    H: picks.map((i) => st.H[i] ?? null),
  };
}

function compareSurface(name: string, a: EngineSurfaceResult | undefined, b: EngineSurfaceResult | undefined, machA: number, machB: number): SurfaceComparison {
  const hasX = (s: EngineSurfaceResult | undefined) => !s || (s.stations.x !== undefined && s.stations.x.length === s.stations.s.length);
  const coordinate: Coordinate = hasX(a) && hasX(b) ? 'x' : 's';
  const present = { a: a !== undefined, b: b !== undefined };
  const criteria = [...new Set([...Object.keys(a?.transition.criteria ?? {}), ...Object.keys(b?.transition.criteria ?? {})])] as (keyof EngineSurfaceResult['transition']['criteria'])[];
  return {
    name,
    transition: transitionDelta(locate(a, a?.transition.s, coordinate), locate(b, b?.transition.s, coordinate), coordinate, a?.transition.by ?? null, b?.transition.by ?? null, present),
    criteria: criteria.map((criterion) => ({
      criterion,
      ...transitionDelta(
        locate(a, a?.transition.criteria[criterion]?.s, coordinate),
        locate(b, b?.transition.criteria[criterion]?.s, coordinate),
        coordinate,
        null,
        null,
        { a: a?.transition.criteria[criterion] !== undefined, b: b?.transition.criteria[criterion] !== undefined },
      ),
    })),
    laminarExtent: delta(laminarExtent(a), laminarExtent(b), EXTENT_TOLERANCE, 'up'),
    cd: delta(a?.cd, b?.cd, CD_TOLERANCE, 'down'),
    cdFriction: delta(a?.cdFriction, b?.cdFriction, CD_TOLERANCE, 'down'),
    laminarSeparation: delta(locate(a, a?.laminarSeparation?.s, coordinate), locate(b, b?.laminarSeparation?.s, coordinate), LOCATION_TOLERANCE, 'neither'),
    turbulentSeparation: (() => {
      const t = transitionDelta(locate(a, a?.turbulentSeparation?.s, coordinate), locate(b, b?.turbulentSeparation?.s, coordinate), coordinate, null, null, present);
      return { a: t.a, b: t.b, delta: t.delta, effect: t.effect };
    })(),
    overlay: { coordinate, a: overlay(a, coordinate, machA), b: overlay(b, coordinate, machB) },
  };
}

export function compareAnalysis(cellId: string, title: string, sideA: Side, sideB: Side): AnalysisComparison {
  const ra = sideA.state === 'ok' ? sideA.result : null;
  const rb = sideB.state === 'ok' ? sideB.result : null;
  const names = [...new Set([...(ra?.surfaces ?? []).map((s) => s.name), ...(rb?.surfaces ?? []).map((s) => s.name)])];
  return {
    cellId,
    title,
    statusA: sideA.state,
    statusB: sideB.state,
    errorA: sideA.state === 'error' ? sideA.message : null,
    errorB: sideB.state === 'error' ? sideB.message : null,
    flow: {
      reynolds: delta(ra?.flow.reynolds, rb?.flow.reynolds, 0, 'neither'),
      mach: delta(ra?.flow.mach, rb?.flow.mach, 0, 'neither'),
      nCrit: delta(ra?.flow.nCrit, rb?.flow.nCrit, 0, 'neither'),
    },
    cd: delta(ra?.cd, rb?.cd, CD_TOLERANCE, 'down'),
    // A surface only one version has still shows its values, with nothing to subtract.
    surfaces: names.map((name) =>
      compareSurface(name, ra?.surfaces.find((s) => s.name === name), rb?.surfaces.find((s) => s.name === name), ra?.flow.mach ?? 0, rb?.flow.mach ?? 0),
    ),
    warningsA: ra?.warnings ?? [],
    warningsB: rb?.warnings ?? [],
  };
}
