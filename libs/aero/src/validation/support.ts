import type { EngineCaseInput, EngineResult, EngineSurfaceResult } from '@laminote/contracts';
import { analyzeCase } from '../analyze';

/** Stations 0 … 1 (or a … b) clustered toward the start by the power `cluster`. */
export function stations(count: number, a = 0, b = 1, cluster = 2): number[] {
  return Array.from({ length: count }, (_, i) => a + (b - a) * Math.pow(i / (count - 1), cluster));
}

/** Stations spaced geometrically from `a` to `b` (> 0). */
export function geometricStations(count: number, a: number, b: number): number[] {
  return Array.from({ length: count }, (_, i) => a * Math.pow(b / a, i / (count - 1)));
}

/** Analyse a one-surface case and return that surface and the whole result. */
export function analyzeOne(engineCase: EngineCaseInput): { surface: EngineSurfaceResult; result: EngineResult } {
  const result = analyzeCase(engineCase);
  return { surface: result.surfaces[0], result };
}

/** Index of the station nearest to s. */
export function nearest(s: readonly number[], target: number): number {
  let best = 0;
  for (let i = 1; i < s.length; i++) if (Math.abs(s[i] - target) < Math.abs(s[best] - target)) best = i;
  return best;
}

/** Relative difference a/b − 1. */
export function relative(a: number, b: number): number {
  return a / b - 1;
}

/** Bisection on a geometric scale for the root of f between lo and hi (f(lo) < 0 < f(hi)). */
export function bisectGeometric(f: (x: number) => number, lo: number, hi: number): number {
  for (let it = 0; it < 200; it++) {
    const mid = Math.sqrt(lo * hi);
    if (f(mid) < 0) lo = mid;
    else hi = mid;
  }
  return Math.sqrt(lo * hi);
}
