import { describe, expect, it } from 'vitest';
import { analyzeCase } from './analyze';
import { mackCriticalN } from './envelope-en';
import { analyzeOne, relative, stations } from '../test/cases';

/**
 * Flat-plate transition Reynolds numbers from the published correlations, evaluated here in closed
 * form on Thwaites' flat-plate layer (θ = √(0.45 x/Re), so Re_θ = √(0.45 Re_x), and H = H(0) = 2.61),
 * against the engine's march, which integrates the same correlations station by station.
 */
const SQRT_045 = Math.sqrt(0.45);
const H_PLATE = 2.61;

function bisect(f: (x: number) => number, lo: number, hi: number): number {
  for (let it = 0; it < 200; it++) {
    const mid = Math.sqrt(lo * hi);
    if (f(mid) < 0) lo = mid;
    else hi = mid;
  }
  return Math.sqrt(lo * hi);
}

// M. Drela & M. B. Giles, AIAA J. 25 (1987) 1347, approximate envelope (eqs. for Re_θ0, dN/dRe_θ, ℓ, m).
function drelaGilesPlate(nCrit: number): number {
  const h = H_PLATE;
  const reTheta0 = Math.pow(10, (1.415 / (h - 1) - 0.489) * Math.tanh(20 / (h - 1) - 12.9) + 3.295 / (h - 1) + 0.44);
  const slope = 0.01 * Math.sqrt((2.4 * h - 3.7 + 2.5 * Math.tanh(1.5 * h - 4.65)) ** 2 + 0.25);
  const ell = (6.54 * h - 14.07) / (h * h);
  const m = (0.058 * (h - 4) ** 2 / (h - 1) - 0.068) / ell;
  // dN/dx = slope (m+1)/2 ℓ/θ with θ = √(0.45 x/Re): N = slope (m+1) ℓ/√0.45 (√Re_x − √Re_x0).
  const k = (slope * (m + 1) * ell) / SQRT_045;
  const sqrtReX0 = reTheta0 / SQRT_045;
  return (sqrtReX0 + nCrit / k) ** 2;
}

describe('flat-plate transition against the published correlations', () => {
  const reynolds = 5e6;
  const s = stations(3001, 0, 1, 1);
  const plate = analyzeCase({ flow: { reynolds }, turbulent: false, surfaces: [{ name: 'plate', s, ue: s.map(() => 1) }] }).surfaces[0];
  const reS = (c: keyof typeof plate.transition.criteria) => plate.transition.criteria[c]!.reS;

  it('envelope e^N (Drela & Giles 1987) at N = 9', () => {
    expect(Math.abs(relative(reS('eN'), drelaGilesPlate(9)))).toBeLessThan(0.005);
    // Common practice: e^9 on a flat plate lies between Re_x = 2e6 and 4e6.
    expect(reS('eN')).toBeGreaterThan(2e6);
    expect(reS('eN')).toBeLessThan(4e6);
  });

  it('Michel (Cebeci & Smith 1974 form): √(0.45 Re_x) = 1.174 (1 + 22400/Re_x) Re_x^0.46', () => {
    const expected = bisect((x) => SQRT_045 * Math.sqrt(x) - 1.174 * (1 + 22400 / x) * Math.pow(x, 0.46), 1e5, 1e8);
    expect(Math.abs(relative(reS('michel'), expected))).toBeLessThan(0.005);
  });

  it('H–Re_x (Wazzan, Gazley & Smith 1981): log10 Re_x = −40.4557 + 64.8066 H − 26.7538 H² + 3.3819 H³', () => {
    const h = H_PLATE;
    const expected = Math.pow(10, -40.4557 + 64.8066 * h - 26.7538 * h * h + 3.3819 * h ** 3);
    expect(Math.abs(relative(reS('hRx'), expected))).toBeLessThan(0.005);
  });

  it('Granville (1953) with λ̄ = 0: Re_θ,tr = Re_θ,i + 375 + e^6.1', () => {
    const h = H_PLATE;
    const reThetaI = Math.pow(10, (1.415 / (h - 1) - 0.489) * Math.tanh(20 / (h - 1) - 12.9) + 3.295 / (h - 1) + 0.44);
    const expected = ((reThetaI + 375 + Math.exp(6.1)) / SQRT_045) ** 2;
    expect(Math.abs(relative(reS('granville'), expected))).toBeLessThan(0.005);
  });

  it('e^N governs by default when it is chosen; the other criteria are cross-checks', () => {
    expect(plate.transition.by).toBe('eN');
    expect(plate.transition.s).toBe(plate.transition.criteria.eN!.s);
  });

  it('`governing: earliest` takes the shortest laminar run of the chosen criteria', () => {
    const earliestCase = analyzeCase({ flow: { reynolds }, governing: 'earliest', turbulent: false, surfaces: [{ name: 'plate', s, ue: s.map(() => 1) }] }).surfaces[0];
    const earliest = Object.entries(earliestCase.transition.criteria).reduce((a, b) => (b[1]!.s < a[1]!.s ? b : a));
    expect(earliestCase.transition.by).toBe(earliest[0]);
    expect(earliestCase.transition.s).toBe(earliest[1]!.s);
    // On a flat plate at N_crit = 9 Michel's line is crossed ahead of e^N (both computed above).
    expect(earliestCase.transition.s!).toBeLessThan(plate.transition.s!);
  });

  it('a named governing criterion must be among the chosen ones; without e^N the earliest governs', () => {
    expect(() => analyzeCase({ flow: { reynolds }, criteria: ['michel'], governing: 'eN', surfaces: [{ name: 'plate', s, ue: s.map(() => 1) }] })).toThrow(/governing/);
    const noEN = analyzeCase({ flow: { reynolds }, criteria: ['michel', 'granville'], turbulent: false, surfaces: [{ name: 'plate', s, ue: s.map(() => 1) }] }).surfaces[0];
    expect(noEN.transition.by).toBe('michel');
  });
});

