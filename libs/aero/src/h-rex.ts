/**
 * The H–Re_x transition correlation.
 *
 * Source: A. R. Wazzan, C. Gazley & A. M. O. Smith, "H–Rx method for predicting transition",
 * AIAA Journal 19 (1981) 810–812, fitted to e⁹ results of linear stability theory for similar flows:
 *   log10 Re_x,tr = −40.4557 + 64.8066 H − 26.7538 H² + 3.3819 H³,   2.1 < H < 2.8
 * (coefficients quoted from memory, as given by Cebeci & Cousteix, "Modeling and Computation of
 * Boundary-Layer Flows", 2005). H is clamped to the fitted range: outside it the cubic turns back
 * (it has a minimum near H = 3.4), which would delay transition in strongly adverse gradients.
 */
export const H_REX_SHAPE_RANGE = [2.1, 2.8] as const;

/** log10 of the transition Reynolds number Ue x / ν at local shape factor H. */
export function hRexTransitionLog10ReX(shapeFactor: number): number {
  const h = shapeFactor < H_REX_SHAPE_RANGE[0] ? H_REX_SHAPE_RANGE[0] : shapeFactor > H_REX_SHAPE_RANGE[1] ? H_REX_SHAPE_RANGE[1] : shapeFactor;
  return -40.4557 + h * (64.8066 + h * (-26.7538 + h * 3.3819));
}

/** Transition Reynolds number Ue x / ν at local shape factor H. */
export function hRexTransitionReX(shapeFactor: number): number {
  return Math.pow(10, hRexTransitionLog10ReX(shapeFactor));
}
