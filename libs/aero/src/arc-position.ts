/**
 * Converting between chordwise position x and arc length s along a surface's stations, by linear
 * interpolation: trips are given at x/c, the boundary layer marches in s.
 */

/** Where a surface passes x (its first crossing), as arc length; null when it never does. */
export function arcAtX(s: ArrayLike<number>, x: ArrayLike<number>, at: number): number | null {
  for (let i = 1; i < s.length; i++) {
    const a = x[i - 1]!;
    const b = x[i]!;
    if ((a - at) * (b - at) <= 0 && a !== b) return s[i - 1]! + ((at - a) / (b - a)) * (s[i]! - s[i - 1]!);
  }
  return null;
}

/** x at an arc length along stations; null without x or without an arc length. Clamped to the ends. */
export function xAtArc(s: readonly number[], x: readonly number[] | undefined, at: number | null): number | null {
  if (at === null || !x || x.length !== s.length || s.length === 0) return null;
  if (at <= s[0]!) return x[0]!;
  for (let i = 1; i < s.length; i++) {
    if (s[i]! >= at) return x[i - 1]! + ((at - s[i - 1]!) / (s[i]! - s[i - 1]!)) * (x[i]! - x[i - 1]!);
  }
  return x[x.length - 1]!;
}
