import { locatedCriterion, type EngineCaseInput, type EngineSurfaceResult } from '@laminote/contracts';
import { describe, expect, it } from 'vitest';
import { analyzeCase } from './analyze';
import { edgeVelocityRatio } from './compressible';
import { OWEN_RANDALL_CRITICAL } from './crossflow';
import { DEMO_SWEEP_DEG, inventedDemoSections } from './demo-sections';
import { attachmentLinePressureCoefficient, chordwiseVelocityRatio } from './swept-wing';

const deg = Math.PI / 180;

/** The benchmark's NLF-like pair of surfaces (libs/aero/bench/engine.bench.ts), 300 stations each. */
function benchCase(sweepDeg: number): EngineCaseInput {
  const n = 300;
  const s = Array.from({ length: n }, (_, i) => 1.02 * (i / (n - 1)) ** 1.6);
  const shape = (x: number, peak: number) => peak * Math.tanh(60 * x) * (1 + 0.25 * x - 0.55 * Math.max(0, x - 0.45) ** 1.3 - 0.1 * x * x);
  return {
    flow: { reynolds: 1.2e7, mach: 0 },
    criteria: ['eN', 'michel', 'hRx', 'granville'],
    sweepDeg,
    surfaces: [
      { name: 'upper', s, ue: s.map((x) => shape(x, 1.18)) },
      { name: 'lower', s, ue: s.map((x) => shape(x, 1.06)) },
    ],
  };
}

/** A station quantity at arc length `at`, linear between stations. */
function valueAt(surface: EngineSurfaceResult, values: (number | null)[], at: number): number {
  const s = surface.stations.s;
  const k = s.findIndex((v) => v >= at);
  return values[k - 1]! + ((at - s[k - 1]!) / (s[k]! - s[k - 1]!)) * (values[k]! - values[k - 1]!);
}

const demo = inventedDemoSections().find((section) => section.id === 'larkspur-t62-cruise')!;
const demoCase = (sweepDeg: number, reynolds?: number): EngineCaseInput => ({
  flow: reynolds === undefined ? { ...demo.flow, nCrit: 9 } : { reynolds, mach: demo.flow.mach, nCrit: 9 },
  pressureTable: demo.pressureTable,
  sweepDeg,
});

describe('simple sweep theory', () => {
  it('takes the chordwise edge velocity as the normal flow’s, scaled by cos Λ', () => {
    // Independent route: the normal flow at M∞ cos Λ with Cp_n = Cp / cos²Λ, Ue = cos Λ · Ue_n / V_n
    // (D. Küchemann, "The Aerodynamic Design of Aircraft", 1978, ch. 4; common practice).
    for (const mach of [0, 0.5, 0.8]) {
      for (const sweepDeg of [10, 25, 35]) {
        const c = Math.cos(sweepDeg * deg);
        for (const cp of [0.5, 0, -0.4]) {
          expect(chordwiseVelocityRatio(cp, mach, sweepDeg * deg)).toBeCloseTo(c * edgeVelocityRatio(cp / (c * c), mach * c), 12);
        }
        // The attachment line is the normal flow's stagnation point.
        expect(chordwiseVelocityRatio(attachmentLinePressureCoefficient(mach, sweepDeg * deg), mach, sweepDeg * deg)).toBeCloseTo(0, 6);
      }
    }
  });
});

