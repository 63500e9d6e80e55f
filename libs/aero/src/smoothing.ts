import { Matrix, solve } from 'ml-matrix';
import { Scratch } from './scratch';

/**
 * Least-squares smoothing and differentiation of sampled data such as Ue(s) from pressure taps.
 *
 * Method: at each station a polynomial f ≈ a + b t + c t² (t = s − s_i) is fitted by least squares to
 * the 2h + 1 nearest stations and its slope b is the derivative there — the local-polynomial
 * smoothing filter of Savitzky & Golay (Analytical Chemistry 36, 1964, 1627–1639), here for arbitrary
 * spacing. The fit is exact for quadratics, so smooth analytic data keep their derivative, while
 * scatter of amplitude σ reaches the slope reduced by the least-squares averaging.
 */

/**
 * Slope df/ds at every station by the local quadratic least-squares fit over `halfWidth` stations on
 * each side (shifted inward at the ends). `s` must be strictly increasing. Writes into `out`.
 */
export function leastSquaresSlope(s: ArrayLike<number>, f: ArrayLike<number>, out: Float64Array, halfWidth = 2): Float64Array {
  localQuadraticFit(s, f, halfWidth, null, out);
  return out;
}

/**
 * Smoothed value f̂(s_i) of the same local quadratic least-squares fit as `leastSquaresSlope` (its
 * constant term a): the distribution whose slope the boundary layer is given. Writes into `out`.
 */
export function leastSquaresValue(s: ArrayLike<number>, f: ArrayLike<number>, out: Float64Array, halfWidth = 2): Float64Array {
  localQuadraticFit(s, f, halfWidth, out, null);
  return out;
}

/** The local fit a + b t + c t² at every station: a into `value`, b into `slope` (either may be null). */
function localQuadraticFit(
  s: ArrayLike<number>,
  f: ArrayLike<number>,
  halfWidth: number,
  value: Float64Array | null,
  slope: Float64Array | null,
  from = 0,
  to = s.length,
): void {
  const n = s.length;
  const width = Math.min(n, 2 * halfWidth + 1);
  if (width < 3) {
    if (slope !== null) slope.fill(n === 2 ? (f[1] - f[0]) / (s[1] - s[0]) : 0, from, to);
    if (value !== null) for (let i = from; i < to; i++) value[i] = f[i];
    return;
  }
  for (let i = from; i < to; i++) {
    let lo = i - halfWidth;
    if (lo < 0) lo = 0;
    if (lo > n - width) lo = n - width;
    const hi = lo + width - 1;
    // The normal equations are assembled in a scaled variable so that they stay well conditioned
    // whatever the station spacing; the 3×3 system is solved in closed form because this runs once per
    // station in every analysis.
    const scale = 0.5 * (s[hi] - s[lo]);
    const si = s[i];
    let s0 = 0, s1 = 0, s2 = 0, s3 = 0, s4 = 0, t0 = 0, t1 = 0, t2 = 0;
    for (let j = lo; j <= hi; j++) {
      const t = (s[j] - si) / scale;
      const tt = t * t;
      const fj = f[j];
      s0 += 1;
      s1 += t;
      s2 += tt;
      s3 += tt * t;
      s4 += tt * tt;
      t0 += fj;
      t1 += fj * t;
      t2 += fj * tt;
    }
    const det = s0 * (s2 * s4 - s3 * s3) - s1 * (s1 * s4 - s3 * s2) + s2 * (s1 * s3 - s2 * s2);
    if (slope !== null) slope[i] = (s0 * (t1 * s4 - s3 * t2) - t0 * (s1 * s4 - s3 * s2) + s2 * (s1 * t2 - t1 * s2)) / det / scale;
    if (value !== null) value[i] = (t0 * (s2 * s4 - s3 * s3) - s1 * (t1 * s4 - s3 * t2) + s2 * (t1 * s3 - s2 * t2)) / det;
  }
}

/**
 * Least-squares polynomial f ≈ Σ c_k (t − origin)^k over the stations from..to (inclusive), solved by
 * QR decomposition (ml-matrix). Returns the coefficients c_0 … c_degree in the unscaled variable.
 */
