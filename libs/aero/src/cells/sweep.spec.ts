import { CELL_SCHEMAS, type CellInputs, type CellKind } from '@laminote/contracts';
import { describe, expect, it } from 'vitest';
import { computeCell } from './compute';
import { joukowskiLoop } from '../../test/joukowski';
import { resultJson } from './result-json';
import { assembleSweep, computeSweepCase, computeSweepCases, gatherSweepWarnings, sweepCaseCount } from './sweep';
import type { CellSource } from './types';

const inputs = <K extends CellKind>(kind: K, given: Record<string, unknown>) => CELL_SCHEMAS[kind].inputs.parse(given) as CellInputs[K];
const source = <K extends CellKind>(kind: K, given: Record<string, unknown>, upstream: CellSource['upstream'] = {}): CellSource<K> => ({ kind, inputs: inputs(kind, given), upstream });
const ID = '00000000-0000-4000-8000-000000000001';
const ID2 = '00000000-0000-4000-8000-000000000002';
const plate = (n = 121) => ['x cp', ...Array.from({ length: n }, (_, i) => `${i / (n - 1)} 0`)].join('\n');

const analysis = source(
  'analysis',
  { flowCellId: ID, pressureCellId: ID2, criteria: ['eN', 'michel'], turbulent: true },
  { flowCellId: source('flow', { mode: 'reynolds', reynolds: 6e6, mach: 0 }), pressureCellId: source('pressure', { text: plate(), layout: 'surface' }) },
);

describe('a sweep computed case by case', () => {
  it('puts together, in any order the cases were computed, exactly what the whole sweep gives', () => {
    const sw = inputs('sweep', { analysisCellId: ID, parameter: 'reynolds', from: 1e6, to: 2e7, steps: 7 });
    const whole = computeCell('sweep', sw, { analysisCellId: analysis });
    const order = [6, 2, 0, 5, 1, 4, 3];
    const cases = new Array(sweepCaseCount(sw));
    for (const index of order) cases[index] = computeSweepCase(sw, { analysisCellId: analysis }, index);
    expect(assembleSweep(sw, cases)).toEqual(whole);
  });

  it('refuses a case the sweep does not have, and an incomplete set of cases', () => {
    const sw = inputs('sweep', { analysisCellId: ID, parameter: 'nCrit', from: 5, to: 9, steps: 3 });
    expect(() => computeSweepCase(sw, { analysisCellId: analysis }, 3)).toThrow(RangeError);
    expect(() => assembleSweep(sw, [computeSweepCase(sw, { analysisCellId: analysis }, 0)])).toThrow(RangeError);
  });
});

describe('a chunk of cases computed together (computeSweepCases)', () => {
  // Exact potential flow about a Joukowski section (the engine's analytic test loop), as a pasted closed loop.
  const loop = joukowskiLoop({ re: -0.08, im: 0.03 }, 1, 201);
  const table = ['x y cp', ...loop.x.map((x, i) => `${x.toFixed(6)} ${loop.y[i]!.toFixed(6)} ${loop.cp[i]!.toFixed(6)}`)].join('\n');
  const flow = source('flow', { mode: 'reynolds', reynolds: 6e6, mach: 0.3 });
  const onTable = source('analysis', { flowCellId: ID, pressureCellId: ID2, criteria: ['eN', 'michel', 'hRx', 'granville'] }, { flowCellId: flow, pressureCellId: source('pressure', { text: table }) });
  const tripped = source('analysis', { flowCellId: ID, pressureCellId: ID2, trips: { lower: 0.3 } }, { flowCellId: flow, pressureCellId: source('pressure', { text: table }) });
  const onSection = source('analysis', { flowCellId: ID, pressureCellId: ID2 }, { flowCellId: flow, pressureCellId: source('section', { naca: '2412', alphaDeg: 1, panels: 100 }) });

  it('gives each case exactly as computeSweepCase gives it alone, to the bit and to the stored character', () => {
    const grid = { analysisCellId: ID, parameter: 'mach', from: 0, to: 0.6, steps: 3, second: { parameter: 'reynolds', from: 2e6, to: 2e7, steps: 3 } };
    for (const [analysisCell, sw] of [
      [onTable, inputs('sweep', grid)],
      [tripped, inputs('sweep', grid)],
      // A section is solved once per Mach number in a chunk: the grid repeats each Mach number three times.
      [onSection, inputs('sweep', grid)],
      // From Mach 0.65 the section's corrected Cp passes the stagnation value (or the vacuum limit): those cases fail, with their message, beside the one that runs.
      [onSection, inputs('sweep', { analysisCellId: ID, parameter: 'mach', from: 0.5, to: 0.95, steps: 4 })],
    ] as const) {
      const upstream = { analysisCellId: analysisCell };
      const count = sweepCaseCount(sw);
      // Out of order and with a repeat, as a retried chunk may be.
      const indices = [...Array.from({ length: count }, (_, i) => count - 1 - i), 0];
      const together = computeSweepCases(sw, upstream, indices);
      const alone = indices.map((index) => computeSweepCase(sw, upstream, index));
      expect(together).toEqual(alone);
      expect(together.map(resultJson)).toEqual(alone.map(resultJson));
      expect(together.some((c) => c.step.status === 'ok')).toBe(true);
    }
  });
});

