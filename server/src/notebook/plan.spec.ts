import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { canonicalJson, outputKey, planCells, type StoredCell } from './plan';

const cell = (kind: string, inputs: Record<string, unknown>, cellId = randomUUID()): StoredCell => ({ cellId, kind, title: '', collapsed: false, inputs });

describe('output keys', () => {
  it('does not depend on the order of object keys', () => {
    expect(canonicalJson({ b: 1, a: { d: [2, { y: 1, x: 0 }], c: null } })).toBe('{"a":{"c":null,"d":[2,{"x":0,"y":1}]},"b":1}');
    expect(outputKey('flow', { a: 1, b: 2 }, [])).toBe(outputKey('flow', { b: 2, a: 1 }, []));
  });

  it('changes with the kind, the inputs, the upstream keys and the engine version', () => {
    const base = outputKey('flow', { a: 1 }, ['k'], '1.0.0');
    expect(outputKey('pressure', { a: 1 }, ['k'], '1.0.0')).not.toBe(base);
    expect(outputKey('flow', { a: 2 }, ['k'], '1.0.0')).not.toBe(base);
    expect(outputKey('flow', { a: 1 }, ['j'], '1.0.0')).not.toBe(base);
    expect(outputKey('flow', { a: 1 }, ['k'], '1.0.1')).not.toBe(base);
  });

  it('gives defaults and written-out defaults the same key, and ignores the order of criteria', () => {
    const flowA = cell('flow', { mode: 'reynolds', reynolds: 6e6 });
    const flowB = cell('flow', { mode: 'reynolds', reynolds: 6e6, mach: 0.7, nCrit: 9, sweepDeg: 0, turbulenceMode: 'nCrit' });
    const p = cell('pressure', { text: 'x cp\n1 0\n0 1\n1 0' });
    const a1 = cell('analysis', { flowCellId: flowA.cellId, pressureCellId: p.cellId, criteria: ['michel', 'eN'] });
    const a2 = cell('analysis', { flowCellId: flowA.cellId, pressureCellId: p.cellId, criteria: ['eN', 'michel'] });
    const plans = planCells([flowA, flowB, p, a1, a2]);
    expect(plans.get(flowA.cellId)!.key).toBe(plans.get(flowB.cellId)!.key);
    expect(plans.get(a1.cellId)!.key).toBe(plans.get(a2.cellId)!.key);
  });

  it('passes a change upstream down to every cell below, and not across', () => {
    const flow = cell('flow', { mode: 'reynolds', reynolds: 6e6 });
    const p = cell('pressure', { text: 'x cp\n1 0\n0 1\n1 0' });
    const a = cell('analysis', { flowCellId: flow.cellId, pressureCellId: p.cellId });
    const sweep = cell('sweep', { analysisCellId: a.cellId, parameter: 'nCrit', from: 6, to: 12, steps: 3 });
    const plate = cell('flatPlate', {});
    const before = planCells([flow, p, a, sweep, plate]);
    const after = planCells([{ ...flow, inputs: { mode: 'reynolds', reynolds: 7e6 } }, p, a, sweep, plate]);
    for (const c of [flow, a, sweep]) expect(after.get(c.cellId)!.key).not.toBe(before.get(c.cellId)!.key);
    for (const c of [p, plate]) expect(after.get(c.cellId)!.key).toBe(before.get(c.cellId)!.key);
  });

  it('has no key for a cell with problems, nor for the cells that use it, and says why', () => {
    const flow = cell('flow', { mode: 'reynolds' });
    const p = cell('pressure', { text: 'x cp\n1 0' });
    const a = cell('analysis', { flowCellId: flow.cellId, pressureCellId: p.cellId });
    const plans = planCells([a, flow, p]);
    expect(plans.get(flow.cellId)!).toMatchObject({ key: null, problems: [{ field: 'reynolds' }] });
    expect(plans.get(a.cellId)!.key).toBeNull();
    expect(plans.get(a.cellId)!.problems).toEqual([{ field: 'flowCellId', message: expect.stringMatching(/has problems to fix first/) }]);
    // Table problems are shown by line but do not stop a run: the run stores them as the cell's failure.
    expect(plans.get(p.cellId)!.key).not.toBeNull();
  });

  it('plans a draft seen before with the cells given now, and a changed one afresh', () => {
    const flow = cell('flow', { mode: 'reynolds', reynolds: 6e6 });
    const p = cell('pressure', { text: 'x cp\n1 0\n0 1\n1 0' });
    const a = cell('analysis', { flowCellId: flow.cellId, pressureCellId: p.cellId });
    const first = planCells([flow, p, a]);
    // The same content after a run: the cells carry output keys now, which a plan hands back as given.
    const ran = [flow, p, { ...a, lastOutputKey: 'k1' }];
    const again = planCells(ran);
    expect([...again.keys()]).toEqual([...first.keys()]);
    expect(again.get(a.cellId)!.cell).toBe(ran[2]);
    expect(again.get(a.cellId)!.key).toBe(first.get(a.cellId)!.key);
    // A table edited in place (same ids) is planned again: its new problem shows and its key changes.
    const edited = planCells([flow, { ...p, inputs: { text: 'x cp\n1 0\n0 1\n1 zero' } }, a]);
    expect(edited.get(p.cellId)!.problems).not.toEqual(first.get(p.cellId)!.problems);
    expect(edited.get(a.cellId)!.key).not.toBe(first.get(a.cellId)!.key);
  });
});
