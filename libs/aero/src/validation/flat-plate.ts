import { laminarLocalCf, laminarMeanCf, turbulentMeanCfPrandtl, turbulentMeanCfSchlichting } from '../flat-plate';
import { digits, relativeWithin, type ValidationSuite } from './case';

export const flatPlateEstimates: ValidationSuite = {
  id: 'flat-plate-estimates',
  title: 'Flat-plate friction estimates',
  methods: ['flat-plate'],
  summary: 'The closed-form laminar, turbulent and mixed-plate laws of the flat-plate estimate cell.',
  cases: () => {
    // Schlichting's A = 1700 comes from the one-fifth-power law, so with the 0.455 law it is about 5 % lower.
    const schlichtingA = 'H. Schlichting, "Boundary-Layer Theory", ch. 21: CF = 0.455/(log Re)^2.58 − A/Re, A = 1700 for Re_tr = 5e5 (from memory)';
    return [
      { id: 'flat-plate.laminar.local', title: 'laminar local friction at Re_x = 1e6', quantity: 'cf (–)', tolerance: digits(9), source: 'H. Blasius, Z. Math. Phys. 56 (1908): cf = 0.664/√Re_x (fact of the trade)', measure: () => ({ value: laminarLocalCf(1e6), reference: 0.000664 }) },
      { id: 'flat-plate.laminar.mean', title: 'laminar mean friction at Re_L = 1e6', quantity: 'CF (–)', tolerance: digits(9), source: 'H. Blasius, Z. Math. Phys. 56 (1908): CF = 1.328/√Re_L (fact of the trade)', measure: () => ({ value: laminarMeanCf(1e6), reference: 0.001328 }) },
      { id: 'flat-plate.mixed.schlichting', title: 'mixed-plate constant A for transition at Re = 5e5, Schlichting’s turbulent law', quantity: 'A (–)', tolerance: relativeWithin(0.06), source: schlichtingA, measure: () => ({ value: 5e5 * (turbulentMeanCfSchlichting(5e5) - laminarMeanCf(5e5)), reference: 1700 }) },
      { id: 'flat-plate.mixed.prandtl', title: 'mixed-plate constant A for transition at Re = 5e5, Prandtl’s one-fifth-power law', quantity: 'A (–)', tolerance: relativeWithin(0.03), source: schlichtingA, measure: () => ({ value: 5e5 * (turbulentMeanCfPrandtl(5e5) - laminarMeanCf(5e5)), reference: 1700 }) },
    ];
  },
};
