import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Comparison, Draft, SaveConflict, StudyHistory, VersionDetail, VersionSummary } from '@laminote/contracts';
import { createTestApp, type TestApp } from '../support/app';
import { testEnv } from '../support/env';
import { signIn, type SignedIn } from '../support/sign-in';
import { runAndWait } from '../support/run';

/**
 * Versions, branches and comparison (issue 5) through the real API on PostgreSQL: drafts are written
 * and run through the notebook's own endpoints, versions saved, branched, restored and compared.
 */

let t: TestApp;
const as: Record<string, SignedIn> = {};

beforeAll(async () => {
  t = await createTestApp();
  for (const role of ['lead', 'engineer', 'reviewer', 'viewer', 'outsider'] as const) as[role] = await signIn(t.app, role, testEnv.publicUrl);
});
afterAll(async () => t?.close());

interface CellIn {
  cellId: string;
  kind: string;
  title: string;
  inputs: Record<string, unknown>;
}

async function newStudy(title: string): Promise<{ studyId: string; branchId: string }> {
  const study = await as['lead']!.post(`/api/projects/${t.demo.projectId}/studies`, { title }).expect(201);
  const branches = await as['lead']!.get(`/api/studies/${study.body.id}/branches`).expect(200);
  return { studyId: study.body.id, branchId: branches.body[0].id };
}

async function getDraft(branchId: string, who = 'lead'): Promise<Draft> {
  return (await as[who]!.get(`/api/branches/${branchId}/draft`).expect(200)).body as Draft;
}

/** Writes the draft through the notebook's autosave, based on the revision it has now. */
async function putDraft(branchId: string, cells: CellIn[], who = 'lead'): Promise<Draft> {
  const { revision } = await getDraft(branchId, who);
  const res = await as[who]!.put(`/api/branches/${branchId}/draft`, { baseRevision: revision, cells: cells.map((c) => ({ ...c, collapsed: false })) });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body as Draft;
}

async function run(branchId: string, who = 'lead'): Promise<void> {
  await runAndWait(as[who]!, branchId);
}

async function save(branchId: string, message: string, expectedHeadVersionId: string | null, who = 'lead'): Promise<VersionSummary> {
  const res = await as[who]!.post(`/api/branches/${branchId}/versions`, { message, expectedHeadVersionId });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as VersionSummary;
}

const flow = (cellId: string, reynolds: number): CellIn => ({
  cellId,
  kind: 'flow',
  title: 'Cruise flow',
  inputs: { mode: 'reynolds', reynolds, mach: 0, nCrit: 9, turbulenceMode: 'nCrit', sweepDeg: 0 },
});

/** A flat plate: Cp = 0 (Ue/V∞ = 1) from the leading edge to x = 1, one surface. */
function flatPlateTable(points = 201): string {
  const rows = Array.from({ length: points }, (_, i) => `${(i / (points - 1)).toFixed(4)} 0`);
  return `x cp\n${rows.join('\n')}\n`;
}

/** An invented closed-loop section table: trailing edge over the upper side to the lower side. */
function loopTable(bump: { x: number; dCp: number } | null = null, extra: string | null = null): string {
  const lines = ['x y cp'];
  const xs = Array.from({ length: 21 }, (_, i) => Number((1 - i / 20).toFixed(2)));
  for (const x of xs) {
    const cp = Number((-0.6 * Math.sqrt(x) * (1 - x) + 0.1 * x).toFixed(4)) + (bump && bump.x === x ? bump.dCp : 0);
    lines.push(`${x} ${(0.06 * Math.sqrt(x) * (1 - x)).toFixed(4)} ${cp.toFixed(4)}`);
  }
  for (const x of xs.slice(0, -1).reverse()) lines.push(`${x} ${(-0.05 * Math.sqrt(x) * (1 - x)).toFixed(4)} ${(-0.3 * Math.sqrt(x) * (1 - x) + 0.1 * x).toFixed(4)}`);
  if (extra) lines.push(extra);
  return lines.join('\n');
}

