import { CELL_SCHEMAS, type CellInputs, type CellKind, type ComputedKind } from '@laminote/contracts';
import { describe, expect, it } from 'vitest';
import { computeCell, computeCellOutput, type CellTask } from './compute';
import type { CellSource } from './types';

/** Inputs as a cell holds them after validation: the schema's defaults under the given values. */
function inputs<K extends CellKind>(kind: K, given: Record<string, unknown>): CellInputs[K] {
  return CELL_SCHEMAS[kind].inputs.parse(given) as CellInputs[K];
}
function source<K extends CellKind>(kind: K, given: Record<string, unknown>, upstream: CellSource['upstream'] = {}): CellSource<K> {
  return { kind, inputs: inputs(kind, given), upstream };
}
/** The result must have its kind's result shape (the registry's result schema). */
function checked<K extends ComputedKind>(kind: K, result: unknown) {
  const schema = CELL_SCHEMAS[kind].result;
  expect(schema.safeParse(result).error?.issues ?? []).toEqual([]);
  return result;
}

const ID = '00000000-0000-4000-8000-000000000001';
const ID2 = '00000000-0000-4000-8000-000000000002';

/** A flat plate at zero pressure gradient as a single surface: Cp = 0 from x = 0 to 1. */
const plate = (n = 201, header = 'x cp') => [header, ...Array.from({ length: n }, (_, i) => `${i / (n - 1)} 0`)].join('\n');

