import { describe, expect, it } from 'vitest';
import { crossflowState } from './crossflow';
import { computeFalknerSkanCookeTable, crossflowShapeAtLambda, emptyCrossflowShape, falknerSkanCooke } from './falkner-skan-cooke';
import { FSC_TABLE } from './falkner-skan-cooke-table';

/**
 * An independent solution of the Falkner–Skan–Cooke equations for the checks below: classical
 * fourth-order Runge–Kutta at a fixed step with bisection on f''(0) (not odex, not Newton), the spanwise
 * equation integrated alongside and scaled by g(η = 8). Returns the profiles on the step grid.
 */
function referenceProfiles(beta: number, etaMax = 8, h = 0.002) {
  const steps = Math.round(etaMax / h);
  const rhs = (y: number[]) => [y[1], y[2], -y[0] * y[2] - beta * (1 - y[1] * y[1]), y[4], -y[0] * y[4]];
  const integrate = (w: number, keep: boolean) => {
    let y = [0, 0, w, 0, 1];
    const fp = keep ? [0] : [];
    const g = keep ? [0] : [];
    for (let k = 0; k < steps; k++) {
      const k1 = rhs(y);
      const k2 = rhs(y.map((v, i) => v + 0.5 * h * k1[i]));
      const k3 = rhs(y.map((v, i) => v + 0.5 * h * k2[i]));
      const k4 = rhs(y.map((v, i) => v + h * k3[i]));
      y = y.map((v, i) => v + (h / 6) * (k1[i] + 2 * k2[i] + 2 * k3[i] + k4[i]));
      // While shooting: f' above 1 overshoots; f' peaking below 1 (f'' < 0) undershoots.
      if (!keep && y[1] > 1 + 1e-9) return { miss: 1, fp, g, y };
      if (!keep && y[2] < 0 && y[1] < 1) return { miss: -1, fp, g, y };
      if (keep) {
        fp.push(y[1]);
        g.push(y[3]);
      }
    }
    return { miss: y[1] - 1, fp, g, y };
  };
  let lo = 0;
  let hi = 2;
  for (let it = 0; it < 60; it++) {
    const mid = 0.5 * (lo + hi);
    if (integrate(mid, false).miss < 0) lo = mid;
    else hi = mid;
  }
  const wallShear = 0.5 * (lo + hi);
  const run = integrate(wallShear, true);
  const gEdge = run.g[run.g.length - 1];
  return { wallShear, fp: run.fp, g: run.g.map((v) => v / gEdge), spanwiseWallShear: 1 / gEdge, h };
}

describe('Falkner–Skan–Cooke profiles (shooting with odex)', () => {
  it("reproduce Hartree's wall shear f''(0)", () => {
    // D. R. Hartree, Proc. Camb. Phil. Soc. 33 (1937) 223, as tabulated in F. M. White, "Viscous Fluid
    // Flow" (3rd ed., 2006), Falkner–Skan table; values quoted from memory to four figures.
    const hartree: [number, number][] = [
      [-0.18, 0.1286],
      [-0.1, 0.3193],
      [0, 0.4696],
      [0.3, 0.7748],
      [0.5, 0.9277],
      [1, 1.2326],
    ];
    for (const [beta, shear] of hartree) expect(falknerSkanCooke(beta).wallShear).toBeCloseTo(shear, 4);
  });

  it('carry the spanwise profile of the swept attachment line and no crossflow at β = 0', () => {
    // β = 1 is the swept Hiemenz flow: spanwise wall shear g'(0) = 0.5705 (L. Rosenhead (ed.), "Laminar
    // Boundary Layers", 1963, swept stagnation-line flow; from memory).
    expect(falknerSkanCooke(1).spanwiseWallShear).toBeCloseTo(0.5705, 4);
    // β = 0: g'' + f g' = 0 is the Blasius equation for f', so g = f' exactly (closed form): no crossflow.
    const blasius = falknerSkanCooke(0);
    expect(blasius.spanwiseWallShear).toBeCloseTo(blasius.wallShear, 8);
    expect(Math.abs(blasius.crossflowMax)).toBeLessThan(1e-7);
  });

  it('give the crossflow maximum, its height and the Owen–Randall thickness of an independent RK4 solution', () => {
    for (const beta of [-0.1, 0.1, 0.5, 1]) {
      const mine = falknerSkanCooke(beta);
      const ref = referenceProfiles(beta);
      const c = ref.fp.map((v, i) => v - ref.g[i]);
      let k = 0;
      for (let i = 1; i < c.length; i++) if (Math.abs(c[i]) > Math.abs(c[k])) k = i;
      let edge = NaN;
      for (let i = k + 1; i < c.length; i++) {
        if (Math.abs(c[i]) <= 0.1 * Math.abs(c[k])) {
          edge = (i - 1 + (Math.abs(c[i - 1]) - 0.1 * Math.abs(c[k])) / (Math.abs(c[i - 1]) - Math.abs(c[i]))) * ref.h;
          break;
        }
      }
      expect(mine.wallShear).toBeCloseTo(ref.wallShear, 6);
      expect(mine.spanwiseWallShear).toBeCloseTo(ref.spanwiseWallShear, 6);
      expect(mine.crossflowMax).toBeCloseTo(c[k], 5);
      expect(mine.crossflowMaxEta).toBeCloseTo(k * ref.h, 2);
      expect(mine.crossflowEdgeEta).toBeCloseTo(edge, 2);
      // Favourable gradient: the chordwise profile is fuller than the spanwise one (f' > g).
      expect(Math.sign(mine.crossflowMax)).toBe(Math.sign(beta));
    }
  });

  it('project to the crossflow maximum in external-streamline axes for several sweeps', () => {
    // Directly from the RK4 profiles: w_n/Qe = (−u We + w Ue)/Qe² with u = Ue f', w = We g.
    for (const beta of [0.2, 0.6, 1]) {
      const ref = referenceProfiles(beta);
      const row = FSC_TABLE.find((r) => Math.abs(r.beta - beta) < 1e-9)!;
      const shape = crossflowShapeAtLambda(row.lambda, emptyCrossflowShape());
      expect(shape.beta).toBeCloseTo(beta, 9);
      for (const sweepDeg of [15, 30, 45]) {
        const ue = 0.8;
        const we = Math.sin((sweepDeg * Math.PI) / 180);
        const q2 = ue * ue + we * we;
        let max = 0;
        for (let i = 0; i < ref.fp.length; i++) max = Math.max(max, Math.abs((-ue * ref.fp[i] * we + we * ref.g[i] * ue) / q2));
        // R_cf = Re · max|w_n| · δ10 with Re = 1, θ = momentum thickness in η units: δ10 = η10.
        const state = crossflowState(ue, we, row.momentum, 1, shape, { reCf: 0, reDelta2: 0, streamwiseShapeFactor: 0 });
        expect(state.reCf / (Math.sqrt(q2) * row.crossflowEdgeEta)).toBeCloseTo(max, 5);
      }
    }
  });

  it('the committed table is what the shooting gives (regenerate with libs/aero/scripts/make-fsc-table.ts)', () => {
    const fresh = computeFalknerSkanCookeTable();
    expect(fresh.length).toBe(FSC_TABLE.length);
    fresh.forEach((row, i) => {
      for (const key of Object.keys(row) as (keyof typeof row)[]) expect(FSC_TABLE[i][key]).toBeCloseTo(row[key], 7);
    });
  });
});
