import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Draft, DraftCell, EngineResult, FlowResult, PressureResult, RunResponse } from '@laminote/contracts';
import { joukowskiLoop } from '../../libs/aero/test/joukowski';
import { createTestApp, type TestApp } from '../support/app';
import { testEnv } from '../support/env';
import { runAndWait } from '../support/run';
import { signIn, type SignedIn } from '../support/sign-in';

let t: TestApp;
const as: Record<string, SignedIn> = {};

beforeAll(async () => {
  t = await createTestApp();
  for (const role of ['lead', 'engineer', 'reviewer', 'viewer', 'outsider'] as const) as[role] = await signIn(t.app, role, testEnv.publicUrl);
});
afterAll(async () => t?.close());

/**
 * Exact potential flow past a symmetric Joukowski section at zero incidence (N. E. Joukowski 1910;
 * L. M. Milne-Thomson, "Theoretical Aerodynamics", ch. 7), the engine's own test fixture, written as a
 * closed-loop `x y cp` table from the trailing edge over the upper side and back along the lower side.
 * 601 points give 2 × 300 stations.
 */
function joukowskiTable(points = 601): string {
  const loop = joukowskiLoop({ re: -0.08, im: 0 }, 0, points);
  return ['x y cp', ...loop.x.map((x, i) => `${x.toFixed(6)} ${loop.y[i]!.toFixed(6)} ${loop.cp[i]!.toFixed(6)}`)].join('\n');
}

interface CellSpec {
  cellId?: string;
  kind: DraftCell['kind'];
  title?: string;
  inputs: Record<string, unknown>;
}

/** A fresh study of the engineer's, with its main branch. */
async function newStudy(title: string): Promise<{ studyId: string; branchId: string }> {
  const study = await as['engineer']!.post(`/api/projects/${t.demo.projectId}/studies`, { title }).expect(201);
  const branches = await as['engineer']!.get(`/api/studies/${study.body.id}/branches`).expect(200);
  return { studyId: study.body.id, branchId: branches.body[0].id };
}

function save(who: SignedIn, branchId: string, baseRevision: number, cells: CellSpec[]) {
  return who.put(`/api/branches/${branchId}/draft`, { baseRevision, cells: cells.map((c) => ({ title: '', collapsed: false, ...c, cellId: c.cellId ?? randomUUID() })) });
}

const cellOf = (draft: Draft, cellId: string) => draft.cells.find((c) => c.cellId === cellId)!;

function standardCells() {
  const ids = { flow: randomUUID(), pressure: randomUUID(), analysis: randomUUID() };
  const flow = { cellId: ids.flow, kind: 'flow' as const, title: 'Wind-tunnel condition', inputs: { mode: 'reynolds', reynolds: 6e6, mach: 0, nCrit: 9 } };
  const pressure = { cellId: ids.pressure, kind: 'pressure' as const, title: 'Joukowski 12 %', inputs: { text: joukowskiTable() } };
  const analysis = { cellId: ids.analysis, kind: 'analysis' as const, title: 'Transition', inputs: { flowCellId: ids.flow, pressureCellId: ids.pressure } };
  return { ids, flow, pressure, analysis };
}

