/**
 * Granville's transition criterion.
 *
 * Source: P. S. Granville, "The calculation of the viscous drag of bodies of revolution", David Taylor
 * Model Basin Report 849 (1953). Transition follows the instability (neutral-stability) point i at a
 * Re_θ rise that grows with the mean pressure-gradient parameter λ̄ = (1/(x − x_i)) ∫ λ dx taken
 * from the instability point; the curve fit used here is
 *   Re_θ,tr − Re_θ,i = 375 + exp(6.1 + 55 λ̄)
 * (quoted from memory from T. Cebeci, "An Engineering Approach to the Calculation of Aerodynamic
 * Flows", 1999). The instability point is where Re_θ first exceeds the critical value of
 * `criticalReTheta` (envelope-en.ts), a fit to the same Falkner–Skan stability results.
 */
export function granvilleReThetaRise(meanLambda: number): number {
  return 375 + Math.exp(6.1 + 55 * meanLambda);
}
