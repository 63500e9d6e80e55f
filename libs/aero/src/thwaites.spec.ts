import { describe, expect, it } from 'vitest';
import { analyzeOne, geometricStations, nearest, relative, stations } from '../test/cases';
import { falknerSkan } from '../test/falkner-skan';
import { THWAITES_SEPARATION_LAMBDA, thwaitesShapeFactor, thwaitesShear } from './thwaites';

const RE = 1e6;

function laminar(s: number[], ue: number[], extra: { r?: number[] } = {}) {
  return analyzeOne({ flow: { reynolds: RE }, criteria: [], turbulent: false, surfaces: [{ name: 'w', s, ue, ...extra }] });
}

describe('Thwaites correlations', () => {
  it('reproduce the ends of Thwaites’ table', () => {
    // B. Thwaites, Aeronaut. Q. 1 (1949), table: λ = 0 → l = 0.220; λ = 0.25 → l = 0.500, H = 2.00
    // (values from memory; the Cebeci–Bradshaw fits are built to pass through them).
    expect(thwaitesShear(0)).toBeCloseTo(0.22, 3);
    expect(thwaitesShear(0.25)).toBeCloseTo(0.5, 2);
    expect(thwaitesShapeFactor(0.25)).toBeCloseTo(2.0, 2);
    // Laminar separation where the wall shear vanishes (Cebeci & Bradshaw 1977: λ = −0.09).
    expect(Math.abs(thwaitesShear(THWAITES_SEPARATION_LAMBDA))).toBeLessThan(0.005);
  });
});

describe('flat plate against Blasius', () => {
  // H. Blasius, Z. Math. Phys. 56 (1908): θ = 0.664 x/√Re_x, cf = 0.664/√Re_x, H = 2.591, and
  // CF = 1.328/√Re_L (facts of the trade). Thwaites' constants give θ 1 % high and cf 1.2 % low
  // (0.45 and l(0) = 0.22), so the checks allow 1.5 %.
  const s = stations(301);
  const { surface } = laminar(s, s.map(() => 1));
  const st = surface.stations;

  it('momentum thickness, skin friction and shape factor', () => {
    for (const target of [0.1, 0.5, 1]) {
      const i = nearest(s, target);
      const reX = RE * s[i];
      expect(Math.abs(relative(st.theta[i]!, (0.664 * s[i]) / Math.sqrt(reX)))).toBeLessThan(0.015);
      expect(Math.abs(relative(st.cf[i]!, 0.664 / Math.sqrt(reX)))).toBeLessThan(0.015);
      expect(Math.abs(relative(st.H[i]!, 2.591))).toBeLessThan(0.01);
    }
  });

  it('integrated friction is 1.328/√Re_L and equals the Squire–Young drag of a plate', () => {
    expect(Math.abs(relative(surface.cdFriction!, 1.328 / Math.sqrt(RE)))).toBeLessThan(0.015);
    // On a plate (Ue = V∞) the momentum integral makes drag = 2 θ_TE = friction (exact). Thwaites'
    // linearisation F(λ) = 0.45 − 6λ against 2 l(0) = 0.44 makes the method itself 2.3 % apart.
    expect(Math.abs(relative(surface.cd!, surface.cdFriction!))).toBeLessThan(0.025);
  });

  it('has no skin friction value at the sharp leading edge', () => {
    expect(st.cf[0]).toBeNull();
    expect(st.theta[0]).toBe(0);
  });
});