export function fitPolynomial(t: ArrayLike<number>, f: ArrayLike<number>, degree: number, from: number, to: number, origin = 0): number[] {
  const count = to - from + 1;
  if (count < degree + 1) throw new RangeError(`a degree-${degree} fit needs at least ${degree + 1} points, got ${count}`);
  let scale = 0;
  for (let j = from; j <= to; j++) scale = Math.max(scale, Math.abs(t[j] - origin));
  if (scale === 0) scale = 1;
  const design = new Matrix(count, degree + 1);
  const rhs = new Matrix(count, 1);
  for (let j = 0; j < count; j++) {
    const u = (t[from + j] - origin) / scale;
    let power = 1;
    for (let k = 0; k <= degree; k++) {
      design.set(j, k, power);
      power *= u;
    }
    rhs.set(j, 0, f[from + j]);
  }
  const solution = solve(design, rhs);
  const coefficients: number[] = [];
  for (let k = 0; k <= degree; k++) coefficients.push(solution.get(k, 0) / Math.pow(scale, k));
  return coefficients;
}

/**
 * Estimate of the scatter σ of f(s) about a smooth curve, from the residuals of the local quadratic
 * least-squares fit over five stations: r_i = f_i − f̂_i has variance σ² (1 − h_ii) for independent
 * errors, h_ii the fit's leverage at its own station, so σ² is the mean of r_i² / (1 − h_ii) (a
 * difference-based variance estimator after J. Rice, Ann. Statist. 12 (1984) 1215–1230, and T. Gasser,
 * L. Sroka & C. Jennen-Steinmetz, Biometrika 73 (1986) 625–633; the quadratic takes out the curvature
 * of smooth data, which would otherwise count as scatter). Residuals above nine times the median one
 * (in r²) are left out, so that the leading edge's steep rise does not count either (common practice).
 */
export function estimateScatter(s: ArrayLike<number>, f: ArrayLike<number>): number {
  return scatterAndSlopes(s, f, null);
}

/**
 * `estimateScatter`, and when every window is sampled (up to SCATTER_SAMPLES + 4 stations) the slope of
 * each window's fit into `slope` at stations 2 to n − 3 (`fitsEveryWindow`): the same sums in the same
 * order as `leastSquaresSlope` with half-width 2, so the same numbers.
 */
function scatterAndSlopes(s: ArrayLike<number>, f: ArrayLike<number>, slope: Float64Array | null): number {
  const n = s.length;
  if (n < 6) return 0;
  // At most SCATTER_SAMPLES windows, evenly spread: plenty for a variance, and bounded cost on long surfaces.
  const stride = Math.max(1, Math.floor((n - 4) / SCATTER_SAMPLES));
  const slopes = stride === 1 ? slope : null;
  work.reset();
  const r2 = work.take(Math.ceil((n - 4) / stride));
  for (let i = 2, k = 0; i < n - 2; i += stride, k++) {
    const scale = 0.5 * (s[i + 2] - s[i - 2]);
    const si = s[i];
    let s0 = 0, s1 = 0, s2 = 0, s3 = 0, s4 = 0, t0 = 0, t1 = 0, t2 = 0;
    for (let j = i - 2; j <= i + 2; j++) {
      const t = (s[j] - si) / scale;
      const tt = t * t;
      s0 += 1;
      s1 += t;
      s2 += tt;
      s3 += tt * t;
      s4 += tt * tt;
      t0 += f[j];
      t1 += f[j] * t;
      t2 += f[j] * tt;
    }
    const det = s0 * (s2 * s4 - s3 * s3) - s1 * (s1 * s4 - s3 * s2) + s2 * (s1 * s3 - s2 * s2);
    const fit = (t0 * (s2 * s4 - s3 * s3) - s1 * (t1 * s4 - s3 * t2) + s2 * (t1 * s3 - s2 * t2)) / det;
    if (slopes !== null) slopes[i] = (s0 * (t1 * s4 - s3 * t2) - t0 * (s1 * s4 - s3 * s2) + s2 * (s1 * t2 - t1 * s2)) / det / scale;
    // The fit at its own station for f = 1 there and 0 elsewhere (t = 0 at station i).
    const leverage = (s2 * s4 - s3 * s3) / det;
    const r = f[i] - fit;
    r2[k] = (r * r) / (1 - leverage);
  }
  const reordered = work.take(r2.length);
  reordered.set(r2);
  const median = medianOf(reordered);
  let sum = 0;
  let count = 0;
  for (let k = 0; k < r2.length; k++) {
    const v = r2[k];
    if (v <= 9 * median) {
      sum += v;
      count++;
    }
  }
  return count > 0 ? Math.sqrt(sum / count) : 0;
}

const SCATTER_SAMPLES = 2000;

