import { CELL_SCHEMAS, type CellInputs, type CellKind } from '@laminote/contracts';
import { describe, expect, it } from 'vitest';
import { analyzeCase } from '../analyze';
import { spheroidMeridian } from './body';
import { computeCell, computeCellOutput } from './compute';
import type { CellSource } from './types';

function inputs<K extends CellKind>(kind: K, given: Record<string, unknown>): CellInputs[K] {
  return CELL_SCHEMAS[kind].inputs.parse(given) as CellInputs[K];
}
function source<K extends CellKind>(kind: K, given: Record<string, unknown>, upstream: CellSource['upstream'] = {}): CellSource<K> {
  return { kind, inputs: inputs(kind, given), upstream };
}
const ID = '00000000-0000-4000-8000-000000000001';
const ID2 = '00000000-0000-4000-8000-000000000002';
const ID3 = '00000000-0000-4000-8000-000000000003';

/**
 * Lamb's added-mass coefficient k1 of a prolate spheroid moving along its axis, eccentricity e:
 * α0 = 2(1 − e²)/e³ · (½ ln((1 + e)/(1 − e)) − e), k1 = α0/(2 − α0) (H. Lamb, "Hydrodynamics", 6th ed.,
 * 1932, §373 and §105). In a stream along the axis the surface speed is (1 + k1) V∞ cos β, β the
 * meridian's slope angle, so Cp = 1 − (1 + k1)² cos²β.
 */
function spheroidCp(fineness: number, x: number): number {
  const e = Math.sqrt(1 - 1 / (fineness * fineness));
  const alpha0 = ((2 * (1 - e * e)) / e ** 3) * (0.5 * Math.log((1 + e) / (1 - e)) - e);
  const k1 = alpha0 / (2 - alpha0);
  // Unit length: x²/a² + r²/b² = 1 about the middle, a = ½, b = 1/(2 fineness); slope dr/dx = −(b²/a²) ξ / r.
  const a = 0.5;
  const b = 1 / (2 * fineness);
  const xi = x - 0.5;
  const r = b * Math.sqrt(Math.max(0, 1 - (xi * xi) / (a * a)));
  const slope = (-(b * b) / (a * a)) * (xi / r);
  return 1 - (1 + k1) ** 2 / (1 + slope * slope);
}

describe('computeCell: body of revolution', () => {
  it('a prolate spheroid of fineness 6: its geometry, and Cp within 0.003 of the exact potential flow over the middle 80 %', () => {
    const r = computeCell('body', inputs('body', { source: 'spheroid', fineness: 6, panels: 160 }), {});
    expect(CELL_SCHEMAS.body.result.safeParse(r).success).toBe(true);
    expect(r.geometry.fineness).toBeCloseTo(6, 6);
    expect(r.geometry.maxRadiusAt).toBeCloseTo(0.5, 6);
    expect(r.title).toBe('Prolate spheroid, fineness ratio 6');
    let worst = 0;
    r.inviscid.x.forEach((x, i) => {
      if (x > 0.1 && x < 0.9) worst = Math.max(worst, Math.abs(r.inviscid.cp[i]! - spheroidCp(6, x)));
    });
    expect(worst).toBeLessThan(0.003);
  });

  it('a sphere (fineness 1): stagnation at the nose, Cp = 1 − 9/4 sin²θ at the shoulder (Lamb, 1932, §92)', () => {
    const r = computeCell('body', inputs('body', { source: 'spheroid', fineness: 1, panels: 120 }), {});
    const shoulder = r.inviscid.x.reduce((best, x, i) => (Math.abs(x - 0.5) < Math.abs(r.inviscid.x[best]! - 0.5) ? i : best), 0);
    expect(r.inviscid.cp[shoulder]).toBeCloseTo(-1.25, 1);
    expect(Math.max(...r.inviscid.cp)).toBeGreaterThan(0.95);
  });

  it('reads a pasted meridian (nose and tail on the axis) and names the line at fault', () => {
    const pasted = computeCell('body', inputs('body', { source: 'coordinates', coordinates: spheroidMeridian(4) }), {});
    const generated = computeCell('body', inputs('body', { source: 'spheroid', fineness: 4 }), {});
    expect(pasted.inviscid.cp).toEqual(generated.inviscid.cp);
    const bad = computeCellOutput({ kind: 'body', inputs: inputs('body', { source: 'coordinates', coordinates: '0 0\n0.1 0.05\n0.3 0.08\n0.5 -0.09\n0.8 0.05\n1 0' }), upstream: {} });
    expect(bad).toMatchObject({ status: 'error', error: { field: 'coordinates', line: 4 } });
    const open = computeCellOutput({ kind: 'body', inputs: inputs('body', { source: 'coordinates', coordinates: '0 0\n0.1 0.05\n0.3 0.08\n0.5 0.09\n0.8 0.05\n1 0.02' }), upstream: {} });
    expect(open).toMatchObject({ status: 'error', error: { field: 'coordinates' } });
    expect(open.error!.message).toMatch(/start and end on the axis/);
  });
});

