/**
 * Long sweeps as jobs: `npm run bench -- jobs`.
 *
 * A 1,000-case Reynolds-number sweep of a 2 × 300-station transition analysis (a Joukowski section,
 * 601 table points), run through the API as a job on one worker process and then on two (each with
 * one compute thread), timed from POST /run to the job's completion. Against it, the cost of one
 * analysis case computed in this process with no queue at all (computeSweepCase, one thread). The job
 * overhead per case is the worker time per case (wall time × compute threads / cases) over the
 * in-process case, less one; target (issue 13): under 20 % at 1,000 cases.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { availableParallelism, loadavg } from 'node:os';
import { computeSweepCase } from '@laminote/aero';
import { CELL_SCHEMAS, type CellInputs, type CellKind, type Job } from '@laminote/contracts';
import { joukowskiLoop } from '../../libs/aero/test/joukowski';
import { ROOT } from '../../scripts/lib/paths';
import { createTestApp } from '../../tests/support/app';
import { testEnv } from '../../tests/support/env';
import { signIn } from '../../tests/support/sign-in';

const CASES = 1000;
const out = (line: string) => process.stdout.write(`${line}\n`);
const parsed = <K extends CellKind>(kind: K, inputs: Record<string, unknown>) => CELL_SCHEMAS[kind].inputs.parse(inputs) as CellInputs[K];

const t = await createTestApp({ LOG_LEVEL: 'silent' }, { worker: false });
const engineer = await signIn(t.app, 'engineer', testEnv.publicUrl);

function studyCells(label: string) {
  const loop = joukowskiLoop({ re: -0.08, im: 0 }, 0, 601);
  const table = [`# ${label}`, 'x y cp', ...loop.x.map((x, i) => `${x.toFixed(6)} ${loop.y[i]!.toFixed(6)} ${loop.cp[i]!.toFixed(6)}`)].join('\n');
  const ids = { flow: randomUUID(), pressure: randomUUID(), analysis: randomUUID(), sweep: randomUUID() };
  const inputs = {
    flow: { mode: 'reynolds', reynolds: 6e6, mach: 0, nCrit: 9 },
    pressure: { text: table },
    analysis: { flowCellId: ids.flow, pressureCellId: ids.pressure, criteria: ['eN', 'michel'] },
    sweep: { analysisCellId: ids.analysis, parameter: 'reynolds', from: 1e6, to: 3e7, steps: CASES },
  };
  return { ids, inputs };
}

/** Starts a worker process (DATABASE_URL only, one compute thread) and waits until it takes work. */
function startWorker(): Promise<ChildProcess> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/src/jobs/worker-main.ts'], {
    cwd: ROOT,
    env: { PATH: process.env['PATH'], DATABASE_URL: t.database.url, ENGINE_THREADS: '1', LOG_LEVEL: 'info' },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  return new Promise((resolve, reject) => {
    child.stdout!.on('data', (chunk: Buffer) => {
      if (chunk.toString().includes('job worker is running')) resolve(child);
    });
    child.once('exit', (code) => reject(new Error(`the worker exited (${code})`)));
  });
}

async function stopWorkers(workers: ChildProcess[]): Promise<void> {
  await Promise.all(workers.map((w) => new Promise<void>((resolve) => (w.once('exit', () => resolve()), w.kill('SIGTERM')))));
}

async function newStudy(label: string, steps: number): Promise<string> {
  const study = await engineer.post(`/api/projects/${t.demo.projectId}/studies`, { title: label }).expect(201);
  const branchId = (await engineer.get(`/api/studies/${study.body.id}/branches`).expect(200)).body[0].id as string;
  const { ids, inputs } = studyCells(label);
  const cells = (['flow', 'pressure', 'analysis', 'sweep'] as const).map((kind) => ({
    cellId: ids[kind],
    kind,
    title: '',
    collapsed: false,
    inputs: kind === 'sweep' ? { ...inputs.sweep, steps } : inputs[kind],
  }));
  await engineer.put(`/api/branches/${branchId}/draft`, { baseRevision: 0, cells }).expect(200);
  return branchId;
}

