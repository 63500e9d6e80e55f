import { randomUUID } from 'node:crypto';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { CookieAccessInfo } from 'cookiejar';
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { computeCell, resultJson } from '@laminote/aero';
import { CELL_SCHEMAS, type CellInputs, type CellKind, type Draft, type DraftCell, type Job, type JobEvent, type SweepResult } from '@laminote/contracts';
import { joukowskiLoop } from '../../libs/aero/test/joukowski';
import { pruneRetained } from '../../server/src/jobs/retention';
import { createTestApp, type TestApp } from '../support/app';
import { testEnv } from '../support/env';
import { runAndWait, waitForJob } from '../support/run';
import { signIn, type SignedIn } from '../support/sign-in';

let t: TestApp;
const as: Record<string, SignedIn> = {};

let server: http.Server;
let base: string;

beforeAll(async () => {
  t = await createTestApp();
  for (const role of ['lead', 'engineer', 'reviewer', 'viewer', 'outsider'] as const) as[role] = await signIn(t.app, role, testEnv.publicUrl);
  server = http.createServer(t.app);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});
afterAll(async () => {
  server?.closeAllConnections();
  server?.close();
  await t?.close();
});

/**
 * Exact potential flow past a symmetric Joukowski section (N. E. Joukowski 1910; L. M. Milne-Thomson,
 * "Theoretical Aerodynamics", ch. 7), the engine's own fixture, as a closed-loop `x y cp` table.
 */
function joukowskiTable(points: number, label: string): string {
  const loop = joukowskiLoop({ re: -0.08, im: 0 }, 0, points);
  // The label (a comment line) makes each study's table its own, so no output is shared between tests.
  // Nine decimals: at six, the points a long table crowds at the cusp repeat one another (and are refused).
  return [`# ${label}`, 'x y cp', ...loop.x.map((x, i) => `${x.toFixed(9)} ${loop.y[i]!.toFixed(9)} ${loop.cp[i]!.toFixed(9)}`)].join('\n');
}

/** A fresh study with a flow, a pressure, an analysis and a sweep over `sweep`. */
async function sweepStudy(sweep: Record<string, unknown>, points = 201) {
  const title = `Jobs ${randomUUID().slice(0, 8)}`;
  const study = await as['engineer']!.post(`/api/projects/${t.demo.projectId}/studies`, { title }).expect(201);
  const branches = await as['engineer']!.get(`/api/studies/${study.body.id}/branches`).expect(200);
  const branchId = branches.body[0].id as string;
  const ids = { flow: randomUUID(), pressure: randomUUID(), analysis: randomUUID(), sweep: randomUUID() };
  const cells = [
    { cellId: ids.flow, kind: 'flow', inputs: { mode: 'reynolds', reynolds: 6e6 + Math.round(Math.random() * 1e5), mach: 0, nCrit: 9 } },
    { cellId: ids.pressure, kind: 'pressure', inputs: { text: joukowskiTable(points, title) } },
    { cellId: ids.analysis, kind: 'analysis', inputs: { flowCellId: ids.flow, pressureCellId: ids.pressure, criteria: ['eN', 'michel'] } },
    { cellId: ids.sweep, kind: 'sweep', inputs: { analysisCellId: ids.analysis, ...sweep } },
  ].map((c) => ({ title: '', collapsed: false, ...c }));
  const saved = await as['engineer']!.put(`/api/branches/${branchId}/draft`, { baseRevision: 0, cells }).expect(200);
  return { branchId, ids, cells, draft: saved.body as Draft };
}

