import { locatedCriterion } from '@laminote/contracts';
import { analyzeCase } from '../analyze';
import { mackCriticalN } from '../envelope-en';
import { digits, once, relativeWithin, type ValidationSuite } from './case';
import { bisectGeometric, stations } from './support';

/**
 * Flat-plate transition Reynolds numbers from the published correlations, evaluated in closed form on
 * Thwaites' flat-plate layer (θ = √(0.45 x/Re), so Re_θ = √(0.45 Re_x), and H = H(0) = 2.61), against
 * the engine's march, which integrates the same correlations station by station.
 */
const SQRT_045 = Math.sqrt(0.45);
const H_PLATE = 2.61;

function reThetaOnset(h: number): number {
  return Math.pow(10, (1.415 / (h - 1) - 0.489) * Math.tanh(20 / (h - 1) - 12.9) + 3.295 / (h - 1) + 0.44);
}

/** M. Drela & M. B. Giles, AIAA J. 25 (1987) 1347, approximate envelope on the plate, integrated in closed form. */
function drelaGilesPlate(nCrit: number): number {
  const h = H_PLATE;
  const slope = 0.01 * Math.sqrt((2.4 * h - 3.7 + 2.5 * Math.tanh(1.5 * h - 4.65)) ** 2 + 0.25);
  const ell = (6.54 * h - 14.07) / (h * h);
  const m = (0.058 * (h - 4) ** 2 / (h - 1) - 0.068) / ell;
  // dN/dx = slope (m+1)/2 ℓ/θ with θ = √(0.45 x/Re): N = slope (m+1) ℓ/√0.45 (√Re_x − √Re_x0).
  const k = (slope * (m + 1) * ell) / SQRT_045;
  return (reThetaOnset(h) / SQRT_045 + nCrit / k) ** 2;
}

export const flatPlateTransition: ValidationSuite = {
  id: 'flat-plate-transition',
  title: 'Flat-plate transition (envelope eᴺ, Michel, H–Re_x, Granville)',
  methods: ['envelope-en', 'michel', 'h-rex', 'granville'],
  summary:
    'Each criterion in closed form on Thwaites’ plate layer (Re_θ = √(0.45 Re_x), H = 2.61) against the engine’s station-by-station march at Re = 5e6, held to 0.5 %.',
  cases: () => {
    const plate = once(() => {
      const s = stations(3001, 0, 1, 1);
      return analyzeCase({ flow: { reynolds: 5e6 }, turbulent: false, surfaces: [{ name: 'plate', s, ue: s.map(() => 1) }] }).surfaces[0];
    });
    const reS = (c: 'eN' | 'michel' | 'hRx' | 'granville') => locatedCriterion(plate().transition.criteria[c])!.reS;
    return [
      { id: 'transition.eN.drela-giles', title: 'envelope eᴺ at N = 9', quantity: 'Re_x,tr (–)', tolerance: relativeWithin(0.005), source: 'M. Drela & M. B. Giles, AIAA J. 25 (1987) 1347, approximate envelope (eqs. for Re_θ0, dN/dRe_θ, ℓ, m)', measure: () => ({ value: reS('eN'), reference: drelaGilesPlate(9) }) },
      // |Re/3e6 − 1| < 1/3 is the open interval 2e6 < Re < 4e6.
      { id: 'transition.eN.range', title: 'envelope eᴺ at N = 9 lies between Re_x = 2e6 and 4e6', quantity: 'Re_x,tr (–)', tolerance: relativeWithin(1 / 3), source: 'common practice', measure: () => ({ value: reS('eN'), reference: 3e6 }) },
      {
        id: 'transition.michel',
        title: 'Michel: √(0.45 Re_x) = 1.174 (1 + 22400/Re_x) Re_x^0.46',
        quantity: 'Re_x,tr (–)',
        tolerance: relativeWithin(0.005),
        source: 'R. Michel (1951), in the form of T. Cebeci & A. M. O. Smith, "Analysis of Turbulent Boundary Layers", 1974',
        measure: () => ({ value: reS('michel'), reference: bisectGeometric((x) => SQRT_045 * Math.sqrt(x) - 1.174 * (1 + 22400 / x) * Math.pow(x, 0.46), 1e5, 1e8) }),
      },
      {
        id: 'transition.h-rex',
        title: 'H–Re_x: log10 Re_x = −40.4557 + 64.8066 H − 26.7538 H² + 3.3819 H³',
        quantity: 'Re_x,tr (–)',
        tolerance: relativeWithin(0.005),
        source: 'A. R. Wazzan, C. Gazley & A. M. O. Smith, AIAA J. 19 (1981)',
        measure: () => ({ value: reS('hRx'), reference: Math.pow(10, -40.4557 + 64.8066 * H_PLATE - 26.7538 * H_PLATE ** 2 + 3.3819 * H_PLATE ** 3) }),
      },
      {
        id: 'transition.granville',
        title: 'Granville with λ̄ = 0: Re_θ,tr = Re_θ,i + 375 + e^6.1',
        quantity: 'Re_x,tr (–)',
        tolerance: relativeWithin(0.005),
        source: 'P. S. Granville, David Taylor Model Basin Report 849 (1953); curve fit quoted from memory from T. Cebeci (1999)',
        measure: () => ({ value: reS('granville'), reference: ((reThetaOnset(H_PLATE) + 375 + Math.exp(6.1)) / SQRT_045) ** 2 }),
      },
    ];
  },
};

export const mack: ValidationSuite = {
  id: 'mack',
  title: 'Critical N from turbulence level (Mack)',
  methods: ['mack'],
  summary: 'N_crit = −8.43 − 2.4 ln Tu; Tu = 0.07 % gives the customary N = 9.',
  cases: () => {
    const source = 'L. M. Mack, AGARD CP-224 (1977)';
    return [
      { id: 'mack.formula', title: 'the relation at Tu = 0.07 %', quantity: 'N_crit (–)', tolerance: digits(10), source, measure: () => ({ value: mackCriticalN(0.0007), reference: -8.43 - 2.4 * Math.log(0.0007) }) },
      { id: 'mack.customary', title: 'Tu = 0.07 % gives the customary N = 9', quantity: 'N_crit (–)', tolerance: digits(1), source: 'common practice', measure: () => ({ value: mackCriticalN(0.0007), reference: 9.0 }) },
      { id: 'mack.one-percent', title: 'Tu = 1 %', quantity: 'N_crit (–)', tolerance: digits(2), source, measure: () => ({ value: mackCriticalN(0.01), reference: 2.62 }) },
    ];
  },
};