describe('Falkner–Skan wedge flows (similarity solutions computed by shooting with odex)', () => {
  it('the shooting reproduces the classical wall shear values', () => {
    // Hartree (1937) / F. M. White, "Viscous Fluid Flow", 3rd ed. (2006), Table 4-1, in the
    // η = y √((m+1)U/(2νx)) scaling: f''(0) = 0.4696 (β = 0), 1.2326 (β = 1), 0.3193 (β = −0.1)
    // (values from memory).
    expect(falknerSkan(0).wallShear).toBeCloseTo(0.4696, 3);
    expect(falknerSkan(1).wallShear).toBeCloseTo(1.2326, 3);
    expect(falknerSkan(-0.1).wallShear).toBeCloseTo(0.3193, 3);
  });

  // Thwaites' one-parameter method is not exact for wedge flows: the tolerances are the errors the
  // method is known to make (a few per cent in θ and H, skin friction worse toward separation, where it
  // goes to zero), and the closed-form λ = 0.45 m/(5m + 1) of the method itself is held to 0.2 %.
  const cases = [
    { beta: 1, theta: 0.07, H: 0.07, cf: 0.04 },
    { beta: 0.5, theta: 0.05, H: 0.06, cf: 0.04 },
    { beta: 0.2, theta: 0.03, H: 0.045, cf: 0.035 },
    { beta: 0, theta: 0.015, H: 0.01, cf: 0.015 },
    { beta: -0.1, theta: 0.04, H: 0.03, cf: 0.04 },
    { beta: -0.15, theta: 0.05, H: 0.06, cf: 0.15 },
    { beta: -0.18, theta: 0.05, H: 0.09, cf: null },
  ];
  for (const c of cases) {
    it(`β = ${c.beta}`, () => {
      const exact = falknerSkan(c.beta);
      const m = exact.m;
      // Accelerating wedges start at the stagnation point; decelerating ones (Ue infinite at x = 0) on
      // a geometric grid from x = 1e-6, where the missing part of the integral is negligible.
      const s = m > 0 ? stations(401) : geometricStations(401, 1e-6, 1);
      const ue = s.map((x) => Math.pow(x, m));
      const { surface } = laminar(s, ue);
      const st = surface.stations;
      const i = nearest(s, 0.5);
      const x = s[i];
      const reX = RE * ue[i] * x;
      const theta = (st.theta[i]! * Math.sqrt(reX)) / x;
      expect(Math.abs(relative(theta, exact.momentum * Math.sqrt(2 / (m + 1))))).toBeLessThan(c.theta);
      expect(Math.abs(relative(st.H[i]!, exact.displacement / exact.momentum))).toBeLessThan(c.H);
      if (c.cf !== null) {
        expect(Math.abs(relative(st.cf[i]! * Math.sqrt(reX), 2 * exact.wallShear * Math.sqrt((m + 1) / 2)))).toBeLessThan(c.cf);
      }
      const lambda = st.theta[i]! ** 2 * RE * m * Math.pow(x, m - 1);
      if (m !== 0) expect(Math.abs(relative(lambda, (0.45 * m) / (5 * m + 1)))).toBeLessThan(0.002);
      expect(surface.laminarSeparation).toBeNull();
    });
  }
});

describe('Howarth’s linearly retarded flow', () => {
  // L. Howarth, Proc. R. Soc. A 164 (1938): Ue = U0 (1 − x/L) separates at x/L ≈ 0.120 (accurate
  // series and numerical solutions give 0.1199; value from memory). With L = 8, Ue = 1 − x/8
  // separates near x = 0.96. Thwaites' method in closed form: λ = −0.075[(1 − x/L)^−6 − 1] = −0.09,
  // x/L = 1 − 2.2^(−1/6) = 0.1231 (about 3 % late, as the method is known to be).
  const s = stations(801, 0, 1.2, 1);
  const { surface } = analyzeOne({ flow: { reynolds: 1e5 }, criteria: [], surfaces: [{ name: 'w', s, ue: s.map((x) => 1 - x / 8) }] });

  it('separates where Thwaites’ method says, within 4 % of the exact point', () => {
    const sep = surface.laminarSeparation!.s;
    expect(Math.abs(relative(sep / 8, 1 - Math.pow(2.2, -1 / 6)))).toBeLessThan(0.003);
    expect(Math.abs(relative(sep / 8, 0.1199))).toBeLessThan(0.04);
  });

  it('lets laminar separation govern transition when no criterion comes first', () => {
    expect(surface.transition.by).toBe('laminarSeparation');
    expect(surface.transition.s).toBeCloseTo(surface.laminarSeparation!.s, 10);
  });
});

