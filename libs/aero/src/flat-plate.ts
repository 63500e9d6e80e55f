/**
 * Flat-plate skin friction and boundary-layer thickness for quick estimates at zero pressure gradient.
 *
 * Sources:
 *  - laminar, H. Blasius, Z. Math. Phys. 56 (1908): local cf = 0.664/√Re_x, mean CF = 1.328/√Re_L,
 *    δ99/x = 4.91/√Re_x (facts of the trade, e.g. H. Schlichting, "Boundary-Layer Theory", ch. 7);
 *  - turbulent, L. Prandtl (1927) one-fifth-power law: CF = 0.074 Re_L^−0.2, δ/x = 0.37 Re_x^−0.2;
 *  - turbulent, H. Schlichting (1936), Prandtl–Schlichting law: CF = 0.455 / (log10 Re_L)^2.58, local
 *    cf = (2 log10 Re_x − 0.65)^−2.3 (Schlichting, "Boundary-Layer Theory", ch. 21);
 *  - mixed laminar/turbulent plate (Prandtl's method, Schlichting ch. 21): the turbulent layer is taken
 *    to grow from the leading edge, and the laminar part replaces its front:
 *    CF = CF_turb(Re_L) − (Re_tr/Re_L) [CF_turb(Re_tr) − CF_lam(Re_tr)]  (the classic "− A/Re_L" form,
 *    A = 1700 for Re_tr = 5e5).
 * Coefficients are per side, on the free-stream dynamic pressure.
 */

export function laminarLocalCf(reX: number): number {
  return 0.664 / Math.sqrt(reX);
}

export function laminarMeanCf(reL: number): number {
  return 1.328 / Math.sqrt(reL);
}

export function laminarThickness(reX: number): number {
  return 4.91 / Math.sqrt(reX);
}

export function turbulentMeanCfPrandtl(reL: number): number {
  return 0.074 * Math.pow(reL, -0.2);
}

export function turbulentMeanCfSchlichting(reL: number): number {
  return 0.455 / Math.pow(Math.log10(reL), 2.58);
}

export function turbulentLocalCfSchlichting(reX: number): number {
  return Math.pow(2 * Math.log10(reX) - 0.65, -2.3);
}

/** Turbulent thickness δ/x from the one-fifth-power law. */
export function turbulentThickness(reX: number): number {
  return 0.37 * Math.pow(reX, -0.2);
}

/** Mean CF of a plate laminar up to Re_tr and turbulent behind it (Prandtl–Schlichting). */
export function mixedMeanCf(reL: number, reTransition: number): number {
  if (reTransition >= reL) return laminarMeanCf(reL);
  if (reTransition <= 0) return turbulentMeanCfSchlichting(reL);
  return turbulentMeanCfSchlichting(reL) - (reTransition / reL) * (turbulentMeanCfSchlichting(reTransition) - laminarMeanCf(reTransition));
}

export interface FlatPlateEstimate {
  reynolds: number;
  /** Transition Reynolds number Re_x used for the mixed estimate. */
  transitionReynolds: number;
  /** Mean friction coefficients per side. */
  cfLaminar: number;
  cfTurbulent: number;
  cfTurbulentPrandtl: number;
  cfMixed: number;
  /** Boundary-layer thickness at the trailing edge, divided by the plate length. */
  deltaLaminar: number;
  deltaTurbulent: number;
  /** Friction drag saved by laminar flow to transition, as a fraction of the all-turbulent value. */
  laminarSaving: number;
}

/**
 * Flat-plate estimate for a plate of Reynolds number Re_L = V L / ν with transition at
 * `transitionFraction` of its length (0 = all turbulent, 1 = all laminar).
 */
export function flatPlateEstimate(reynolds: number, transitionFraction: number): FlatPlateEstimate {
  if (!(reynolds > 0)) throw new RangeError('reynolds must be greater than zero');
  if (!(transitionFraction >= 0 && transitionFraction <= 1)) throw new RangeError('transitionFraction must lie between 0 and 1');
  const transitionReynolds = transitionFraction * reynolds;
  const cfTurbulent = turbulentMeanCfSchlichting(reynolds);
  const cfMixed = mixedMeanCf(reynolds, transitionReynolds);
  return {
    reynolds,
    transitionReynolds,
    cfLaminar: laminarMeanCf(reynolds),
    cfTurbulent,
    cfTurbulentPrandtl: turbulentMeanCfPrandtl(reynolds),
    cfMixed,
    deltaLaminar: laminarThickness(reynolds),
    deltaTurbulent: turbulentThickness(reynolds),
    laminarSaving: 1 - cfMixed / cfTurbulent,
  };
}