describe('draft', () => {
  it('gives every member the draft and hides it from outsiders', async () => {
    const branches = await as['viewer']!.get(`/api/studies/${t.demo.studyId}/branches`).expect(200);
    const branchId = branches.body[0].id as string;
    for (const role of ['lead', 'engineer', 'reviewer', 'viewer']) {
      const res = await as[role]!.get(`/api/branches/${branchId}/draft`).expect(200);
      expect(res.body).toMatchObject({ branchId, studyId: t.demo.studyId });
    }
    const res = await as['outsider']!.get(`/api/branches/${branchId}/draft`).expect(404);
    expect(res.body.type).toBe('/problems/not-found');
    await as['engineer']!.get(`/api/branches/${randomUUID()}/draft`).expect(404);
  });

  it('opens a study in one read: the study, its branches and the draft of the branch asked for (else main), for members only', async () => {
    const { studyId, branchId } = await newStudy('Opening');
    const cell = { kind: 'note' as const, title: 'Reading', inputs: { markdown: 'hello' } };
    await save(as['engineer']!, branchId, 0, [cell]).expect(200);
    const draft = (await as['viewer']!.get(`/api/branches/${branchId}/draft`).expect(200)).body as Draft;
    const study = (await as['viewer']!.get(`/api/studies/${studyId}`).expect(200)).body;
    const branches = (await as['viewer']!.get(`/api/studies/${studyId}/branches`).expect(200)).body;
    for (const query of ['', '?branch=main', `?branch=${branchId}`]) {
      const opening = await as['viewer']!.get(`/api/studies/${studyId}/opening${query}`).expect(200);
      // The same study, branches and draft as their own reads give.
      expect(opening.body).toEqual({ study, branches, draft });
    }
    const none = await as['viewer']!.get(`/api/studies/${studyId}/opening?branch=${encodeURIComponent('no such branch')}`).expect(200);
    expect(none.body).toEqual({ study, branches, draft: null });
    const hostile = await as['viewer']!.get(`/api/studies/${studyId}/opening?branch=a%00b`).expect(400);
    expect(hostile.body.detail ?? hostile.body.title).toMatch(/branch/i);
    await as['outsider']!.get(`/api/studies/${studyId}/opening`).expect(404);
    await as['viewer']!.get(`/api/studies/${randomUUID()}/opening`).expect(404);
    await request(t.app).get(`/api/studies/${studyId}/opening`).expect(401);
  });

  it('validates cells by their kind and names the field at fault, keeping what was typed', async () => {
    const { branchId } = await newStudy('Validation');
    const flowId = randomUUID();
    const inputs = { mode: 'altitude', altitude_m: 25000, mach: 1.2, referenceLength_m: -1 };
    const saved = await save(as['engineer']!, branchId, 0, [
      { cellId: flowId, kind: 'flow', inputs },
      { kind: 'analysis', inputs: { flowCellId: randomUUID(), pressureCellId: flowId } },
      { kind: 'pressure', inputs: { text: 'x cp\n1 0.2\n0.5 abc\n0 1' } },
    ]).expect(200);
    const [flow, analysis, pressure] = saved.body.cells as DraftCell[];
    expect(flow!.inputs).toEqual(inputs);
    expect(flow!.problems.map((p) => p.field).sort()).toEqual(['altitude_m', 'mach', 'referenceLength_m']);
    expect(analysis!.problems).toEqual(
      expect.arrayContaining([
        { field: 'flowCellId', message: expect.stringMatching(/names no cell/) },
        { field: 'pressureCellId', message: expect.stringMatching(/Flow condition cell, not a Pressure distribution/) },
      ]),
    );
    expect(pressure!.problems).toContainEqual({ field: 'text', line: 3, message: expect.stringMatching(/^line 3: "abc" is not a number/) });
    expect(saved.body.cells.every((c: DraftCell) => c.runState === 'idle')).toBe(true);
  });

  it('refuses a malformed save with 400 naming the field, and a cell id used twice', async () => {
    const { branchId } = await newStudy('Malformed');
    const res = await as['engineer']!.put(`/api/branches/${branchId}/draft`, { baseRevision: 0, cells: [{ cellId: 'nope', kind: 'wing', inputs: {} }] }).expect(400);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(res.body.errors.map((e: { field: string }) => e.field).sort()).toEqual(['cells[0].cellId', 'cells[0].kind']);
    const id = randomUUID();
    const twice = await save(as['engineer']!, branchId, 0, [
      { cellId: id, kind: 'note', inputs: { markdown: 'a' } },
      { cellId: id, kind: 'note', inputs: { markdown: 'b' } },
    ]).expect(400);
    expect(twice.body.field).toBe('cells[1].cellId');
  });

  it('answers a stale save with 409 and the current draft; nothing is lost', async () => {
    const { branchId } = await newStudy('Two writers');
    const a = { cellId: randomUUID(), kind: 'note' as const, inputs: { markdown: 'Engineer: scope of the study' } };
    await save(as['engineer']!, branchId, 0, [a]).expect(200);
    const b = { cellId: randomUUID(), kind: 'note' as const, inputs: { markdown: 'Lead: check the root too' } };
    const c = { cellId: randomUUID(), kind: 'note' as const, inputs: { markdown: 'Engineer: second thought' } };
    // Both writers saw revision 1 and save at once.
    const [first, second] = await Promise.all([save(as['lead']!, branchId, 1, [a, b]), save(as['engineer']!, branchId, 1, [a, c])]);
    const statuses = [first.status, second.status].sort();
    expect(statuses).toEqual([200, 409]);
    const lost = first.status === 409 ? first : second;
    const won = first.status === 200 ? first : second;
    expect(lost.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(lost.body).toMatchObject({ status: 409, type: '/problems/conflict', baseRevision: 1, currentRevision: 2 });
    expect(lost.body.current.revision).toBe(2);
    expect(lost.body.current.cells.map((x: DraftCell) => x.cellId)).toEqual(won.body.cells.map((x: DraftCell) => x.cellId));
    // The loser merges on top of the current revision: both edits survive.
    const winnerCells = (won.body as Draft).cells.map(({ cellId, kind, title, collapsed, inputs }) => ({ cellId, kind, title, collapsed, inputs }));
    const loserCell = first.status === 409 ? b : c;
    const merged = await save(as[first.status === 409 ? 'lead' : 'engineer']!, branchId, 2, [...winnerCells, loserCell]).expect(200);
    expect(merged.body.revision).toBe(3);
    expect(merged.body.cells.map((x: DraftCell) => x.inputs['markdown'])).toHaveLength(3);
  });

  it('puts removed cells in the trash, newest first, and brings them back with their outputs', async () => {
    const { branchId } = await newStudy('Trash');
    const plate = { cellId: randomUUID(), kind: 'flatPlate' as const, title: 'Fairing', inputs: { reynolds: 5e6, transitionMode: 'location', transitionLocation: 0.4 } };
    const note = { cellId: randomUUID(), kind: 'note' as const, inputs: { markdown: 'keep me' } };
    await save(as['engineer']!, branchId, 0, [plate, note]).expect(200);
    const ran = await runAndWait(as['engineer']!, branchId, {});
    const key = cellOf(ran, plate.cellId).output!.key;
    await save(as['engineer']!, branchId, 1, [note]).expect(200);
    const gone = await save(as['engineer']!, branchId, 2, []).expect(200);
    expect(gone.body.trash.map((x: { cellId: string }) => x.cellId)).toEqual([note.cellId, plate.cellId]);
    expect(gone.body.trash[0]).toMatchObject({ deletedBy: expect.any(String), deletedByName: expect.any(String), inputs: { markdown: 'keep me' } });
    const back = await save(as['engineer']!, branchId, 3, [gone.body.trash[1]]).expect(200);
    expect(back.body.trash.map((x: { cellId: string }) => x.cellId)).toEqual([note.cellId]);
    expect(cellOf(back.body, plate.cellId)).toMatchObject({ runState: 'current', output: { key } });
  });

  it('writes one audit event per save and per run', async () => {
    const { branchId } = await newStudy('Audit');
    await save(as['engineer']!, branchId, 0, [{ kind: 'note', inputs: { markdown: 'x' } }]).expect(200);
    await runAndWait(as['engineer']!, branchId, {});
    const { rows } = await t.database.pool.query<{ action: string }>('select action from audit_events where target_id = $1', [branchId]);
    expect(rows.map((r) => r.action).sort()).toEqual(['cells.run', 'draft.save']);
  });
});

describe('the demo study', () => {
  it('holds the invented Larkspur T-62 notebook, which runs end to end', async () => {
    const branches = await as['engineer']!.get(`/api/studies/${t.demo.studyId}/branches`).expect(200);
    const branchId = branches.body[0].id as string;
    const draft = (await as['viewer']!.get(`/api/branches/${branchId}/draft`).expect(200)).body as Draft;
    expect(draft.cells.map((c) => c.kind)).toEqual(['note', 'flow', 'pressure', 'analysis', 'sweep', 'flatPlate', 'leadingEdge']);
    expect(draft.cells[0]!.inputs['markdown']).toMatch(/Invented data/);
    expect(draft.cells[2]!.inputs['text']).toMatch(/INVENTED DATA/);
    expect(draft.cells.every((c) => c.problems.length === 0 && c.runState === 'idle')).toBe(true);
    const ran = await runAndWait(as['engineer']!, branchId, {});
    expect(ran.ran.map((r) => [r.kind, r.status])).toEqual([
      ['flow', 'ok'],
      ['pressure', 'ok'],
      ['analysis', 'ok'],
      ['sweep', 'ok'],
      ['flatPlate', 'ok'],
      ['leadingEdge', 'ok'],
    ]);
    const analysis = cellOf(ran, draft.cells[3]!.cellId).output!.result as EngineResult;
    expect(analysis.surfaces.map((s) => s.name)).toEqual(['upper', 'lower']);
    for (const surface of analysis.surfaces) expect(surface.transition.s).not.toBeNull();
    // The flow cell's sweep reaches the attachment-line check of the analysis.
    expect(analysis.attachmentLine).not.toBeNull();
  });
});

describe('roles', () => {
  it('lets reviewers and viewers read but not save or run (403); outsiders get 404', async () => {
    const { branchId } = await newStudy('Roles');
    const cell = { kind: 'note' as const, inputs: { markdown: 'hello' } };
    for (const role of ['reviewer', 'viewer']) {
      const put = await save(as[role]!, branchId, 0, [cell]).expect(403);
      expect(put.body.type).toBe('/problems/forbidden');
      await as[role]!.post(`/api/branches/${branchId}/run`, {}).expect(403);
      await as[role]!.get(`/api/branches/${branchId}/draft`).expect(200);
    }
    await save(as['outsider']!, branchId, 0, [cell]).expect(404);
    await as['outsider']!.post(`/api/branches/${branchId}/run`, {}).expect(404);
    const draft = await as['lead']!.get(`/api/branches/${branchId}/draft`).expect(200);
    expect(draft.body.revision).toBe(0);
    await save(as['lead']!, branchId, 0, [cell]).expect(200);
  });

  it('refuses anonymous calls (401) and state changes without the anti-forgery token (403)', async () => {
    const { branchId } = await newStudy('Forgery');
    await request(t.app).get(`/api/branches/${branchId}/draft`).expect(401);
    await as['engineer']!.agent.put(`/api/branches/${branchId}/draft`).send({ baseRevision: 0, cells: [] }).expect(403);
    await as['engineer']!.agent.post(`/api/branches/${branchId}/run`).send({}).expect(403);
  });
});

describe('runs', () => {
  it('derives the flow condition from the standard atmosphere', async () => {
    const { branchId } = await newStudy('Cruise condition');
    const flowId = randomUUID();
    await save(as['engineer']!, branchId, 0, [{ cellId: flowId, kind: 'flow', inputs: { mode: 'altitude', altitude_m: 12500, mach: 0.72, referenceLength_m: 1.9, turbulenceMode: 'intensity', turbulenceIntensity: 0.001 } }]).expect(200);
    const ran = await runAndWait(as['engineer']!, branchId, { cellIds: [flowId] });
    const r = cellOf(ran, flowId).output!.result as FlowResult;
    // U.S. Standard Atmosphere 1976: 216.65 K from 11 to 20 km; p = 22 632.06 Pa · exp(−g0 (h − 11 000)/(R T)) there (eq. 33b).
    expect(r.temperature_K).toBeCloseTo(216.65, 2);
    expect(r.pressure_Pa).toBeCloseTo(22632.06 * Math.exp((-9.80665 * 1500) / (287.0531 * 216.65)), -1);
    // a = √(γ R T), V = M a, q = ½ ρ V² (definitions).
    expect(r.speed_mps).toBeCloseTo(0.72 * Math.sqrt(1.4 * 287.0531 * 216.65), 1);
    expect(r.dynamicPressure_Pa).toBeCloseTo(0.5 * r.density_kgm3! * r.speed_mps! ** 2, 3);
    expect(r.reynolds).toBeCloseTo((r.speed_mps! * 1.9) / r.kinematicViscosity_m2s!, -2);
    // Mack's relation N = −8.43 − 2.4 ln Tu (L. M. Mack, AGARD Report 709, 1984): Tu = 0.1 % gives 8.15.
    expect(r.nCrit).toBeCloseTo(-8.43 - 2.4 * Math.log(0.001), 6);
  });

  it('runs a study in dependency order, caches by key, and marks cells outdated when the flow upstream changes', async () => {
    const { branchId } = await newStudy('Joukowski section');
    const { ids, flow, pressure, analysis } = standardCells();
    // The analysis comes first in the stack: order on screen is not run order.
    await save(as['engineer']!, branchId, 0, [analysis, flow, pressure]).expect(200);
    const first = await runAndWait(as['engineer']!, branchId, { cellIds: [ids.analysis] });
    expect(first.ran.map((r) => [r.cellId, r.status, r.reused])).toEqual([
      [ids.analysis, 'ok', false],
      [ids.flow, 'ok', false],
      [ids.pressure, 'ok', false],
    ]);
    expect(first.revision).toBe(1);
    const out = cellOf(first, ids.analysis);
    expect(out.runState).toBe('current');
    const result = out.output!.result as EngineResult;
    expect(result.surfaces.map((s) => s.name)).toEqual(['upper', 'lower']);
    // A symmetric section at zero incidence: both sides carry the same boundary layer (exact by symmetry).
    const [upper, lower] = result.surfaces;
    expect(upper!.transition.s).not.toBeNull();
    expect(upper!.transition.s!).toBeCloseTo(lower!.transition.s!, 2);
    const pressureOut = cellOf(first, ids.pressure).output!.result as PressureResult;
    // The stagnation point of a symmetric section at zero incidence is its leading edge, x = 0, y = 0.
    expect(pressureOut.stagnation!.x).toBeCloseTo(0, 3);
    expect(pressureOut.stagnation!.y!).toBeCloseTo(0, 3);

    // Running again computes nothing: every key is stored already.
    const completed = t.worker!.runner.processed;
    const again = await runAndWait(as['engineer']!, branchId, {});
    expect(again.ran.every((r) => r.reused && r.status === 'ok')).toBe(true);
    expect(again.jobId).toBeNull();
    expect(t.worker!.runner.processed).toBe(completed);
    expect(cellOf(again, ids.analysis).output!.computedAt).toBe(out.output!.computedAt);

    // A higher Reynolds number upstream outdates the analysis (and the flow cell) but not the table.
    const faster = { ...flow, inputs: { ...flow.inputs, reynolds: 2e7 } };
    const edited = (await save(as['engineer']!, branchId, 1, [analysis, faster, pressure]).expect(200)).body as Draft;
    expect(edited.cells.map((c) => [c.cellId, c.runState])).toEqual([
      [ids.analysis, 'outdated'],
      [ids.flow, 'outdated'],
      [ids.pressure, 'current'],
    ]);
    expect(cellOf(edited, ids.analysis).output!.key).toBe(out.output!.key);
    const rerun = await runAndWait(as['engineer']!, branchId, {});
    expect(rerun.ran.find((r) => r.cellId === ids.pressure)!.reused).toBe(true);
    expect(rerun.ran.find((r) => r.cellId === ids.analysis)!.reused).toBe(false);
    const fastUpper = (cellOf(rerun, ids.analysis).output!.result as EngineResult).surfaces[0]!;
    // A higher Reynolds number moves natural transition forward (common practice).
    expect(fastUpper.transition.s!).toBeLessThan(upper!.transition.s!);

    // Going back to the first Reynolds number finds the first outputs again: the run computes nothing.
    await save(as['engineer']!, branchId, 2, [analysis, flow, pressure]).expect(200);
    const before = t.worker!.runner.processed;
    const back = await runAndWait(as['engineer']!, branchId, {});
    expect(back.ran.every((r) => r.reused)).toBe(true);
    expect(back.jobId).toBeNull();
    expect(t.worker!.runner.processed).toBe(before);
    expect(cellOf(back, ids.analysis).output!.key).toBe(out.output!.key);
  });

  it('sees cells another writer changed at once: the draft and the run read them again (the cells token)', async () => {
    const { branchId } = await newStudy('Changed elsewhere');
    const { ids, flow, pressure, analysis } = standardCells();
    await save(as['engineer']!, branchId, 0, [flow, pressure, analysis]).expect(200);
    const first = await as['engineer']!.post(`/api/branches/${branchId}/run`, { cellIds: [ids.analysis] }).expect(200);
    const firstKey = (first.body as RunResponse).ran.find((r) => r.cellId === ids.analysis)!.key;
    await as['engineer']!.get(`/api/branches/${branchId}/draft`).expect(200);
    const tokenOf = async () => (await t.database.pool.query<{ token: string }>('select cells_token as token from drafts where branch_id = $1', [branchId])).rows[0]!.token;
    const before = await tokenOf();
    // Another writer (a second server, a script, a restore) sets a new Reynolds number in the cells.
    const { rows } = await t.database.pool.query<{ cells: { cellId: string; inputs: Record<string, unknown> }[] }>('select cells from drafts where branch_id = $1', [branchId]);
    const cells = rows[0]!.cells.map((c) => (c.cellId === ids.flow ? { ...c, inputs: { ...c.inputs, reynolds: 7e6 } } : c));
    await t.database.pool.query('update drafts set cells = $1::jsonb where branch_id = $2', [JSON.stringify(cells), branchId]);
    expect(await tokenOf()).not.toBe(before);

    const draft = (await as['engineer']!.get(`/api/branches/${branchId}/draft`).expect(200)).body as Draft;
    expect(cellOf(draft, ids.flow).inputs).toMatchObject({ reynolds: 7e6 });
    expect(cellOf(draft, ids.analysis).runState).toBe('outdated');
    const again = (await as['engineer']!.post(`/api/branches/${branchId}/run`, { cellIds: [ids.analysis] }).expect(200)).body as RunResponse;
    const report = again.ran.find((r) => r.cellId === ids.analysis)!;
    expect(report).toMatchObject({ status: 'ok', reused: false });
    expect(report.key).not.toBe(firstKey);
    // The draft as saved by the author next (based on the revision they hold) keeps working.
    await save(as['engineer']!, branchId, draft.revision, [{ ...flow, inputs: { ...flow.inputs, reynolds: 8e6 } }, pressure, analysis]).expect(200);
    const last = (await as['engineer']!.get(`/api/branches/${branchId}/draft`).expect(200)).body as Draft;
    expect(cellOf(last, ids.flow).inputs).toMatchObject({ reynolds: 8e6 });
  });

  it('does not make the next autosave stale: runs leave the revision alone', async () => {
    const { branchId } = await newStudy('Run while typing');
    const { ids, flow, pressure, analysis } = standardCells();
    await save(as['engineer']!, branchId, 0, [flow, pressure, analysis]).expect(200);
    const [ran, typed] = await Promise.all([
      runAndWait(as['engineer']!, branchId),
      save(as['engineer']!, branchId, 1, [{ ...flow, title: 'Wind-tunnel condition, typed meanwhile' }, pressure, analysis]),
    ]);
    expect(ran.ran.map((r) => r.status)).toEqual(['ok', 'ok', 'ok']);
    expect(typed.status).toBe(200);
    const next = await save(as['engineer']!, branchId, 2, [{ ...flow, title: 'Renamed again' }, pressure, analysis]).expect(200);
    expect(next.body.revision).toBe(3);
    // The run's outputs survived the saves (renaming does not outdate a cell).
    expect(cellOf(next.body, ids.analysis).runState).toBe('current');
  });

  it('stores a failed run with the engine message and keeps the last good output, marked outdated', async () => {
    const { branchId } = await newStudy('Failing table');
    const { ids, flow, pressure, analysis } = standardCells();
    await save(as['engineer']!, branchId, 0, [flow, pressure, analysis]).expect(200);
    const good = await runAndWait(as['engineer']!, branchId, {});
    const goodKey = cellOf(good, ids.analysis).output!.key;
    // A Cp of 1.5 is above the stagnation value 1 at Mach 0: no flow has it (Bernoulli).
    const lines = joukowskiTable().split('\n');
    lines[40] = lines[40]!.replace(/\S+$/, '1.5');
    const broken = { ...pressure, inputs: { text: lines.join('\n') } };
    await save(as['engineer']!, branchId, 1, [flow, broken, analysis]).expect(200);
    const bad = await runAndWait(as['engineer']!, branchId, { cellIds: [ids.analysis] });
    const cell = cellOf(bad, ids.analysis);
    expect(cell.runState).toBe('failed');
    expect(cell.output).toMatchObject({ status: 'error', error: { field: 'pressureTable line 41', line: 41, message: expect.stringMatching(/stagnation value/) } });
    expect(cell.lastGoodOutput).toMatchObject({ status: 'ok', key: goodKey });
    // The table stays exactly as typed.
    expect(cellOf(bad, ids.pressure).inputs['text']).toBe(lines.join('\n'));
    const reread = (await as['viewer']!.get(`/api/branches/${branchId}/draft`).expect(200)).body as Draft;
    expect(cellOf(reread, ids.analysis).lastGoodOutput!.key).toBe(goodKey);
  });

  it('reports line-numbered parse problems of a pasted table as the failed output of the pressure cell', async () => {
    const { branchId } = await newStudy('Parse problems');
    const id = randomUUID();
    await save(as['engineer']!, branchId, 0, [{ cellId: id, kind: 'pressure', inputs: { text: '# from the tunnel\n1.0 0.1\n0.5 -0.3\n0,0 1,0;\n0.5 oops\n1.0 0.1' } }]).expect(200);
    const ran = await runAndWait(as['engineer']!, branchId, {});
    const out = cellOf(ran, id).output!;
    expect(out.status).toBe('error');
    expect(out.error!.field).toBe('text');
    expect(out.error!.problems!.map((p) => p.line)).toEqual([4, 5]);
  });

  it('refuses to run cells the draft does not hold, naming the index', async () => {
    const { branchId } = await newStudy('Unknown cell');
    const res = await as['engineer']!.post(`/api/branches/${branchId}/run`, { cellIds: [randomUUID()] }).expect(400);
    expect(res.body.field).toBe('cellIds[0]');
  });

  it('computes flat-plate estimates, leading-edge checks and sweeps', async () => {
    const { branchId } = await newStudy('Quick estimates');
    const { ids, flow, pressure, analysis } = standardCells();
    const plate = { cellId: randomUUID(), kind: 'flatPlate' as const, inputs: { reynolds: 1e7, transitionMode: 'location', transitionLocation: 1 } };
    const le = { cellId: randomUUID(), kind: 'leadingEdge' as const, inputs: { flowCellId: ids.flow, sweepDeg: 30, mode: 'radius', leadingEdgeRadius: 0.01 } };
    const sweep = { cellId: randomUUID(), kind: 'sweep' as const, inputs: { analysisCellId: ids.analysis, parameter: 'reynolds', from: 3e6, to: 1.5e7, steps: 4 } };
    await save(as['engineer']!, branchId, 0, [sweep, le, plate, flow, pressure, analysis]).expect(200);
    const ran = await runAndWait(as['engineer']!, branchId, {});
    expect(ran.ran.every((r) => r.status === 'ok')).toBe(true);
    const p = cellOf(ran, plate.cellId).output!.result as { cfMixed: number; cfLaminar: number };
    // Blasius: mean CF = 1.328/√Re_L for a plate laminar to its end (H. Blasius 1908).
    expect(p.cfMixed).toBeCloseTo(1.328 / Math.sqrt(1e7), 7);
    const l = cellOf(ran, le.cellId).output!.result as { reBar: number; verdict: string };
    // Poll (1979): R̄ = √(Re r sin Λ tan Λ / 2) from a circular leading edge, here Re = 6e6, r/c = 0.01, Λ = 30°.
    const sweepRad = Math.PI / 6;
    // Results are kept to 7 significant digits.
    expect(l.reBar).toBeCloseTo(Math.sqrt((6e6 * 0.01 * Math.sin(sweepRad) * Math.tan(sweepRad)) / 2), 4);
    const s = cellOf(ran, sweep.cellId).output!.result as { values: number[]; steps: { surfaces: { transitionS: number }[] }[] };
    expect(s.values).toEqual([3e6, 7e6, 1.1e7, 1.5e7]);
    const upperTransition = s.steps.map((step) => step.surfaces[0]!.transitionS);
    // Transition moves forward as the Reynolds number rises (common practice).
    for (let i = 1; i < upperTransition.length; i++) expect(upperTransition[i]!).toBeLessThanOrEqual(upperTransition[i - 1]!);
  });
});

describe('trips, single surfaces and limits', () => {
  it('forces transition at a trip given at x/c, on that surface only', async () => {
    const { branchId } = await newStudy('Tripped');
    const { ids, flow, pressure, analysis } = standardCells();
    const tripped = { ...analysis, inputs: { ...analysis.inputs, trips: { upper: 0.05 } } };
    await save(as['engineer']!, branchId, 0, [flow, pressure, tripped]).expect(200);
    const ran = await runAndWait(as['engineer']!, branchId, {});
    const r = cellOf(ran, ids.analysis).output!.result as EngineResult;
    const [upper, lower] = r.surfaces;
    // A trip ahead of natural transition sets it there (common practice: that is what a trip strip is for).
    expect(upper!.transition.by).toBe('trip');
    const st = upper!.stations;
    const i = st.s.findIndex((s) => s >= upper!.transition.s!);
    expect(st.x![i]!).toBeCloseTo(0.05, 2);
    expect(lower!.transition.by).not.toBe('trip');
    // The stations keep their chordwise coordinate when the case had to be split here.
    expect(st.x).toHaveLength(st.s.length);

    const wrong = { ...analysis, inputs: { ...analysis.inputs, trips: { nacelle: 0.1 } } };
    await save(as['engineer']!, branchId, 1, [flow, pressure, wrong]).expect(200);
    const bad = await runAndWait(as['engineer']!, branchId, {});
    expect(cellOf(bad, ids.analysis).output!.error).toMatchObject({ field: 'trips.nacelle', message: expect.stringMatching(/no surface named "nacelle"/) });
  });

  it('reads a single axisymmetric surface with its radius column', async () => {
    const { branchId } = await newStudy('Nacelle lip');
    const flowId = randomUUID();
    const id = randomUUID();
    // A body of revolution r = 0.1 + 0.05 √x with a mild favourable gradient (invented for the check).
    const rows = Array.from({ length: 120 }, (_, k) => {
      const x = (k / 119) ** 1.5;
      return `${x.toFixed(6)} ${(0.1 + 0.05 * Math.sqrt(x)).toFixed(6)} ${(-0.1 - 0.2 * x).toFixed(6)}`;
    });
    const text = ['x r cp', ...rows].join('\n');
    await save(as['engineer']!, branchId, 0, [
      { cellId: flowId, kind: 'flow', inputs: { mode: 'reynolds', reynolds: 5e6, mach: 0 } },
      { cellId: id, kind: 'pressure', inputs: { text, layout: 'surface', surfaceName: 'outer', hasRadius: true } },
      { kind: 'analysis', inputs: { flowCellId: flowId, pressureCellId: id } },
    ]).expect(200);
    const ran = await runAndWait(as['engineer']!, branchId, {});
    expect(ran.ran.map((r) => r.status)).toEqual(['ok', 'ok', 'ok']);
    const p = cellOf(ran, id).output!.result as PressureResult;
    expect(p.surfaces.map((s) => s.name)).toEqual(['outer']);
    expect(p.surfaces[0]!.r![0]).toBeCloseTo(0.1, 6);
    const a = ran.cells[2]!.output!.result as EngineResult;
    expect(a.surfaces.map((s) => s.name)).toEqual(['outer']);

    const noHeader = { cellId: id, kind: 'pressure' as const, inputs: { text: rows.join('\n'), layout: 'surface', hasRadius: true } };
    await save(as['engineer']!, branchId, 1, [noHeader]).expect(200);
    const bad = await runAndWait(as['engineer']!, branchId, {});
    expect(cellOf(bad, id).output!.error).toMatchObject({ field: 'text', message: expect.stringMatching(/header row/) });
  });

  it('keeps a table over the size limit as typed, with a problem naming the field', async () => {
    const { branchId } = await newStudy('Huge table');
    const id = randomUUID();
    const text = `x cp\n${'0.5 0.1\n'.repeat(640_000)}`;
    const res = await save(as['engineer']!, branchId, 0, [{ cellId: id, kind: 'pressure', inputs: { text } }]).expect(200);
    expect(cellOf(res.body, id).problems).toContainEqual({ field: 'text', message: expect.stringMatching(/longer than 5 million characters/) });
    expect((cellOf(res.body, id).inputs['text'] as string).length).toBe(text.length);
  });

  it('answers a draft save over 16 MB with 413 and says the limit', async () => {
    const { branchId } = await newStudy('Too big');
    const cells = Array.from({ length: 4 }, () => ({ kind: 'note' as const, inputs: { markdown: 'x'.repeat(4_500_000) } }));
    const res = await save(as['engineer']!, branchId, 0, cells).expect(413);
    expect(res.body).toMatchObject({ type: '/problems/too-large', detail: expect.stringMatching(/16 MB/) });
  });
});

describe('uploads', () => {
  it('stores an uploaded table byte for byte with its SHA-256 and gives it back to members only', async () => {
    const { studyId } = await newStudy('Upload');
    const bytes = Buffer.from('# tap data, Tamsk tunnel (invented)\r\nx\tcp\r\n1.0\t0.12\r\n0.0\t1.0\r\n', 'utf8');
    const res = await as['engineer']!.agent.post(`/api/studies/${studyId}/uploads`).set('x-xsrf-token', as['engineer']!.csrf).attach('file', bytes, { filename: 'tunnel run 7.txt', contentType: 'text/plain' }).expect(201);
    // SHA-256 by Node's crypto (FIPS 180-4) over the bytes sent.
    const { createHash } = await import('node:crypto');
    expect(res.body).toMatchObject({ filename: 'tunnel run 7.txt', size: bytes.length, sha256: createHash('sha256').update(bytes).digest('hex'), text: bytes.toString('utf8'), encoding: 'utf-8' });
    const back = await as['viewer']!.get(`/api/uploads/${res.body.uploadId}/content`).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    }).expect(200);
    expect(Buffer.compare(back.body as Buffer, bytes)).toBe(0);
    expect(back.headers['content-disposition']).toMatch(/attachment/);
    await as['outsider']!.get(`/api/uploads/${res.body.uploadId}/content`).expect(404);
    await as['viewer']!.agent.post(`/api/studies/${studyId}/uploads`).set('x-xsrf-token', as['viewer']!.csrf).attach('file', bytes, 'x.txt').expect(403);
  });

  it('refuses a file over 5 MB with 413 and a clear message', async () => {
    const { studyId } = await newStudy('Big upload');
    const big = Buffer.alloc(5 * 1024 * 1024 + 1, 'x');
    const res = await as['engineer']!.agent.post(`/api/studies/${studyId}/uploads`).set('x-xsrf-token', as['engineer']!.csrf).attach('file', big, 'big.txt').expect(413);
    expect(res.body).toMatchObject({ type: '/problems/too-large', field: 'file', detail: expect.stringMatching(/5 MB/) });
  });

  it('asks for the field "file" when none is sent', async () => {
    const { studyId } = await newStudy('No file');
    const res = await as['engineer']!.agent.post(`/api/studies/${studyId}/uploads`).set('x-xsrf-token', as['engineer']!.csrf).field('name', 'x').expect(400);
    expect(res.body.field).toBe('file');
  });
});