describe('saving versions', () => {
  it('snapshots the draft, moves the head and reuses unchanged cell revisions', async () => {
    const { studyId, branchId } = await newStudy('Versions: save');
    const [f, p, n] = [randomUUID(), randomUUID(), randomUUID()];
    const cells: CellIn[] = [
      flow(f, 6e6),
      { cellId: p, kind: 'pressure', title: 'Outboard Cp', inputs: { text: loopTable(), layout: 'closedLoop' } },
      { cellId: n, kind: 'note', title: 'Why', inputs: { markdown: 'Invented data for the Larkspur T-62.' } },
    ];
    await putDraft(branchId, cells);
    const v1 = await save(branchId, 'First cut', null);
    expect(v1).toMatchObject({ number: 1, message: 'First cut', cellCount: 3, branchName: 'main', parentVersionId: null, review: null });
    expect(v1.author?.name).toBeTruthy();

    const detail = (await as['viewer']!.get(`/api/versions/${v1.id}`).expect(200)).body as VersionDetail;
    expect(detail.cells.map((c) => [c.position, c.cellId, c.kind])).toEqual([
      [0, f, 'flow'],
      [1, p, 'pressure'],
      [2, n, 'note'],
    ]);
    expect(detail.cells[0]!.inputs).toMatchObject({ reynolds: 6e6 });

    const history = (await as['viewer']!.get(`/api/studies/${studyId}/versions`).expect(200)).body as StudyHistory;
    expect(history.branches[0]).toMatchObject({ headVersionId: v1.id, headNumber: 1, versionCount: 1 });
    // The study's own branch list (what the notebook page loads) carries the head's number too.
    const listed = await as['viewer']!.get(`/api/studies/${studyId}/branches`).expect(200);
    expect(listed.body[0]).toMatchObject({ headVersionId: v1.id, headNumber: 1 });
    expect((await getDraft(branchId)).basedOnVersionId).toBe(v1.id);

    // Only the flow cell changes: one new revision, the other two rows are shared with version 1.
    await putDraft(branchId, [flow(f, 9e6), ...cells.slice(1)]);
    const before = await t.database.pool.query('select count(*)::int as n from cell_revisions where cell_id = any($1)', [[f, p, n]]);
    const v2 = await save(branchId, 'Higher Reynolds number', v1.id);
    expect(v2).toMatchObject({ number: 2, parentVersionId: v1.id });
    const after = await t.database.pool.query('select count(*)::int as n from cell_revisions where cell_id = any($1)', [[f, p, n]]);
    expect(after.rows[0].n - before.rows[0].n).toBe(1);
    const shared = await t.database.pool.query(
      'select a.cell_id from version_cells a join version_cells b on a.cell_id = b.cell_id and a.cell_revision_id = b.cell_revision_id where a.version_id = $1 and b.version_id = $2',
      [v1.id, v2.id],
    );
    expect(shared.rows.map((r) => r.cell_id).sort()).toEqual([p, n].sort());

    const list = (await as['reviewer']!.get(`/api/branches/${branchId}/versions`).expect(200)).body as VersionSummary[];
    expect(list.map((v) => v.number)).toEqual([2, 1]);
  });

  it('refuses to change a saved version in the database itself', async () => {
    const { branchId } = await newStudy('Versions: immutable');
    await putDraft(branchId, [flow(randomUUID(), 6e6)]);
    const v = await save(branchId, 'Frozen', null);
    const pool = t.database.pool;
    await expect(pool.query('update versions set message = $1 where id = $2', ['rewritten', v.id])).rejects.toThrow(/immutable/);
    await expect(pool.query('delete from versions where id = $1', [v.id])).rejects.toThrow(/immutable/);
    await expect(pool.query('update version_cells set output_key = $1 where version_id = $2', ['forged', v.id])).rejects.toThrow(/immutable/);
    await expect(pool.query('update cell_revisions set title = $1 where id in (select cell_revision_id from version_cells where version_id = $2)', ['x', v.id])).rejects.toThrow(
      /immutable/,
    );
    const detail = (await as['lead']!.get(`/api/versions/${v.id}`).expect(200)).body as VersionDetail;
    expect(detail.message).toBe('Frozen');
  });

  it('answers a stale save with 409, what the other save changed, and the draft untouched', async () => {
    const { branchId } = await newStudy('Versions: stale save');
    const f = randomUUID();
    const note = randomUUID();
    await putDraft(branchId, [flow(f, 6e6), { cellId: note, kind: 'note', title: 'Plan', inputs: { markdown: 'a' } }]);
    const v1 = await save(branchId, 'Baseline condition', null, 'engineer');
    // The engineer raises the Reynolds number and saves; the lead still thinks version 1 is the head.
    await putDraft(branchId, [flow(f, 9e6), { cellId: note, kind: 'note', title: 'Plan', inputs: { markdown: 'a' } }], 'engineer');
    const v2 = await save(branchId, 'Re 9 million', v1.id, 'engineer');
    const draftBefore = await getDraft(branchId);

    const res = await as['lead']!.post(`/api/branches/${branchId}/versions`, { message: 'My take', expectedHeadVersionId: v1.id }).expect(409);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    const problem = res.body as SaveConflict;
    expect(problem).toMatchObject({ status: 409, type: '/problems/conflict', reason: 'headMoved', draftRevision: draftBefore.revision });
    expect(problem.currentHead).toMatchObject({ id: v2.id, number: 2, message: 'Re 9 million' });
    expect(problem.newerVersions.map((v) => v.number)).toEqual([2]);
    expect(problem.detail).toContain('version 2');
    expect(problem.changes).toHaveLength(1);
    expect(problem.changes[0]).toMatchObject({ cellId: f, change: 'changed' });
    expect(problem.changes[0]!.fields).toContainEqual(expect.objectContaining({ path: 'reynolds', old: 6e6, new: 9e6, label: 'Reynolds number' }));

    // Nothing was saved and nothing of the draft was lost.
    expect(await getDraft(branchId)).toEqual(draftBefore);
    const list = (await as['lead']!.get(`/api/branches/${branchId}/versions`).expect(200)).body as VersionSummary[];
    expect(list.map((v) => v.number)).toEqual([2, 1]);

    // Having seen the change, the lead saves on top of version 2.
    const v3 = await save(branchId, 'My take', v2.id);
    expect(v3).toMatchObject({ number: 3, parentVersionId: v2.id });

    // A save from a client whose draft is behind the server's is refused too.
    const behind = await as['lead']!.post(`/api/branches/${branchId}/versions`, { message: 'x', expectedHeadVersionId: v3.id, draftRevision: draftBefore.revision - 1 }).expect(409);
    expect(behind.body).toMatchObject({ reason: 'draftChanged', draftRevision: draftBefore.revision });
  });

  it('lets exactly one of two simultaneous saves on the same head through (the branch row is locked)', async () => {
    const { branchId } = await newStudy('Versions: race');
    await putDraft(branchId, [flow(randomUUID(), 6e6)]);
    const [x, y] = await Promise.all([
      as['lead']!.post(`/api/branches/${branchId}/versions`, { message: 'From the lead', expectedHeadVersionId: null }),
      as['engineer']!.post(`/api/branches/${branchId}/versions`, { message: 'From the engineer', expectedHeadVersionId: null }),
    ]);
    expect([x.status, y.status].sort()).toEqual([201, 409]);
    const loser = x.status === 409 ? x : y;
    const winner = x.status === 201 ? x : y;
    expect(loser.body.currentHead).toMatchObject({ id: winner.body.id, number: 1 });
    const list = (await as['lead']!.get(`/api/branches/${branchId}/versions`).expect(200)).body as VersionSummary[];
    expect(list.map((v) => v.number)).toEqual([1]);
  });

  it('names the field at fault in a bad save', async () => {
    const { branchId } = await newStudy('Versions: bad input');
    const res = await as['lead']!.post(`/api/branches/${branchId}/versions`, { message: '  ', expectedHeadVersionId: 'nope' }).expect(400);
    expect(res.body.errors.map((e: { field: string }) => e.field).sort()).toEqual(['expectedHeadVersionId', 'message']);
  });
});