/** The reference: the engine's one entry point computing the study's whole sweep in this process. */
function wholeSweep(cells: Awaited<ReturnType<typeof sweepStudy>>['cells'], ids: Awaited<ReturnType<typeof sweepStudy>>['ids']): SweepResult {
  const up = (id: string) => cells.find((c) => c.cellId === id)!;
  const flow = { kind: 'flow' as const, inputs: parsed('flow', up(ids.flow).inputs), upstream: {} };
  const pressure = { kind: 'pressure' as const, inputs: parsed('pressure', up(ids.pressure).inputs), upstream: {} };
  const analysis = { kind: 'analysis' as const, inputs: parsed('analysis', up(ids.analysis).inputs), upstream: { flowCellId: flow, pressureCellId: pressure } };
  return computeCell('sweep', parsed('sweep', up(ids.sweep).inputs), { analysisCellId: analysis });
}

const cellOf = (draft: Draft, cellId: string) => draft.cells.find((c) => c.cellId === cellId)!;
const parsed = <K extends CellKind>(kind: K, inputs: Record<string, unknown>) => CELL_SCHEMAS[kind].inputs.parse(inputs) as CellInputs[K];

/**
 * Reads the branch's server-sent events until `enough` says so, then closes the stream. Over a server
 * of its own (supertest's would wait for the open stream), with the person's session cookie.
 */
function followEvents(who: SignedIn, branchId: string, enough: (events: JobEvent[]) => boolean, timeoutMs = 60_000): Promise<{ status: number; events: JobEvent[] }> {
  const jar = (who.agent as unknown as { jar: { getCookies(access: unknown): { toValueString(): string } } }).jar;
  const cookie = jar.getCookies(CookieAccessInfo.All).toValueString();
  return new Promise((resolve, reject) => {
    const events: JobEvent[] = [];
    const req = http.get(`${base}/api/branches/${branchId}/events`, { headers: { cookie, accept: 'text/event-stream' } }, (res) => {
      if (res.statusCode !== 200) {
        res.resume();
        clearTimeout(timer);
        resolve({ status: res.statusCode!, events });
        return;
      }
      let text = '';
      res.setEncoding('utf8');
      res.on('data', (chunk: string) => {
        text += chunk;
        let end;
        while ((end = text.indexOf('\n\n')) >= 0) {
          const data = text.slice(0, end).split('\n').find((line) => line.startsWith('data: '));
          text = text.slice(end + 2);
          if (data) events.push(JSON.parse(data.slice(6)) as JobEvent);
        }
        if (enough(events)) {
          clearTimeout(timer);
          resolve({ status: 200, events });
          req.destroy();
        }
      });
    });
    req.on('error', () => undefined);
    const timer = setTimeout(() => {
      req.destroy();
      reject(new Error(`events: not enough after ${timeoutMs} ms (${events.length} received)`));
    }, timeoutMs);
  });
}

