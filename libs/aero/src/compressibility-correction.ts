import { criticalPressureCoefficient } from './compressible';

/**
 * Compressibility corrections of an incompressible pressure coefficient Cp0 to free-stream Mach M∞
 * (subsonic, attached flow, thin sections; both fail as the local flow nears sonic).
 *
 * Prandtl–Glauert rule (H. Glauert, "The effect of compressibility on the lift of an aerofoil",
 * Proc. R. Soc. A 118, 1928):  Cp = Cp0 / β,  β = √(1 − M∞²).
 *
 * Kármán–Tsien rule (H. S. Tsien, "Two-dimensional subsonic flow of compressible fluids",
 * J. Aeronaut. Sci. 6, 1939, p. 399; Th. von Kármán, "Compressibility effects in aerodynamics",
 * J. Aeronaut. Sci. 8, 1941, p. 337):  Cp = Cp0 / (β + M∞²/(1 + β) · Cp0/2).
 *
 * Critical Mach number: the M∞ at which the corrected minimum Cp equals the sonic value Cp*(M∞)
 * (isentropic, compressible.ts), found by bisection.
 */

export function prandtlGlauert(cp0: number, mach: number): number {
  return cp0 / Math.sqrt(1 - mach * mach);
}

export function karmanTsien(cp0: number, mach: number): number {
  const beta = Math.sqrt(1 - mach * mach);
  return cp0 / (beta + ((mach * mach) / (1 + beta)) * (cp0 / 2));
}

/**
 * Free-stream Mach number at which the Kármán–Tsien-corrected `cpMin0` (the incompressible minimum)
 * reaches the critical Cp; null when cpMin0 ≥ 0 (no suction, no critical Mach below 1).
 */
export function criticalMachKarmanTsien(cpMin0: number): number | null {
  if (!(cpMin0 < 0)) return null;
  const gap = (m: number) => karmanTsien(cpMin0, m) - criticalPressureCoefficient(m);
  // gap > 0 below the critical Mach number; the rule itself breaks down where its denominator
  // β + M²/(1 + β)·Cp0/2 reaches zero, so the search stops short of that.
  let lo = 1e-3;
  let hi = lo;
  while (hi < 0.999 && gap(hi) > 0) {
    lo = hi;
    hi = Math.min(0.999, hi + 0.01);
    const beta = Math.sqrt(1 - hi * hi);
    if (beta + ((hi * hi) / (1 + beta)) * (cpMin0 / 2) <= 0) return null;
  }
  if (gap(hi) > 0) return null;
  for (let k = 0; k < 60; k++) {
    const mid = 0.5 * (lo + hi);
    if (gap(mid) > 0) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}
