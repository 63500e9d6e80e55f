import { edgeVelocityRatio, pressureCoefficientFromVelocity, stagnationPressureCoefficient } from './compressible';

/**
 * Simple sweep theory for the infinite swept wing: the flow normal to the leading edge is a
 * two-dimensional flow at the normal Mach number M∞ cos Λ with Cp_n = Cp / cos²Λ, and the spanwise
 * velocity We = V∞ sin Λ is the same everywhere (no spanwise pressure gradient).
 *
 * Source: e.g. D. Küchemann, "The Aerodynamic Design of Aircraft" (1978), ch. 4; common practice. The
 * Cp given is based on the free stream (as CFD and tests give it), so the edge speed Qe/V∞ follows from
 * the isentropic relation at M∞ (compressible.ts) and the chordwise component is
 *   Ue/V∞ = √((Qe/V∞)² − sin²Λ),
 * which is cos Λ times the normal flow's Ue/V_n from Cp_n at M∞ cos Λ (the energy equation is the same).
 * On the attachment line Ue = 0, Qe = V∞ sin Λ, and Cp takes its largest value, the attachment-line Cp.
 */

/** Cp on the attachment line (the largest Cp on the section): the stagnation value when Λ = 0. */
export function attachmentLinePressureCoefficient(mach: number, sweep: number): number {
  return sweep === 0 ? stagnationPressureCoefficient(mach) : pressureCoefficientFromVelocity(Math.abs(Math.sin(sweep)), mach);
}

/** Chordwise edge velocity Ue/V∞ from a free-stream-based Cp; NaN above the attachment-line Cp or below vacuum. */
export function chordwiseVelocityRatio(cp: number, mach: number, sweep: number): number {
  const q = edgeVelocityRatio(cp, mach);
  if (sweep === 0) return q;
  const spanwise = Math.sin(sweep);
  const u2 = q * q - spanwise * spanwise;
  // Round-off at the attachment line may leave u2 a hair below zero.
  return u2 >= 0 ? Math.sqrt(u2) : u2 > -1e-12 ? 0 : NaN;
}
