import { THWAITES_SEPARATION_LAMBDA, thwaitesShapeFactor, thwaitesShear } from '../thwaites';
import { digits, once, relativeWithin, type ValidationCase, type ValidationSuite } from './case';
import { falknerSkan } from './falkner-skan';
import { analyzeOne, geometricStations, nearest, stations } from './support';

/** Laminar layer (Thwaites' method, with Mangler's transformation) against exact and tabulated solutions. */

const RE = 1e6;

function laminar(s: number[], ue: number[], extra: { r?: number[] } = {}) {
  return analyzeOne({ flow: { reynolds: RE }, criteria: [], turbulent: false, surfaces: [{ name: 'w', s, ue, ...extra }] });
}

export const thwaitesTable: ValidationSuite = {
  id: 'thwaites-table',
  title: 'Thwaites’ correlations',
  methods: ['thwaites'],
  summary: 'The fitted shear and shape-factor functions pass through the ends of Thwaites’ table.',
  cases: () => {
    const source = 'B. Thwaites, Aeronaut. Q. 1 (1949), table (values from memory; the Cebeci–Bradshaw fits are built to pass through them)';
    return [
      { id: 'thwaites.l.0', title: 'shear function at λ = 0', quantity: 'l(0) (–)', tolerance: digits(3), source, measure: () => ({ value: thwaitesShear(0), reference: 0.22 }) },
      { id: 'thwaites.l.0.25', title: 'shear function at λ = 0.25', quantity: 'l(0.25) (–)', tolerance: digits(2), source, measure: () => ({ value: thwaitesShear(0.25), reference: 0.5 }) },
      { id: 'thwaites.H.0.25', title: 'shape factor at λ = 0.25', quantity: 'H(0.25) (–)', tolerance: digits(2), source, measure: () => ({ value: thwaitesShapeFactor(0.25), reference: 2.0 }) },
      {
        id: 'thwaites.separation',
        title: 'wall shear vanishes at the separation value λ = −0.09',
        quantity: 'l(−0.09) (–)',
        tolerance: { kind: 'absolute', value: 0.005 },
        source: 'T. Cebeci & P. Bradshaw, "Momentum Transfer in Boundary Layers", 1977 (λ_sep = −0.09)',
        measure: () => ({ value: thwaitesShear(THWAITES_SEPARATION_LAMBDA), reference: 0 }),
      },
    ];
  },
};

export const blasius: ValidationSuite = {
  id: 'blasius',
  title: 'Flat plate (Blasius)',
  methods: ['thwaites', 'squire-young'],
  summary:
    'The exact laminar flat-plate solution. Thwaites’ constants give θ 1 % high and cf 1.2 % low (0.45 and l(0) = 0.22), so 1.5 % is allowed.',
  cases: () => {
    const source = 'H. Blasius, Z. Math. Phys. 56 (1908): θ = 0.664 x/√Re_x, cf = 0.664/√Re_x, H = 2.591, CF = 1.328/√Re_L (facts of the trade)';
    const run = once(() => {
      const s = stations(301);
      return { s, surface: laminar(s, s.map(() => 1)).surface };
    });
    const at = (target: number) => {
      const { s, surface } = run();
      const i = nearest(s, target);
      return { reX: RE * s[i], x: s[i], theta: surface.stations.theta[i]!, cf: surface.stations.cf[i]!, H: surface.stations.H[i]! };
    };
    const cases: ValidationCase[] = [];
    for (const x of [0.1, 0.5, 1]) {
      cases.push(
        { id: `blasius.theta.x${x}`, title: `momentum thickness at x = ${x}, Re = 1e6`, quantity: 'θ √Re_x / x (–)', tolerance: relativeWithin(0.015), source, measure: () => { const p = at(x); return { value: (p.theta * Math.sqrt(p.reX)) / p.x, reference: 0.664 }; } },
        { id: `blasius.cf.x${x}`, title: `skin friction at x = ${x}, Re = 1e6`, quantity: 'cf √Re_x (–)', tolerance: relativeWithin(0.015), source, measure: () => { const p = at(x); return { value: p.cf * Math.sqrt(p.reX), reference: 0.664 }; } },
        { id: `blasius.H.x${x}`, title: `shape factor at x = ${x}, Re = 1e6`, quantity: 'H (–)', tolerance: relativeWithin(0.01), source, measure: () => ({ value: at(x).H, reference: 2.591 }) },
      );
    }
    cases.push(
      { id: 'blasius.CF', title: 'integrated friction of a plate, Re_L = 1e6', quantity: 'CF √Re_L (–)', tolerance: relativeWithin(0.015), source, measure: () => ({ value: run().surface.cdFriction! * Math.sqrt(RE), reference: 1.328 }) },
      {
        id: 'blasius.squire-young',
        title: 'Squire–Young drag of a plate equals its friction (Thwaites’ 0.45 − 6λ against 2 l(0) = 0.44 makes the method 2.3 % apart)',
        quantity: 'cd / CF (–)',
        tolerance: relativeWithin(0.025),
        source: 'momentum integral equation with dUe/dx = 0: drag = 2 θ_TE = friction (exact)',
        measure: () => ({ value: run().surface.cd! / run().surface.cdFriction!, reference: 1 }),
      },
    );
    return cases;
  },
};

