import type { FlatPlateInputs, FlatPlateResult } from '@laminote/contracts';
import { flatPlateEstimate } from '../flat-plate';

/** Flat-plate estimate: laminar, turbulent and mixed skin friction of a plate (flat-plate.ts). */
export function computeFlatPlate(f: FlatPlateInputs): FlatPlateResult {
  const reynolds = f.mode === 'reynolds' ? f.reynolds : (f.speed_mps * f.length_m) / f.kinematicViscosity_m2s;
  const warnings: string[] = [];
  let fraction = f.transitionMode === 'location' ? f.transitionLocation : f.transitionReynolds / reynolds;
  if (fraction > 1) {
    warnings.push(`the transition Reynolds number ${f.transitionReynolds.toExponential(2)} is beyond the end of the plate (Re ${reynolds.toExponential(2)}): the plate is laminar throughout`);
    fraction = 1;
  }
  if (reynolds > 1e9) warnings.push('Re above 1e9: the turbulent laws are extrapolated');
  const e = flatPlateEstimate(reynolds, fraction);
  const length = f.mode === 'dimensional' ? f.length_m : null;
  return {
    ...e,
    transitionLocation: fraction,
    deltaLaminar_m: length === null ? null : e.deltaLaminar * length,
    deltaTurbulent_m: length === null ? null : e.deltaTurbulent * length,
    warnings,
  };
}
