/**
 * Natural cubic spline through (t_i, f_i), t strictly increasing: piecewise cubics with continuous first
 * and second derivatives and zero second derivative at both ends. The second derivatives M_i solve the
 * tridiagonal system h_{i−1} M_{i−1} + 2(h_{i−1} + h_i) M_i + h_i M_{i+1} = 6 (Δ_i − Δ_{i−1}), Δ_i the
 * slope of interval i, by the Thomas algorithm.
 *
 * Source: C. de Boor, "A Practical Guide to Splines" (Springer, 1978), ch. IV; R. L. Burden and
 * J. D. Faires, "Numerical Analysis", §3.5 (natural cubic spline, Algorithm 3.4).
 */
export interface CubicSpline {
  /** Value at t (clamped to the end intervals' cubics outside the data). */
  at(t: number): number;
  /** First derivative at t. */
  slope(t: number): number;
}

export function naturalCubicSpline(t: ArrayLike<number>, f: ArrayLike<number>): CubicSpline {
  const n = t.length;
  if (n < 2) throw new RangeError('a spline needs at least two points');
  const m = new Float64Array(n);
  if (n > 2) {
    const diag = new Float64Array(n);
    const rhs = new Float64Array(n);
    for (let i = 1; i < n - 1; i++) {
      const h0 = t[i] - t[i - 1];
      const h1 = t[i + 1] - t[i];
      diag[i] = 2 * (h0 + h1);
      rhs[i] = 6 * ((f[i + 1] - f[i]) / h1 - (f[i] - f[i - 1]) / h0);
    }
    // Forward elimination on rows 1 … n−2 (M_0 = M_{n−1} = 0).
    for (let i = 2; i < n - 1; i++) {
      const w = (t[i] - t[i - 1]) / diag[i - 1];
      diag[i] -= w * (t[i] - t[i - 1]);
      rhs[i] -= w * rhs[i - 1];
    }
    for (let i = n - 2; i >= 1; i--) {
      m[i] = (rhs[i] - (i < n - 2 ? (t[i + 1] - t[i]) * m[i + 1] : 0)) / diag[i];
    }
  }
  const interval = (x: number) => {
    let lo = 0;
    let hi = n - 1;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (t[mid] <= x) lo = mid;
      else hi = mid;
    }
    return lo;
  };
  return {
    at(x: number) {
      const i = interval(x);
      const h = t[i + 1] - t[i];
      const a = (t[i + 1] - x) / h;
      const b = (x - t[i]) / h;
      return a * f[i] + b * f[i + 1] + (((a * a * a - a) * m[i] + (b * b * b - b) * m[i + 1]) * h * h) / 6;
    },
    slope(x: number) {
      const i = interval(x);
      const h = t[i + 1] - t[i];
      const a = (t[i + 1] - x) / h;
      const b = (x - t[i]) / h;
      return (f[i + 1] - f[i]) / h + (((1 - 3 * a * a) * m[i] + (3 * b * b - 1) * m[i + 1]) * h) / 6;
    },
  };
}
