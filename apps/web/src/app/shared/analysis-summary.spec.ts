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