describe('runs as jobs', () => {
  it('queues a run (202), counts its sweep case by case, and lands outputs equal to the engine computing in-process', async () => {
    const sweep = { parameter: 'reynolds', from: 2e6, to: 2e7, steps: 120 };
    const { branchId, ids, cells } = await sweepStudy(sweep);
    const res = await as['engineer']!.post(`/api/branches/${branchId}/run`, {}).expect(202);
    expect(res.headers['location']).toBe(`/api/jobs/${res.body.jobId}`);
    const queued = res.body.job as Job;
    expect(queued).toMatchObject({ jobId: res.body.jobId, branchId, state: expect.stringMatching(/^(queued|running)$/), total: 3 + 120 });
    expect(queued.cells.map((c) => [c.cellId, c.total])).toEqual([[ids.flow, 1], [ids.pressure, 1], [ids.analysis, 1], [ids.sweep, 120]]);

    const seen: number[] = [];
    const job = await waitForJob(as['engineer']!, queued.jobId, { until: (j) => (seen.push(j.done), j.state !== 'queued' && j.state !== 'running') });
    expect(job.state).toBe('completed');
    expect(job.done).toBe(job.total);
    // Progress only grows.
    expect(seen).toEqual([...seen].sort((a, b) => a - b));
    expect(job.ran!.map((r) => [r.cellId, r.status, r.reused])).toEqual([ids.flow, ids.pressure, ids.analysis, ids.sweep].map((id) => [id, 'ok', false]));

    const draft = (await as['engineer']!.get(`/api/branches/${branchId}/draft`).expect(200)).body as Draft;
    expect(draft.cells.map((c) => c.runState)).toEqual(['current', 'current', 'current', 'current']);
    const whole = wholeSweep(cells, ids);
    const stored = cellOf(draft, ids.sweep).output!.result as SweepResult;
    // What the sweep cell stores when computed whole, to the last digit.
    expect(stored).toEqual(JSON.parse(resultJson(whole)));
    expect(stored.steps).toHaveLength(120);
    expect(stored.values).toEqual(whole.values.map((v) => Number(v.toPrecision(7))));
    stored.steps.forEach((step, i) => {
      expect(step.status).toBe(whole.steps[i]!.status);
      expect(step.cd).toBeCloseTo(whole.steps[i]!.cd!, 9);
      expect(step.surfaces.map((s) => s.transitionS)).toEqual(whole.steps[i]!.surfaces.map((s) => (s.transitionS === null ? null : Number(s.transitionS.toPrecision(7)))));
    });
    // Each case stored once.
    const [count] = (await t.database.db.execute<{ n: number; distinct: number }>(sql`select count(*)::int as n, count(distinct index)::int as distinct from sweep_cases where sweep_key = ${cellOf(draft, ids.sweep).output!.key}`)).rows;
    expect(count).toEqual({ n: 120, distinct: 120 });
  });

  it('lands a grid sweep as the engine computes it whole: both parameters\' values, every step in order, each warning once', async () => {
    // Mach 0.6 to 0.9 × Re: each Mach step warns of its own (compressible layer, supersonic pocket), and the
    // cases of one Mach value repeat its warnings, which the result lists once, in the order first given,
    // those alike but for the step's value gathered into one.
    const sweep = { parameter: 'mach', from: 0.6, to: 0.9, steps: 4, second: { parameter: 'reynolds', from: 2e6, to: 1.2e7, steps: 5 } };
    const { branchId, ids, cells } = await sweepStudy(sweep);
    await runAndWait(as['engineer']!, branchId);
    const draft = (await as['engineer']!.get(`/api/branches/${branchId}/draft`).expect(200)).body as Draft;
    const whole = wholeSweep(cells, ids);
    const stored = cellOf(draft, ids.sweep).output!.result as SweepResult;
    // Four Mach values each warn of the compressible layer in their own words: said once, as a range,
    // with the cases that gave it (the stored result is put together from the cases' text by PostgreSQL).
    expect(whole.warnings).toHaveLength(2);
    expect(whole.warnings[0]).toMatch(/^mach 0\.6–0\.9: the laminar layer is computed compressible; .* \(in 20 of 20 cases\)$/);
    expect(whole.warnings[1]).toMatch(/supersonic pocket/);
    expect(stored).toEqual(JSON.parse(resultJson(whole)));
    expect(stored.steps.map((s) => [s.value, s.value2])).toEqual(whole.steps.map((s) => [Number(s.value.toPrecision(7)), Number(s.value2!.toPrecision(7))]));
  });

  it('answers 200 with the draft at once when every output is stored, computing nothing', async () => {
    const { branchId, ids } = await sweepStudy({ parameter: 'nCrit', from: 6, to: 12, steps: 30 });
    await runAndWait(as['engineer']!, branchId);
    const processed = t.worker!.runner.processed;
    const again = await as['engineer']!.post(`/api/branches/${branchId}/run`, {}).expect(200);
    expect(again.body.ran.map((r: { reused: boolean }) => r.reused)).toEqual([true, true, true, true]);
    // Nothing changed: the answer names no cell, and the draft has every output, current.
    expect(again.body.cells).toEqual([]);
    const draft = (await as['engineer']!.get(`/api/branches/${branchId}/draft`).expect(200)).body as Draft;
    expect(cellOf(draft, ids.sweep).runState).toBe('current');
    expect(t.worker!.runner.processed).toBe(processed);
    // One cell and what it uses: all stored too.
    const one = await as['engineer']!.post(`/api/branches/${branchId}/run`, { cellIds: [ids.analysis] }).expect(200);
    expect(one.body.ran.map((r: { cellId: string }) => r.cellId)).toEqual([ids.flow, ids.pressure, ids.analysis]);
  });

  it('answers the job under way when the same run is asked for again', async () => {
    // 2 × 2,000 stations a case, so the job is still under way when the second run is asked for.
    const { branchId } = await sweepStudy({ parameter: 'reynolds', from: 2e6, to: 2e7, steps: 400 }, 4001);
    const first = await as['engineer']!.post(`/api/branches/${branchId}/run`, {}).expect(202);
    const second = await as['lead']!.post(`/api/branches/${branchId}/run`, {}).expect(202);
    expect(second.body.jobId).toBe(first.body.jobId);
    await waitForJob(as['engineer']!, first.body.jobId);
  });

  it('streams progress and landed outputs as server-sent events, starting with the true state', async () => {
    // Long enough (2,000 cases of 2 × 2,000 stations, about 2 s of computing) that progress is reported on
    // the way, however fast the machine.
    const { branchId, ids } = await sweepStudy({ parameter: 'reynolds', from: 2e6, to: 2e7, steps: 2000 }, 4001);
    const following = followEvents(as['engineer']!, branchId, (events) => events.some((e) => e.type === 'job' && e.job.state === 'completed'), 110_000);
    // The stream has sent its first snapshot (no jobs yet) before the run starts.
    await new Promise((resolve) => setTimeout(resolve, 300));
    const res = await as['engineer']!.post(`/api/branches/${branchId}/run`, {}).expect(202);
    const { status, events } = await following;
    expect(status).toBe(200);
    expect(events[0]).toEqual({ type: 'snapshot', jobs: [] });
    const progress = events.flatMap((e) => (e.type === 'job' && e.job.jobId === res.body.jobId ? [e.job.done] : []));
    expect(progress).toEqual([...progress].sort((a, b) => a - b));
    expect(progress.some((done) => done > 3 && done < 2003)).toBe(true);
    expect(progress.at(-1)).toBe(2003);
    const landed = events.flatMap((e) => (e.type === 'output' ? [e.cellId] : []));
    expect(landed).toEqual([ids.flow, ids.pressure, ids.analysis, ids.sweep]);

    // Connecting afterwards gives the finished job in the first snapshot.
    const later = await followEvents(as['engineer']!, branchId, (evs) => evs.length > 0);
    expect(later.events[0]).toMatchObject({ type: 'snapshot', jobs: [{ jobId: res.body.jobId, state: 'completed', done: 2003, total: 2003 }] });
  }, 120_000);

  it('cancels a long sweep: workers stop taking its cases, what landed stays and a later run goes on from there', async () => {
    // 2 × 2,000 stations a case (about 2 s for the sweep), so it is cancelled with most of it to do.
    const { branchId, ids } = await sweepStudy({ parameter: 'reynolds', from: 2e6, to: 2e7, steps: 2000 }, 4001);
    const res = await as['engineer']!.post(`/api/branches/${branchId}/run`, {}).expect(202);
    const jobId = res.body.jobId as string;
    await waitForJob(as['engineer']!, jobId, { until: (j) => j.done > 60 });
    // Reviewers and viewers may not cancel; outsiders do not see the job at all.
    await as['reviewer']!.delete(`/api/jobs/${jobId}`).expect(403);
    await as['outsider']!.delete(`/api/jobs/${jobId}`).expect(404);
    const cancelled = (await as['engineer']!.delete(`/api/jobs/${jobId}`).expect(200)).body as Job;
    expect(cancelled.state).toBe('cancelled');
    expect(cancelled.done).toBeLessThan(2003);
    // Pieces already on a thread finish; then nothing more lands.
    await new Promise((resolve) => setTimeout(resolve, 1500));
    const settled = (await as['engineer']!.get(`/api/jobs/${jobId}`).expect(200)).body as Job;
    await new Promise((resolve) => setTimeout(resolve, 1500));
    const after = (await as['engineer']!.get(`/api/jobs/${jobId}`).expect(200)).body as Job;
    expect(after).toMatchObject({ state: 'cancelled', done: settled.done });
    expect(after.done).toBeLessThan(2003);
    const again = await as['engineer']!.delete(`/api/jobs/${jobId}`).expect(409);
    expect(again.body.detail).toMatch(/cancelled/);
    const draft = (await as['engineer']!.get(`/api/branches/${branchId}/draft`).expect(200)).body as Draft;
    expect(cellOf(draft, ids.sweep).runState).toBe('idle');

    // Running again starts from the cases that landed.
    const rerun = await as['engineer']!.post(`/api/branches/${branchId}/run`, {}).expect(202);
    expect(rerun.body.jobId).not.toBe(jobId);
    expect((rerun.body.job as Job).done).toBeGreaterThanOrEqual(after.done);
    const finished = await waitForJob(as['engineer']!, rerun.body.jobId, { timeoutMs: 240_000 });
    expect(finished.state).toBe('completed');
    const [count] = (await t.database.db.execute<{ n: number; distinct: number }>(sql`select count(*)::int as n, count(distinct index)::int as distinct from sweep_cases where sweep_key = ${finished.ran!.at(-1)!.key}`)).rows;
    expect(count).toEqual({ n: 2000, distinct: 2000 });
  }, 300_000);

  it('never puts a late result over a newer one: a cell edited while its job ran keeps its new state', async () => {
    const { branchId, ids, cells, draft } = await sweepStudy({ parameter: 'reynolds', from: 2e6, to: 2e7, steps: 300 });
    const res = await as['engineer']!.post(`/api/branches/${branchId}/run`, {}).expect(202);
    const edited = cells.map((c) => (c.cellId === ids.sweep ? { ...c, inputs: { ...c.inputs, steps: 150 } } : c));
    await as['engineer']!.put(`/api/branches/${branchId}/draft`, { baseRevision: draft.revision, cells: edited }).expect(200);
    const job = await waitForJob(as['engineer']!, res.body.jobId, { timeoutMs: 120_000 });
    expect(job.state).toBe('completed');
    const after = (await as['engineer']!.get(`/api/branches/${branchId}/draft`).expect(200)).body as Draft;
    // The analysis is the one the job computed; the sweep asks for another run.
    expect(cellOf(after, ids.analysis).runState).toBe('current');
    expect(cellOf(after, ids.sweep).runState).toBe('idle');
    expect(cellOf(after, ids.sweep).output).toBeNull();
  }, 180_000);

  it('lets engineers and leads run and follow, refuses reviewers and viewers (403), and hides everything from outsiders (404)', async () => {
    const { branchId } = await sweepStudy({ parameter: 'nCrit', from: 6, to: 12, steps: 10 });
    for (const role of ['reviewer', 'viewer']) {
      await as[role]!.post(`/api/branches/${branchId}/run`, {}).expect(403);
      expect((await followEvents(as[role]!, branchId, () => false)).status).toBe(403);
    }
    await as['outsider']!.post(`/api/branches/${branchId}/run`, {}).expect(404);
    expect((await followEvents(as['outsider']!, branchId, () => false)).status).toBe(404);
    const res = await as['lead']!.post(`/api/branches/${branchId}/run`, {}).expect(202);
    const lead = await followEvents(as['lead']!, branchId, (events) => events.length > 0);
    expect(lead.events[0]!.type).toBe('snapshot');
    await waitForJob(as['lead']!, res.body.jobId);
    // Every member may read a job; an outsider gets 404, as for an unknown or malformed id.
    await as['viewer']!.get(`/api/jobs/${res.body.jobId}`).expect(200);
    await as['outsider']!.get(`/api/jobs/${res.body.jobId}`).expect(404);
    await as['engineer']!.get(`/api/jobs/${randomUUID()}`).expect(404);
    await as['engineer']!.get('/api/jobs/not-a-job').expect(400);
  });

  it('records who ran what in the audit log once the job is done', async () => {
    const { branchId } = await sweepStudy({ parameter: 'nCrit', from: 6, to: 12, steps: 8 });
    const { jobId } = await runAndWait(as['engineer']!, branchId);
    const rows = (await t.database.db.execute<{ action: string; detail: Record<string, unknown> }>(sql`select action, detail from audit_events where target_id = ${branchId} and action in ('job.queue', 'cells.run') order by id`)).rows;
    expect(rows.map((r) => r.action)).toEqual(['job.queue', 'cells.run']);
    expect(rows[1]!.detail).toMatchObject({ jobId, computed: 4, reused: 0, failed: 0 });
  });
});

