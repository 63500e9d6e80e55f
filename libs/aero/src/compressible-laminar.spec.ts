import { describe, expect, it } from 'vitest';
import { sutherlandViscosity } from './atmosphere';
import {
  compressibleThwaitesMarch,
  eckertFlatPlateSkinFriction,
  LAMINAR_RECOVERY_FACTOR,
  PRANDTL_AIR,
  recoveryTemperatureRatio,
} from './compressible-laminar';
import { Solver } from './odex-solver';
import { thwaitesMarch } from './thwaites';

const EDGE_TEMPERATURE_K = 216.65; // ISA tropopause, the cruise case
const MACHS = [0.3, 0.6, 0.85];

/**
 * The compressible Blasius layer on an adiabatic plate, solved here by shooting (odex, Newton on two
 * unknowns) as an independent reference: L. Howarth / A. Dorodnitsyn variables in the Levy–Lees form
 * (e.g. F. M. White, "Viscous Fluid Flow", 3rd ed. 2006, sec. 7-3; common practice):
 *   (C f'')' + f f'' = 0,   (C g'/Pr)' + f g' + (γ − 1) Me² C f''² = 0,
 *   f(0) = f'(0) = 0, g'(0) = 0 (adiabatic), f'(∞) = 1, g(∞) = 1,
 * g = T/Te, C = ρμ/(ρe μe) = μ(T)/(μ(Te) g) with Sutherland's law. Then cf √Re_x = √2 C_w f''(0) and
 * the recovery factor is r = (g(0) − 1)/((γ − 1)/2 Me²).
 */
function compressibleBlasius(mach: number) {
  const gm1m2 = 0.4 * mach * mach;
  const c = (g: number) => sutherlandViscosity(g * EDGE_TEMPERATURE_K) / sutherlandViscosity(EDGE_TEMPERATURE_K) / g;
  const solver = new Solver(5);
  solver.relativeTolerance = 1e-11;
  solver.absoluteTolerance = 1e-11;
  // y = [f, f', C f'', g, C g'/Pr]
  const rhs = (_eta: number, y: number[]) => {
    const cy = c(y[3]);
    const fpp = y[2] / cy;
    const gp = (PRANDTL_AIR * y[4]) / cy;
    return [y[1], fpp, -y[0] * fpp, gp, -y[0] * gp - gm1m2 * cy * fpp * fpp];
  };
  const miss = (a: number, b: number) => {
    const end = solver.solve(rhs, 0, [0, 0, c(b) * a, b, 0], 12).y;
    return [end[1] - 1, end[3] - 1];
  };
  let a = 0.47;
  let b = 1 + 0.42 * gm1m2;
  for (let it = 0; it < 30; it++) {
    const m = miss(a, b);
    const d = 1e-7;
    const ma = miss(a + d, b);
    const mb = miss(a, b + d);
    const j = [(ma[0] - m[0]) / d, (mb[0] - m[0]) / d, (ma[1] - m[1]) / d, (mb[1] - m[1]) / d];
    const det = j[0] * j[3] - j[1] * j[2];
    const da = (m[0] * j[3] - m[1] * j[1]) / det;
    const db = (m[1] * j[0] - m[0] * j[2]) / det;
    a -= da;
    b -= db;
    if (Math.abs(da) + Math.abs(db) < 1e-12) break;
  }
  return { skinFriction: Math.SQRT2 * c(b) * a, recoveryFactor: mach > 0 ? (b - 1) / (0.5 * gm1m2) : NaN };
}

function flatPlate(mach: number, reynolds = 1e7) {
  const n = 401;
  const s = Float64Array.from({ length: n }, (_, i) => i / (n - 1));
  const ue = new Float64Array(n).fill(1);
  const out = { theta: new Float64Array(n), lambda: new Float64Array(n), shapeFactor: new Float64Array(n), skinFriction: new Float64Array(n), wallShear: new Float64Array(n) };
  const stations = { reynoldsRatio: new Float64Array(n), densityRatio: new Float64Array(n), shapeFactor: new Float64Array(n) };
  compressibleThwaitesMarch(s, ue, new Float64Array(n), reynolds, null, { mach, sweep: 0, temperature_K: EDGE_TEMPERATURE_K }, out, stations);
  return { s, reynolds, out, stations };
}

