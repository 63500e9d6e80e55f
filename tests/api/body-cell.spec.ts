import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { computeCell } from '@laminote/aero';
import { CELL_SCHEMAS, type BodyResult, type Draft, type EngineResult } from '@laminote/contracts';
import { createTestApp, type TestApp } from '../support/app';
import { testEnv } from '../support/env';
import { runAndWait } from '../support/run';
import { signIn, type SignedIn } from '../support/sign-in';

/**
 * A body of revolution through the real API on PostgreSQL (issue 14's axisymmetric panel method in the
 * notebook): a flow condition, a 5:1 prolate spheroid and an analysis naming the body run as the engine
 * computes them in-process; bad meridian text is refused with its line and kept as typed.
 */

let t: TestApp;
let engineer: SignedIn;

beforeAll(async () => {
  t = await createTestApp();
  engineer = await signIn(t.app, 'engineer', testEnv.publicUrl);
});
afterAll(async () => t?.close());

async function study(bodyInputs: Record<string, unknown>) {
  const created = await engineer.post(`/api/projects/${t.demo.projectId}/studies`, { title: `Pod ${randomUUID().slice(0, 8)} (invented)` }).expect(201);
  const branchId = (await engineer.get(`/api/studies/${created.body.id}/branches`).expect(200)).body[0].id as string;
  const ids = { flow: randomUUID(), body: randomUUID(), analysis: randomUUID() };
  const cells = [
    { cellId: ids.flow, kind: 'flow', inputs: { mode: 'reynolds', reynolds: 1.5e7, mach: 0, nCrit: 9 } },
    { cellId: ids.body, kind: 'body', inputs: bodyInputs },
    { cellId: ids.analysis, kind: 'analysis', inputs: { flowCellId: ids.flow, pressureCellId: ids.body, criteria: ['eN', 'michel'] } },
  ].map((c) => ({ title: '', collapsed: false, ...c }));
  await engineer.put(`/api/branches/${branchId}/draft`, { baseRevision: 0, cells }).expect(200);
  return { branchId, ids };
}

describe('a body of revolution cell', () => {
  it('runs with its analysis, each output equal to the engine computing the same cells in-process', async () => {
    const { branchId, ids } = await study({ source: 'spheroid', fineness: 5 });
    const ran = await runAndWait(engineer, branchId);
    const draft = (await engineer.get(`/api/branches/${branchId}/draft`).expect(200)).body as Draft;
    const body = draft.cells.find((c) => c.cellId === ids.body)!;
    const analysis = draft.cells.find((c) => c.cellId === ids.analysis)!;
    expect(ran.ran.filter((r) => r.status === 'ok').map((r) => r.cellId).sort()).toEqual([ids.flow, ids.body, ids.analysis].sort());
    const bodyInputs = CELL_SCHEMAS.body.inputs.parse({ source: 'spheroid', fineness: 5 });
    const expectedBody = computeCell('body', bodyInputs, {});
    expect((body.output!.result as BodyResult).geometry.fineness).toBeCloseTo(expectedBody.geometry.fineness, 6);
    const expected = computeCell('analysis', CELL_SCHEMAS.analysis.inputs.parse({ flowCellId: ids.flow, pressureCellId: ids.body, criteria: ['eN', 'michel'] }), {
      flowCellId: { kind: 'flow', inputs: CELL_SCHEMAS.flow.inputs.parse({ mode: 'reynolds', reynolds: 1.5e7, mach: 0, nCrit: 9 }), upstream: {} },
      pressureCellId: { kind: 'body', inputs: bodyInputs, upstream: {} },
    });
    const result = analysis.output!.result as EngineResult;
    expect(result.surfaces.map((s) => s.name)).toEqual(['body']);
    expect(result.inviscid?.kind).toBe('body');
    // Outputs are stored to 7 significant digits.
    expect(result.surfaces[0]!.transition.s!).toBeCloseTo(expected.surfaces[0]!.transition.s!, 6);
    // No drag coefficient for a body (the plane Squire–Young form does not apply), and the result says so.
    expect(result.cd).toBeNull();
    expect(expected.cd).toBeNull();
    expect(result.warnings.some((w) => /no drag coefficient is given for a body of revolution/.test(w))).toBe(true);
  });

  it('refuses a meridian that does not close on the axis, naming the field, and keeps the text as typed', async () => {
    const text = '# open tail (invented)\n0 0\n0.2 0.07\n0.5 0.09\n0.8 0.06\n1 0.03';
    const { branchId, ids } = await study({ source: 'coordinates', coordinates: text });
    await runAndWait(engineer, branchId, { cellIds: [ids.body] });
    const draft = (await engineer.get(`/api/branches/${branchId}/draft`).expect(200)).body as Draft;
    const body = draft.cells.find((c) => c.cellId === ids.body)!;
    expect(body.inputs['coordinates']).toBe(text);
    expect(body.output?.status).toBe('error');
    expect(body.output?.error).toMatchObject({ field: 'coordinates' });
    expect(body.output?.error?.message).toMatch(/start and end on the axis/);
  });

  it('refuses inputs out of range with the field named', async () => {
    const created = await engineer.post(`/api/projects/${t.demo.projectId}/studies`, { title: `Pod ${randomUUID().slice(0, 8)} (invented)` }).expect(201);
    const branchId = (await engineer.get(`/api/studies/${created.body.id}/branches`).expect(200)).body[0].id as string;
    const res = await engineer.put(`/api/branches/${branchId}/draft`, { baseRevision: 0, cells: [{ cellId: randomUUID(), kind: 'body', title: '', collapsed: false, inputs: { source: 'spheroid', fineness: 0.5 } }] });
    // A draft keeps what was typed; the cell says what is wrong.
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const cell = (res.body as Draft).cells[0]!;
    expect(cell.problems.map((p) => p.field)).toContain('fineness');
  });
});

