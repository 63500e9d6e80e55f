import { spawnSync } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { Express } from 'express';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { computeSweepCase } from '@laminote/aero';
import { CELL_SCHEMAS, type CellInputs, type CellKind, type Draft, type Job, type SweepResult } from '@laminote/contracts';
import { joukowskiLoop } from '../../libs/aero/test/joukowski';
import { ensureDatabase, startCluster, type Cluster } from '../../scripts/lib/postgres';
import { freePort, startService, waitForPort, type Service } from '../../scripts/lib/proc';
import { ROOT, TSX } from '../../scripts/lib/paths';
import { testEnv } from '../support/env';
import { waitForJob } from '../support/run';
import { signIn, type SignedIn } from '../support/sign-in';

/**
 * Faults while a long sweep runs as a job, with the real server and job workers as processes on a
 * PostgreSQL cluster of this file's own: a worker killed outright (SIGKILL) halfway through, and the
 * database restarted halfway through. Each sweep must finish with every one of its 1,000 cases stored
 * exactly once and equal to the engine's own computation of it. Bounded: pieces of work are handed out
 * again 5 s after their worker stops answering (JOB_EXPIRE_SECONDS), and each wait has a deadline.
 */
const HOST = '127.0.0.1';
const CASES = 1000;
const log = (line: string) => process.stdout.write(`[job-faults] ${line}\n`);
const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

let scratch: string;
let cluster: Cluster;
let db: pg.Pool;
const services: Service[] = [];
let engineer: SignedIn;

const timing = { JOB_EXPIRE_SECONDS: '5', JOB_MAINTENANCE_SECONDS: '1' };

/** A worker needs only DATABASE_URL (the timing is shortened so the test is quick). Started without tsx's wrapper, so its pid is the worker's own. */
function startWorker(name: string): Service {
  const service = startService(name, process.execPath, ['--import', 'tsx', 'server/src/jobs/worker-main.ts'], { DATABASE_URL: cluster.url('laminote'), ENGINE_THREADS: '1', LOG_LEVEL: 'warn', ...timing }, { quiet: !process.env['TEST_SERVER_LOGS'] });
  services.push(service);
  return service;
}

beforeAll(async () => {
  scratch = mkdtempSync(path.join(tmpdir(), 'laminote-job-faults-'));
  chmodSync(scratch, 0o755);
  cluster = await startCluster(path.join(scratch, 'pg'), await freePort(), log, { mode: 'throwaway' });
  await ensureDatabase(cluster.url('postgres'), 'laminote');
  const env: NodeJS.ProcessEnv = {
    NODE_ENV: 'test',
    DATABASE_URL: cluster.url('laminote'),
    HOST,
    // The test stack's identity provider knows this address as the app's.
    PORT: new URL(testEnv.publicUrl).port,
    PUBLIC_URL: testEnv.publicUrl,
    OIDC_ISSUER: testEnv.oidcIssuer,
    DATA_DIR: path.join(scratch, 'data'),
    WEB_DIST: '/nonexistent',
    LOG_LEVEL: 'warn',
    ENGINE_THREADS: '1',
    ...timing,
  };
  const seed = spawnSync(TSX, ['server/src/seed/main.ts'], { cwd: ROOT, env: { ...process.env, ...env }, encoding: 'utf8' });
  if (seed.status !== 0) throw new Error(`seeding failed: ${seed.stderr}`);
  const server = startService('server', TSX, ['server/src/main.ts'], env, { quiet: !process.env['TEST_SERVER_LOGS'] });
  services.push(server);
  await waitForPort(HOST, Number(env['PORT']), 60_000, server.child);
  db = new pg.Pool({ connectionString: cluster.url('laminote'), max: 2 });
  db.on('error', () => undefined);
  engineer = await signIn(testEnv.publicUrl as unknown as Express, 'engineer', testEnv.publicUrl);
}, 120_000);

