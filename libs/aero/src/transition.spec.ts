import { describe, expect, it } from 'vitest';
import { analyzeCase } from './analyze';
import { analyzeOne, stations } from '../test/cases';

// The criteria's flat-plate transition Reynolds numbers against their published closed forms are shared
// reference cases (./validation/transition.ts), run by the validation page too.
describe('governing criterion on a flat plate', () => {
  const reynolds = 5e6;
  const s = stations(3001, 0, 1, 1);
  const plate = analyzeCase({ flow: { reynolds }, turbulent: false, surfaces: [{ name: 'plate', s, ue: s.map(() => 1) }] }).surfaces[0];

  it('e^N governs by default when it is chosen; the other criteria are cross-checks', () => {
    expect(plate.transition.by).toBe('eN');
    expect(plate.transition.s).toBe(plate.transition.criteria.eN!.s);
  });

  it('`governing: earliest` takes the shortest laminar run of the chosen criteria', () => {
    const earliestCase = analyzeCase({ flow: { reynolds }, governing: 'earliest', turbulent: false, surfaces: [{ name: 'plate', s, ue: s.map(() => 1) }] }).surfaces[0];
    // Every chosen criterion is located on the plate (the crossflow ones say there is no sweep).
    const located = Object.entries(earliestCase.transition.criteria).flatMap(([c, entry]) => (entry != null && entry.s !== null ? [[c, entry.s] as const] : []));
    const earliest = located.reduce((a, b) => (b[1] < a[1] ? b : a));
    expect(earliestCase.transition.by).toBe(earliest[0]);
    expect(earliestCase.transition.s).toBe(earliest[1]);
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

describe('Mack’s relation (values: ./validation/transition.ts)', () => {
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
