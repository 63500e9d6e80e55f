/**
 * Thwaites' integral method for the laminar boundary layer, with the Mangler transformation for bodies
 * of revolution.
 *
 * Source: B. Thwaites, "Approximate calculation of the laminar boundary layer", Aeronautical Quarterly 1
 * (1949) 245–280:  θ² = 0.45 ν / Ue⁶ ∫₀ˢ Ue⁵ ds,  λ = θ² (dUe/ds) / ν,  τw θ / (μ Ue) = l(λ),  H = H(λ).
 * Correlations l(λ) and H(λ): the fits of T. Cebeci & P. Bradshaw, "Momentum Transfer in Boundary
 * Layers" (1977), to Thwaites' table (coefficients quoted from memory; they reproduce Thwaites'
 * tabulated l = 0.22, H = 2.61 at λ = 0 and l = 0.5, H = 2.0 at λ = 0.25):
 *   0 ≤ λ ≤ 0.25:   l = 0.22 + 1.57 λ − 1.8 λ²,           H = 2.61 − 3.75 λ + 5.24 λ²
 *   −0.1 ≤ λ < 0:   l = 0.22 + 1.402 λ + 0.018 λ/(0.107 + λ),  H = 2.088 + 0.0731/(0.14 + λ)
 * Laminar separation where λ = −0.09 (l → 0). At a stagnation point (Ue = 0, Ue = a s) the integral
 * gives the finite start θ² = 0.075 ν / a.
 * Axisymmetric flow (L. Rott & L. F. Crabtree, J. Aeronaut. Sci. 19, 1952, 553, after W. Mangler,
 * 1948):  θ² = 0.45 ν / (r² Ue⁶) ∫ r² Ue⁵ ds, with the same l(λ), H(λ); at a pointed-nose stagnation
 * point (r = 0) the start is θ² = 0.05625 ν / a.
 *
 * All lengths are divided by L, velocities by V∞, so ν enters as 1/Re.
 */

export const THWAITES_CONSTANT = 0.45;
/** λ at laminar separation with the Cebeci–Bradshaw correlations. */
export const THWAITES_SEPARATION_LAMBDA = -0.09;
const LAMBDA_MIN = -0.1;
const LAMBDA_MAX = 0.25;

/** Wall-shear correlation l(λ) = τw θ / (μ Ue). */
export function thwaitesShear(lambda: number): number {
  const x = lambda < LAMBDA_MIN ? LAMBDA_MIN : lambda > LAMBDA_MAX ? LAMBDA_MAX : lambda;
  return x >= 0 ? 0.22 + 1.57 * x - 1.8 * x * x : 0.22 + 1.402 * x + (0.018 * x) / (0.107 + x);
}

/** Shape-factor correlation H(λ) = δ* / θ. */
export function thwaitesShapeFactor(lambda: number): number {
  const x = lambda < LAMBDA_MIN ? LAMBDA_MIN : lambda > LAMBDA_MAX ? LAMBDA_MAX : lambda;
  return x >= 0 ? 2.61 - 3.75 * x + 5.24 * x * x : 2.088 + 0.0731 / (0.14 + x);
}

/** Station arrays the laminar march fills (all of the surface's length). */
export interface LaminarStations {
  /** θ / L. */
  theta: Float64Array;
  /** Pressure-gradient parameter λ = θ² Re dUe/ds. */
  lambda: Float64Array;
  shapeFactor: Float64Array;
  /** τw / (½ ρ Ue²); NaN where Ue = 0 or θ = 0. */
  skinFriction: Float64Array;
  /** τw / (½ ρ V∞²); NaN where θ = 0 (sharp leading edge). */
  wallShear: Float64Array;
}

// Gauss–Legendre nodes and weights on [0, 1], exact for the degree-7 integrand r² Ue⁵ with r and Ue
// linear over an interval.
const GL_T = [0.0694318442029737, 0.3300094782075719, 0.6699905217924281, 0.9305681557970263];
const GL_W = [0.1739274225687269, 0.3260725774312731, 0.3260725774312731, 0.1739274225687269];

/**
 * March Thwaites' method along stations `s` (strictly increasing) with edge velocity `ue`, its slope
 * `dUeds`, Reynolds number `reynolds` = V∞ L / ν and optional body radius `radius` (axisymmetric).
 * Ue is taken as linear between stations, and the integral is exact for that.
 */
export function thwaitesMarch(
  s: ArrayLike<number>,
  ue: ArrayLike<number>,
  dUeds: ArrayLike<number>,
  reynolds: number,
  radius: ArrayLike<number> | null,
  out: LaminarStations,
): void {
  const n = s.length;
  const { theta, lambda, shapeFactor, skinFriction, wallShear } = out;
  let integral = 0;
  for (let i = 0; i < n; i++) {
    const u = ue[i];
    if (i > 0) {
      const ds = s[i] - s[i - 1];
      const u0 = ue[i - 1];
      if (radius === null) {
        // ∫ Ue⁵ ds for linear Ue = ds/6 · Σ u0^k u^(5−k)
        const a2 = u0 * u0;
        const b2 = u * u;
        integral += (ds / 6) * (a2 * a2 * u0 + a2 * a2 * u + a2 * u0 * b2 + a2 * b2 * u + u0 * b2 * b2 + b2 * b2 * u);
      } else {
        const r0 = radius[i - 1];
        const dr = radius[i] - r0;
        const du = u - u0;
        let sum = 0;
        for (let q = 0; q < 4; q++) {
          const rq = r0 + GL_T[q] * dr;
          const uq = u0 + GL_T[q] * du;
          const u2 = uq * uq;
          sum += GL_W[q] * rq * rq * u2 * u2 * uq;
        }
        integral += ds * sum;
      }
    }
    let th2: number;
    if (u > 0) {
      const u2 = u * u;
      const r2 = radius === null ? 1 : radius[i] * radius[i];
      th2 = (THWAITES_CONSTANT * integral) / (reynolds * r2 * u2 * u2 * u2);
    } else {
      // Stagnation-point start: the limit of the integral as Ue = a s → 0.
      const start = radius !== null && radius[i] === 0 ? THWAITES_CONSTANT / 8 : THWAITES_CONSTANT / 6;
      th2 = dUeds[i] > 0 ? start / (reynolds * dUeds[i]) : NaN;
    }
    const th = Math.sqrt(th2);
    const lam = th2 * reynolds * dUeds[i];
    const l = thwaitesShear(lam);
    theta[i] = th;
    lambda[i] = lam;
    shapeFactor[i] = thwaitesShapeFactor(lam);
    skinFriction[i] = u > 0 && th > 0 ? (2 * l) / (reynolds * u * th) : NaN;
    wallShear[i] = th > 0 ? (2 * l * u) / (reynolds * th) : NaN;
  }
}
