import { CELL_SCHEMAS, type CellInputs, type CellKind } from '@laminote/contracts';
import { describe, expect, it } from 'vitest';
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
const flow = source('flow', { mode: 'reynolds', reynolds: 6e6, mach: 0, nCrit: 9 });

describe('computeCell: section', () => {
  it('a NACA 0012 at zero incidence: no lift, 12 % thick, nose radius 1.1019 t² (NACA Report 460)', () => {
    const r = computeCell('section', inputs('section', { source: 'naca', naca: '0012', alphaDeg: 0 }), {});
    expect(CELL_SCHEMAS.section.result.safeParse(r).success).toBe(true);
    expect(r.inviscid.cl).toBeCloseTo(0, 8);
    expect(r.geometry.thickness).toBeCloseTo(0.12, 3);
    expect(r.geometry.leadingEdgeRadius! / (1.1019 * 0.0144)).toBeCloseTo(1, 2);
    expect(r.title).toBe('NACA 0012');
  });

  it('takes the Mach number from the flow cell it names and names a bad coordinate line', () => {
    const compressible = source('flow', { mode: 'reynolds', reynolds: 6e6, mach: 0.5 });
    const r = computeCell('section', inputs('section', { naca: '2412', at: 'cl', cl: 0.5, flowCellId: ID }), { flowCellId: compressible });
    expect(r.inviscid.mach).toBe(0.5);
    expect(r.inviscid.cl).toBeCloseTo(0.5, 6);
    const bad = computeCellOutput({ kind: 'section', inputs: inputs('section', { source: 'coordinates', coordinates: '1 0\n0.5 0.06\n0 0\n0.5 -0.04x\n1 0' }), upstream: {} });
    expect(bad.status).toBe('error');
    expect(bad.error).toMatchObject({ field: 'coordinates', line: 4 });
  });
});

describe('computeCell: analysis of a section cell', () => {
  it('gives the same result as the section pasted as a pressure table', () => {
    const section = source('section', { naca: '2412', alphaDeg: 2 });
    const fromSection = computeCell('analysis', inputs('analysis', { flowCellId: ID, pressureCellId: ID2 }), { flowCellId: flow, pressureCellId: section });
    const solved = computeCell('section', section.inputs, {});
    // The boundary layer is marched to x/c 0.995 (section-case.ts, BOUNDARY_LAYER_AFT_LIMIT).
    const text = solved.inviscid.x.flatMap((x, i) => (x <= 0.995 ? [`${x} ${solved.inviscid.y[i]} ${solved.inviscid.cp[i]}`] : [])).join('\n');
    const fromTable = computeCell('analysis', inputs('analysis', { flowCellId: ID, pressureCellId: ID2 }), { flowCellId: flow, pressureCellId: source('pressure', { text, layout: 'closedLoop' }) });
    expect(fromSection.cd).toBeCloseTo(fromTable.cd!, 6);
    expect(fromSection.surfaces[0].transition.s).toBeCloseTo(fromTable.surfaces[0].transition.s!, 5);
    // The pasted table names no shape; the section's analysis carries the panel solution, so the
    // screen can draw the outline and mark transition on it.
    expect(fromTable.inviscid).toBeUndefined();
    expect(CELL_SCHEMAS.analysis.result.safeParse(fromSection).success).toBe(true);
    const inviscid = fromSection.inviscid!;
    expect(inviscid.kind).toBe('section');
    if (inviscid.kind !== 'section') return;
    expect(inviscid.x).toEqual(solved.inviscid.x);
    expect(inviscid.y).toEqual(solved.inviscid.y);
    expect(inviscid.alphaDeg).toBe(2);
    // NACA 2412: 12 % thick (Report 460), so the loop's extent in y is about 0.12 of the chord (plus camber).
    expect(Math.max(...inviscid.y) - Math.min(...inviscid.y)).toBeGreaterThan(0.11);
    expect(Math.max(...inviscid.y) - Math.min(...inviscid.y)).toBeLessThan(0.16);
  });
});

describe('computeCell: polar', () => {
  it('NACA 0012: symmetric in incidence, least drag at zero lift, upper transition moving forward with lift', () => {
    const section = source('section', { naca: '0012' });
    const r = computeCell('polar', inputs('polar', { flowCellId: ID, sectionCellId: ID2, from: -4, to: 4, points: 5 }), { flowCellId: flow, sectionCellId: section });
    expect(CELL_SCHEMAS.polar.result.safeParse(r).success).toBe(true);
    expect(r.points.map((p) => p.problem)).toEqual([null, null, null, null, null]);
    expect(r.points[0].cl!).toBeCloseTo(-r.points[4].cl!, 6);
    expect(r.points[0].cd!).toBeCloseTo(r.points[4].cd!, 5);
    expect(r.points[2].cd!).toBeLessThan(r.points[4].cd!);
    const upper = (k: number) => r.points[k].surfaces.find((s) => s.name === 'upper')!.transitionX!;
    expect(upper(4)).toBeLessThan(upper(2));
  });

  it('follows the criteria and governing criterion chosen on the polar cell', () => {
    const section = source('section', { naca: '0012' });
    const run = (given: Record<string, unknown>) =>
      computeCell('polar', inputs('polar', { flowCellId: ID, sectionCellId: ID2, from: 0, to: 4, points: 3, ...given }), { flowCellId: flow, sectionCellId: section });
    const surfaceOf = (r: ReturnType<typeof run>, k: number, name: string) => r.points[k].surfaces.find((s) => s.name === name)!;
    // Only the criteria asked for are reported at each point.
    const two = run({ criteria: ['eN', 'michel'], governing: 'michel' });
    for (const point of two.points) for (const s of point.surfaces) expect(Object.keys(s.criteria).sort()).toEqual(['eN', 'michel']);
    // A named governing criterion sets the transition (unless separation comes first); 'earliest' takes the
    // shorter laminar run of the two, so it can never lie aft of either one.
    const earliest = run({ criteria: ['eN', 'michel'], governing: 'earliest' });
    for (let k = 0; k < 3; k++) {
      for (const name of ['upper', 'lower']) {
        const m = surfaceOf(two, k, name);
        if (m.transitionBy === 'michel') expect(m.transitionX!).toBeCloseTo(m.criteria['michel']!, 9);
        const e = surfaceOf(earliest, k, name);
        const located = Object.values(e.criteria).filter((x): x is number => x !== null);
        if (e.transitionBy === 'eN' || e.transitionBy === 'michel') expect(e.transitionX!).toBeCloseTo(Math.min(...located), 9);
      }
    }
    expect(two.points.some((p) => p.surfaces.some((s) => s.transitionBy === 'michel'))).toBe(true);
    // The governing choice reaches the drag: Michel and eᴺ put transition at different places.
    const byEN = run({ criteria: ['eN', 'michel'], governing: 'eN' });
    expect(byEN.points[1].cd).not.toBeCloseTo(two.points[1].cd!, 6);
  });
});