/** The work arrays of the scatter estimate and the median spacing (at most 4 000 and n − 1 doubles). */
const work = new Scratch(1 << 14);

/** Whether `scatterAndSlopes` fits every five-station window of n stations (and so writes their slopes). */
function fitsEveryWindow(n: number): boolean {
  return n >= 6 && Math.max(1, Math.floor((n - 4) / SCATTER_SAMPLES)) === 1;
}

/** The slope noise the automatic width aims at, in d(Ue/V∞)/d(s/L) (a few per cent of a roof-top gradient). */
export const SMOOTHING_SLOPE_NOISE = 0.01;
export const SMOOTHING_MIN_HALF_WIDTH = 2;
export const SMOOTHING_MAX_HALF_WIDTH = 20;

/**
 * The half-width the automatic smoothing takes: the smallest h ≥ 2 for which the scatter σ reaches the
 * least-squares slope as at most SMOOTHING_SLOPE_NOISE, with the slope's standard error
 * σ / √(Σ t²) = σ / (Δs √(h (h + 1)(2h + 1)/3)) over 2h + 1 stations at the median spacing Δs (common
 * practice for a symmetric least-squares window). Clean computed data keep h = 2.
 */
export function automaticHalfWidth(s: ArrayLike<number>, f: ArrayLike<number>): { halfWidth: number; scatter: number } {
  return halfWidthForScatter(s, estimateScatter(s, f));
}

function halfWidthForScatter(s: ArrayLike<number>, scatter: number): { halfWidth: number; scatter: number } {
  const n = s.length;
  if (n < 3 || scatter === 0) return { halfWidth: SMOOTHING_MIN_HALF_WIDTH, scatter };
  work.reset();
  const steps = work.take(n - 1);
  for (let i = 1; i < n; i++) steps[i - 1] = s[i] - s[i - 1];
  const spacing = medianOf(steps);
  let h = SMOOTHING_MIN_HALF_WIDTH;
  while (h < SMOOTHING_MAX_HALF_WIDTH && 2 * h + 1 < n && scatter / (spacing * Math.sqrt((h * (h + 1) * (2 * h + 1)) / 3)) > SMOOTHING_SLOPE_NOISE) h++;
  return { halfWidth: h, scatter };
}

/**
 * The smoothing of f(s) the analysis uses and its least-squares slope into `slope`: the automatic
 * half-width (`automaticHalfWidth`) or the one given, with the estimated scatter either way. Where the
 * width is 2 the scatter's own five-station fits give the slope (the same numbers as
 * `leastSquaresSlope`, computed once instead of twice).
 */
export function smoothedSlope(s: ArrayLike<number>, f: ArrayLike<number>, halfWidth: number | 'auto', slope: Float64Array): { halfWidth: number; scatter: number } {
  const scatter = scatterAndSlopes(s, f, slope);
  const smoothing = halfWidth === 'auto' ? halfWidthForScatter(s, scatter) : { halfWidth, scatter };
  const n = s.length;
  if (fitsEveryWindow(n) && smoothing.halfWidth === 2) {
    localQuadraticFit(s, f, 2, null, slope, 0, 2);
    localQuadraticFit(s, f, 2, null, slope, n - 2, n);
  } else {
    localQuadraticFit(s, f, smoothing.halfWidth, null, slope);
  }
  return smoothing;
}

/** The median of `values` by quickselect (Hoare's FIND, CACM 4 (1961) 321), in linear time; reorders `values`. */
function medianOf(values: Float64Array): number {
  const m = values.length;
  const select = (k: number): number => {
    let lo = 0;
    let hi = m - 1;
    while (lo < hi) {
      const pivot = values[(lo + hi) >> 1];
      let i = lo;
      let j = hi;
      while (i <= j) {
        while (values[i] < pivot) i++;
        while (values[j] > pivot) j--;
        if (i <= j) {
          const t = values[i];
          values[i] = values[j];
          values[j] = t;
          i++;
          j--;
        }
      }
      if (k <= j) hi = j;
      else if (k >= i) lo = i;
      else return values[k];
    }
    return values[k];
  };
  if (m % 2) return select((m - 1) >> 1);
  const upper = select(m >> 1);
  // After selecting the upper middle, everything below it lies at lower indices: the lower middle is their largest.
  let lower = -Infinity;
  for (let i = 0; i < m >> 1; i++) if (values[i] > lower) lower = values[i];
  return 0.5 * (lower + upper);
}