describe('computeCell: flow condition', () => {
  it('derives the ISA free stream at 11 000 m', () => {
    const r = checked('flow', computeCell('flow', inputs('flow', { mode: 'altitude', altitude_m: 11000, mach: 0.7, referenceLength_m: 2 }), {})) as ReturnType<typeof computeCell<'flow'>>;
    // ICAO Doc 7488/3, Manual of the ICAO Standard Atmosphere (1993), table at 11 000 m:
    // T = 216.65 K, p = 22 632 Pa, ρ = 0.36392 kg/m³, a = 295.07 m/s, μ = 1.4216e-5 Pa s.
    expect(r.temperature_K).toBeCloseTo(216.65, 2);
    expect(r.pressure_Pa! / 22632).toBeCloseTo(1, 3);
    expect(r.density_kgm3! / 0.36392).toBeCloseTo(1, 3);
    expect(r.speedOfSound_mps! / 295.07).toBeCloseTo(1, 3);
    const reynolds = (0.36392 * 0.7 * 295.07 * 2) / 1.4216e-5;
    expect(r.reynolds / reynolds).toBeCloseTo(1, 2);
    expect(r.nCrit).toBe(9);
  });

  it("takes N_crit from the turbulence level by Mack's relation and warns outside its range", () => {
    const r = computeCell('flow', inputs('flow', { mode: 'reynolds', reynolds: 6e6, mach: 0, turbulenceMode: 'intensity', turbulenceIntensity: 0.001 }), {});
    // L. M. Mack (1977), AGARD Report 709: N = −8.43 − 2.4 ln(Tu).
    expect(r.nCrit).toBeCloseTo(-8.43 - 2.4 * Math.log(0.001), 6);
    expect(r.nCritFrom).toBe('turbulenceIntensity');
    expect(r.warnings).toEqual([]);
    const outside = computeCell('flow', inputs('flow', { mode: 'reynolds', reynolds: 6e6, turbulenceMode: 'intensity', turbulenceIntensity: 0.04 }), {});
    expect(outside.warnings.join(' ')).toMatch(/outside the range of Mack's relation/);
  });
});

describe('computeCell: pressure distribution', () => {
  it('measures a straight single surface by its own length', () => {
    const r = checked('pressure', computeCell('pressure', inputs('pressure', { text: plate(11), layout: 'surface', surfaceName: 'nacelle outer' }), {})) as ReturnType<typeof computeCell<'pressure'>>;
    expect(r.surfaces).toHaveLength(1);
    expect(r.surfaces[0]!.name).toBe('nacelle outer');
    // Arc length along y = 0 is x itself (exact).
    r.surfaces[0]!.s.forEach((s, i) => expect(s).toBeCloseTo(r.surfaces[0]!.x[i]!, 12));
    expect(r.surfaces[0]!.line[0]).toBe(2);
  });

  it('splits a closed loop at its stagnation point', () => {
    // A circle of radius 0.5 in potential flow: Cp = 1 − 4 sin²φ (exact; e.g. Anderson, Fundamentals
    // of Aerodynamics, 6th ed. 2017, eq. 3.101), listed from the rear over the top to the rear.
    const rows = Array.from({ length: 73 }, (_, i) => {
      const phi = (2 * Math.PI * i) / 72;
      return `${0.5 + 0.5 * Math.cos(phi)} ${0.5 * Math.sin(phi)} ${1 - 4 * Math.sin(phi) ** 2}`;
    });
    const r = computeCell('pressure', inputs('pressure', { text: ['x y cp', ...rows.slice(0, 72)].join('\n') }), {});
    expect(r.stagnation!.x).toBeCloseTo(0, 3);
    expect(r.surfaces.map((s) => s.name)).toEqual(['upper', 'lower']);
    // Half the circumference, π r, from the stagnation point to the rear on each side.
    expect(r.surfaces[0]!.s.at(-1)!).toBeGreaterThan(Math.PI * 0.5 * 0.95);
    expect(r.cpMin.cp).toBeCloseTo(-3, 6);
  });

  it('reads a body radius under any of its header names, and names the line of a bad one', () => {
    for (const name of ['r', 'r/c', 'rc', 'r/l', 'radius', 'R']) {
      const text = `x ${name} cp\n0 0 0.5\n0.5 0.1 0\n1 0.2 -0.1`;
      const r = computeCell('pressure', inputs('pressure', { text, layout: 'surface', hasRadius: true }), {});
      expect(r.surfaces[0]!.r).toEqual([0, 0.1, 0.2]);
    }
    expect(computeCellOutput({ kind: 'pressure', inputs: inputs('pressure', { text: 'x cp\n0 0\n1 0\n2 0', layout: 'surface', hasRadius: true }), upstream: {} }).error).toMatchObject({
      field: 'text',
      line: 1,
      message: 'line 1: the header "x cp" names no radius column (call it r)',
    });
    expect(computeCellOutput({ kind: 'pressure', inputs: inputs('pressure', { text: 'x r cp\n0 0 0\n1 -1 0\n2 0.1 0', layout: 'surface', hasRadius: true }), upstream: {} }).error).toMatchObject({
      field: 'text',
      line: 3,
    });
  });
});

describe('computeCell: transition analysis', () => {
  const flow = source('flow', { mode: 'reynolds', reynolds: 1e6, mach: 0 });
  const surface = source('pressure', { text: plate(), layout: 'surface', surfaceName: 'upper' });

  it("marches the flat plate: Thwaites' momentum thickness", () => {
    const r = checked('analysis', computeCell('analysis', inputs('analysis', { flowCellId: ID, pressureCellId: ID2, criteria: ['michel'], turbulent: false }), { flowCellId: flow, pressureCellId: surface })) as ReturnType<typeof computeCell<'analysis'>>;
    const st = r.surfaces[0]!.stations;
    const i = st.s.findIndex((s) => s >= 0.1);
    // Thwaites (1949) at zero pressure gradient: θ² = 0.45 ν s / Ue, θ = 0.6708 s / √Re_s (closed form of his integral).
    expect(st.theta[i]! / ((0.6708 * st.s[i]!) / Math.sqrt(1e6 * st.s[i]!))).toBeCloseTo(1, 2);
    expect(st.x).toEqual(st.s.map((s) => expect.closeTo(s, 12)));
  });

  it('puts a trip given at x/c where the surface passes it', () => {
    const r = computeCell('analysis', inputs('analysis', { flowCellId: ID, pressureCellId: ID2, trips: { upper: 0.05 } }), { flowCellId: flow, pressureCellId: surface });
    expect(r.surfaces[0]!.transition).toMatchObject({ by: 'trip' });
    expect(r.surfaces[0]!.transition.s).toBeCloseTo(0.05, 12);
  });

  it('names the trip field of a surface the table does not have, and the field that names a wrong cell', () => {
    const bad = computeCellOutput({ kind: 'analysis', inputs: inputs('analysis', { flowCellId: ID, pressureCellId: ID2, trips: { lower: 0.3 } }), upstream: { flowCellId: flow, pressureCellId: surface } });
    expect(bad.error).toMatchObject({ field: 'trips.lower', message: 'there is no surface named "lower" (the table gives upper)' });
    const wrong = computeCellOutput({ kind: 'analysis', inputs: inputs('analysis', { flowCellId: ID, pressureCellId: ID2 }), upstream: { flowCellId: surface, pressureCellId: surface } } as CellTask);
    expect(wrong.error).toMatchObject({ field: 'flowCellId' });
  });
});

describe('computeCell: parameter sweep', () => {
  it('re-runs the analysis at evenly spaced values; transition moves aft as N_crit rises', () => {
    const flow = source('flow', { mode: 'reynolds', reynolds: 6e6, mach: 0 });
    const pressure = source('pressure', { text: plate(), layout: 'surface' });
    const analysis = source('analysis', { flowCellId: ID, pressureCellId: ID2, criteria: ['eN'], turbulent: false }, { flowCellId: flow, pressureCellId: pressure });
    const r = checked('sweep', computeCell('sweep', inputs('sweep', { analysisCellId: ID, parameter: 'nCrit', from: 5, to: 9, steps: 3 }), { analysisCellId: analysis })) as ReturnType<typeof computeCell<'sweep'>>;
    expect(r.values).toEqual([5, 7, 9]);
    const s = r.steps.map((step) => step.surfaces[0]!.transitionS);
    expect(s.every((v) => v !== null)).toBe(true);
    expect(s[0]!).toBeLessThan(s[1]!);
    expect(s[1]!).toBeLessThan(s[2]!);
    expect(r.steps[2]!.surfaces[0]!.transitionX).toBeCloseTo(s[2]!, 12);
  });
});

describe('computeCell: quick estimates', () => {
  it('gives the Blasius friction of a plate laminar to its end', () => {
    const r = checked('flatPlate', computeCell('flatPlate', inputs('flatPlate', { reynolds: 1e6, transitionMode: 'location', transitionLocation: 1 }), {})) as ReturnType<typeof computeCell<'flatPlate'>>;
    // Blasius (1908): mean CF = 1.328 / √Re_L.
    expect(r.cfMixed).toBeCloseTo(1.328 / 1000, 9);
  });

  it("gives Poll's attachment-line Reynolds number from the radius, with the Reynolds number of the named flow cell", () => {
    const flow = source('flow', { mode: 'reynolds', reynolds: 2e7 });
    const r = checked('leadingEdge', computeCell('leadingEdge', inputs('leadingEdge', { flowCellId: ID, sweepDeg: 30, leadingEdgeRadius: 0.01 }), { flowCellId: flow })) as ReturnType<typeof computeCell<'leadingEdge'>>;
    // Poll (1979): R̄ = √(Re r sin Λ tan Λ / 2) for a circular leading edge.
    const sweep = Math.PI / 6;
    expect(r.reBar).toBeCloseTo(Math.sqrt((2e7 * 0.01 * Math.sin(sweep) * Math.tan(sweep)) / 2), 6);
    expect(r.reynolds).toBe(2e7);
    expect(computeCell('leadingEdge', inputs('leadingEdge', { sweepDeg: 30, reynolds: 1e6 }), {}).reynolds).toBe(1e6);
  });
});

describe('computeCellOutput', () => {
  it('keeps numbers to 7 significant digits', () => {
    const out = computeCellOutput({ kind: 'flatPlate', inputs: inputs('flatPlate', { reynolds: 3e6 }), upstream: {} });
    const numbers = (out.resultJson!.match(/-?\d+\.\d+(?:e[+-]?\d+)?/g) ?? []).map((n) => n.replace(/^-?0\.0*|\.|e.*$/g, ''));
    expect(numbers.length).toBeGreaterThan(3);
    for (const digits of numbers) expect(digits.replace(/^0+/, '').length).toBeLessThanOrEqual(7);
  });
});