async function runToEnd(branchId: string): Promise<Job> {
  const run = await engineer.post(`/api/branches/${branchId}/run`, {}).expect(202);
  for (;;) {
    const job = (await engineer.get(`/api/jobs/${run.body.jobId}`).expect(200)).body as Job;
    if (job.state !== 'queued' && job.state !== 'running') {
      if (job.state !== 'completed') throw new Error(`the job ended ${job.state}: ${job.error ?? ''}`);
      return job;
    }
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}

/** CPU time (user + system, all threads) a process has used so far, in ms, from /proc. */
function cpuMsOf(pid: number): number {
  const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ');
  // utime and stime are fields 14 and 15 of stat (proc(5)), in clock ticks; 100 a second on Linux.
  return ((Number(fields[11]) + Number(fields[12])) * 1000) / 100;
}

/**
 * Wall and CPU time of the 1,000-case job on `workers` fresh worker processes, warmed up by a short
 * sweep first (as long-lived workers are). CPU time is the worker processes' own: what the job costs,
 * whatever else the machine is doing.
 */
async function timedRun(workers: number): Promise<{ wallMs: number; cpuMs: number; idleCpuMsPerS: number }> {
  const label = `Bench ${workers} worker(s) ${randomUUID().slice(0, 8)}`;
  const warmUp = await newStudy(`${label} warm-up`, 40 * workers);
  const branchId = await newStudy(label, CASES);
  const procs = await Promise.all(Array.from({ length: workers }, () => startWorker()));
  await runToEnd(warmUp);
  // What the worker processes use while waiting for work (polling, the queue's upkeep, timers).
  const idleStart = procs.reduce((sum, p) => sum + cpuMsOf(p.pid!), 0);
  await new Promise((resolve) => setTimeout(resolve, 4000));
  const idleCpuMsPerS = (procs.reduce((sum, p) => sum + cpuMsOf(p.pid!), 0) - idleStart) / 4 / workers;
  const cpuBefore = procs.reduce((sum, p) => sum + cpuMsOf(p.pid!), 0);
  const started = performance.now();
  await runToEnd(branchId);
  const wallMs = performance.now() - started;
  const cpuMs = procs.reduce((sum, p) => sum + cpuMsOf(p.pid!), 0) - cpuBefore;
  await stopWorkers(procs);
  return { wallMs, cpuMs, idleCpuMsPerS };
}

/** The same 1,000 cases computed one after another in this process with no queue (after a warm-up): wall and CPU ms a case. */
function inProcessCase(): { wallMs: number; cpuMs: number } {
  const { inputs } = studyCells('in-process');
  const upstream = {
    analysisCellId: {
      kind: 'analysis' as const,
      inputs: parsed('analysis', inputs.analysis),
      upstream: { flowCellId: { kind: 'flow' as const, inputs: parsed('flow', inputs.flow), upstream: {} }, pressureCellId: { kind: 'pressure' as const, inputs: parsed('pressure', inputs.pressure), upstream: {} } },
    },
  };
  const sweep = parsed('sweep', inputs.sweep);
  for (let i = 0; i < 60; i++) computeSweepCase(sweep, upstream, (i * 37) % CASES);
  const start = performance.now();
  const cpu = process.cpuUsage();
  for (let index = 0; index < CASES; index++) computeSweepCase(sweep, upstream, index);
  const used = process.cpuUsage(cpu);
  return { wallMs: (performance.now() - start) / CASES, cpuMs: (used.user + used.system) / 1000 / CASES };
}

try {
  const before = inProcessCase();
  const one = await timedRun(1);
  const two = await timedRun(2);
  const after = inProcessCase();
  const caseCpu = (before.cpuMs + after.cpuMs) / 2;
  const caseWall = (before.wallMs + after.wallMs) / 2;
  const pct = (x: number) => `${x >= 0 ? '+' : ''}${x.toFixed(1)} %`;
  out(`jobs: ${CASES}-case Reynolds-number sweep of a 2 × 300-station analysis (e^N and Michel), as a job through the API`);
  out(`  in-process, no queue (the same ${CASES} cases one after another, one thread): ${caseCpu.toFixed(2)} ms CPU a case, ${caseWall.toFixed(2)} ms wall (before the jobs ${before.cpuMs.toFixed(2)} / ${before.wallMs.toFixed(2)}, after ${after.cpuMs.toFixed(2)} / ${after.wallMs.toFixed(2)})`);
  for (const [n, r] of [[1, one], [2, two]] as const) {
    out(
      `  ${n} worker process${n > 1 ? 'es' : ''} × 1 thread: wall ${(r.wallMs / 1000).toFixed(2)} s; worker CPU ${(r.cpuMs / CASES).toFixed(2)} ms a case, job overhead ${pct((r.cpuMs / CASES / caseCpu - 1) * 100)} (target < 20 %)` +
        `; wall × threads ${((r.wallMs * n) / CASES).toFixed(2)} ms a case (${pct((((r.wallMs * n) / CASES) / caseWall - 1) * 100)} against in-process wall)`,
    );
  }
  out(`  an idle worker process uses ${one.idleCpuMsPerS.toFixed(1)} ms CPU a second (${two.idleCpuMsPerS.toFixed(1)} each with two), included above`);
  out(`  speed-up of two workers over one: ${(one.wallMs / two.wallMs).toFixed(2)}×`);
  out(`  (wall: POST /run to the job completed, its 3 light cells and the sweep's assembly included; workers warmed up by a short sweep first;`);
  out(`   CPU: the worker processes' user + system time from /proc, all threads; ${availableParallelism()} cores, shared with whatever else runs: load ${loadavg()[0]!.toFixed(1)})`);
} finally {
  await t.close();
}
process.exit(0);