export const falknerSkanSuite: ValidationSuite = {
  id: 'falkner-skan',
  title: 'Wedge flows (Falkner–Skan)',
  methods: ['thwaites'],
  summary:
    'Similarity solutions computed here by shooting with odex. Thwaites’ one-parameter method is not exact for wedge flows: the tolerances are the errors the method is known to make (a few per cent in θ and H, skin friction worse toward separation); its own closed form λ = 0.45 m/(5m + 1) is held to 0.2 %.',
  cases: () => {
    const hartree = 'D. R. Hartree, Proc. Camb. Phil. Soc. 33 (1937); F. M. White, "Viscous Fluid Flow", 3rd ed. (2006), Table 4-1 (values from memory)';
    const shooting = 'V. M. Falkner & S. W. Skan, Phil. Mag. 12 (1931): similarity solution computed by shooting with odex';
    const cases: ValidationCase[] = [
      { id: 'falkner-skan.shooting.0', title: 'the shooting reproduces the wall shear, β = 0', quantity: 'f″(0) (–)', tolerance: digits(3), source: hartree, measure: () => ({ value: falknerSkan(0).wallShear, reference: 0.4696 }) },
      { id: 'falkner-skan.shooting.1', title: 'the shooting reproduces the wall shear, β = 1', quantity: 'f″(0) (–)', tolerance: digits(3), source: hartree, measure: () => ({ value: falknerSkan(1).wallShear, reference: 1.2326 }) },
      { id: 'falkner-skan.shooting.-0.1', title: 'the shooting reproduces the wall shear, β = −0.1', quantity: 'f″(0) (–)', tolerance: digits(3), source: hartree, measure: () => ({ value: falknerSkan(-0.1).wallShear, reference: 0.3193 }) },
    ];
    const wedges = [
      { beta: 1, theta: 0.07, H: 0.07, cf: 0.04 },
      { beta: 0.5, theta: 0.05, H: 0.06, cf: 0.04 },
      { beta: 0.2, theta: 0.03, H: 0.045, cf: 0.035 },
      { beta: 0, theta: 0.015, H: 0.01, cf: 0.015 },
      { beta: -0.1, theta: 0.04, H: 0.03, cf: 0.04 },
      { beta: -0.15, theta: 0.05, H: 0.06, cf: 0.15 },
      { beta: -0.18, theta: 0.05, H: 0.09, cf: null },
    ];
    for (const w of wedges) {
      const run = once(() => {
        const exact = falknerSkan(w.beta);
        const m = exact.m;
        // Accelerating wedges start at the stagnation point; decelerating ones (Ue infinite at x = 0) on
        // a geometric grid from x = 1e-6, where the missing part of the integral is negligible.
        const s = m > 0 ? stations(401) : geometricStations(401, 1e-6, 1);
        const ue = s.map((x) => Math.pow(x, m));
        const { surface } = laminar(s, ue);
        const i = nearest(s, 0.5);
        const x = s[i];
        const reX = RE * ue[i] * x;
        return { exact, m, x, reX, theta: surface.stations.theta[i]!, H: surface.stations.H[i]!, cf: surface.stations.cf[i]! };
      });
      const b = `β = ${w.beta}`;
      cases.push(
        { id: `falkner-skan.${w.beta}.theta`, title: `momentum thickness at x = 0.5, ${b}`, quantity: 'θ √Re_x / x (–)', tolerance: relativeWithin(w.theta), source: shooting, measure: () => { const r = run(); return { value: (r.theta * Math.sqrt(r.reX)) / r.x, reference: r.exact.momentum * Math.sqrt(2 / (r.m + 1)) }; } },
        { id: `falkner-skan.${w.beta}.H`, title: `shape factor at x = 0.5, ${b}`, quantity: 'H (–)', tolerance: relativeWithin(w.H), source: shooting, measure: () => { const r = run(); return { value: r.H, reference: r.exact.displacement / r.exact.momentum }; } },
      );
      if (w.cf !== null) {
        const tolerance = w.cf;
        cases.push({ id: `falkner-skan.${w.beta}.cf`, title: `skin friction at x = 0.5, ${b}`, quantity: 'cf √Re_x (–)', tolerance: relativeWithin(tolerance), source: shooting, measure: () => { const r = run(); return { value: r.cf * Math.sqrt(r.reX), reference: 2 * r.exact.wallShear * Math.sqrt((r.m + 1) / 2) }; } });
      }
      if (w.beta !== 0) {
        cases.push({
          id: `falkner-skan.${w.beta}.lambda`,
          title: `Thwaites’ closed form of the pressure-gradient parameter, ${b}`,
          quantity: 'λ = θ² Re dUe/dx (–)',
          tolerance: relativeWithin(0.002),
          source: 'B. Thwaites, Aeronaut. Q. 1 (1949): for Ue = x^m the method gives λ = 0.45 m/(5m + 1) (closed form)',
          measure: () => { const r = run(); return { value: r.theta ** 2 * RE * r.m * Math.pow(r.x, r.m - 1), reference: (0.45 * r.m) / (5 * r.m + 1) }; },
        });
      }
    }
    return cases;
  },
};

