import { CELL_SCHEMAS, type CellInputs, type CellKind } from '@laminote/contracts';
import { describe, expect, it } from 'vitest';
import { CELL_COMPUTE, CELL_TABLES, computeCell, resultTable } from './compute';
import type { CellSource } from './types';

/**
 * A cell's result as one table (the CSV export): each table must carry the result's own numbers, row
 * for row, and say above it what the rows do not (a section's lift, a polar's flow).
 */

const inputs = <K extends CellKind>(kind: K, given: Record<string, unknown>) => CELL_SCHEMAS[kind].inputs.parse(given) as CellInputs[K];
const source = <K extends CellKind>(kind: K, given: Record<string, unknown>, upstream: CellSource['upstream'] = {}): CellSource<K> => ({ kind, inputs: inputs(kind, given), upstream });
const ID = '00000000-0000-4000-8000-000000000001';
const ID2 = '00000000-0000-4000-8000-000000000002';
const column = (table: { fields: string[]; rows: unknown[][] }, name: string) => table.rows.map((r) => r[table.fields.indexOf(name)]);

describe('a result as one table', () => {
  it('has a table for every kind that computes', () => {
    expect(Object.keys(CELL_TABLES).sort()).toEqual(Object.keys(CELL_COMPUTE).sort());
  });

  it('section: Cp at every panel midpoint, lift and shape above', () => {
    const r = computeCell('section', inputs('section', { naca: '2412', alphaDeg: 2, panels: 100 }), {});
    const t = resultTable('section', r);
    expect(t.fields).toEqual(['x', 'y', 'cp', 'cpPrandtlGlauert']);
    expect(t.rows).toHaveLength(r.inviscid.x.length);
    expect(column(t, 'cp')).toEqual(r.inviscid.cp);
    expect(column(t, 'x')).toEqual(r.inviscid.x);
    expect(t.notes.join('\n')).toContain(`cl ${r.inviscid.cl}`);
    expect(t.notes.join('\n')).toContain(`t/c ${r.geometry.thickness}`);
  });

  it('body: Cp along the meridian with the radius', () => {
    const r = computeCell('body', inputs('body', { fineness: 6, panels: 60 }), {});
    const t = resultTable('body', r);
    expect(t.fields).toEqual(['x', 'r', 'cp']);
    expect(column(t, 'r')).toEqual(r.inviscid.r);
    expect(column(t, 'cp')).toEqual(r.inviscid.cp);
    expect(t.notes[0]).toContain(`fineness ${r.geometry.fineness}`);
  });

  it('polar: a row per point and surface, with the point’s lift and drag on each', () => {
    const flow = source('flow', { mode: 'reynolds', reynolds: 6e6, mach: 0 });
    const section = source('section', { naca: '0012', panels: 100 });
    const r = computeCell('polar', inputs('polar', { flowCellId: ID, sectionCellId: ID2, from: 0, to: 4, points: 3 }), { flowCellId: flow, sectionCellId: section });
    const t = resultTable('polar', r);
    expect(t.rows).toHaveLength(r.points.reduce((n, p) => n + p.surfaces.length, 0));
    const upper = t.rows.filter((row) => row[t.fields.indexOf('surface')] === 'upper');
    expect(upper.map((row) => row[t.fields.indexOf('cl')])).toEqual(r.points.map((p) => p.cl));
    expect(upper.map((row) => row[t.fields.indexOf('transitionX')])).toEqual(r.points.map((p) => p.surfaces.find((s) => s.name === 'upper')!.transitionX));
    expect(t.notes[0]).toBe(`Reynolds number ${r.reynolds}, Mach ${r.mach}, N_crit ${r.nCrit}`);
  });

  it('sweep over a grid: both parameters beside each row', () => {
    const plate = ['x cp', ...Array.from({ length: 81 }, (_, i) => `${i / 80} 0`)].join('\n');
    const analysis = source(
      'analysis',
      { flowCellId: ID, pressureCellId: ID2, criteria: ['eN'], turbulent: true },
      { flowCellId: source('flow', { mode: 'reynolds', reynolds: 6e6, mach: 0 }), pressureCellId: source('pressure', { text: plate, layout: 'surface' }) },
    );
    const sw = inputs('sweep', { analysisCellId: ID, parameter: 'reynolds', from: 2e6, to: 8e6, steps: 2, second: { parameter: 'nCrit', from: 7, to: 9, steps: 2 } });
    const r = computeCell('sweep', sw, { analysisCellId: analysis });
    const t = resultTable('sweep', r);
    expect(t.fields.slice(0, 3)).toEqual(['reynolds', 'nCrit', 'surface']);
    expect(t.rows.map((row) => [row[0], row[1]])).toEqual(r.steps.flatMap((s) => s.surfaces.map(() => [s.value, s.value2])));
  });

  it('flow: its scalar values by name', () => {
    const r = computeCell('flow', inputs('flow', { mode: 'altitude', altitude_m: 11000, mach: 0.7, referenceLength_m: 2 }), {});
    const t = resultTable('flow', r);
    expect(t.fields).toEqual(['quantity', 'value']);
    expect(t.rows).toContainEqual(['reynolds', r.reynolds]);
    expect(t.rows).toContainEqual(['mach', r.mach]);
    // Its warnings above the rows, said as warnings like every other kind's.
    const high = computeCell('flow', inputs('flow', { mode: 'reynolds', reynolds: 5e6, mach: 0, turbulenceMode: 'intensity', turbulenceIntensity: 0.0005 }), {});
    expect(high.warnings.length).toBeGreaterThan(0);
    expect(resultTable('flow', high).notes).toEqual(high.warnings.map((w) => `warning: ${w}`));
  });
});