afterAll(async () => {
  for (const service of services.reverse()) await service.stop();
  await db?.end();
  cluster?.stop();
  if (scratch) rmSync(scratch, { recursive: true, force: true });
});

const parsed = <K extends CellKind>(kind: K, inputs: Record<string, unknown>) => CELL_SCHEMAS[kind].inputs.parse(inputs) as CellInputs[K];

/**
 * A 2 × 2,000-station Joukowski section (exact potential flow, N. E. Joukowski 1910) swept over `CASES`
 * Reynolds numbers: about a millisecond a case, so a chunk of cases takes long enough that the worker is
 * killed (or the database stopped) with most of the sweep still to do, however fast the machine; at
 * 2 × 300 stations (0.3 ms a case since the engine's chunk entry) a quiet machine could finish the next
 * chunks between the test's polls.
 */
async function longSweep(label: string) {
  const projects = await engineer.get('/api/projects').expect(200);
  const projectId = (projects.body as { id: string }[])[0]!.id;
  const study = await engineer.post(`/api/projects/${projectId}/studies`, { title: label }).expect(201);
  const branchId = (await engineer.get(`/api/studies/${study.body.id}/branches`).expect(200)).body[0].id as string;
  const loop = joukowskiLoop({ re: -0.08, im: 0 }, 0, 4001);
  // Nine decimals: at six, points crowded at the cusp repeat one another (the table refuses them).
  const table = [`# ${label}`, 'x y cp', ...loop.x.map((x, i) => `${x.toFixed(9)} ${loop.y[i]!.toFixed(9)} ${loop.cp[i]!.toFixed(9)}`)].join('\n');
  const ids = { flow: randomUUID(), pressure: randomUUID(), analysis: randomUUID(), sweep: randomUUID() };
  const cells = [
    { cellId: ids.flow, kind: 'flow', inputs: { mode: 'reynolds', reynolds: 6e6, mach: 0, nCrit: 9 } },
    { cellId: ids.pressure, kind: 'pressure', inputs: { text: table } },
    { cellId: ids.analysis, kind: 'analysis', inputs: { flowCellId: ids.flow, pressureCellId: ids.pressure, criteria: ['eN'] } },
    { cellId: ids.sweep, kind: 'sweep', inputs: { analysisCellId: ids.analysis, parameter: 'reynolds', from: 1e6, to: 3e7, steps: CASES } },
  ].map((c) => ({ title: '', collapsed: false, ...c }));
  await engineer.put(`/api/branches/${branchId}/draft`, { baseRevision: 0, cells }).expect(200);
  return { branchId, ids, cells };
}

/** Every case stored once, and the sweep's output equal, case by case, to the engine computing it in this process. */
async function expectEveryCaseOnce(sweep: Awaited<ReturnType<typeof longSweep>>, job: Job) {
  expect(job.state, job.error).toBe('completed');
  expect(job.done).toBe(job.total);
  const draft = (await engineer.get(`/api/branches/${sweep.branchId}/draft`).expect(200)).body as Draft;
  const output = draft.cells.find((c) => c.cellId === sweep.ids.sweep)!.output!;
  const { rows } = await db.query<{ n: number; distinct: number; first: number; last: number }>(
    'select count(*)::int as n, count(distinct index)::int as distinct, min(index) as first, max(index) as last from sweep_cases where sweep_key = $1',
    [output.key],
  );
  expect(rows[0]).toEqual({ n: CASES, distinct: CASES, first: 0, last: CASES - 1 });
  const result = output.result as SweepResult;
  expect(result.steps).toHaveLength(CASES);
  const up = (id: string) => sweep.cells.find((c) => c.cellId === id)!.inputs;
  const upstream = {
    analysisCellId: {
      kind: 'analysis' as const,
      inputs: parsed('analysis', up(sweep.ids.analysis)),
      upstream: { flowCellId: { kind: 'flow' as const, inputs: parsed('flow', up(sweep.ids.flow)), upstream: {} }, pressureCellId: { kind: 'pressure' as const, inputs: parsed('pressure', up(sweep.ids.pressure)), upstream: {} } },
    },
  };
  const inputs = parsed('sweep', up(sweep.ids.sweep));
  for (const index of [0, 1, 249, 250, 499, 500, 777, CASES - 1]) {
    const reference = computeSweepCase(inputs, upstream, index).step;
    // Stored to 7 significant digits (RESULT_DIGITS).
    expect(Math.abs(result.steps[index]!.value - reference.value) / reference.value).toBeLessThan(1e-6);
    expect(result.steps[index]!.surfaces.map((s) => s.transitionS)).toEqual(reference.surfaces.map((s) => (s.transitionS === null ? null : Number(s.transitionS.toPrecision(7)))));
  }
}

