/**
 * Squire–Young profile drag.
 *
 * Source: H. B. Squire & A. D. Young, "The calculation of the profile drag of aerofoils", ARC R&M 1838
 * (1938): the wake's far-downstream momentum thickness follows from the trailing-edge state,
 *   θ∞ = θ_TE (Ue,TE / V∞)^((H_TE + 5)/2),   cd = 2 θ∞ / L,
 * applied to each surface and summed. θ in units of L, Ue in units of V∞.
 */
export function squireYoungDrag(trailingEdgeTheta: number, trailingEdgeUe: number, trailingEdgeShapeFactor: number): number {
  return 2 * trailingEdgeTheta * Math.pow(trailingEdgeUe, 0.5 * (trailingEdgeShapeFactor + 5));
}