describe('export', () => {
  it('exports an analysis as CSV (stations per surface) and JSON (with the summary and the caution)', async () => {
    const { branchId } = await newStudy('Export');
    const { ids, flow, pressure, analysis } = standardCells();
    await save(as['engineer']!, branchId, 0, [flow, pressure, { ...analysis, title: 'Cruise transition' }]).expect(200);
    await as['viewer']!.get(`/api/branches/${branchId}/cells/${ids.analysis}/export?format=csv`).expect(409);
    const ran = await runAndWait(as['engineer']!, branchId, {});
    const result = cellOf(ran, ids.analysis).output!.result as EngineResult;

    const csv = await as['viewer']!.get(`/api/branches/${branchId}/cells/${ids.analysis}/export?format=csv`).expect(200);
    expect(csv.headers['content-type']).toMatch(/^text\/csv/);
    expect(csv.headers['content-disposition']).toMatch(/^attachment; filename="?export-cruise-transition\.csv"?$/);
    const lines = csv.text.trim().split('\n');
    const comments = lines.filter((l) => l.startsWith('#'));
    expect(comments.join(' ')).toMatch(/Engineering estimates/);
    const data = lines.filter((l) => !l.startsWith('#'));
    expect(data[0]).toBe('surface,s,x,ue,theta,deltaStar,H,cf,n');
    const rows = data.slice(1).map((l) => l.split(','));
    expect(rows).toHaveLength(result.surfaces[0]!.stations.s.length + result.surfaces[1]!.stations.s.length);
    expect(new Set(rows.map((r) => r[0]))).toEqual(new Set(['upper', 'lower']));
    expect(Number(rows[5]![1])).toBe(result.surfaces[0]!.stations.s[5]);

    const json = await as['viewer']!.get(`/api/branches/${branchId}/cells/${ids.analysis}/export?format=json`).expect(200);
    expect(json.headers['content-disposition']).toMatch(/^attachment; filename="?export-cruise-transition\.json"?$/);
    expect(json.body).toMatchObject({ state: 'current', cell: { cellId: ids.analysis, kind: 'analysis' }, caution: expect.stringMatching(/Engineering estimates/) });
    expect(json.body.summary.surfaces.map((s: { surface: string }) => s.surface)).toEqual(['upper', 'lower']);
    expect(json.body.summary.surfaces[0].transitionS).toBe(result.surfaces[0]!.transition.s);

    await as['viewer']!.get(`/api/branches/${branchId}/cells/${ids.analysis}/export?format=xls`).expect(400);
    await as['outsider']!.get(`/api/branches/${branchId}/cells/${ids.analysis}/export?format=csv`).expect(404);
  });
});