describe('a long sweep as a job survives', () => {
  it('a worker killed outright halfway: another takes its pieces up and the sweep completes with every case once', async () => {
    const first = startWorker('worker-a');
    const sweep = await longSweep('Killed worker');
    const run = await engineer.post(`/api/branches/${sweep.branchId}/run`, {}).expect(202);
    const half = await waitForJob(engineer, run.body.jobId, { timeoutMs: 120_000, until: (j) => j.done >= 3 + CASES * 0.3 });
    log(`killing worker-a (pid ${first.child.pid}) at ${half.done} of ${half.total}`);
    first.child.kill('SIGKILL');
    await sleep(500);
    const stalled = (await engineer.get(`/api/jobs/${run.body.jobId}`).expect(200)).body as Job;
    expect(stalled.state).toBe('running');
    expect(stalled.done).toBeLessThan(stalled.total);
    startWorker('worker-b');
    const job = await waitForJob(engineer, run.body.jobId, { timeoutMs: 180_000 });
    await expectEveryCaseOnce(sweep, job);
  }, 300_000);

  it('a PostgreSQL restart halfway: the job pauses, is not failed, and completes with every case once', async () => {
    const sweep = await longSweep('Database restart');
    const run = await engineer.post(`/api/branches/${sweep.branchId}/run`, {}).expect(202);
    const half = await waitForJob(engineer, run.body.jobId, { timeoutMs: 120_000, until: (j) => j.done >= 3 + CASES * 0.3 });
    log(`restarting PostgreSQL at ${half.done} of ${half.total}`);
    const bin = path.dirname(spawnSync('sh', ['-c', 'ls /usr/lib/postgresql/*/bin/pg_ctl | sort -V | tail -1'], { encoding: 'utf8' }).stdout.trim());
    const ctl = (args: string[]) => {
      const cmd = process.getuid?.() === 0 ? spawnSync('runuser', ['-u', 'laminote', '--', path.join(bin, 'pg_ctl'), ...args], { encoding: 'utf8' }) : spawnSync(path.join(bin, 'pg_ctl'), args, { encoding: 'utf8' });
      if (cmd.status !== 0) throw new Error(`pg_ctl ${args.at(-1)} failed: ${cmd.stderr}`);
    };
    const dataDir = path.join(scratch, 'pg');
    ctl(['-D', dataDir, '-m', 'fast', '-w', 'stop']);
    // Down for a while, as an operator's restart would leave it.
    await sleep(3000);
    ctl(['-D', dataDir, '-l', path.join(scratch, 'pg-run', 'postgres.log'), '-o', `-p ${cluster.port} -h 127.0.0.1`, '-w', '-t', '60', 'start']);
    let sawFailed = false;
    const job = await waitForJob(engineer, run.body.jobId, {
      timeoutMs: 180_000,
      until: (j) => {
        sawFailed ||= j.state === 'failed';
        return j.state !== 'queued' && j.state !== 'running';
      },
    });
    expect(sawFailed).toBe(false);
    await expectEveryCaseOnce(sweep, job);
  }, 300_000);
});