describe('circular cylinder (Hiemenz flow with the potential-flow Ue = 2 V sin φ)', () => {
  // Thwaites' method in closed form: λ = 0.45 I cos φ / sin⁶ φ, I = ∫₀^φ sin⁵ = 8/15 − cos φ +
  // (2/3) cos³ φ − (1/5) cos⁵ φ; laminar separation where λ = −0.09. The exact solution for this Ue
  // separates at φ ≈ 104.5° (R. M. Terrill, Phil. Trans. R. Soc. A 253, 1960; value from memory).
  const lambda = (phi: number) => {
    const c = Math.cos(phi);
    return (0.45 * (8 / 15 - c + (2 / 3) * c ** 3 - c ** 5 / 5) * c) / Math.sin(phi) ** 6;
  };
  let lo = Math.PI / 2;
  let hi = Math.PI * 0.75;
  for (let it = 0; it < 100; it++) {
    const mid = 0.5 * (lo + hi);
    if (lambda(mid) > -0.09) lo = mid;
    else hi = mid;
  }
  const count = 721;
  const s = Array.from({ length: count }, (_, i) => (0.8 * Math.PI * i) / (count - 1));
  const { surface } = laminar(s, s.map((x) => 2 * Math.sin(x)));

  it('separates where the closed form says, within 2 % of the exact angle', () => {
    const degrees = (surface.laminarSeparation!.s * 180) / Math.PI;
    expect(Math.abs(relative(surface.laminarSeparation!.s, lo))).toBeLessThan(0.002);
    expect(Math.abs(relative(degrees, 104.5))).toBeLessThan(0.02);
  });

  it('starts from the plane stagnation point: θ² = 0.075 ν / (dUe/dx)', () => {
    expect(surface.stations.theta[0]! ** 2 * RE * 2).toBeCloseTo(0.075, 4);
  });
});

describe('axisymmetric flow (Mangler transformation)', () => {
  const s = stations(301, 0, 1, 1.5);
  const plate = laminar(s, s.map(() => 1)).surface.stations;

  it('a cone at constant Ue has θ = θ_plate/√3 and cf = √3 cf_plate', () => {
    // W. Mangler, ZAMM 28 (1948): the boundary layer on a cone is the flat-plate layer with x/3, so
    // θ and cf differ by √3 at the same x (closed form of the transformation).
    const cone = laminar(
      s,
      s.map(() => 1),
      { r: s.map((x) => x * Math.sin((10 * Math.PI) / 180)) },
    ).surface.stations;
    for (const target of [0.2, 0.8]) {
      const i = nearest(s, target);
      expect(Math.abs(relative(cone.theta[i]! * Math.sqrt(3), plate.theta[i]!))).toBeLessThan(0.005);
      expect(Math.abs(relative(cone.cf[i]!, plate.cf[i]! * Math.sqrt(3)))).toBeLessThan(0.005);
    }
  });

  it('a body of constant radius behaves like plane flow', () => {
    const cylinder = laminar(
      s,
      s.map(() => 1),
      { r: s.map(() => 0.3) },
    ).surface.stations;
    const i = nearest(s, 0.6);
    expect(Math.abs(relative(cylinder.theta[i]!, plate.theta[i]!))).toBeLessThan(1e-9);
  });

  it('a pointed-nose stagnation point starts at λ = 0.05625 instead of the plane 0.075', () => {
    // Closed form of the Mangler–Thwaites integral for Ue = a s, r = s: θ² = 0.45 ν /(8 a).
    const nose = stations(201, 0, 0.05, 1.3);
    const body = laminar(nose, nose.map((x) => 2 * x), { r: nose }).surface.stations;
    const planeFlow = laminar(nose, nose.map((x) => 2 * x)).surface.stations;
    const i = nearest(nose, 0.02);
    expect((body.theta[i]! ** 2 * RE * 2)).toBeCloseTo(0.05625, 4);
    expect((planeFlow.theta[i]! ** 2 * RE * 2)).toBeCloseTo(0.075, 4);
  });
});
