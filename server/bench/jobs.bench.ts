/**
 * Long sweeps as jobs: `npm run bench -- jobs`.
 *
 * A 1,000-case Reynolds-number sweep of a 2 × 300-station transition analysis (a Joukowski section,
 * 601 table points), run through the API as a job on one worker process and then on two (each with
 * one compute thread), timed from POST /run to the job's completion. Against it, the cost of one
 * analysis case computed in this process with no queue at all, by the workers' own compute path (the
 * engine's chunk entry, in the same chunks and slices, one thread, nothing written out or stored). The
 * job overhead per case is the worker processes' CPU time per case (all their threads) over the
 * in-process case's CPU time (all this process's threads), less one; target (issue 13): under 20 % at
 * 1,000 cases.
 *
 * The engine's CPU time per case drifts by ±30 % from minute to minute on a shared machine, in a worker
 * and in a lone loop alike, so each job run is paired with an in-process loop run just before it
 * (A B A B …, BENCH_ROUNDS rounds, 5 unless told) and the medians are read with their spread. Beside
 * the target figure the overhead is split in two: the engine's own time in the worker (its computing
 * thread's CPU around the engine's calls, which the worker reports from inside the job) against the
 * loop's, which moves with the machine; and the job's code, the worker's CPU over its engine's against
 * the loop's CPU over its engine's, which does not. The app server's and PostgreSQL's CPU over the same
 * run are shown beside it, not counted in it. BENCH_WORKERS=1 runs the one-worker rounds only.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { appendFileSync, readdirSync, readFileSync } from 'node:fs';
import { availableParallelism, loadavg } from 'node:os';
import { createInterface } from 'node:readline';
import type { Job } from '@laminote/contracts';
import { ROOT } from '../../scripts/lib/paths';
import { createTestApp } from '../../tests/support/app';
import { testEnv } from '../../tests/support/env';
import { signIn } from '../../tests/support/sign-in';
import { JOB_CHANNEL, type JobNotice } from '../src/jobs/store';
import { CASES, inProcessCases, inProcessLightCells, studyCells, WARM_UP, type CaseCost } from './sweep-case-loop';

/** Rounds of (in-process loop, one worker, two loops at once, two workers); BENCH_ROUNDS overrides. */
const ROUNDS = Number(process.env['BENCH_ROUNDS'] ?? 5);
const WORKER_COUNTS = process.env['BENCH_WORKERS'] === '1' ? ([1] as const) : ([1, 2] as const);
/**
 * Warm-up sweeps each fresh worker runs before the measured one (BENCH_WARM_JOBS overrides): a worker
 * that has run a few jobs, as a long-lived one has. V8 compiles the job's own path (the queue, the
 * chunk's store, the light cells) as jobs come, not as cases do: with --trace-opt in the workers
 * (BENCH_WORKER_FLAGS), TurboFan made 46 compilations during the measured job after 1 warm-up sweep,
 * 26 after 6, 28 after 10 and 26 after 25 (the latter two of 100 cases each): some of the job's code
 * is compiled again in every job (each study's new table), the rest is done by the fifth or sixth.
 * The fresh workers' cost over their warm-up is printed beside the figure.
 */
const WARM_JOBS = Number(process.env['BENCH_WARM_JOBS'] ?? 6);
const out = (line: string) => process.stdout.write(`${line}\n`);

const t = await createTestApp({ LOG_LEVEL: 'silent' }, { worker: false });
const engineer = await signIn(t.app, 'engineer', testEnv.publicUrl);

/** The engine's CPU time in the workers by job (ms, and the cases it covers), as they report it for each chunk. */
const engineByJob = new Map<string, { cases: number; engineCpuMs: number }>();

