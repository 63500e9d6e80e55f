/**
 * Saving and comparing versions of a 40-cell study: `npm run bench -- versions`.
 *
 * The real app (createTestApp: its own seeded database, the engine worker pool) listens on a loopback
 * port; a lead signs in through the identity provider fake and builds a study of 40 cells: 10 flow
 * conditions, 10 closed-loop pressure tables of the invented Larkspur T-62 section (about 140 rows
 * each), 15 transition analyses and 5 notes, all run so every result is stored.
 *
 * - save: one note changes in the draft (untimed), then POST /versions is timed: 40 cells, revisions
 *   reused by content hash, version and version cells inserted and the head moved in one transaction.
 * - compare: GET /compare of two versions that differ in every flow condition, one table and so in
 *   every result: 40 cell diffs, a numeric table diff and 15 analyses compared with overlay data.
 *
 * Times are request round trips to the server on the same machine (no network between): server time.
 * Target (issue 5): median and p95 under 100 ms each; and (issue 15) the same for a 200-cell study
 * (five times each kind), timed the same way.
 */
import { randomUUID } from 'node:crypto';
import type { Server } from 'node:http';
import type { Express } from 'express';
import { inventedDemoSections } from '@laminote/aero';
import type { Comparison, Draft, VersionSummary } from '@laminote/contracts';
import { createTestApp } from '../../tests/support/app';
import { testEnv } from '../../tests/support/env';
import { signIn, type SignedIn } from '../../tests/support/sign-in';

const out = (line: string) => process.stdout.write(`${line}\n`);

function percentile(sorted: number[], p: number): number {
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1))]!;
}

function stats(samples: number[]) {
  const sorted = [...samples].sort((a, b) => a - b);
  return { n: sorted.length, median: percentile(sorted, 50), p95: percentile(sorted, 95), max: sorted[sorted.length - 1]! };
}

const fmt = (ms: number) => `${ms.toFixed(1).padStart(6)} ms`;

/** A table with its suction scaled a little, so each pressure cell has content of its own. */
function scaledTable(table: string, factor: number): string {
  return table
    .split('\n')
    .map((line) => {
      const fields = line.trim().split(/\s+/);
      if (fields.length !== 3 || !/^-?\d/.test(fields[0]!)) return line;
      const cp = Number(fields[2]);
      // Suction only: the stagnation value stays as it is.
      return `${fields[0]} ${fields[1]} ${(cp < 0 ? cp * factor : cp).toFixed(5)}`;
    })
    .join('\n');
}

interface Cell {
  cellId: string;
  kind: string;
  title: string;
  collapsed: boolean;
  inputs: Record<string, unknown>;
}

const ids = (n: number) => Array.from({ length: n }, () => randomUUID());

/**
 * A study of 40 × `scale` cells: per 40, 10 flow conditions, 10 pressure tables, 15 analyses and 5
 * notes. The same ids serve versions A and B, so every cell of B is a revision of a cell of A.
 */
function studyIds(scale: number) {
  return { flows: ids(10 * scale), tables: ids(10 * scale), analyses: ids(15 * scale), notes: ids(5 * scale) };
}

function buildStudy(IDS: ReturnType<typeof studyIds>, reynoldsScale: number, tableBump: number): Cell[] {
  // Each size of study has flow conditions of its own, so no output is shared between them.
  const offset = IDS.flows.length * 100;
  const sections = inventedDemoSections();
  const { flows, tables } = IDS;
  const cells: Cell[] = [];
  flows.forEach((cellId, i) =>
    cells.push({ cellId, kind: 'flow', title: `Condition ${i + 1}`, collapsed: false, inputs: { mode: 'reynolds', reynolds: (6e6 + i * 5e5 + offset) * reynoldsScale, mach: 0.6, nCrit: 9 } }),
  );
  tables.forEach((cellId, i) =>
    cells.push({
      cellId,
      kind: 'pressure',
      title: `Section ${i + 1}`,
      collapsed: false,
      inputs: { text: scaledTable(sections[i % 2]!.pressureTable, 1 + 0.01 * (i % 10) + 0.001 * Math.floor(i / 10) + (i === 0 ? tableBump : 0)), layout: 'closedLoop' },
    }),
  );
  IDS.analyses.forEach((cellId, i) => {
    cells.push({
      cellId,
      kind: 'analysis',
      title: `Transition ${i + 1}`,
      collapsed: false,
      inputs: { flowCellId: flows[i % flows.length], pressureCellId: tables[(i * 3) % tables.length], criteria: ['eN', 'michel', 'hRx', 'granville'] },
    });
  });
  IDS.notes.forEach((cellId, i) => cells.push({ cellId, kind: 'note', title: `Note ${i + 1}`, collapsed: false, inputs: { markdown: `Invented bench note ${i + 1}.` } }));
  return cells;
}

async function ok<T>(test: Promise<{ status: number; body: unknown; text?: string }>, expected: number): Promise<T> {
  const res = await test;
  if (res.status !== expected) throw new Error(`answered ${res.status}: ${JSON.stringify(res.body).slice(0, 400)}`);
  return res.body as T;
}

async function putDraft(lead: SignedIn, branchId: string, cells: Cell[]): Promise<Draft> {
  const { revision } = await ok<Draft>(lead.get(`/api/branches/${branchId}/draft`), 200);
  return ok<Draft>(lead.put(`/api/branches/${branchId}/draft`, { baseRevision: revision, cells }), 200);
}

/**
 * Runs every cell of the draft: a run that answers 200 ran them at once; one that answers 202 queued a
 * job, which is followed until it has finished.
 */