describe('what each step of a sweep reports', () => {
  it('gives every evaluated criterion and the laminar extent beside the governing transition', () => {
    const sw = inputs('sweep', { analysisCellId: ID, parameter: 'reynolds', from: 2e6, to: 2e7, steps: 4 });
    const r = computeCell('sweep', sw, { analysisCellId: analysis });
    for (const step of r.steps) {
      const upper = step.surfaces[0]!;
      expect(Object.keys(upper.criteria ?? {}).sort()).toEqual(['eN', 'michel']);
      // e^N governs by default: its location is the governing one; the laminar run ends there, or at
      // the trailing edge (x/c 1) of a plate that stays laminar.
      expect(upper.criteria!['eN']).toBe(upper.transitionX);
      expect(upper.laminarExtent).toBe(upper.transitionX ?? 1);
    }
    // On a flat plate Michel's criterion and e^N both move forward as Re grows (Blasius layer; common
    // practice), so each criterion's curve falls with Re where it is reached.
    const michel = r.steps.map((step) => step.surfaces[0]!.criteria!['michel']).filter((x): x is number => x !== null);
    expect(michel.length).toBeGreaterThan(1);
    expect(michel).toEqual([...michel].sort((a, b) => b - a));
  });
});

describe('a sweep over a grid of two parameters', () => {
  it('runs every value of the second parameter at every value of the first, row by row', () => {
    const sw = inputs('sweep', { analysisCellId: ID, parameter: 'reynolds', from: 2e6, to: 8e6, steps: 3, second: { parameter: 'nCrit', from: 5, to: 11, steps: 4 } });
    expect(sweepCaseCount(sw)).toBe(12);
    const r = computeCell('sweep', sw, { analysisCellId: analysis });
    expect(r.values).toEqual([2e6, 5e6, 8e6]);
    expect(r.second).toEqual({ parameter: 'nCrit', values: [5, 7, 9, 11] });
    expect(r.steps.map((s) => [s.value, s.value2])).toEqual([2e6, 5e6, 8e6].flatMap((re) => [5, 7, 9, 11].map((n) => [re, n])));
    // Each case is the analysis at both values: the same as a one-parameter sweep over N_crit at that Re.
    const row = computeCell('sweep', inputs('sweep', { analysisCellId: ID, parameter: 'nCrit', from: 5, to: 11, steps: 4 }), {
      analysisCellId: { ...analysis, upstream: { ...analysis.upstream, flowCellId: source('flow', { mode: 'reynolds', reynolds: 5e6, mach: 0 }) } },
    });
    expect(r.steps.slice(4, 8).map((s) => s.surfaces[0]!.transitionS)).toEqual(row.steps.map((s) => s.surfaces[0]!.transitionS));
    // Higher N_crit (quieter stream) moves transition aft at a fixed Reynolds number (Mack 1977, common
    // practice); no transition on the plate counts as furthest aft.
    const s = r.steps.slice(8, 12).map((step) => step.surfaces[0]!.transitionS ?? Infinity);
    expect(s[0]).toBeLessThan(1);
    expect(s).toEqual([...s].sort((a, b) => a - b));
  });

  it('refuses a grid of more than 2,000 cases and the same parameter twice, naming the field', () => {
    const over = CELL_SCHEMAS.sweep.inputs.safeParse({ analysisCellId: ID, parameter: 'reynolds', from: 1e6, to: 2e7, steps: 50, second: { parameter: 'mach', from: 0, to: 0.5, steps: 41 } });
    expect(over.error?.issues.map((i) => [i.path.join('.'), i.message])).toEqual([['second.steps', 'the grid has 2,050 cases (steps × second.steps); at most 2,000']]);
    const twice = CELL_SCHEMAS.sweep.inputs.safeParse({ analysisCellId: ID, parameter: 'mach', from: 0, to: 0.5, steps: 3, second: { parameter: 'mach', from: 0.1, to: 0.2, steps: 3 } });
    expect(twice.error?.issues.map((i) => i.path.join('.'))).toEqual(['second.parameter']);
    expect(CELL_SCHEMAS.sweep.inputs.safeParse({ analysisCellId: ID, parameter: 'reynolds', from: 1e6, to: 2e7, steps: 2000 }).success).toBe(true);
    const steps = CELL_SCHEMAS.sweep.inputs.safeParse({ analysisCellId: ID, parameter: 'reynolds', from: 1e6, to: 2e7, steps: 2001 });
    expect(steps.error?.issues.map((i) => [i.path.join('.'), i.message])).toEqual([['steps', 'steps must be at most 2,000']]);
  });
});

