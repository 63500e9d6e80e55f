/**
 * Michel's transition criterion in the form of Cebeci & Smith.
 *
 * Source: T. Cebeci & A. M. O. Smith, "Analysis of Turbulent Boundary Layers" (Academic Press, 1974),
 * after R. Michel, ONERA Report 1/1578A (1951):
 *   Re_θ,tr = 1.174 (1 + 22 400 / Re_x) Re_x^0.46,   0.1e6 ≲ Re_x ≲ 40e6,
 * with Re_θ = Ue θ / ν and Re_x = Ue x / ν on the local edge velocity and the distance from the
 * attachment line. Transition is where the laminar Re_θ first reaches this value.
 */
export function michelTransitionReTheta(reX: number): number {
  // Re_x^0.46 as exp(0.46 ln Re_x): evaluated at every laminar station (V8's Math.pow is the slower).
  return 1.174 * (1 + 22_400 / reX) * Math.exp(0.46 * Math.log(reX));
}
