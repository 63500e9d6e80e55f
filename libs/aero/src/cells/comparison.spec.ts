import { CELL_SCHEMAS, type CellInputs, type CellKind } from '@laminote/contracts';
import { describe, expect, it } from 'vitest';
import { computeCell } from './compute';
import type { CellSource } from './types';

const inputs = <K extends CellKind>(kind: K, given: Record<string, unknown>) => CELL_SCHEMAS[kind].inputs.parse(given) as CellInputs[K];
const source = <K extends CellKind>(kind: K, given: Record<string, unknown>, upstream: CellSource['upstream'] = {}): CellSource<K> => ({ kind, inputs: inputs(kind, given), upstream });
const ID = (n: number) => `00000000-0000-4000-8000-00000000000${n}`;
// A flat plate at zero incidence: Cp = 0 along it (exact potential flow; common knowledge).
const plate = (n = 81) => ['x cp', ...Array.from({ length: n }, (_, i) => `${i / (n - 1)} 0`)].join('\n');

const pressure = source('pressure', { text: plate(), layout: 'surface' });
const analysisAt = (reynolds: number) =>
  source('analysis', { flowCellId: ID(1), pressureCellId: ID(2), criteria: ['eN', 'michel'] }, { flowCellId: source('flow', { mode: 'reynolds', reynolds, mach: 0 }), pressureCellId: pressure });

describe('a comparison cell', () => {
  it('overlays a pressure cell and two analyses: the same Cp, and transition moving forward with Reynolds number', () => {
    const low = analysisAt(6e6);
    const high = analysisAt(2e7);
    const c = computeCell('comparison', inputs('comparison', { firstCellId: ID(2), secondCellId: ID(3), thirdCellId: ID(4) }), { firstCellId: pressure, secondCellId: low, thirdCellId: high });
    expect(c.entries.map((e) => [e.field, e.kind])).toEqual([
      ['firstCellId', 'pressure'],
      ['secondCellId', 'analysis'],
      ['thirdCellId', 'analysis'],
    ]);
    // The plate's Cp is 0 whether read from the table or from the analysis's marched edge velocity.
    expect(Math.max(...c.entries[0]!.surfaces[0]!.cp.map((v) => Math.abs(v ?? 0)))).toBe(0);
    expect(Math.max(...c.entries[1]!.surfaces[0]!.cp.map((v) => Math.abs(v ?? 0)))).toBeLessThan(1e-9);
    // Each analysis's transition is what its own cell computes; ten times the Reynolds number moves it forward.
    const own = computeCell('analysis', low.inputs as CellInputs['analysis'], low.upstream);
    expect(c.entries[1]!.surfaces[0]!.transitionX).toBeCloseTo(own.surfaces[0]!.transition.s!, 9);
    expect(c.entries[2]!.surfaces[0]!.transitionX!).toBeLessThan(c.entries[1]!.surfaces[0]!.transitionX!);
    expect(c.entries[1]!.surfaces[0]!.n?.length).toBe(c.entries[1]!.surfaces[0]!.x.length);
  });

  it('needs two cells, and names the field of a cell it cannot overlay', () => {
    expect(() => computeCell('comparison', inputs('comparison', { firstCellId: ID(2), secondCellId: ID(3) }), { firstCellId: pressure })).toThrow(/secondCellId names no cell/);
    const flow = source('flow', { mode: 'reynolds', reynolds: 2e6, mach: 0 });
    expect(() => computeCell('comparison', inputs('comparison', { firstCellId: ID(2), secondCellId: ID(1) }), { firstCellId: pressure, secondCellId: flow })).toThrow(/secondCellId names a flow cell/);
  });
});