describe('branches and restore', () => {
  it('branches from an old version: the new draft starts as that version, history continues from it', async () => {
    const { studyId, branchId } = await newStudy('Versions: branching');
    const f = randomUUID();
    const extra = randomUUID();
    await putDraft(branchId, [flow(f, 6e6)]);
    const v1 = await save(branchId, 'Re 6 million', null);
    await putDraft(branchId, [flow(f, 9e6), { cellId: extra, kind: 'note', title: 'Later note', inputs: { markdown: 'b' } }]);
    const v2 = await save(branchId, 'Re 9 million', v1.id);

    const created = await as['lead']!.post(`/api/versions/${v1.id}/branches`, { name: 'low-Re variant', purpose: 'Keep Re 6e6, try a new table' }).expect(201);
    expect(created.body).toMatchObject({ name: 'low-Re variant', forkedFromVersionId: v1.id, headVersionId: null, versionCount: 0, forkedFrom: { versionId: v1.id, branchName: 'main', number: 1 } });
    const draft = await getDraft(created.body.id);
    expect(draft.cells.map((c) => [c.cellId, c.inputs['reynolds']])).toEqual([[f, 6e6]]);
    expect(draft.basedOnVersionId).toBe(v1.id);

    const b1 = await save(created.body.id, 'Variant start', null);
    expect(b1).toMatchObject({ number: 1, parentVersionId: v1.id, branchName: 'low-Re variant' });
    const history = (await as['viewer']!.get(`/api/studies/${studyId}/versions`).expect(200)).body as StudyHistory;
    expect(history.branches.map((b) => [b.name, b.headNumber])).toEqual([
      ['main', 2],
      ['low-Re variant', 1],
    ]);
    expect(history.branches[0]!.headVersionId).toBe(v2.id);

    const dup = await as['lead']!.post(`/api/versions/${v2.id}/branches`, { name: 'low-Re variant' }).expect(409);
    expect(dup.body.field).toBe('name');

    const renamed = await as['lead']!.patch(`/api/branches/${created.body.id}`, { name: 'low-Re, new table', archived: true }).expect(200);
    expect(renamed.body).toMatchObject({ name: 'low-Re, new table', archived: true });
    const onArchived = await as['lead']!.post(`/api/branches/${created.body.id}/versions`, { message: 'x', expectedHeadVersionId: b1.id }).expect(409);
    expect(onArchived.body.detail).toMatch(/archived/);
    const main = await as['lead']!.patch(`/api/branches/${branchId}`, { archived: true }).expect(400);
    expect(main.body.field).toBe('archived');
  });

  it('restores a version into the draft as a draft change, keeping dropped cells in the trash', async () => {
    const { branchId } = await newStudy('Versions: restore');
    const f = randomUUID();
    const later = randomUUID();
    await putDraft(branchId, [flow(f, 6e6)]);
    const v1 = await save(branchId, 'Re 6 million', null);
    const edited = await putDraft(branchId, [flow(f, 9e6), { cellId: later, kind: 'note', title: 'Unsaved thought', inputs: { markdown: 'keep me' } }]);

    const stale = await as['lead']!.post(`/api/branches/${branchId}/draft/restore`, { versionId: v1.id, baseRevision: edited.revision - 1 }).expect(409);
    expect(stale.body).toMatchObject({ field: 'baseRevision', draftRevision: edited.revision });
    await as['viewer']!.post(`/api/branches/${branchId}/draft/restore`, { versionId: v1.id, baseRevision: edited.revision }).expect(403);

    const res = await as['lead']!.post(`/api/branches/${branchId}/draft/restore`, { versionId: v1.id, baseRevision: edited.revision }).expect(200);
    expect(res.body).toMatchObject({ revision: edited.revision + 1, cellCount: 1, movedToTrash: [{ cellId: later, title: 'Unsaved thought' }] });
    const draft = await getDraft(branchId);
    expect(draft.revision).toBe(edited.revision + 1);
    expect(draft.cells.map((c) => [c.cellId, c.inputs['reynolds']])).toEqual([[f, 6e6]]);
    expect(draft.trash.map((c) => [c.cellId, c.inputs['markdown']])).toContainEqual([later, 'keep me']);
  });

  it('lets engineers branch only when the lead allows it, and only leads mark the baseline', async () => {
    const { studyId, branchId } = await newStudy('Versions: branch rights');
    await putDraft(branchId, [flow(randomUUID(), 6e6)]);
    const v1 = await save(branchId, 'Start', null, 'engineer');
    await as['engineer']!.post(`/api/versions/${v1.id}/branches`, { name: 'engineer try' }).expect(403);
    await as['lead']!.patch(`/api/projects/${t.demo.projectId}`, { settings: { engineersMayBranch: true } }).expect(200);
    try {
      await as['engineer']!.post(`/api/versions/${v1.id}/branches`, { name: 'engineer try' }).expect(201);
    } finally {
      await as['lead']!.patch(`/api/projects/${t.demo.projectId}`, { settings: { engineersMayBranch: false } }).expect(200);
    }
    await as['engineer']!.post(`/api/studies/${studyId}/baseline`, { versionId: v1.id }).expect(403);
    const marked = await as['lead']!.post(`/api/studies/${studyId}/baseline`, { versionId: v1.id }).expect(200);
    expect(marked.body.baselineVersionId).toBe(v1.id);
    expect(marked.body.versions[0]).toMatchObject({ id: v1.id, isBaseline: true });
    const other = await newStudy('Versions: another study');
    const bad = await as['lead']!.post(`/api/studies/${other.studyId}/baseline`, { versionId: v1.id }).expect(400);
    expect(bad.body.field).toBe('versionId');
  });
});