export const howarth: ValidationSuite = {
  id: 'howarth',
  title: 'Linearly retarded flow (Howarth)',
  methods: ['thwaites'],
  summary:
    'Ue = U0 (1 − x/L) separates at x/L = 0.1199. Thwaites’ method in closed form separates at x/L = 1 − 2.2^(−1/6) = 0.1231, about 3 % late, as the method is known to be.',
  cases: () => {
    const separation = once(() => {
      const s = stations(801, 0, 1.2, 1);
      return analyzeOne({ flow: { reynolds: 1e5 }, criteria: [], surfaces: [{ name: 'w', s, ue: s.map((x) => 1 - x / 8) }] }).surface.laminarSeparation!.s / 8;
    });
    return [
      {
        id: 'howarth.closed-form',
        title: 'laminar separation where Thwaites’ method says (L = 8)',
        quantity: 'x_sep / L (–)',
        tolerance: relativeWithin(0.003),
        source: 'Thwaites’ method in closed form: λ = −0.075[(1 − x/L)^−6 − 1] = −0.09',
        measure: () => ({ value: separation(), reference: 1 - Math.pow(2.2, -1 / 6) }),
      },
      {
        id: 'howarth.exact',
        title: 'laminar separation against the exact solution (L = 8)',
        quantity: 'x_sep / L (–)',
        tolerance: relativeWithin(0.04),
        source: 'L. Howarth, Proc. R. Soc. A 164 (1938); accurate series and numerical solutions give 0.1199 (value from memory)',
        measure: () => ({ value: separation(), reference: 0.1199 }),
      },
    ];
  },
};

