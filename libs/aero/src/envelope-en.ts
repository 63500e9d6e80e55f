/**
 * The envelope e^N method: amplification of the most unstable Tollmien–Schlichting wave, in the
 * approximate-envelope form of Drela & Giles, with Mack's relation for the critical N.
 *
 * Source: M. Drela & M. B. Giles, "Viscous–inviscid analysis of transonic and low Reynolds number
 * airfoils", AIAA Journal 25 (1987) 1347–1355, fitted to Falkner–Skan stability results (coefficients
 * quoted from memory):
 *   log10 Re_θ0 = (1.415/(H−1) − 0.489) tanh(20/(H−1) − 12.9) + 3.295/(H−1) + 0.44
 *   dN/dRe_θ  = 0.01 √{[2.4 H − 3.7 + 2.5 tanh(1.5 H − 4.65)]² + 0.25}
 *   ℓ(H) = (6.54 H − 14.07)/H²,  m(H) = (0.058 (H − 4)²/(H − 1) − 0.068)/ℓ(H)
 *   dN/ds = dN/dRe_θ · (m + 1)/2 · ℓ / θ   where Re_θ > Re_θ0, else 0.
 * Transition where N reaches N_crit. Critical N from the free-stream turbulence intensity Tu (as a
 * fraction) by L. M. Mack, "Transition prediction and linear stability theory", AGARD CP-224 (1977):
 *   N_crit = −8.43 − 2.4 ln Tu,
 * usually quoted as valid for 0.07 % ≤ Tu ≤ 2.98 % (range from memory, as the relation is commonly
 * cited after Mack), which is exactly where it gives N_crit from 9.0 down to 0: the everyday
 * N_crit = 9 sits at the low end of the range, not outside it.
 */

/** Re_θ at which Tollmien–Schlichting waves start to grow (neutral point), for shape factor H. */
export function criticalReTheta(shapeFactor: number): number {
  const hm1 = 1 / (shapeFactor - 1);
  // 10^x as exp(x ln 10): evaluated at every laminar station (V8's Math.pow is the slower).
  return Math.exp(Math.LN10 * ((1.415 * hm1 - 0.489) * Math.tanh(20 * hm1 - 12.9) + 3.295 * hm1 + 0.44));
}

/** Envelope growth dN/dRe_θ for shape factor H. */
export function envelopeSlope(shapeFactor: number): number {
  const a = 2.4 * shapeFactor - 3.7 + 2.5 * Math.tanh(1.5 * shapeFactor - 4.65);
  return 0.01 * Math.sqrt(a * a + 0.25);
}

/** Spatial growth rate dN/ds (per unit of s/L) for shape factor H and θ/L, once Re_θ > Re_θ0. */
export function envelopeGrowthRate(shapeFactor: number, theta: number): number {
  const h = shapeFactor;
  const ell = (6.54 * h - 14.07) / (h * h);
  // (m + 1) ℓ / 2 written without the division by ℓ, which vanishes at H = 2.15.
  const mEll = (0.058 * (h - 4) * (h - 4)) / (h - 1) - 0.068;
  return (envelopeSlope(h) * 0.5 * (mEll + ell)) / theta;
}

/** Turbulence levels (fractions) over which Mack's relation is usually quoted as valid: N_crit 9 to 0. */
export const MACK_TURBULENCE_RANGE = [0.0007, 0.0298] as const;

/** Mack's critical N-factor for turbulence intensity Tu (fraction), never below zero. */
export function mackCriticalN(turbulenceIntensity: number): number {
  return Math.max(0, -8.43 - 2.4 * Math.log(turbulenceIntensity));
}