describe('the infinite swept wing in the analysis', () => {
  it('reproduces the two-dimensional results of engine 1.2.4 exactly, and of engine 1.1.0 to 1e-8, at Λ = 0 and continuously as Λ → 0', () => {
    // Figures printed by engine 1.2.4 for this case: the regression reference. Engine 1.2.4 writes the
    // powers of Head's correlations and of the Michel and e^N criteria as exp(a ln x) (issue 15, speed),
    // which differ from Math.pow in the last bits: against engine 1.1.0 (commit 653f0ce), whose figures
    // this test pinned exactly until then, cd moved by −6.7e-10 relative (the surfaces' cd by −3.0e-10
    // and −1.2e-9, cdFriction by +1.2e-10 and −2.1e-11), Michel's and Granville's s by one unit in the
    // last place; the transition and e^N's Re_θ did not move.
    const pinned = {
      cd: 0.006803294547001269,
      upper: { s: 0.29595022077353084, cd: 0.0039988453756721895, cdFriction: 0.003064973061205083, eN: 1271.3061631546807, michel: 0.5390925134247838, hRx: 0.45061850190282493, granville: 0.49248002790671197 },
      lower: { s: 0.32099410044766985, cd: 0.002804449171329079, cdFriction: 0.0024569286184302932, eN: 1256.2358071087192, michel: 0.5456875298263164, hRx: 0.4518507636246038, granville: 0.5042932909869154 },
    };
    const engine110 = {
      cd: 0.006803294551528482,
      upper: { s: 0.29595022077353084, cd: 0.0039988453768645335, cdFriction: 0.003064973060827464, eN: 1271.3061631546807, michel: 0.5390925134247839, hRx: 0.45061850190282493, granville: 0.4924800279067119 },
      lower: { s: 0.32099410044766985, cd: 0.0028044491746639483, cdFriction: 0.0024569286184830154, eN: 1256.2358071087192, michel: 0.5456875298263165, hRx: 0.4518507636246038, granville: 0.5042932909869154 },
    };
    const flat = analyzeCase(benchCase(0));
    expect(flat.cd).toBe(pinned.cd);
    expect(Math.abs(flat.cd! / engine110.cd - 1)).toBeLessThan(1e-8);
    for (const surface of flat.surfaces) {
      const b = pinned[surface.name as 'upper' | 'lower'];
      const c = surface.transition.criteria;
      const figures = [surface.transition.s!, surface.cd!, surface.cdFriction!, locatedCriterion(c.eN)!.reTheta, c.michel!.s!, c.hRx!.s!, c.granville!.s!];
      expect([surface.transition.by, ...figures]).toEqual(['eN', b.s, b.cd, b.cdFriction, b.eN, b.michel, b.hRx, b.granville]);
      const old = engine110[surface.name as 'upper' | 'lower'];
      [old.s, old.cd, old.cdFriction, old.eN, old.michel, old.hRx, old.granville].forEach((value, k) => expect(Math.abs(figures[k]! / value - 1)).toBeLessThan(1e-8));
    }
    const tiny = analyzeCase(benchCase(1e-6));
    expect(tiny.cd! / flat.cd!).toBeCloseTo(1, 9);
    tiny.surfaces.forEach((surface, k) => {
      expect(surface.transition.s! / flat.surfaces[k]!.transition.s!).toBeCloseTo(1, 9);
      surface.stations.theta.forEach((theta, i) => expect(theta).toBeCloseTo(flat.surfaces[k]!.stations.theta[i]!, 12));
    });
    expect(flat.flow).toMatchObject({ sweepDeg: 0, compressibleLaminar: false });
  });

  it('moves crossflow transition forward as sweep and Reynolds number grow, with TS (e^N) governing at low sweep', () => {
    // The invented cruise section accelerates the flow round the nose and on to 45 % chord: the crossflow
    // Reynolds number grows with sin Λ and with Re (Owen & Randall 1952; Arnal et al. 1984).
    const upper = (sweepDeg: number, reynolds?: number) => analyzeCase(demoCase(sweepDeg, reynolds)).surfaces[0]!;
    const low = upper(4);
    expect(low.transition.by).toBe('eN');
    expect(locatedCriterion(low.transition.criteria.crossflow)).toBeNull();
    const at = (sweepDeg: number, reynolds?: number) => locatedCriterion(upper(sweepDeg, reynolds).transition.criteria.crossflow)!.s;
    expect(at(25)).toBeLessThan(at(DEMO_SWEEP_DEG));
    expect(at(DEMO_SWEEP_DEG, 2e7)).toBeLessThan(at(DEMO_SWEEP_DEG, 1e7));
    const swept = upper(DEMO_SWEEP_DEG);
    expect(swept.transition.by).toBe('crossflow');
    expect(swept.transition.s).toBeLessThan(locatedCriterion(swept.transition.criteria.eN)!.s);
  });

  it('shows the whole spread of criteria on the demo section, each located or with its reason', () => {
    const result = analyzeCase(demoCase(DEMO_SWEEP_DEG));
    expect(result.flow).toMatchObject({ sweepDeg: DEMO_SWEEP_DEG, compressibleLaminar: true });
    expect(result.warnings.join('\n')).not.toMatch(/methods are incompressible/);
    for (const surface of result.surfaces) {
      const entries = Object.entries(surface.transition.criteria);
      expect(entries.map(([c]) => c).sort()).toEqual(['crossflow', 'crossflowC1', 'eN', 'granville', 'hRx', 'michel']);
      const located: number[] = [];
      for (const [, entry] of entries) {
        expect(entry).not.toBeNull();
        if (entry!.s === null) expect(['notReached', 'afterLaminarSeparation']).toContain((entry as { reason: string }).reason);
        else located.push(entry!.s);
      }
      // e^N and both crossflow criteria are located; the earlier of e^N and R_cf governs.
      const c = surface.transition.criteria;
      const eN = locatedCriterion(c.eN)!;
      const crossflow = locatedCriterion(c.crossflow)!;
      expect(locatedCriterion(c.crossflowC1)).not.toBeNull();
      expect(surface.transition.s).toBe(Math.min(eN.s, crossflow.s));
      // The spread: several distinct locations, all ahead of the would-be laminar separation.
      expect(Math.max(...located) - Math.min(...located)).toBeGreaterThan(0.1);
      for (const s of located) expect(s).toBeLessThanOrEqual(surface.transition.laminarSeparationS!);
      // A criterion the laminar layer does not reach before it separates says so.
      for (const [, entry] of entries) if (entry!.s === null) expect((entry as { reason: string }).reason).toBe('afterLaminarSeparation');
      // The curves meet their critical values at their marks.
      expect(valueAt(surface, surface.stations.n, eN.s)).toBeCloseTo(result.flow.nCrit, 9);
      expect(valueAt(surface, surface.stations.reCf!, crossflow.s)).toBeCloseTo(OWEN_RANDALL_CRITICAL, 6);
      expect(crossflow.reCf).toBeCloseTo(OWEN_RANDALL_CRITICAL, 6);
    }
  });

  it('names a crossflow criterion on an unswept section as not applying, and runs the N curve to N_crit when e^N governs', () => {
    const result = analyzeCase({ ...benchCase(0), criteria: ['eN', 'crossflow', 'michel'] });
    for (const surface of result.surfaces) {
      expect(surface.transition.criteria.crossflow).toEqual({ s: null, reason: 'noSweep' });
      expect(surface.stations.reCf!.every((v) => v === null)).toBe(true);
      expect(valueAt(surface, surface.stations.n, surface.transition.s!)).toBeCloseTo(result.flow.nCrit, 9);
      // Michel's criterion lies aft of the governing e^N transition and is still located.
      expect(locatedCriterion(surface.transition.criteria.michel)!.s).toBeGreaterThan(surface.transition.s!);
    }
  });
});