describe('computeCell: analysis of a body cell', () => {
  const flow = source('flow', { mode: 'reynolds', reynolds: 2e7, mach: 0, nCrit: 9 });
  const body = source('body', { source: 'spheroid', fineness: 6 });

  it('is the engine case with the same body: one surface with its radius (Mangler), the panel solution carried along', () => {
    const r = computeCell('analysis', inputs('analysis', { flowCellId: ID, pressureCellId: ID2 }), { flowCellId: flow, pressureCellId: body });
    const direct = analyzeCase({ flow: { reynolds: 2e7, mach: 0, nCrit: 9 }, body: { coordinates: spheroidMeridian(6), panels: 120 } });
    expect(r.surfaces.map((s) => s.name)).toEqual(['body']);
    expect(r.inviscid?.kind).toBe('body');
    expect(r.surfaces[0]!.transition.s).toBe(direct.surfaces[0]!.transition.s);
    // Drag: the plane Squire–Young form gives no body drag coefficient, so none is reported, and it says so.
    expect(r.cd).toBeNull();
    expect(r.surfaces[0]!.cd).toBeNull();
    expect(r.warnings.some((w) => /no drag coefficient is given for a body of revolution/.test(w))).toBe(true);
    // The forebody's favourable gradient holds the layer laminar longer than on a flat plate at the same
    // Reynolds number (common practice), and transition falls ahead of the maximum diameter, where the
    // gradient turns adverse (x/L 0.5 on a spheroid).
    const plate = analyzeCase({ flow: { reynolds: 2e7, mach: 0, nCrit: 9 }, surfaces: [{ name: 'plate', s: Array.from({ length: 300 }, (_, i) => i / 299), ue: Array.from({ length: 300 }, () => 1) }] });
    const reS = (result: typeof r) => {
      const found = result.surfaces[0]!.transition.criteria.eN;
      return found && found.s !== null ? found.reS : NaN;
    };
    expect(reS(r)).toBeGreaterThan(reS(plate) * 1.2);
    const x = r.surfaces[0]!.stations.x!;
    const at = r.surfaces[0]!.stations.s.findIndex((v) => v >= r.surfaces[0]!.transition.s!);
    expect(x[at]).toBeLessThan(0.5);
  });

  it('refuses forced transition on a body with the field named, and says a swept flow is not used', () => {
    const tripped = computeCellOutput({ kind: 'analysis', inputs: inputs('analysis', { flowCellId: ID, pressureCellId: ID2, trips: { body: 0.1 } }), upstream: { flowCellId: flow, pressureCellId: body } });
    expect(tripped).toMatchObject({ status: 'error', error: { field: 'trips' } });
    const swept = source('flow', { mode: 'reynolds', reynolds: 2e7, mach: 0, nCrit: 9, sweepDeg: 25 });
    const r = computeCell('analysis', inputs('analysis', { flowCellId: ID, pressureCellId: ID2 }), { flowCellId: swept, pressureCellId: body });
    expect(r.warnings.some((w) => /sweep 25°/.test(w))).toBe(true);
  });

  it('is swept over Reynolds number by a sweep cell, each step the analysis of the body at that value', () => {
    const analysis = source('analysis', { flowCellId: ID, pressureCellId: ID2 }, { flowCellId: flow, pressureCellId: body });
    const sweep = computeCell('sweep', inputs('sweep', { analysisCellId: ID3, parameter: 'reynolds', from: 1e7, to: 3e7, steps: 3 }), { analysisCellId: analysis });
    expect(sweep.steps.map((st) => st.status)).toEqual(['ok', 'ok', 'ok']);
    const middle = computeCell('analysis', analysis.inputs, { flowCellId: source('flow', { mode: 'reynolds', reynolds: 2e7, mach: 0, nCrit: 9 }), pressureCellId: body });
    expect(sweep.steps[1]!.surfaces[0]!.transitionS).toBe(middle.surfaces[0]!.transition.s);
    // A higher Reynolds number moves transition forward on the same body (common practice).
    const at = sweep.steps.map((st) => st.surfaces[0]!.transitionX!);
    expect(at[2]).toBeLessThan(at[0]!);
  });
});
