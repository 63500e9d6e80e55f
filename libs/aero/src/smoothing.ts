import { Matrix, solve } from 'ml-matrix';

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
  const n = s.length;
  const width = Math.min(n, 2 * halfWidth + 1);
  if (width < 3) {
    const slope = n === 2 ? (f[1] - f[0]) / (s[1] - s[0]) : 0;
    out.fill(slope, 0, n);
    return out;
  }
  for (let i = 0; i < n; i++) {
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
    const detB = s0 * (t1 * s4 - s3 * t2) - t0 * (s1 * s4 - s3 * s2) + s2 * (s1 * t2 - t1 * s2);
    out[i] = detB / det / scale;
  }
  return out;
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
