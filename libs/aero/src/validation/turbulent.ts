import { turbulentMeanCfPrandtl, turbulentMeanCfSchlichting } from '../flat-plate';
import { relativeWithin, type ValidationCase, type ValidationSuite } from './case';
import { analyzeOne, stations } from './support';

/** Mean skin friction of a plate turbulent from the leading edge, by the engine's Head march. */
export function turbulentPlate(reynolds: number) {
  const s = stations(301, 0, 1, 1.5);
  return analyzeOne({ flow: { reynolds }, criteria: [], surfaces: [{ name: 'plate', s, ue: s.map(() => 1), trip: 0 }] }).surface;
}

export const turbulentPlateSuite: ValidationSuite = {
  id: 'turbulent-plate',
  title: 'Turbulent flat plate (Head’s method)',
  methods: ['head', 'squire-young'],
  summary:
    'Head’s entrainment method with Ludwieg–Tillmann friction on a plate tripped at the leading edge, against the classical friction laws. It runs a few per cent low; 8 % is allowed, 13 % at Re = 1e8 where Ludwieg–Tillmann falls furthest below Schlichting’s law.',
  cases: () => {
    const cache = new Map<number, ReturnType<typeof turbulentPlate>>();
    const plate = (re: number) => cache.get(re) ?? cache.set(re, turbulentPlate(re)).get(re)!;
    const cases: ValidationCase[] = [];
    for (const re of [3e6, 1e7]) {
      cases.push({
        id: `turbulent-plate.prandtl.${re}`,
        title: `mean friction at Re_L = ${re.toExponential(0)} against Prandtl’s one-fifth-power law`,
        quantity: 'CF (–)',
        tolerance: relativeWithin(0.08),
        source: 'L. Prandtl (1927): CF = 0.074 Re_L^−0.2 (H. Schlichting, "Boundary-Layer Theory", ch. 21)',
        measure: () => ({ value: plate(re).cdFriction!, reference: turbulentMeanCfPrandtl(re) }),
      });
    }
    for (const [re, tolerance] of [[1e6, 0.08], [1e7, 0.08], [1e8, 0.13]] as const) {
      cases.push({
        id: `turbulent-plate.schlichting.${re}`,
        title: `mean friction at Re_L = ${re.toExponential(0)} against Schlichting’s law`,
        quantity: 'CF (–)',
        tolerance: relativeWithin(tolerance),
        source: 'H. Schlichting (1936), Prandtl–Schlichting law CF = 0.455/(log10 Re_L)^2.58 ("Boundary-Layer Theory", ch. 21)',
        measure: () => ({ value: plate(re).cdFriction!, reference: turbulentMeanCfSchlichting(re) }),
      });
    }
    for (const re of [1e6, 1e8]) {
      cases.push({
        id: `turbulent-plate.momentum.${re}`,
        title: `Squire–Young drag 2θ_TE equals the friction integral, Re_L = ${re.toExponential(0)}`,
        quantity: 'cd / CF (–)',
        tolerance: relativeWithin(0.003),
        source: 'momentum integral equation with dUe/dx = 0: dθ/dx = cf/2 (exact)',
        measure: () => ({ value: plate(re).cd! / plate(re).cdFriction!, reference: 1 }),
      });
    }
    return cases;
  },
};