export const cylinder: ValidationSuite = {
  id: 'cylinder',
  title: 'Circular cylinder (Hiemenz flow)',
  methods: ['thwaites'],
  summary: 'The potential-flow Ue = 2 V sin φ round a cylinder: stagnation-point start and laminar separation angle.',
  cases: () => {
    // Thwaites' method in closed form: λ = 0.45 I cos φ / sin⁶ φ, I = ∫₀^φ sin⁵ = 8/15 − cos φ +
    // (2/3) cos³ φ − (1/5) cos⁵ φ; laminar separation where λ = −0.09.
    const closedForm = () => {
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
      return lo;
    };
    const run = once(() => {
      const count = 721;
      const s = Array.from({ length: count }, (_, i) => (0.8 * Math.PI * i) / (count - 1));
      return laminar(s, s.map((x) => 2 * Math.sin(x))).surface;
    });
    return [
      { id: 'cylinder.separation.closed-form', title: 'laminar separation where the closed form says', quantity: 'φ_sep (rad)', tolerance: relativeWithin(0.002), source: 'Thwaites’ method in closed form for Ue = 2 sin φ (λ = −0.09)', measure: () => ({ value: run().laminarSeparation!.s, reference: closedForm() }) },
      {
        id: 'cylinder.separation.exact',
        title: 'laminar separation against the exact solution',
        quantity: 'φ_sep (°)',
        tolerance: relativeWithin(0.02),
        source: 'R. M. Terrill, Phil. Trans. R. Soc. A 253 (1960): φ ≈ 104.5° (value from memory)',
        measure: () => ({ value: (run().laminarSeparation!.s * 180) / Math.PI, reference: 104.5 }),
      },
      {
        id: 'cylinder.stagnation',
        title: 'plane stagnation-point start θ² = 0.075 ν/(dUe/dx)',
        quantity: 'θ² Re dUe/dx (–)',
        tolerance: digits(4),
        source: 'Thwaites’ method at a plane stagnation point (closed form)',
        measure: () => ({ value: run().stations.theta[0]! ** 2 * RE * 2, reference: 0.075 }),
      },
    ];
  },
};

export const mangler: ValidationSuite = {
  id: 'mangler-cone',
  title: 'Axisymmetric flow (Mangler’s cone)',
  methods: ['thwaites', 'mangler'],
  summary: 'The laminar layer on a cone at constant Ue is the flat-plate layer with x/3, so θ and cf differ by √3 at the same x.',
  cases: () => {
    const s = stations(301, 0, 1, 1.5);
    const plate = once(() => laminar(s, s.map(() => 1)).surface.stations);
    const cone = once(() => laminar(s, s.map(() => 1), { r: s.map((x) => x * Math.sin((10 * Math.PI) / 180)) }).surface.stations);
    const source = 'W. Mangler, ZAMM 28 (1948): closed form of the transformation';
    const cases: ValidationCase[] = [];
    for (const x of [0.2, 0.8]) {
      const i = nearest(s, x);
      cases.push(
        { id: `mangler.theta.x${x}`, title: `10° cone, momentum thickness at x = ${x}`, quantity: '√3 θ_cone / θ_plate (–)', tolerance: relativeWithin(0.005), source, measure: () => ({ value: (cone().theta[i]! * Math.sqrt(3)) / plate().theta[i]!, reference: 1 }) },
        { id: `mangler.cf.x${x}`, title: `10° cone, skin friction at x = ${x}`, quantity: 'cf_cone / (√3 cf_plate) (–)', tolerance: relativeWithin(0.005), source, measure: () => ({ value: cone().cf[i]! / (plate().cf[i]! * Math.sqrt(3)), reference: 1 }) },
      );
    }
    const nose = once(() => {
      const n = stations(201, 0, 0.05, 1.3);
      const i = nearest(n, 0.02);
      return { body: laminar(n, n.map((x) => 2 * x), { r: n }).surface.stations.theta[i]!, plane: laminar(n, n.map((x) => 2 * x)).surface.stations.theta[i]! };
    });
    cases.push(
      {
        id: 'mangler.cylinder',
        title: 'a body of constant radius behaves like plane flow',
        quantity: 'θ_body / θ_plate at x = 0.6 (–)',
        tolerance: relativeWithin(1e-9),
        source,
        measure: () => {
          const body = laminar(s, s.map(() => 1), { r: s.map(() => 0.3) }).surface.stations;
          const i = nearest(s, 0.6);
          return { value: body.theta[i]! / plate().theta[i]!, reference: 1 };
        },
      },
      { id: 'mangler.nose', title: 'pointed-nose stagnation point (Ue = 2s, r = s)', quantity: 'θ² Re dUe/ds (–)', tolerance: digits(4), source: 'closed form of the Mangler–Thwaites integral for Ue = a s, r = s: θ² = 0.45 ν/(8a)', measure: () => ({ value: nose().body ** 2 * RE * 2, reference: 0.05625 }) },
      { id: 'mangler.nose.plane', title: 'the same Ue in plane flow', quantity: 'θ² Re dUe/ds (–)', tolerance: digits(4), source: 'Thwaites’ method at a plane stagnation point (closed form)', measure: () => ({ value: nose().plane ** 2 * RE * 2, reference: 0.075 }) },
    );
    return cases;
  },
};