describe('roles', () => {
  it('lets reviewers and viewers browse and compare, not save, branch or restore; hides it all from outsiders', async () => {
    const { studyId, branchId } = await newStudy('Versions: roles');
    await putDraft(branchId, [flow(randomUUID(), 6e6)]);
    const v1 = await save(branchId, 'Start', null);
    const permissions = async (role: string) => ((await as[role]!.get(`/api/studies/${studyId}/versions`).expect(200)).body as StudyHistory).permissions;
    expect(await permissions('lead')).toEqual({ saveVersion: true, branch: true, markBaseline: true, editStudy: true });
    expect(await permissions('engineer')).toEqual({ saveVersion: true, branch: false, markBaseline: false, editStudy: true });
    for (const role of ['reviewer', 'viewer']) {
      expect(await permissions(role)).toEqual({ saveVersion: false, branch: false, markBaseline: false, editStudy: false });
      const who = as[role]!;
      await who.get(`/api/branches/${branchId}/versions`).expect(200);
      await who.get(`/api/versions/${v1.id}`).expect(200);
      await who.get(`/api/compare?a=${v1.id}&b=${v1.id}`).expect(200);
      await who.post(`/api/branches/${branchId}/versions`, { message: 'x', expectedHeadVersionId: v1.id }).expect(403);
      await who.post(`/api/versions/${v1.id}/branches`, { name: `by ${role}` }).expect(403);
      await who.patch(`/api/branches/${branchId}`, { purpose: 'x' }).expect(403);
      await who.post(`/api/studies/${studyId}/baseline`, { versionId: v1.id }).expect(403);
    }
    const outsider = as['outsider']!;
    for (const res of [
      await outsider.get(`/api/studies/${studyId}/versions`),
      await outsider.get(`/api/branches/${branchId}/versions`),
      await outsider.get(`/api/versions/${v1.id}`),
      await outsider.get(`/api/compare?a=${v1.id}&b=${v1.id}`),
      await outsider.post(`/api/branches/${branchId}/versions`, { message: 'x', expectedHeadVersionId: v1.id }),
      await outsider.post(`/api/versions/${v1.id}/branches`, { name: 'x' }),
      await outsider.post(`/api/branches/${branchId}/draft/restore`, { versionId: v1.id, baseRevision: 0 }),
    ]) {
      expect(res.status).toBe(404);
      expect(res.body.type).toBe('/problems/not-found');
    }
    const { rows } = await t.database.pool.query<{ action: string }>("select distinct action from audit_events where action like 'version.%' or action like 'branch.%' or action like 'draft.restore' or action like 'study.baseline%'");
    expect(rows.map((r) => r.action)).toEqual(expect.arrayContaining(['version.save', 'branch.create', 'branch.archive', 'draft.restore', 'study.baseline']));
  });
});

