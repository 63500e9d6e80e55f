import { analyzeCase } from '../src/analyze';
import type { EngineCaseInput, EngineResult, EngineSurfaceResult } from '@laminote/contracts';

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