describe('compressible laminar layer (Thwaites through the Stewartson–Illingworth transformation)', () => {
  it("Eckert's reference-temperature skin friction agrees with the exact compressible Blasius layer", () => {
    // Validates the reference against which the method is checked next: E. R. G. Eckert, J. Aeronaut.
    // Sci. 22 (1955) 585, adiabatic wall, Sutherland's law, Pr = 0.72, Te = 216.65 K.
    const incompressible = compressibleBlasius(0);
    expect(incompressible.skinFriction).toBeCloseTo(0.664, 3); // Blasius (1908), 0.6641
    for (const mach of MACHS) {
      const exact = compressibleBlasius(mach);
      expect(eckertFlatPlateSkinFriction(1, mach, EDGE_TEMPERATURE_K) / exact.skinFriction).toBeCloseTo(1, 2);
    }
  });

  it('gives the adiabatic recovery temperature of the exact layer (r = √Pr)', () => {
    // Laminar recovery factor r ≈ √Pr (E. Pohlhausen, ZAMM 1 (1921) 115; common practice), here against
    // the exact similarity solution: within 1 %.
    for (const mach of MACHS) {
      const exact = compressibleBlasius(mach);
      expect(exact.recoveryFactor / LAMINAR_RECOVERY_FACTOR).toBeCloseTo(1, 2);
      expect(recoveryTemperatureRatio(mach)).toBeCloseTo(1 + exact.recoveryFactor * 0.2 * mach * mach, 3);
    }
  });

  it("flat-plate skin friction at M = 0.3, 0.6, 0.85 follows Eckert's reference temperature", () => {
    const figures: string[] = [];
    for (const mach of MACHS) {
      const { s, reynolds, out } = flatPlate(mach);
      for (const i of [100, 400]) {
        const reX = reynolds * s[i];
        const eckert = eckertFlatPlateSkinFriction(reX, mach, EDGE_TEMPERATURE_K);
        // Thwaites' method gives 0.656/√Re_x incompressible, 1.2 % under Blasius' 0.664 (Thwaites 1949);
        // the compressible march keeps that ratio to Eckert's value within 0.1 %.
        expect(out.skinFriction[i] / eckert / (0.656 / 0.664)).toBeCloseTo(1, 3);
        if (i === 400) figures.push(`M ${mach}: cf√Re_x ${(out.skinFriction[i] * Math.sqrt(reX)).toFixed(4)}, Eckert ${(eckert * Math.sqrt(reX)).toFixed(4)}`);
      }
    }
    expect(figures).toHaveLength(3);
  });

  it('reduces to the incompressible march as M → 0', () => {
    const compressible = flatPlate(1e-6);
    const n = compressible.s.length;
    const ue = Float64Array.from(compressible.s, (x) => 1 + 0.2 * x);
    const incompressible = { theta: new Float64Array(n), lambda: new Float64Array(n), shapeFactor: new Float64Array(n), skinFriction: new Float64Array(n), wallShear: new Float64Array(n) };
    thwaitesMarch(compressible.s, ue, new Float64Array(n).fill(0.2), 1e7, null, incompressible);
    const other = { theta: new Float64Array(n), lambda: new Float64Array(n), shapeFactor: new Float64Array(n), skinFriction: new Float64Array(n), wallShear: new Float64Array(n) };
    const stations = { reynoldsRatio: new Float64Array(n), densityRatio: new Float64Array(n), shapeFactor: new Float64Array(n) };
    compressibleThwaitesMarch(compressible.s, ue, new Float64Array(n).fill(0.2), 1e7, null, { mach: 1e-6, sweep: 0, temperature_K: 288.15 }, other, stations);
    for (const i of [1, 50, 400]) {
      expect(other.theta[i] / incompressible.theta[i]).toBeCloseTo(1, 9);
      expect(other.lambda[i] / incompressible.lambda[i]).toBeCloseTo(1, 8);
      expect(other.skinFriction[i] / incompressible.skinFriction[i]).toBeCloseTo(1, 8);
      expect(stations.shapeFactor[i]).toBeCloseTo(other.shapeFactor[i], 9);
    }
  });

  it('heats the layer: the physical shape factor rises with Mach as H = H_k + (T0/Te − 1)(H_k + 1)', () => {
    // Adiabatic, Pr = 1 form of the Stewartson transformation (Stewartson 1949): on a flat plate at
    // M = 0.85, H = 2.61 + 0.1445 × 3.61 = 3.13.
    const { stations, out } = flatPlate(0.85);
    expect(out.shapeFactor[200]).toBeCloseTo(2.61, 6);
    expect(stations.shapeFactor[200]).toBeCloseTo(2.61 + 0.2 * 0.85 * 0.85 * 3.61, 6);
  });
});
