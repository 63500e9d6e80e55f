import { fitPolynomial } from './smoothing';

/**
 * Stagnation-point detection on a closed loop of surface points and the split into two surfaces.
 *
 * The loop runs from the trailing edge over one side, round the leading edge and back along the other
 * side. Arc length is the polygon length Σ √(Δx² + Δy²) (Σ |Δx| when no y is given). The stagnation
 * point is where the tangential velocity changes sign: the speed |Ue| is given a sign (negative
 * before the lowest speed near the leading edge, positive after), a cubic is fitted (ml-matrix least
 * squares, here through the four points round the sign change) to the signed velocity, and its root is
 * the stagnation point. This
 * resolves the point between stations and gives the leading-edge velocity gradient dUe/ds there,
 * used by the stagnation-point start of the laminar march and by the attachment-line check
 * (common practice; e.g. Cebeci & Cousteix, "Modeling and Computation of Boundary-Layer Flows", 2005).
 */

export interface SurfaceBranch {
  /** Arc length from the stagnation point, strictly increasing, starting at 0. */
  s: Float64Array;
  /** |Ue|/V∞, 0 at the stagnation point. */
  ue: Float64Array;
  x: Float64Array;
  y: Float64Array | null;
  /** Row index in the loop for each station; −1 for the stagnation point itself. */
  source: Int32Array;
}

export interface StagnationSplit {
  stagnation: {
    /** Arc length along the loop from its first point. */
    loopArcLength: number;
    x: number;
    y: number | null;
    /** d|Ue|/ds at the stagnation point, from the least-squares fit. */
    velocityGradient: number;
  };
  upper: SurfaceBranch;
  lower: SurfaceBranch;
  /** true when the upper surface is the first part of the loop. */
  upperFirst: boolean;
}

/** A point of the loop that prevents the split; `row` is the 0-based loop index. */
export class StagnationError extends Error {
  constructor(readonly row: number, message: string) {
    super(message);
    this.name = 'StagnationError';
  }
}

/** Length of each side of the loop: `side[i]` joins points i − 1 and i (|Δx| when y is null); side[0] = 0. */
function sideLengths(x: ArrayLike<number>, y: ArrayLike<number> | null): Float64Array {
  const n = x.length;
  const side = new Float64Array(n);
  for (let i = 1; i < n; i++) {
    const dx = x[i] - x[i - 1];
    const ds = y === null ? Math.abs(dx) : Math.hypot(dx, y[i] - y[i - 1]);
    if (!(ds > 0)) throw new StagnationError(i, 'repeats the point before it (zero arc length)');
    side[i] = ds;
  }
  return side;
}

/** Cumulative polygon arc length of the loop (|Δx| steps when y is null). */
export function loopArcLength(x: ArrayLike<number>, y: ArrayLike<number> | null): Float64Array {
  const arc = sideLengths(x, y);
  for (let i = 1; i < arc.length; i++) arc[i] += arc[i - 1];
  return arc;
}

/**
 * Find the stagnation point of a closed loop with surface speeds `speed` = |Ue|/V∞ and split it into
 * the upper and lower surfaces, each starting at the stagnation point.
 *
 * Both surfaces are built the same way outward from the stagnation point: the point's distance to each
 * neighbouring station comes from a fit seen from that station's side, and arc length is summed side by
 * side away from it. So a loop that is mirror-symmetric about its chord, to the bit, gives the two
 * surfaces the same stations to the bit (differences of long cumulative sums from the loop's start
 * would differ by round-off, which the adaptive turbulent march then amplifies).
 */
export function splitAtStagnation(x: ArrayLike<number>, y: ArrayLike<number> | null, speed: ArrayLike<number>): StagnationSplit {
  const n = x.length;
  if (n < 7) throw new StagnationError(0, `a closed loop needs at least 7 points, got ${n}`);
  const side = sideLengths(x, y);

  // The attachment line is near the leading edge: search the front part of the section only, so that
  // a trailing-edge stagnation point at the ends of the loop is not taken for it.
  let xMin = Infinity;
  let xMax = -Infinity;
  for (let i = 0; i < n; i++) {
    if (x[i] < xMin) xMin = x[i];
    if (x[i] > xMax) xMax = x[i];
  }
  const front = xMin + 0.3 * (xMax - xMin);
  let k = -1;
  for (let i = 1; i < n - 1; i++) if (x[i] <= front && (k < 0 || speed[i] < speed[k])) k = i;
  if (k < 0) throw new StagnationError(0, 'no point near the leading edge; is this a closed loop from trailing edge to trailing edge?');
  // The sign change lies between k and whichever neighbour is slower.
  const a = speed[k - 1] < speed[k + 1] ? k - 1 : k;
  const b = a + 1;
  if (a < 1 || b > n - 2) throw new StagnationError(a < 1 ? 0 : n - 1, 'the stagnation point is at an end of the loop; the table must run from the trailing edge round the leading edge and back');

  const span = side[b];
  // The same fit seen from a's side and from b's side: for mirror-image sides the two see the same numbers.
  const fromA = rootOfSignedSpeed(side[a], span, side[b + 1], speed[a - 1], speed[a], speed[b], speed[b + 1]);
  const fromB = rootOfSignedSpeed(side[b + 1], span, side[a], speed[b + 1], speed[b], speed[a], speed[a - 1]);
  // The stagnation point is a station where the speed is zero, or the slowest station when its two
  // neighbours are equally fast (then a = k: the sign change has no side to lean to).
  const onA = speed[a] === 0 || speed[k - 1] === speed[k + 1];
  const onB = !onA && speed[b] === 0;
  const toA = onA ? 0 : onB ? span : fromA.distance;
  const toB = onB ? 0 : onA ? span : fromB.distance;
  const gradient = 0.5 * (fromA.gradient + fromB.gradient);
  const fraction = toA / (toA + toB);
  let arcToA = 0;
  for (let i = 1; i <= a; i++) arcToA += side[i];
  const stagnationArc = arcToA + fraction * span;
  const stagnationX = x[a] + fraction * (x[b] - x[a]);
  const stagnationY = y === null ? null : y[a] + fraction * (y[b] - y[a]);

  let perimeter = 0;
  for (let i = 1; i < n; i++) perimeter += side[i];
  const tolerance = 1e-9 * perimeter;
  const first = branch(a, -1, toA, tolerance, side, x, y, speed, stagnationX, stagnationY);
  const second = branch(b, 1, toB, tolerance, side, x, y, speed, stagnationX, stagnationY);
  const upperFirst = y === null ? true : meanHeight(first) >= meanHeight(second);
  return {
    stagnation: { loopArcLength: stagnationArc, x: stagnationX, y: stagnationY, velocityGradient: gradient },
    upper: upperFirst ? first : second,
    lower: upperFirst ? second : first,
    upperFirst,
  };
}

