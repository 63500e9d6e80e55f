import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Draft, ImportStudyResult, StudyDocument } from '@laminote/contracts';
import { createTestApp, type TestApp } from '../support/app';
import { testEnv } from '../support/env';
import { signIn, type SignedIn } from '../support/sign-in';

/**
 * Moving a study (issue 16): the demo study is run and exported, and the export made a new study in a
 * project, keeping cells, inputs and outputs, with roles checked.
 */
let t: TestApp;
const as: Record<string, SignedIn> = {};
let document: StudyDocument;

async function runToEnd(who: SignedIn, branchId: string) {
  const run = await who.post(`/api/branches/${branchId}/run`, {});
  expect([200, 202], JSON.stringify(run.body)).toContain(run.status);
  for (let state = run.body?.job?.state as string | undefined; run.status === 202 && (state === 'queued' || state === 'running'); ) {
    await new Promise((resolve) => setTimeout(resolve, 100));
    state = (await who.get(`/api/jobs/${run.body.jobId}`).expect(200)).body.state;
  }
}

beforeAll(async () => {
  t = await createTestApp();
  for (const role of ['lead', 'engineer', 'viewer', 'outsider'] as const) as[role] = await signIn(t.app, role, testEnv.publicUrl);
  const branchId = (await as['lead']!.get(`/api/studies/${t.demo.studyId}/branches`).expect(200)).body[0].id as string;
  await runToEnd(as['lead']!, branchId);
  document = (await as['lead']!.get(`/api/branches/${branchId}/export`).expect(200)).body as StudyDocument;
}, 120_000);
afterAll(async () => t?.close());

describe('importing a study export', () => {
  it('makes a new study with every cell, its inputs and its outputs, current at once', async () => {
    const res = await as['engineer']!.post(`/api/projects/${t.demo.projectId}/studies/import`, { document, title: 'Outboard section, moved (invented data)' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const result = res.body as ImportStudyResult;
    const withOutput = document.cells.filter((c) => c.output).length;
    expect(result).toMatchObject({ title: 'Outboard section, moved (invented data)', cellCount: document.cells.length, outputsKept: withOutput, outputsLeft: 0 });
    expect(result.studyId).not.toBe(t.demo.studyId);

    const draft = (await as['engineer']!.get(`/api/branches/${result.branchId}/draft`).expect(200)).body as Draft;
    expect(draft.cells.map((c) => [c.kind, c.title])).toEqual(document.cells.map((c) => [c.kind, c.title]));
    // New cell ids, and the names between cells follow them.
    const oldIds = new Set(document.cells.map((c) => c.cellId));
    expect(draft.cells.some((c) => oldIds.has(c.cellId))).toBe(false);
    const newId = new Map(document.cells.map((c, i) => [c.cellId, draft.cells[i]!.cellId]));
    document.cells.forEach((c, i) => {
      for (const field of ['flowCellId', 'pressureCellId', 'analysisCellId']) {
        if (typeof c.inputs[field] === 'string' && c.inputs[field]) expect(draft.cells[i]!.inputs[field]).toBe(newId.get(c.inputs[field] as string));
      }
    });
    // Outputs came along: nothing to run, and the analysis says what it said.
    for (const cell of draft.cells.filter((c) => c.kind !== 'note')) expect(`${cell.title}: ${cell.runState}`).toBe(`${cell.title}: current`);
    const i = document.cells.findIndex((c) => c.kind === 'analysis');
    const before = document.cells[i]!.output!.result as { surfaces: { transition: { s: number } }[] };
    const after = draft.cells[i]!.output!.result as { surfaces: { transition: { s: number } }[] };
    expect(after.surfaces.map((s) => s.transition.s)).toEqual(before.surfaces.map((s) => s.transition.s));
    const rerun = await as['engineer']!.post(`/api/branches/${result.branchId}/run`, {});
    expect(rerun.status).toBe(200);
  });

  it('leaves behind outputs of another engine version, and the cells are then stale', async () => {
    const older = { ...document, cells: document.cells.map((c) => (c.output ? { ...c, output: { ...c.output, engineVersion: '0.9.0' } } : c)) };
    const result = (await as['lead']!.post(`/api/projects/${t.demo.projectId}/studies/import`, { document: older }).expect(201)).body as ImportStudyResult;
    expect(result.outputsKept).toBe(0);
    expect(result.title).toBe(document.study.title);
    const draft = (await as['lead']!.get(`/api/branches/${result.branchId}/draft`).expect(200)).body as Draft;
    expect(draft.cells.find((c) => c.kind === 'analysis')!.runState).not.toBe('current');
  });

  it('checks roles: a viewer may not, someone outside the project finds nothing', async () => {
    await as['viewer']!.post(`/api/projects/${t.demo.projectId}/studies/import`, { document }).expect(403);
    await as['outsider']!.post(`/api/projects/${t.demo.projectId}/studies/import`, { document }).expect(404);
  });

  it('names the field at fault in a document that is not a study export', async () => {
    const wrongFormat = await as['engineer']!.post(`/api/projects/${t.demo.projectId}/studies/import`, { document: { ...document, format: 'something/1' } }).expect(400);
    expect(wrongFormat.body.field).toBe('document.format');
    const unknownKind = await as['engineer']!.post(`/api/projects/${t.demo.projectId}/studies/import`, { document: { ...document, cells: [{ ...document.cells[0]!, kind: 'wormhole' }] } }).expect(400);
    expect(unknownKind.body.detail).toMatch(/cells\[0\]\.kind/);
  });
});