describe('retention', () => {
  it('prunes outputs no draft or version refers to, sent mail and spent request budgets, once old enough; keeps the rest', async () => {
    const { branchId, ids, draft } = await sweepStudy({ parameter: 'nCrit', from: 6, to: 12, steps: 6 });
    const ran = await runAndWait(as['engineer']!, branchId);
    const keys = Object.fromEntries(ran.cells.map((c: DraftCell) => [c.cellId, c.output!.key]));
    // Dropping the sweep from the draft leaves its output referred to by nothing (the trash refers to it, so empty the trash too).
    const kept = ran.cells.filter((c) => c.cellId !== ids.sweep).map(({ cellId, kind, title, collapsed, inputs }) => ({ cellId, kind, title, collapsed, inputs }));
    await as['engineer']!.put(`/api/branches/${branchId}/draft`, { baseRevision: draft.revision, cells: kept }).expect(200);
    await t.database.db.execute(sql`update drafts set trash = '[]'::jsonb where branch_id = ${branchId}`);
    await t.database.db.execute(sql`insert into mail_outbox (to_email, subject, text, sent_at) values ('a@tamsk.example', 'sent', 'x', now() - interval '20 days'), ('b@tamsk.example', 'waiting', 'x', null)`);
    // Request budgets: one whose minute ended two hours ago, one still counting.
    await t.database.db.execute(sql`insert into rate_limits (key, points, expire) values ('sign-in:old', 3, (extract(epoch from now()) * 1000)::bigint - 7200000), ('sign-in:now', 1, (extract(epoch from now()) * 1000)::bigint + 60000)`);
    const young = await pruneRetained(t.database.db, { outputAgeDays: 1, mailAgeDays: 30 });
    expect(young).toMatchObject({ outputs: 0, mail: 0 });
    const pruned = await pruneRetained(t.database.db, { outputAgeDays: 0, mailAgeDays: 14 });
    expect(pruned.outputs).toBeGreaterThanOrEqual(1);
    expect(pruned.mail).toBe(1);
    const left = new Set((await t.database.db.execute<{ key: string }>(sql`select key from outputs`)).rows.map((r) => r.key));
    expect(left.has(keys[ids.sweep]!)).toBe(false);
    for (const id of [ids.flow, ids.pressure, ids.analysis]) expect(left.has(keys[id]!)).toBe(true);
    const mail = (await t.database.db.execute<{ subject: string }>(sql`select subject from mail_outbox where subject in ('sent', 'waiting')`)).rows.map((r) => r.subject);
    expect(mail).toEqual(['waiting']);
    expect(young.rateLimits).toBe(1);
    const budgets = (await t.database.db.execute<{ key: string }>(sql`select key from rate_limits where key in ('sign-in:old', 'sign-in:now')`)).rows.map((r) => r.key);
    expect(budgets).toEqual(['sign-in:now']);
  });
});