describe('rear stagnation points', () => {
  it('accepts a 12 % ellipse from exact potential flow, symmetric about its chord', () => {
    // Ellipse of thickness ratio t at zero incidence, x = (1 + cos φ)/2, y = (t/2) sin φ: the exact surface
    // speed is q/V∞ = (1 + t) |sin φ| / √(sin²φ + t² cos²φ) (L. M. Milne-Thomson, "Theoretical
    // Hydrodynamics", 1968, flow past an elliptic cylinder); Cp = 1 − q², 1 at both ends.
    const t = 0.12;
    const n = 161;
    const rows = ['x y cp'];
    for (let k = 0; k < n; k++) {
      const phi = (2 * Math.PI * k) / (n - 1);
      const sin = Math.sin(phi);
      const q = ((1 + t) * Math.abs(sin)) / Math.sqrt(sin * sin + t * t * Math.cos(phi) ** 2);
      rows.push(`${(0.5 * (1 + Math.cos(phi))).toFixed(12)} ${(0.5 * t * sin).toFixed(12)} ${(1 - q * q).toFixed(12)}`);
    }
    const result = analyzeCase({ flow: { reynolds: 2e6 }, pressureTable: rows.join('\n') });
    const [upper, lower] = result.surfaces;
    expect(result.warnings.filter((w) => /rear stagnation point/.test(w))).toHaveLength(2);
    expect(upper!.stations.s.length).toBe(lower!.stations.s.length);
    expect(upper!.transition.s!).toBeCloseTo(lower!.transition.s!, 6);
    expect(upper!.transition.by).toBe(lower!.transition.by);
    // The table is mirror-symmetric to the bit (each row's x and cp equal, y negated, in the 12-decimal
    // text), and the engine builds both surfaces alike from the stagnation point: the same numbers.
    expect(upper!.stations).toEqual(lower!.stations);
    expect(upper!.cd!).toBe(lower!.cd!);
    // The layer does not reach the rear stagnation point attached: it separates (laminar or turbulent) first.
    expect(upper!.turbulentSeparation ?? upper!.laminarSeparation).not.toBeNull();
  });

  it('still refuses a stagnation point ahead of the rear half, naming the station', () => {
    expect(() =>
      analyzeCase({ flow: { reynolds: 1e6 }, surfaces: [{ name: 'w', s: [0, 0.1, 0.2, 0.3, 0.6, 1], ue: [0, 0.8, 0.9, 0, 0.9, 0.9] }] }),
    ).toThrow(/surfaces\[0\]\.ue\[3\].*ahead of the rear half/);
  });
});
