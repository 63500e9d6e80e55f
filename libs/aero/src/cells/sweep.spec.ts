import { CELL_SCHEMAS, type CellInputs, type CellKind } from '@laminote/contracts';
import { describe, expect, it } from 'vitest';
import { computeCell } from './compute';
import { assembleSweep, computeSweepCase, sweepCaseCount } from './sweep';
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