describe('the nacelle project’s demo study (invented data)', () => {
  it('is seeded for the nacelle team only, and runs: the pod’s forebody laminar to eᴺ transition, a sweep of N_crit moving it aft as N_crit rises', async () => {
    const mine = (await engineer.get('/api/projects').expect(200)).body as { id: string; name: string }[];
    const nacelle = mine.find((p) => p.name === 'Larkspur T-62 nacelles')!;
    const studies = (await engineer.get(`/api/projects/${nacelle.id}/studies`).expect(200)).body as { id: string; title: string }[];
    const pod = studies.find((s) => s.title === 'Nacelle pod, cruise: laminar forebody (invented data)')!;
    expect(pod).toBeDefined();
    const reviewer = await signIn(t.app, 'reviewer', testEnv.publicUrl);
    await reviewer.get(`/api/studies/${pod.id}/branches`).expect(404);

    const branchId = (await engineer.get(`/api/studies/${pod.id}/branches`).expect(200)).body[0].id as string;
    await runAndWait(engineer, branchId);
    const draft = (await engineer.get(`/api/branches/${branchId}/draft`).expect(200)).body as Draft;
    expect(draft.cells.map((c) => c.kind)).toEqual(['note', 'flow', 'body', 'analysis', 'sweep']);
    expect(draft.cells.filter((c) => c.kind !== 'note').map((c) => c.output?.status)).toEqual(['ok', 'ok', 'ok', 'ok']);
    const analysis = draft.cells.find((c) => c.kind === 'analysis')!.output!.result as EngineResult;
    const surface = analysis.surfaces[0]!;
    expect(surface.transition.by).toBe('eN');
    // Ahead of the pod's widest point (x/L 0.42): transition on the forebody's falling pressure.
    const x = surface.stations.x!;
    const at = x[surface.stations.s.findIndex((s) => s >= surface.transition.s!)]!;
    expect(at).toBeGreaterThan(0.1);
    expect(at).toBeLessThan(0.42);
    const sweep = draft.cells.find((c) => c.kind === 'sweep')!.output!.result as { steps: { value: number; surfaces: { transitionX: number | null }[] }[] };
    const moves = sweep.steps.map((s) => s.surfaces[0]!.transitionX!);
    expect(moves).toHaveLength(7);
    for (let i = 1; i < moves.length; i++) expect(moves[i]!).toBeGreaterThanOrEqual(moves[i - 1]!);
  });
});
