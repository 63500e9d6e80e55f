import type { CrossflowShape } from './falkner-skan-cooke';

/**
 * Crossflow on an infinite swept wing, from the chordwise integral layer and the local
 * Falkner–Skan–Cooke profile (falkner-skan-cooke.ts), and the two crossflow transition criteria.
 *
 * With chordwise edge velocity Ue and spanwise We = V∞ sin Λ, the external streamline makes the angle
 * ψ with the chord, tan ψ = We/Ue, Qe = √(Ue² + We²); the crossflow velocity is
 * w_n = Qe sin ψ cos ψ (g − f'), whose largest magnitude is Ue We |f' − g|max / Qe.
 *
 * Crossflow Reynolds number after P. R. Owen & D. G. Randall, "Boundary layer transition on a swept
 * back wing", RAE TM Aero 277 (1952):  R_cf = |w_n|max δ₁₀ / ν, with δ₁₀ the height above the maximum
 * where the crossflow has fallen to a tenth of it. Transition is taken where R_cf reaches
 * OWEN_RANDALL_CRITICAL (about 200; quoted from memory: Owen & Randall found crossflow disturbances
 * from about 125–150 and transition near 175–250 in low-turbulence tunnels; common practice takes
 * 150–250).
 *
 * Arnal's C1 criterion: D. Arnal, M. Habiballah & E. Coustols, "Théorie de l'instabilité laminaire et
 * critères de transition en écoulement bi- et tridimensionnel", La Recherche Aérospatiale 1984-2,
 * 125–143: transition where the crossflow displacement-thickness Reynolds number
 * R_δ2 = Qe δ2/ν, δ2 = |∫ w_n/Qe dy|, reaches
 *   R_δ2,T = (300/π) arctan[0.106 / (H − 2.3)^2.052]   for 2.3 < H < 2.7,  150 for H ≤ 2.3,
 * with H the shape factor of the streamwise profile (formula and constants quoted from memory; held at
 * its H = 2.7 value beyond the range it was fitted to).
 */

export const OWEN_RANDALL_CRITICAL = 200;

/** The C1 criterion's critical R_δ2 for the streamwise shape factor H. */
export function arnalC1CriticalReDelta2(shapeFactor: number): number {
  if (shapeFactor <= 2.3) return 150;
  const h = Math.min(shapeFactor, 2.7);
  return (300 / Math.PI) * Math.atan(0.106 / Math.pow(h - 2.3, 2.052));
}

export interface CrossflowState {
  /** Owen–Randall crossflow Reynolds number. */
  reCf: number;
  /** Crossflow displacement-thickness Reynolds number Qe δ2 / ν. */
  reDelta2: number;
  /** Shape factor of the streamwise (external-streamline) profile. */
  streamwiseShapeFactor: number;
}

/**
 * Crossflow at one station: chordwise Ue/V∞ `ue`, spanwise We/V∞ `we`, chordwise momentum thickness θ/L
 * `theta`, local unit Reynolds number `reynolds` (Ue L / ν on V∞), and the similarity profile `shape`.
 */
export function crossflowState(ue: number, we: number, theta: number, reynolds: number, shape: CrossflowShape, out: CrossflowState): CrossflowState {
  const q2 = ue * ue + we * we;
  const q = Math.sqrt(q2);
  const cos2 = (ue * ue) / q2;
  const sin2 = (we * we) / q2;
  // Qe sin ψ cos ψ = Ue We / Qe.
  const scale = (ue * we) / q;
  out.reCf = reynolds * scale * Math.abs(shape.crossflowMax) * shape.crossflowEdgeOverTheta * theta;
  out.reDelta2 = reynolds * scale * Math.abs(shape.crossflowIntegralOverTheta) * theta;
  const displacement = cos2 * shape.chordwiseShapeFactor + sin2 * shape.spanwiseDisplacementOverTheta;
  const momentum = cos2 * cos2 + cos2 * sin2 * shape.mixedMomentumOverTheta + sin2 * sin2 * shape.spanwiseMomentumOverTheta;
  out.streamwiseShapeFactor = displacement / momentum;
  return out;
}
