/**
 * Checks on a table read as one surface, for two mistakes that change the result without any
 * error: a closed loop (trailing edge → leading edge → trailing edge) pasted as one surface, and a
 * surface that does not start at the attachment line (stagnation point), so the boundary layer starts
 * part-way round the nose as if on a sharp edge.
 *
 * Stagnation pressure coefficient: Cp₀ = 1 in incompressible flow and 1 + M²/4 + M⁴/40 + … above it
 * (the isentropic stagnation relation expanded in M; textbook result, quoted from memory), so a first
 * point well below 1 is not a stagnation point at any Mach number. The 0.9 threshold is a
 * judgement (common practice for tap data, whose first tap rarely sits exactly on the attachment line).
 */

export interface SurfacePoint {
  readonly x: number;
  readonly cp: number;
  /** 1-based line of the table. */
  readonly line: number;
}

/** Below this first Cp a one-surface table is said not to start at a stagnation point. */
export const STAGNATION_CP_THRESHOLD = 0.9;

function fixed3(value: number): string {
  return value.toFixed(3);
}

/** What looks wrong with a one-surface table, in words for the person who pasted it (each names its line). */
export function oneSurfaceWarnings(points: readonly SurfacePoint[]): string[] {
  const warnings: string[] = [];
  if (points.length < 3) return warnings;
  const xs = points.map((p) => p.x);
  const low = Math.min(...xs);
  const high = Math.max(...xs);
  const span = high - low;
  const turn = xs.indexOf(low);
  const first = points[0]!;
  const last = points[points.length - 1]!;
  // x runs down to its minimum and back up by most of the chord on both sides: both surfaces.
  if (span > 0 && turn > 0 && turn < points.length - 1 && first.x - low > 0.5 * span && last.x - low > 0.5 * span) {
    warnings.push(
      `x/c runs ${fixed3(first.x)} → ${fixed3(low)} (line ${points[turn]!.line}) → ${fixed3(last.x)}: this looks like a closed loop over both surfaces, not one surface; choose “Closed loop” so it is split at the stagnation point`,
    );
  } else if (first.cp < STAGNATION_CP_THRESHOLD) {
    warnings.push(
      `the surface does not start at a stagnation point: the first Cp (line ${first.line}) is ${first.cp.toFixed(2)}, where about 1 is expected; the boundary layer is started there as if at a sharp edge, which moves transition and drag (start the table at the attachment line, or paste the closed loop)`,
    );
  }
  return warnings;
}
