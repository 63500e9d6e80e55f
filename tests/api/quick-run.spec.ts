import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { computeCell } from '@laminote/aero';
import { CELL_SCHEMAS, type Draft, type EngineResult } from '@laminote/contracts';
import { joukowskiLoop } from '../../libs/aero/test/joukowski';
import { createTestApp, type TestApp } from '../support/app';
import { testEnv } from '../support/env';
import { waitForJob } from '../support/run';
import { signIn, type SignedIn } from '../support/sign-in';

/**
 * A run of a few quick cells is computed at once by the server (200 with the draft), stored by key as
 * a job's would be; a run with a sweep is still a job (202). Issue 15: a small run answers in
 * milliseconds instead of waiting for a worker to take it from the queue.
 */

let t: TestApp;
let engineer: SignedIn;

beforeAll(async () => {
  t = await createTestApp();
  engineer = await signIn(t.app, 'engineer', testEnv.publicUrl);
});
afterAll(async () => {
  await t?.close();
});

/**
 * Exact potential flow past a symmetric Joukowski section (N. E. Joukowski 1910; L. M. Milne-Thomson,
 * "Theoretical Aerodynamics", ch. 7), the engine's own fixture, as a closed-loop `x y cp` table.
 */
function joukowskiTable(label: string): string {
  const loop = joukowskiLoop({ re: -0.08, im: 0 }, 0, 201);
  return [`# ${label}`, 'x y cp', ...loop.x.map((x, i) => `${x.toFixed(6)} ${loop.y[i]!.toFixed(6)} ${loop.cp[i]!.toFixed(6)}`)].join('\n');
}

async function study(withSweep: boolean) {
  const title = `Quick run ${randomUUID().slice(0, 8)}`;
  const created = await engineer.post(`/api/projects/${t.demo.projectId}/studies`, { title }).expect(201);
  const branchId = (await engineer.get(`/api/studies/${created.body.id}/branches`).expect(200)).body[0].id as string;
  const ids = { flow: randomUUID(), pressure: randomUUID(), analysis: randomUUID(), sweep: randomUUID() };
  const cells = [
    { cellId: ids.flow, kind: 'flow', inputs: { mode: 'reynolds', reynolds: 6e6, mach: 0, nCrit: 9 } },
    { cellId: ids.pressure, kind: 'pressure', inputs: { text: joukowskiTable(title) } },
    { cellId: ids.analysis, kind: 'analysis', inputs: { flowCellId: ids.flow, pressureCellId: ids.pressure, criteria: ['eN', 'michel'] } },
    ...(withSweep ? [{ cellId: ids.sweep, kind: 'sweep', inputs: { analysisCellId: ids.analysis, parameter: 'nCrit', from: 6, to: 12, steps: 7 } }] : []),
  ].map((c) => ({ title: '', collapsed: false, ...c }));
  const saved = await engineer.put(`/api/branches/${branchId}/draft`, { baseRevision: 0, cells }).expect(200);
  return { branchId, ids, cells, revision: (saved.body as Draft).revision };
}

describe('a run of a few quick cells', () => {
  it('is computed at once (200): the analysis and what it uses, equal to the engine computing in-process', async () => {
    const { branchId, ids, cells } = await study(false);
    const res = await engineer.post(`/api/branches/${branchId}/run`, { cellIds: [ids.analysis] }).expect(200);
    expect(res.body.ran.map((r: { cellId: string; status: string; reused: boolean }) => [r.cellId, r.status, r.reused])).toEqual([
      [ids.flow, 'ok', false],
      [ids.pressure, 'ok', false],
      [ids.analysis, 'ok', false],
    ]);
    const draft = res.body as Draft;
    expect(draft.cells.map((c) => c.runState)).toEqual(['current', 'current', 'current']);
    // The reference: the engine's one entry point in this process, on the same inputs.
    const inputs = (id: string, kind: 'flow' | 'pressure' | 'analysis') => CELL_SCHEMAS[kind].inputs.parse(cells.find((c) => c.cellId === id)!.inputs);
    const flow = { kind: 'flow' as const, inputs: inputs(ids.flow, 'flow'), upstream: {} };
    const pressure = { kind: 'pressure' as const, inputs: inputs(ids.pressure, 'pressure'), upstream: {} };
    const expected = computeCell('analysis', inputs(ids.analysis, 'analysis') as never, { flowCellId: flow, pressureCellId: pressure } as never) as unknown as EngineResult;
    const stored = draft.cells.find((c) => c.cellId === ids.analysis)!.output!.result as EngineResult;
    // Stored outputs keep seven significant digits (computeCellOutput), as a job's do.
    const seven = (v: number | null) => (v === null ? null : Number(v.toPrecision(7)));
    expect(stored.surfaces.map((s) => s.transition.s)).toEqual(expected.surfaces.map((s) => seven(s.transition.s)));
    expect(stored.cd).toBe(seven(expected.cd));
    // Stored by key: the same run again reuses every output.
    const again = await engineer.post(`/api/branches/${branchId}/run`, { cellIds: [ids.analysis] }).expect(200);
    expect(again.body.ran.map((r: { reused: boolean }) => r.reused)).toEqual([true, true, true]);
  });

  it('computes again after an edit upstream, never answering the output of the inputs before', async () => {
    const { branchId, ids, cells, revision } = await study(false);
    const first = await engineer.post(`/api/branches/${branchId}/run`, { cellIds: [ids.analysis] }).expect(200);
    const before = (first.body as Draft).cells.find((c) => c.cellId === ids.analysis)!.output!;
    const edited = cells.map((c) => (c.cellId === ids.flow ? { ...c, inputs: { ...c.inputs, reynolds: 9e6 } } : c));
    await engineer.put(`/api/branches/${branchId}/draft`, { baseRevision: revision, cells: edited }).expect(200);
    const second = await engineer.post(`/api/branches/${branchId}/run`, { cellIds: [ids.analysis] }).expect(200);
    const after = (second.body as Draft).cells.find((c) => c.cellId === ids.analysis)!;
    expect(after.runState).toBe('current');
    expect(after.output!.key).not.toBe(before.key);
    expect((after.output!.result as EngineResult).flow.reynolds).toBe(9e6);
  });

  it('is still a job (202) when a sweep has to be computed', async () => {
    const { branchId } = await study(true);
    const res = await engineer.post(`/api/branches/${branchId}/run`, {}).expect(202);
    const job = await waitForJob(engineer, res.body.jobId as string);
    expect(job.state).toBe('completed');
  });
});