async function runAll(lead: SignedIn, branchId: string): Promise<void> {
  const res = await lead.post(`/api/branches/${branchId}/run`, {});
  let ran: { status: string }[] | undefined;
  if (res.status === 200) ran = (res.body as { ran: { status: string }[] }).ran;
  else if (res.status === 202) {
    const { jobId } = res.body as { jobId: string };
    for (let waited = 0; ; waited += 50) {
      const job = await ok<{ state: string; ran?: { status: string }[]; error?: string }>(lead.get(`/api/jobs/${jobId}`), 200);
      if (job.state === 'completed') {
        ran = job.ran ?? [];
        break;
      }
      if (job.state !== 'queued' && job.state !== 'running') throw new Error(`the run job ended ${job.state}: ${job.error ?? ''}`);
      if (waited > 600_000) throw new Error('the run job did not finish in 10 minutes');
      await new Promise((r) => setTimeout(r, 50));
    }
  } else throw new Error(`run answered ${res.status}: ${JSON.stringify(res.body).slice(0, 400)}`);
  const failed = ran.filter((r) => r.status !== 'ok');
  if (failed.length) throw new Error(`${failed.length} cells did not run: ${JSON.stringify(failed[0])}`);
}

/** Builds, runs and saves versions A and B of a 40 × `scale`-cell study, then times saves and compares. */
async function benchStudy(lead: SignedIn, projectId: string, scale: number, rounds: number, target: number) {
  const IDS = studyIds(scale);
  const study = await ok<{ id: string }>(lead.post(`/api/projects/${projectId}/studies`, { title: `Versions bench ${randomUUID().slice(0, 8)}` }), 201);
  const [branch] = await ok<{ id: string }[]>(lead.get(`/api/studies/${study.id}/branches`), 200);
  const branchId = branch!.id;

  const cellsA = buildStudy(IDS, 1, 0);
  await putDraft(lead, branchId, cellsA);
  await runAll(lead, branchId);
  const a = await ok<VersionSummary>(lead.post(`/api/branches/${branchId}/versions`, { message: 'A', expectedHeadVersionId: null }), 201);
  const cellsB = buildStudy(IDS, 1.5, 0.03);
  await putDraft(lead, branchId, cellsB);
  await runAll(lead, branchId);
  let head = await ok<VersionSummary>(lead.post(`/api/branches/${branchId}/versions`, { message: 'B', expectedHeadVersionId: a.id }), 201);
  const b = head;
  out('');
  out(`versions of a ${cellsB.length}-cell study (${IDS.flows.length} flow, ${IDS.tables.length} pressure tables of ~140 rows, ${IDS.analyses.length} analyses, ${IDS.notes.length} notes)`);

  const saves: number[] = [];
  for (let i = 0; i < rounds + 5; i++) {
    const cells = cellsB.map((c) => (c.kind === 'note' && c.title === 'Note 1' ? { ...c, inputs: { markdown: `Invented bench note, round ${i}.` } } : c));
    await putDraft(lead, branchId, cells);
    const t0 = performance.now();
    head = await ok<VersionSummary>(lead.post(`/api/branches/${branchId}/versions`, { message: `Round ${i}`, expectedHeadVersionId: head.id }), 201);
    if (i >= 5) saves.push(performance.now() - t0);
  }

  const compares: number[] = [];
  let cold = 0;
  let bytes = 0;
  for (let i = 0; i < rounds + 5; i++) {
    const t0 = performance.now();
    const res = await lead.get(`/api/compare?a=${a.id}&b=${b.id}`);
    const elapsed = performance.now() - t0;
    if (res.status !== 200) throw new Error(`compare answered ${res.status}`);
    const body = res.body as Comparison;
    if (body.results.length !== IDS.analyses.length || body.results.some((r) => r.statusA !== 'ok' || r.statusB !== 'ok')) {
      throw new Error(`compare did not see ${IDS.analyses.length} results on both sides`);
    }
    bytes = res.text.length;
    if (i === 0) cold = elapsed;
    if (i >= 5) compares.push(elapsed);
  }

  const save = stats(saves);
  const compare = stats(compares);
  out('operation   rounds     median        p95        max');
  out(`save        ${String(save.n).padStart(6)}  ${fmt(save.median)}  ${fmt(save.p95)}  ${fmt(save.max)}`);
  out(`compare     ${String(compare.n).padStart(6)}  ${fmt(compare.median)}  ${fmt(compare.p95)}  ${fmt(compare.max)}   (${(bytes / 1024).toFixed(0)} KiB answer)`);
  out(`the first compare, with no analysis output read before: ${cold.toFixed(1)} ms (later ones reuse the outputs already read and checked)`);
  for (const [name, s] of [
    ['save', save],
    ['compare', compare],
  ] as const) {
    out(`${cellsB.length} cells, ${name}: median ${s.median.toFixed(1)} ms, p95 ${s.p95.toFixed(1)} ms against the target of ${target} ms: ${s.median < target && s.p95 < target ? 'met' : 'NOT met'}`);
  }
}

const t = await createTestApp();
const server: Server = t.app.listen(0, '127.0.0.1');
await new Promise((resolve) => server.once('listening', resolve));
try {
  // supertest against the listening server: one port for every request, as a browser would see it.
  const lead = await signIn(server as unknown as Express, 'lead', testEnv.publicUrl);
  out(`versions bench, server at ${JSON.stringify(server.address())}`);
  await benchStudy(lead, t.demo.projectId, 1, 60, 100);
  await benchStudy(lead, t.demo.projectId, 5, 30, 100);
} finally {
  server.close();
  await t.close();
}
