import { describe, expect, it } from 'vitest';
import { analyzeOne, geometricStations, stations } from '../test/cases';

/**
 * Thwaites' method against the exact and tabulated solutions (Blasius, Falkner–Skan, Howarth, the
 * circular cylinder, Mangler's cone) is checked by the shared reference cases in
 * ./validation/laminar.ts, which the validation page runs too. What stays here is behaviour with no
 * reference value.
 */
const RE = 1e6;

function laminar(s: number[], ue: number[]) {
  return analyzeOne({ flow: { reynolds: RE }, criteria: [], turbulent: false, surfaces: [{ name: 'w', s, ue }] });
}

describe('flat plate', () => {
  it('has no skin friction value at the sharp leading edge', () => {
    const s = stations(301);
    const st = laminar(s, s.map(() => 1)).surface.stations;
    expect(st.cf[0]).toBeNull();
    expect(st.theta[0]).toBe(0);
  });
});

describe('wedge flows', () => {
  it('stay attached from β = 1 down to β = −0.18', () => {
    for (const m of [1, 1 / 3, 0.2 / 1.8, 0, -0.1 / 2.1, -0.15 / 2.15, -0.18 / 2.18]) {
      const s = m > 0 ? stations(401) : geometricStations(401, 1e-6, 1);
      expect(laminar(s, s.map((x) => Math.pow(x, m))).surface.laminarSeparation, `m = ${m}`).toBeNull();
    }
  });
});

describe('Howarth’s linearly retarded flow', () => {
  it('lets laminar separation govern transition when no criterion comes first', () => {
    const s = stations(801, 0, 1.2, 1);
    const { surface } = analyzeOne({ flow: { reynolds: 1e5 }, criteria: [], surfaces: [{ name: 'w', s, ue: s.map((x) => 1 - x / 8) }] });
    expect(surface.transition.by).toBe('laminarSeparation');
    expect(surface.transition.s).toBeCloseTo(surface.laminarSeparation!.s, 10);
  });
});