describe('compare', () => {
  it('matches cells by id: added, removed, moved, changed, with a numeric ΔCp for a changed table', async () => {
    const { branchId } = await newStudy('Versions: compare cells');
    const [f, p, n1, n2, gone] = [randomUUID(), randomUUID(), randomUUID(), randomUUID(), randomUUID()];
    const note = (cellId: string, title: string, markdown: string): CellIn => ({ cellId, kind: 'note', title, inputs: { markdown } });
    await putDraft(branchId, [
      flow(f, 6e6),
      { cellId: p, kind: 'pressure', title: 'Outboard Cp', inputs: { text: loopTable(), layout: 'closedLoop' } },
      note(n1, 'First note', 'one\ntwo'),
      note(n2, 'Second note', 'unchanged'),
      note(gone, 'Dropped', 'bye'),
    ]);
    const a = await save(branchId, 'A', null);
    const added = randomUUID();
    await putDraft(branchId, [
      note(n2, 'Second note', 'unchanged'),
      flow(f, 9e6),
      // Cp at x = 0.4 on the upper side rises by 0.05; one row appended on the lower side.
      { cellId: p, kind: 'pressure', title: 'Outboard Cp', inputs: { text: loopTable({ x: 0.4, dCp: 0.05 }, '1.05 -0.0010 0.1050'), layout: 'closedLoop' } },
      note(n1, 'First note', 'one\nthree'),
      note(added, 'New', 'hello'),
    ]);
    const b = await save(branchId, 'B', a.id);

    const res = await as['viewer']!.get(`/api/compare?a=${a.id}&b=${b.id}`).expect(200);
    const cmp = res.body as Comparison;
    const byId = new Map(cmp.cells.map((c) => [c.cellId, c]));
    expect(byId.get(added)).toMatchObject({ change: 'added', positionA: null, positionB: 4 });
    expect(byId.get(gone)).toMatchObject({ change: 'removed', positionA: 4, positionB: null });
    expect(byId.get(n2)).toMatchObject({ change: 'moved', moved: true });
    expect(cmp.summary).toEqual({ added: 1, removed: 1, changed: 3, moved: 1, unchanged: 0 });

    const flowDiff = byId.get(f)!;
    expect(flowDiff.fields).toEqual([expect.objectContaining({ path: 'reynolds', old: 6e6, new: 9e6, oldText: '6 × 10⁶', newText: '9 × 10⁶', relative: 0.5 })]);

    // The table difference is numbers: exact arithmetic on the rows written above.
    const table = byId.get(p)!.table!;
    expect(table).toMatchObject({ rowCountA: 41, rowCountB: 42, problems: [] });
    const upper = table.surfaces.find((s) => s.name === 'upper')!;
    expect(upper.maxAbsDeltaCp).toBeCloseTo(0.05, 10);
    expect(upper.maxAt).toBe(0.4);
    expect(upper.matched.filter((m) => m.deltaCp !== 0)).toEqual([expect.objectContaining({ x: 0.4 })]);
    const lower = table.surfaces.find((s) => s.name === 'lower')!;
    expect(lower.maxAbsDeltaCp).toBe(0);
    expect(lower.rowsAdded).toEqual([{ x: 1.05, cp: 0.105, line: 43 }]);
    expect(byId.get(p)!.fields.find((x) => x.path === 'text')).toMatchObject({ oldText: '41 rows', newText: '42 rows' });

    const text = byId.get(n1)!.text!;
    expect(text).toMatchObject({ linesAdded: 1, linesRemoved: 1 });
    expect(text.excerpt).toEqual(expect.arrayContaining([{ op: '+', text: 'three' }, { op: '-', text: 'two' }]));

    const bad = await as['viewer']!.get(`/api/compare?a=${a.id}&b=not-a-version`).expect(400);
    expect(bad.body.field).toBe('b');
  });

  it('shows a raised Reynolds number moving the e^N transition forward on a flat plate, as an adverse shift', async () => {
    // Flat plate (Cp = 0): at a fixed transition Reynolds number Re_x,tr the transition location is
    // x_tr = Re_x,tr / Re, so doubling Re halves x_tr (common practice; e.g. Schlichting & Gersten,
    // "Boundary-Layer Theory", 2017, ch. 15 on the e^N method for the Blasius layer).
    const { branchId } = await newStudy('Versions: flat plate Re');
    const [f, p, an] = [randomUUID(), randomUUID(), randomUUID()];
    const cells = (reynolds: number): CellIn[] => [
      flow(f, reynolds),
      { cellId: p, kind: 'pressure', title: 'Flat plate', inputs: { text: flatPlateTable(), layout: 'surface', surfaceName: 'upper' } },
      { cellId: an, kind: 'analysis', title: 'Transition', inputs: { flowCellId: f, pressureCellId: p, criteria: ['eN'], turbulent: true } },
    ];
    await putDraft(branchId, cells(4e6));
    await run(branchId);
    const a = await save(branchId, 'Re 4 million', null);
    // Saved before running: the flow and analysis results no longer match their inputs and are not
    // kept with the version; the unchanged pressure cell keeps its result.
    await putDraft(branchId, cells(8e6));
    const unrun = await save(branchId, 'Re 8 million, not run', a.id);
    const unrunCells = ((await as['lead']!.get(`/api/versions/${unrun.id}`).expect(200)).body as VersionDetail).cells;
    expect(unrunCells.map((c) => [c.kind, c.outputKey !== null])).toEqual([
      ['flow', false],
      ['pressure', true],
      ['analysis', false],
    ]);
    const stale = (await as['lead']!.get(`/api/compare?a=${a.id}&b=${unrun.id}`).expect(200)).body as Comparison;
    expect(stale.results[0]).toMatchObject({ statusA: 'ok', statusB: 'notRun' });
    await run(branchId);
    const b = await save(branchId, 'Re 8 million', unrun.id);

    const cmp = (await as['reviewer']!.get(`/api/compare?a=${a.id}&b=${b.id}`).expect(200)).body as Comparison;
    expect(cmp.caution).toMatch(/engineering estimates/i);
    const result = cmp.results.find((r) => r.cellId === an)!;
    expect(result).toMatchObject({ statusA: 'ok', statusB: 'ok' });
    expect(result.flow.reynolds).toMatchObject({ a: 4e6, b: 8e6 });
    const upper = result.surfaces.find((s) => s.name === 'upper')!;
    const eN = upper.criteria.find((c) => c.criterion === 'eN')!;
    expect(eN.coordinate).toBe('x');
    expect(eN.shift).toBe('forward');
    expect(eN.effect).toBe('adverse');
    expect(eN.delta!).toBeLessThan(0);
    // x_tr,B / x_tr,A = Re_A / Re_B = 0.5 within the station spacing of the table (0.005).
    expect(eN.b! / eN.a!).toBeGreaterThan(0.46);
    expect(eN.b! / eN.a!).toBeLessThan(0.54);
    expect(upper.transition).toMatchObject({ shift: 'forward', byA: 'eN', byB: 'eN', effect: 'adverse' });
    expect(upper.laminarExtent.effect).toBe('adverse');
    // Overlay data for both versions: Cp ≈ 0 along the plate, the N-factor envelope and H.
    expect(upper.overlay.a!.x.length).toBeGreaterThan(50);
    expect(Math.max(...upper.overlay.a!.cp.map((v) => Math.abs(v ?? 0)))).toBeLessThan(1e-9);
    // The envelope grows to N_crit = 9 where it sets transition.
    expect(Math.max(...upper.overlay.b!.n.map((v) => v ?? 0))).toBeCloseTo(9, 0);
    // Laminar flat plate: H = 2.59 (Blasius 1908; Schlichting & Gersten 2017, table 7.1); Thwaites gives 2.61.
    expect(upper.overlay.a!.H.some((h) => h !== null && h > 2.5 && h < 2.7)).toBe(true);
    // Mixed laminar–turbulent plate at a fixed Re_x,tr ≈ 2.3e6: Prandtl–Schlichting's
    // c_F = 0.074 Re^-0.2 − A/Re (A ≈ 7000 for that Re_x,tr) gives 0.0018 at Re 4e6 and 0.0022 at 8e6
    // (Schlichting & Gersten, "Boundary-Layer Theory", 2017, eq. 18.100; arithmetic here), so drag rises.
    expect(upper.cd.delta!).toBeGreaterThan(0);
    expect(upper.cd.effect).toBe('adverse');
  });
});