describe("a sweep's warnings", () => {
  it('says a warning that names each step\'s Mach number once, with the range and how many cases gave it', () => {
    // 41 Mach numbers from 0 to 0.8: the engine warns of its compressible laminar layer from M 0.3 up
    // (every step at 0.3 and above; the steps 0.02 apart carry float noise such as 0.30000000000000004).
    const sw = inputs('sweep', { analysisCellId: ID, parameter: 'mach', from: 0, to: 0.8, steps: 41 });
    const r = computeCell('sweep', sw, { analysisCellId: analysis });
    const perStep = Array.from({ length: 41 }, (_, i) => computeSweepCase(sw, { analysisCellId: analysis }, i).warnings).flat();
    const compressible = perStep.filter((w) => w.includes('computed compressible'));
    expect(compressible.length).toBe(26); // steps 15..40
    const said = r.warnings.filter((w) => w.includes('computed compressible'));
    expect(said).toHaveLength(1);
    expect(said[0]).toMatch(/^mach 0\.3–0\.8: the laminar layer is computed compressible; .* \(in 26 of 41 cases\)$/);
    // Nothing else is lost: each other warning of any case is there as it was.
    for (const w of new Set(perStep.filter((w) => !w.includes('computed compressible')))) expect(r.warnings).toContain(w);
  });

  it('keeps apart warnings alike but for their numbers when one case gives several (two table lines)', () => {
    const lines = ['pressureTable line 12: x repeats', 'pressureTable line 40: x repeats'];
    expect(gatherSweepWarnings(lines.map((warning) => ({ warning, steps: [0, 1, 2] })), 3)).toEqual(lines);
    // …and gathers them when each comes from other cases, a long step value written to 4 digits.
    expect(
      gatherSweepWarnings(
        [
          { warning: 'upper: local Mach number up to 1.04 (supersonic pocket)', steps: [3] },
          { warning: 'upper: local Mach number up to 1.2137745110934 (supersonic pocket)', steps: [4, 5] },
          { warning: 'Re 3e6 is low', steps: [0, 1, 2, 3, 4, 5] },
        ],
        6,
      ),
    ).toEqual(['upper: local Mach number up to 1.04–1.214 (supersonic pocket) (in 3 of 6 cases)', 'Re 3e6 is low']);
  });
});