/**
 * The stagnation point seen from one side of the interval that holds it: the cubic through the four
 * points round the sign change (a compact, centred stencil is the most accurate for the gradient where
 * the speed rises steeply round a small nose radius), with the near station at t = 0, the far one at
 * t = span, and the speed signed negative on the near side. Returns the root's distance from the near
 * station (bisection on the fitted cubic inside the interval; the data's own sign change keeps the root
 * there, and linear interpolation of the data is the fallback if the fit does not bracket it) and
 * d|Ue|/ds there.
 */
function rootOfSignedSpeed(
  sideBefore: number,
  span: number,
  sideAfter: number,
  speedBefore: number,
  speedNear: number,
  speedFar: number,
  speedAfter: number,
): { distance: number; gradient: number } {
  const c = fitPolynomial([-sideBefore, 0, span, span + sideAfter], [-speedBefore, -speedNear, speedFar, speedAfter], 3, 0, 3);
  const value = (t: number) => c[0] + t * (c[1] + t * (c[2] + t * c[3]));
  const slope = (t: number) => c[1] + t * (2 * c[2] + t * 3 * c[3]);
  let t0 = 0;
  let t1 = span;
  let root: number;
  if (value(t0) <= 0 && value(t1) >= 0) {
    for (let it = 0; it < 60; it++) {
      const mid = 0.5 * (t0 + t1);
      if (value(mid) <= 0) t0 = mid;
      else t1 = mid;
    }
    root = 0.5 * (t0 + t1);
  } else {
    root = (span * speedNear) / (speedNear + speedFar);
  }
  let gradient = slope(root);
  if (!(gradient > 0)) gradient = (speedNear + speedFar) / span;
  return { distance: root, gradient };
}

/**
 * One surface from the stagnation point: stations from `start` on in direction `step` to the loop's end,
 * arc length summed side by side from `toStart`, the stagnation point's distance to `start` (which is
 * left out when it lies on the stagnation point).
 */
function branch(
  start: number,
  step: number,
  toStart: number,
  tolerance: number,
  side: Float64Array,
  x: ArrayLike<number>,
  y: ArrayLike<number> | null,
  speed: ArrayLike<number>,
  stagnationX: number,
  stagnationY: number | null,
): SurfaceBranch {
  const end = step > 0 ? x.length - 1 : 0;
  const skipStart = toStart <= tolerance;
  const count = Math.abs(end - start) + 1 + (skipStart ? 0 : 1);
  const out: SurfaceBranch = {
    s: new Float64Array(count),
    ue: new Float64Array(count),
    x: new Float64Array(count),
    y: y === null ? null : new Float64Array(count),
    source: new Int32Array(count),
  };
  out.x[0] = stagnationX;
  if (out.y !== null) out.y[0] = stagnationY!;
  out.source[0] = -1;
  let arc = toStart;
  let j = 1;
  for (let row = start; step > 0 ? row <= end : row >= end; row += step) {
    // The side joining this row to the one before it in the direction of the march.
    if (row !== start) arc += side[step > 0 ? row : row + 1];
    if (row === start && skipStart) continue;
    out.s[j] = arc;
    out.ue[j] = speed[row];
    out.x[j] = x[row];
    if (out.y !== null) out.y[j] = y![row];
    out.source[j] = row;
    j++;
  }
  return out;
}

function meanHeight(b: SurfaceBranch): number {
  let area = 0;
  let length = 0;
  for (let i = 1; i < b.s.length; i++) {
    const ds = b.s[i] - b.s[i - 1];
    area += 0.5 * (b.y![i] + b.y![i - 1]) * ds;
    length += ds;
  }
  return area / length;
}