describe('behaviour of the criteria', () => {
  const s = stations(801, 0, 1, 1.5);

  it('a favourable pressure gradient delays e^N transition, an adverse one brings it forward', () => {
    const at = (ue: (x: number) => number) =>
      analyzeOne({ flow: { reynolds: 8e6 }, criteria: ['eN'], turbulent: false, surfaces: [{ name: 'w', s, ue: s.map(ue) }] }).surface.transition.s!;
    const flat = at(() => 1);
    expect(at((x) => 1 + 0.15 * x)).toBeGreaterThan(flat * 1.1);
    expect(at((x) => 1 - 0.15 * x)).toBeLessThan(flat * 0.9);
  });

  it('a higher N_crit moves e^N transition back', () => {
    const at = (nCrit: number) =>
      analyzeOne({ flow: { reynolds: 8e6, nCrit }, criteria: ['eN'], turbulent: false, surfaces: [{ name: 'w', s, ue: s.map(() => 1) }] }).surface.transition.s!;
    expect(at(11)).toBeGreaterThan(at(9));
    expect(at(9)).toBeGreaterThan(at(7));
  });

  it('N grows monotonically in the laminar part and is reported up to transition only', () => {
    const { surface } = analyzeOne({ flow: { reynolds: 8e6 }, criteria: ['eN'], surfaces: [{ name: 'w', s, ue: s.map(() => 1) }] });
    const n = surface.stations.n;
    const last = n.findLastIndex((v) => v !== null);
    for (let i = 1; i <= last; i++) expect(n[i]!).toBeGreaterThanOrEqual(n[i - 1]!);
    expect(n[last]!).toBeLessThan(9.5);
    expect(s[last + 1]).toBeGreaterThan(surface.transition.s!);
  });
});

describe('trip', () => {
  const s = stations(401, 0, 1, 1.5);
  const run = (trip: number) =>
    analyzeOne({ flow: { reynolds: 6e6 }, criteria: ['eN'], surfaces: [{ name: 'w', s, ue: s.map(() => 1), trip }] }).surface;

  it('forces transition ahead of natural transition', () => {
    const tripped = run(0.1);
    expect(tripped.transition.by).toBe('trip');
    expect(tripped.transition.s).toBe(0.1);
    // The natural location is still reported beside the trip.
    expect(tripped.transition.criteria.eN!.s).toBeGreaterThan(0.3);
  });

  it('does nothing behind natural transition', () => {
    const late = run(0.95);
    expect(late.transition.by).toBe('eN');
    expect(late.transition.s).toBeLessThan(0.95);
  });

  it('raises the drag against the untripped plate', () => {
    expect(run(0.1).cd!).toBeGreaterThan(run(0.95).cd!);
  });
});

describe('Mack’s relation', () => {
  it('N_crit = −8.43 − 2.4 ln Tu (Mack, AGARD CP-224, 1977)', () => {
    // Tu = 0.07 % gives the customary N = 9 (common practice); 1 % gives 2.62.
    expect(mackCriticalN(0.0007)).toBeCloseTo(-8.43 - 2.4 * Math.log(0.0007), 10);
    expect(mackCriticalN(0.0007)).toBeCloseTo(9.0, 1);
    expect(mackCriticalN(0.01)).toBeCloseTo(2.62, 2);
  });

  it('is used when nCrit is not given, and nCrit wins when both are', () => {
    const surfaces = [{ name: 'w', s: [0, 0.5, 1], ue: [1, 1, 1] }];
    const fromTu = analyzeCase({ flow: { reynolds: 1e6, turbulenceIntensity: 0.002 }, surfaces });
    expect(fromTu.flow.nCrit).toBeCloseTo(-8.43 - 2.4 * Math.log(0.002), 10);
    expect(fromTu.flow.nCritFrom).toBe('turbulenceIntensity');
    const both = analyzeCase({ flow: { reynolds: 1e6, turbulenceIntensity: 0.002, nCrit: 8 }, surfaces });
    expect(both.flow.nCrit).toBe(8);
    expect(both.warnings.some((w) => w.includes('turbulenceIntensity'))).toBe(true);
    expect(analyzeCase({ flow: { reynolds: 1e6 }, surfaces }).flow).toMatchObject({ nCrit: 9, nCritFrom: 'default' });
  });
});
