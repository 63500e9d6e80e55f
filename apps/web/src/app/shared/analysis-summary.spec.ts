import { computeCell } from '@laminote/aero';
import { CELL_SCHEMAS, type CellInputs, type CellKind } from '@laminote/contracts';
import { describe, expect, it } from 'vitest';
import { analysisFigures, isBodyResult, summarise } from './analysis-summary';

const inputs = <K extends CellKind>(kind: K, given: Record<string, unknown>) => CELL_SCHEMAS[kind].inputs.parse(given) as CellInputs[K];
const ID = '00000000-0000-4000-8000-000000000001';
const ID2 = '00000000-0000-4000-8000-000000000002';
const flow = { kind: 'flow' as const, inputs: inputs('flow', { mode: 'reynolds', reynolds: 2e7, mach: 0, nCrit: 9 }), upstream: {} };

describe('analysis summary', () => {
  it('tells a body of revolution by its length: x/L from the nose, plots along the body', () => {
    const body = { kind: 'body' as const, inputs: inputs('body', { source: 'spheroid', fineness: 6, panels: 80 }), upstream: {} };
    const result = computeCell('analysis', inputs('analysis', { flowCellId: ID, pressureCellId: ID2 }), { flowCellId: flow, pressureCellId: body });
    expect(isBodyResult(result)).toBe(true);
    const [surface] = summarise(result, ['eN']);
    expect(surface!.governing?.along).toBe('x/L');
    expect(surface!.governing!.value).toBeGreaterThan(0);
    expect(surface!.governing!.value).toBeLessThan(1);
    const figures = analysisFigures(result);
    expect(figures.map((f) => f.label).every((label) => !label.includes('chord'))).toBe(true);
    expect(figures[0]!.figure.x.title).toMatch(/^x\/L/);
  });

  it('keeps x/c along the chord for a section given by its Cp', () => {
    const plate = ['x cp', ...Array.from({ length: 81 }, (_, i) => `${i / 80} 0`)].join('\n');
    const pressure = { kind: 'pressure' as const, inputs: inputs('pressure', { text: plate, layout: 'surface' }), upstream: {} };
    const result = computeCell('analysis', inputs('analysis', { flowCellId: ID, pressureCellId: ID2, criteria: ['eN'] }), { flowCellId: flow, pressureCellId: pressure });
    expect(isBodyResult(result)).toBe(false);
    expect(summarise(result, ['eN'])[0]!.governing?.along).toBe('x/c');
    expect(analysisFigures(result)[0]!.label).toContain('along the chord');
  });
});

describe('Re_θ plot', () => {
  it('takes the local unit Reynolds number at Mach > 0, as the criteria do', () => {
    // A plate in a stream 20 % faster than the free stream (Cp = −0.44 all along) at M 0.78: the edge
    // density and viscosity differ from the free stream's, so local and free-stream Re_θ differ.
    const plate = ['x cp', ...Array.from({ length: 401 }, (_, i) => `${i / 400} -0.44`)].join('\n');
    const pressure = { kind: 'pressure' as const, inputs: inputs('pressure', { text: plate, layout: 'surface' }), upstream: {} };
    const cruise = { kind: 'flow' as const, inputs: inputs('flow', { mode: 'reynolds', reynolds: 1.5e7, mach: 0.78, nCrit: 9 }), upstream: {} };
    const result = computeCell('analysis', inputs('analysis', { flowCellId: ID, pressureCellId: ID2, criteria: ['michel'] }), { flowCellId: cruise, pressureCellId: pressure });
    const surface = result.surfaces[0]!;
    const ratio = surface.stations.reynoldsRatio!;
    expect(Math.abs(ratio[100]! - 1)).toBeGreaterThan(0.05);
    const michel = surface.transition.criteria.michel as { s: number; reTheta: number };
    const figure = analysisFigures(result).find((f) => f.id === 'retheta')!.figure;
    const [reTheta, line] = figure.traces;
    // The last laminar station before the criterion: the plotted Re_θ is the criterion's own, within
    // the station spacing, and still under the plotted Michel line.
    const last = surface.stations.s.findIndex((s) => s >= michel.s) - 1;
    expect((reTheta!.y[last] as number) / michel.reTheta).toBeCloseTo(1, 1);
    expect(Math.abs((reTheta!.y[last] as number) / michel.reTheta - 1)).toBeLessThan(0.02);
    expect(reTheta!.y[last] as number).toBeLessThan(line!.y[last] as number);
  });
});