/**
 * Starts a worker process (DATABASE_URL only, one compute thread) and waits until it takes work. Its
 * log is read at debug level for the engine's CPU time of each chunk ("sweep cases computed").
 * BENCH_CPU_PROF=dir writes each worker's CPU profile (node --cpu-prof) there. For diagnosis,
 * BENCH_WORKER_FLAGS adds Node/V8 options to each worker (e.g. "--trace-gc" or "--trace-deopt"),
 * BENCH_WORKER_FLAGS_B gives the even rounds' workers other options instead (see workerFlags), and
 * BENCH_WORKER_LOG=path keeps each worker's standard output (its log and any such trace) in path.<pid>.
 */
/**
 * The Node/V8 options of a round's workers: BENCH_WORKER_FLAGS, or in the even rounds (2, 4, …)
 * BENCH_WORKER_FLAGS_B when it is set, so two sets of options are held side by side on the same load
 * (A B A B …; each round's line names its options).
 */
const workerFlags = (round: number): string => (round % 2 === 1 && process.env['BENCH_WORKER_FLAGS_B'] !== undefined ? process.env['BENCH_WORKER_FLAGS_B'] : (process.env['BENCH_WORKER_FLAGS'] ?? '')).trim();

function startWorker(round: number): Promise<ChildProcess> {
  const child = spawn(process.execPath, [...(process.env['BENCH_CPU_PROF'] ? ['--cpu-prof', '--cpu-prof-dir', process.env['BENCH_CPU_PROF']] : []), ...workerFlags(round).split(/\s+/).filter(Boolean), '--import', 'tsx', 'server/src/jobs/worker-main.ts'], {
    cwd: ROOT,
    env: { PATH: process.env['PATH'], DATABASE_URL: t.database.url, ENGINE_THREADS: '1', LOG_LEVEL: 'debug' },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  if (process.env['BENCH_WORKER_LOG']) child.stdout!.on('data', (chunk: Buffer) => appendFileSync(`${process.env['BENCH_WORKER_LOG']}.${child.pid}`, chunk));
  return new Promise((resolve, reject) => {
    createInterface({ input: child.stdout! }).on('line', (line) => {
      if (!line.startsWith('{')) return;
      const entry = JSON.parse(line) as { msg?: string; jobId?: string; cases?: number; engineCpuMs?: number };
      if (entry.msg === 'job worker is running') resolve(child);
      if (entry.msg === 'sweep cases computed' && entry.jobId) {
        const sum = engineByJob.get(entry.jobId) ?? { cases: 0, engineCpuMs: 0 };
        engineByJob.set(entry.jobId, { cases: sum.cases + entry.cases!, engineCpuMs: sum.engineCpuMs + entry.engineCpuMs! });
      }
    });
    child.once('exit', (code) => reject(new Error(`the worker exited (${code})`)));
  });
}

/** The workers' engine CPU time over a job's cases (each chunk's report read from their logs, which may lag the job's end a little). */
async function engineCpuOf(jobId: string): Promise<number> {
  for (let waited = 0; (engineByJob.get(jobId)?.cases ?? 0) < CASES; waited += 20) {
    if (waited > 5000) throw new Error(`the workers reported the engine's time for ${engineByJob.get(jobId)?.cases ?? 0} of ${CASES} cases`);
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
  return engineByJob.get(jobId)!.engineCpuMs;
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

/**
 * Job notices (the channel workers notify and app servers LISTEN to), so the bench follows a job as a
 * browser does over server-sent events: it asks for the job when it has moved, not on a timer (polling
 * every 100 ms cost the app server more CPU than the notices, on the same two cores as the workers).
 */
const listener = await t.database.pool.connect();
const noticeWaiters = new Map<string, () => void>();
listener.on('notification', (msg) => {
  const notice = JSON.parse(msg.payload ?? '{}') as JobNotice;
  noticeWaiters.get(notice.jobId)?.();
});
await listener.query(`LISTEN ${JOB_CHANNEL}`);

/** Resolves at the job's next notice, or after a second whatever happens. */
function nextNotice(jobId: string): Promise<void> {
  return new Promise((resolve) => {
    const timer = setTimeout(done, 1000);
    function done() {
      clearTimeout(timer);
      noticeWaiters.delete(jobId);
      resolve();
    }
    noticeWaiters.set(jobId, done);
  });
}

async function runToEnd(branchId: string): Promise<Job> {
  const run = await engineer.post(`/api/branches/${branchId}/run`, {}).expect(202);
  const jobId = run.body.jobId as string;
  for (;;) {
    // Waiting for the next notice starts before the job is read, so none falls between the two.
    const moved = nextNotice(jobId);
    const job = (await engineer.get(`/api/jobs/${jobId}`).expect(200)).body as Job;
    if (job.state !== 'queued' && job.state !== 'running') {
      if (job.state !== 'completed') throw new Error(`the job ended ${job.state}: ${job.error ?? ''}`);
      return job;
    }
    await moved;
  }
}

/** CPU time (user + system) of one process or thread, in ms, from a /proc stat file. */
function cpuMsAt(statPath: string): number {
  const fields = readFileSync(statPath, 'utf8').split(') ')[1]!.split(' ');
  // utime and stime are fields 14 and 15 of stat (proc(5)), in clock ticks; 100 a second on Linux.
  return ((Number(fields[11]) + Number(fields[12])) * 1000) / 100;
}

/** CPU time a process has used so far (all its threads, living or ended), in ms. */
const cpuMsOf = (pid: number): number => cpuMsAt(`/proc/${pid}/stat`);

/**
 * CPU time so far of each living thread of a process, by thread id, in ms: the scheduler's account
 * (schedstat, nanoseconds), not stat's clock ticks, which count in 10 ms steps, 2-3 % of a whole
 * 1,000-case job.
 */
function threadCpuMs(pid: number): Map<string, number> {
  const threads = new Map<string, number>();
  for (const tid of readdirSync(`/proc/${pid}/task`)) {
    try {
      threads.set(tid, Number(readFileSync(`/proc/${pid}/task/${tid}/schedstat`, 'utf8').split(' ', 1)[0]) / 1e6);
    } catch {
      // the thread ended meanwhile
    }
  }
  return threads;
}

/**
 * Starts counting the CPU time of some processes, all their threads; the function returned gives the
 * time used since, in ms. Counted by thread from schedstat; should a thread have ended meanwhile (its
 * time is gone from /proc/<pid>/task), from the processes' stat instead.
 */
function cpuSince(pids: readonly number[]): () => number {
  const threads = pids.map(threadCpuMs);
  const ticks = pids.reduce((ms, pid) => ms + cpuMsOf(pid), 0);
  return () => {
    let ms = 0;
    for (const [i, pid] of pids.entries()) {
      const now = threadCpuMs(pid);
      for (const tid of threads[i]!.keys()) if (!now.has(tid)) return pids.reduce((total, p) => total + cpuMsOf(p), 0) - ticks;
      for (const [tid, used] of now) ms += used - (threads[i]!.get(tid) ?? 0);
    }
    return ms;
  };
}

/** The PostgreSQL cluster's CPU time so far (postmaster, its living children and those it has reaped), in ms. */
async function postgresCpuMs(): Promise<number> {
  const { rows } = await t.database.pool.query<{ pid: number }>('select pg_backend_pid() as pid');
  const postmaster = Number(readFileSync(`/proc/${rows[0]!.pid}/stat`, 'utf8').split(') ')[1]!.split(' ')[1]);
  const fields = readFileSync(`/proc/${postmaster}/stat`, 'utf8').split(') ')[1]!.split(' ');
  // utime, stime, cutime and cstime (fields 14 to 17 of stat), in clock ticks.
  let ms = ((Number(fields[11]) + Number(fields[12]) + Number(fields[13]) + Number(fields[14])) * 1000) / 100;
  for (const child of readFileSync(`/proc/${postmaster}/task/${postmaster}/children`, 'utf8').trim().split(/\s+/).filter(Boolean)) {
    try {
      ms += cpuMsOf(Number(child));
    } catch {
      // it ended meanwhile (and was counted in cutime, or will be)
    }
  }
  return ms;
}

/** This process's CPU time so far (the app server answering the run and the polls), in ms. */
const ownCpuMs = () => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
};

interface TimedRun {
  wallMs: number;
  /** Worker processes, all threads. */
  cpuMs: number;
  /** Of which: the engine's own, on the computing threads around its calls (the workers' reports). */
  engineCpuMs: number;
  /** Of which: their main threads (queue, database, assembly), and their busiest other thread each (the compute thread when there is one). */
  mainMs: number;
  computeMs: number;
  idleCpuMsPerS: number;
  /** The fresh workers' CPU time a case over the warm-up sweep. */
  warmUpCpuMsPerCase: number;
  /** The app server (this process) and the PostgreSQL cluster over the same run. */
  appMs: number;
  postgresMs: number;
}

/**
 * Wall and CPU time of the 1,000-case job on `workers` fresh worker processes, warmed up first by a
 * sweep of WARM_UP cases each (as long-lived workers are; the in-process case is warmed up by as many).
 * CPU time is the worker processes' own: what the job costs, whatever else the machine is doing.
 */
async function timedRun(workers: number, round: number): Promise<TimedRun> {
  const label = `Bench ${workers} worker(s) ${randomUUID().slice(0, 8)}`;
  const warmUps = await Promise.all(Array.from({ length: WARM_JOBS }, (_, i) => newStudy(`${label} warm-up ${i + 1}`, WARM_UP * workers)));
  const branchId = await newStudy(label, CASES);
  const procs = await Promise.all(Array.from({ length: workers }, () => startWorker(round)));
  const pids = procs.map((p) => p.pid!);
  const warmUpCpu = cpuSince(pids);
  for (const warmUp of warmUps) await runToEnd(warmUp);
  const warmUpCpuMsPerCase = warmUpCpu() / (WARM_UP * workers * WARM_JOBS);
  // What the worker processes use while waiting for work (polling, the queue's upkeep, timers).
  const idleCpu = cpuSince(pids);
  await new Promise((resolve) => setTimeout(resolve, 4000));
  const idleCpuMsPerS = idleCpu() / 4 / workers;
  const threadsBefore = procs.map((p) => threadCpuMs(p.pid!));
  const [jobCpu, appBefore, pgBefore] = [cpuSince(pids), ownCpuMs(), await postgresCpuMs()];
  const started = performance.now();
  const job = await runToEnd(branchId);
  const wallMs = performance.now() - started;
  const [cpuMs, appAfter, pgAfter] = [jobCpu(), ownCpuMs(), await postgresCpuMs()];
  const engineCpuMs = await engineCpuOf(job.jobId);
  let mainMs = 0;
  let computeMs = 0;
  procs.forEach((p, i) => {
    const used = [...threadCpuMs(p.pid!)].map(([tid, ms]) => ({ tid, ms: ms - (threadsBefore[i]!.get(tid) ?? 0) }));
    mainMs += used.find((u) => u.tid === String(p.pid))?.ms ?? 0;
    computeMs += Math.max(0, ...used.filter((u) => u.tid !== String(p.pid)).map((u) => u.ms));
  });
  await stopWorkers(procs);
  return { wallMs, cpuMs, engineCpuMs, mainMs, computeMs, idleCpuMsPerS, warmUpCpuMsPerCase, appMs: appAfter - appBefore, postgresMs: pgAfter - pgBefore };
}


/**
 * Two in-process loops at once, each in a process of its own (warmed up, then started together): what
 * the cases cost when two processes compute side by side on this machine, as two workers do. Their
 * mean costs a case.
 */
async function inProcessPair(): Promise<CaseCost> {
  const loops = [0, 1].map(() => {
    const child = spawn(process.execPath, ['--import', 'tsx', 'server/bench/sweep-case-loop.ts'], { cwd: ROOT, env: { PATH: process.env['PATH'] }, stdio: ['pipe', 'pipe', 'inherit'] });
    const lines = createInterface({ input: child.stdout! })[Symbol.asyncIterator]();
    return { child, next: async () => ((await lines.next()).value as string | undefined) ?? '' };
  });
  for (const loop of loops) if ((await loop.next()) !== 'ready') throw new Error('an in-process loop did not start');
  for (const loop of loops) loop.child.stdin!.write('go\n');
  const [a, b] = await Promise.all(loops.map(async (loop) => JSON.parse(await loop.next()) as CaseCost));
  return { wallMs: (a!.wallMs + b!.wallMs) / 2, cpuMs: (a!.cpuMs + b!.cpuMs) / 2, engineCpuMs: (a!.engineCpuMs + b!.engineCpuMs) / 2 };
}

/** The median of a few figures. */
function median(xs: readonly number[]): number {
  const sorted = [...xs].sort((a, b) => a - b);
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
}

/** One job run beside the in-process loop run just before it. */
interface Round {
  workers: 1 | 2;
  run: TimedRun;
  /** The loop it is held against: one loop for one worker, two loops at once for two workers. */
  loop: CaseCost;
  /** For two workers, the one-worker round's lone loop too. */
  lone: CaseCost;
  load: number;
  /** The workers' Node/V8 options (workerFlags). */
  flags: string;
  /** The lone loop's cases computed one at a time (computeSweepCase), as workers did before the chunk entry. */
  oneByOne: CaseCost;
  /** The job's three light cells computed in this process (ms, inProcessLightCells), after the lone loop. */
  lightMs: number;
}

/** Worker CPU a case over the loop's, less one: the issue's figure. */
const overhead = (r: Round, loop = r.loop) => r.run.cpuMs / CASES / loop.cpuMs - 1;
/** The engine's own CPU in the worker against the loop's engine thread: the machine's drift, and living in a worker. */
const engineShift = (r: Round) => r.run.engineCpuMs / CASES / r.loop.engineCpuMs - 1;
/** The job's code: the worker's CPU over its engine's, against the loop's CPU over its engine's (threads besides it). Drift cancels. */
const jobCode = (r: Round) => r.run.cpuMs / r.run.engineCpuMs / (r.loop.cpuMs / r.loop.engineCpuMs) - 1;

try {
  const rounds: Round[] = [];
  for (let round = 0; round < ROUNDS; round++) {
    const oneByOne = await inProcessCases(undefined, 'cases');
    const lone = await inProcessCases();
    const lightMs = inProcessLightCells(`light cells ${round}`);
    for (const workers of WORKER_COUNTS) {
      const loop = workers === 1 ? lone : await inProcessPair();
      const run = await timedRun(workers, round);
      rounds.push({ workers, run, loop, lone, load: loadavg()[0]!, oneByOne, flags: workerFlags(round), lightMs });
    }
  }
  const pct = (x: number) => `${x >= 0 ? '+' : ''}${(x * 100).toFixed(1)} %`;
  const ms = (x: number) => `${x.toFixed(3)} ms`;
  const perCase = (total: number) => ms(total / CASES);
  const spread = (xs: readonly number[]) => `median ${pct(median(xs))} (${pct(Math.min(...xs))} to ${pct(Math.max(...xs))}, ${xs.length} rounds)`;
  out(`jobs: ${CASES}-case Reynolds-number sweep of a 2 × 300-station analysis (e^N and Michel), as a job through the API; ${ROUNDS} rounds, each an in-process loop and then the job`);
  for (const n of WORKER_COUNTS) {
    const of = rounds.filter((r) => r.workers === n);
    const against = n === 1 ? 'one in-process loop' : 'two in-process loops at once (each in its own process)';
    out(`  ${n} worker process${n > 1 ? 'es' : ''} × 1 thread, against ${against}; CPU a case (all threads; engine = the computing thread around the engine's calls):`);
    of.forEach((r, i) => {
      out(
        `    round ${i + 1}: loop ${ms(r.loop.cpuMs)} (engine ${ms(r.loop.engineCpuMs)}) | job ${perCase(r.run.cpuMs)} (engine ${perCase(r.run.engineCpuMs)}): overhead ${pct(overhead(r))}` +
          ` = engine in the job ${pct(engineShift(r))} × job code ${pct(jobCode(r))}${n > 1 ? `; against one loop ${pct(overhead(r, r.lone))}` : ''}; wall ${(r.run.wallMs / 1000).toFixed(2)} s; load ${r.load.toFixed(1)}${r.flags ? `; workers ${r.flags}` : ''}`,
      );
      out(
        `      worker CPU: main thread${n > 1 ? 's' : ''} ${perCase(r.run.mainMs)}, busiest other thread${n > 1 ? 's' : ''} ${perCase(r.run.computeMs)}, the rest ${perCase(r.run.cpuMs - r.run.mainMs - r.run.computeMs)};` +
          ` beside it the app server ${perCase(r.run.appMs)} and PostgreSQL ${perCase(r.run.postgresMs)}; fresh workers over their warm-up ${r.run.warmUpCpuMsPerCase.toFixed(2)} ms a case`,
      );
    });
    out(`    job overhead (target < 20 %): ${spread(of.map((r) => overhead(r)))}${n > 1 ? `; against one loop ${spread(of.map((r) => overhead(r, r.lone)))}` : ''}`);
    out(`      of which the job's code (drift-free): ${spread(of.map(jobCode))}; the engine in the job against the loop's: ${spread(of.map(engineShift))}`);
    out(`      of which the job's 3 light cells (flow, pressure, the analysis), which the loop does not compute: ${ms(median(of.map((r) => r.lightMs)))} in-process, ${pct(median(of.map((r) => r.lightMs / (CASES * r.loop.cpuMs))))} of the loop's ${CASES} cases (medians)`);
    out(`      median wall ${(median(of.map((r) => r.run.wallMs)) / 1000).toFixed(2)} s; idle worker ${median(of.map((r) => r.run.idleCpuMsPerS)).toFixed(1)} ms CPU a second (included above)`);
    if (process.env['BENCH_WORKER_FLAGS_B'] !== undefined) {
      for (const flags of new Set(of.map((r) => r.flags))) {
        const with_ = of.filter((r) => r.flags === flags);
        out(`      workers ${flags ? `with ${flags}` : 'without options'}: overhead ${spread(with_.map((r) => overhead(r)))}; job code ${spread(with_.map(jobCode))}`);
      }
    }
  }
  const ones = rounds.filter((r) => r.workers === 1);
  out(
    `  in-process, the engine's chunk entry (the workers' path, above) against one case at a time (computeSweepCase): wall ${ms(median(ones.map((r) => r.lone.wallMs)))} against ${ms(median(ones.map((r) => r.oneByOne.wallMs)))} a case,` +
      ` CPU ${ms(median(ones.map((r) => r.lone.cpuMs)))} against ${ms(median(ones.map((r) => r.oneByOne.cpuMs)))} (medians; ${(median(ones.map((r) => r.oneByOne.wallMs / r.lone.wallMs))).toFixed(2)}× by the median of the rounds' ratios)`,
  );
  if (WORKER_COUNTS.length > 1) {
    const wall = (n: number) => median(rounds.filter((r) => r.workers === n).map((r) => r.run.wallMs));
    out(`  speed-up of two workers over one (median wall): ${(wall(1) / wall(2)).toFixed(2)}×`);
  }
  out(`  (wall: POST /run to the job seen completed (followed by its notices, as the browser does), its 3 light cells and the sweep's assembly included; each side warmed up by ${WARM_UP} cases (each worker${WARM_JOBS > 1 ? `, ${WARM_JOBS} sweeps of them` : ''}) first;`);
  out(`   CPU: worker processes' time from /proc, all threads (schedstat); loops' from process.cpuUsage; engine: the computing thread's schedstat; ${availableParallelism()} cores, shared with whatever else runs)`);
} finally {
  listener.release();
  await t.close();
}
process.exit(0);
