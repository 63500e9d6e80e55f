import { CELL_SCHEMAS, type CellInputs, type CellKind } from '@laminote/contracts';
import { describe, expect, it } from 'vitest';
import { computeCell } from './cells/compute';
import { demoNacelleRadius, inventedDemoNacelle } from './demo-nacelle';

const inputs = <K extends CellKind>(kind: K, given: Record<string, unknown>) => CELL_SCHEMAS[kind].inputs.parse(given) as CellInputs[K];

describe('the invented demo nacelle pod', () => {
  it('is a closed body the body cell reads: nose and tail on the axis, fineness about 5.9, widest at 42 %', () => {
    const nacelle = inventedDemoNacelle();
    const body = computeCell('body', inputs('body', { source: 'coordinates', coordinates: nacelle.meridian }), {});
    expect(body.warnings).toEqual([]);
    expect(body.geometry.fineness).toBeCloseTo(1 / (2 * 0.085), 2);
    expect(body.geometry.maxRadiusAt).toBeCloseTo(0.42, 2);
    expect(demoNacelleRadius(0)).toBe(0);
    expect(demoNacelleRadius(1)).toBe(0);
  });

  it('has falling pressure over its forebody (its laminar part) and its lowest Cp near the widest point', () => {
    const body = computeCell('body', inputs('body', { source: 'coordinates', coordinates: inventedDemoNacelle().meridian }), {});
    const { x, cp } = body.inviscid;
    const lowest = x[cp.indexOf(Math.min(...cp))]!;
    // Common practice for a blunt elliptic forebody: the suction peak sits near the shoulder.
    expect(lowest).toBeGreaterThan(0.3);
    expect(lowest).toBeLessThan(0.5);
    const fore = x.map((v, i) => [v, cp[i]!] as const).filter(([v]) => v > 0.1 && v < 0.3);
    for (let i = 1; i < fore.length; i++) expect(fore[i]![1]).toBeLessThan(fore[i - 1]![1]);
  });
});
