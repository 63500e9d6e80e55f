/**
 * The sweep the jobs benchmark runs (jobs.bench.ts), and its cases computed one after another in one
 * process with no queue at all: the in-process figure the job's cost is held against. Run as a script
 * (`tsx server/bench/sweep-case-loop.ts`) it is one of two such loops at once, for the two-worker
 * comparison: it warms up, prints "ready", waits for a line on stdin, computes, prints its figures as JSON.
 */
import { randomUUID } from 'node:crypto';
import { createInterface } from 'node:readline';
import { computeCellOutput, computeSweepCase } from '@laminote/aero';
import { CELL_SCHEMAS, type CellInputs, type CellKind } from '@laminote/contracts';
import { joukowskiLoop } from '../../libs/aero/test/joukowski';
import { YIELD_MS } from '../src/jobs/compute-pool';
import { SweepCasesComputation } from '../src/jobs/sweep-cases';
import { threadCpuMs } from '../src/jobs/thread-cpu';
import { CASES_PER_CHUNK } from '../src/jobs/work';

export const CASES = 1000;
/** Cases each side computes before it is measured: enough for the engine's code to be optimised (about 200). */
export const WARM_UP = 300;

const parsed = <K extends CellKind>(kind: K, inputs: Record<string, unknown>) => CELL_SCHEMAS[kind].inputs.parse(inputs) as CellInputs[K];

/** A study of a Joukowski section's pressures (601 points), its flow, a 2 × 300-station analysis and a Reynolds-number sweep of it. */
export function studyCells(label: string) {
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

/** What the in-process cases cost, each a mean over the CASES cases, in ms. */
export interface CaseCost {
  wallMs: number;
  /** CPU time of the whole process (every thread: the computing one, the collector's and the compiler's). */
  cpuMs: number;
  /** CPU time of the computing thread alone: the engine's own, as a job worker reports it from inside a job. */
  engineCpuMs: number;
}

/**
 * The same CASES cases computed one after another in this process with no queue (after WARM_UP cases),
 * by the job worker's own compute path: chunks of CASES_PER_CHUNK through the engine's chunk entry, in
 * slices of YIELD_MS (SweepCasesComputation), without writing them out or storing them. `path: 'cases'`
 * computes them one at a time through computeSweepCase instead, as workers did before the chunk entry.
 */
export async function inProcessCases(beforeMeasuring: () => Promise<void> = async () => undefined, path: 'chunks' | 'cases' = 'chunks'): Promise<CaseCost> {
  const { inputs } = studyCells('in-process');
  const upstream = {
    analysisCellId: {
      kind: 'analysis' as const,
      inputs: parsed('analysis', inputs.analysis),
      upstream: { flowCellId: { kind: 'flow' as const, inputs: parsed('flow', inputs.flow), upstream: {} }, pressureCellId: { kind: 'pressure' as const, inputs: parsed('pressure', inputs.pressure), upstream: {} } },
    },
  };
  const sweep = parsed('sweep', inputs.sweep);
  const task = { kind: 'sweep' as const, inputs: sweep, upstream };
  /** The engine's thread CPU over the indices, in ms. */
  const compute = (indices: number[]): number => {
    if (path === 'cases') {
      const thread = threadCpuMs();
      for (const index of indices) computeSweepCase(sweep, upstream, index);
      return threadCpuMs() - thread;
    }
    let engineMs = 0;
    for (let from = 0; from < indices.length; from += CASES_PER_CHUNK) {
      const computation = new SweepCasesComputation({ task, indices: indices.slice(from, from + CASES_PER_CHUNK) });
      while (!computation.done) computation.step(YIELD_MS);
      engineMs += computation.engineCpuMs;
    }
    return engineMs;
  };
  compute(Array.from({ length: WARM_UP }, (_, i) => (i * 37) % CASES));
  await beforeMeasuring();
  const start = performance.now();
  const cpu = process.cpuUsage();
  const engineMs = compute(Array.from({ length: CASES }, (_, i) => i));
  const used = process.cpuUsage(cpu);
  return { wallMs: (performance.now() - start) / CASES, cpuMs: (used.user + used.system) / 1000 / CASES, engineCpuMs: engineMs / CASES };
}

/**
 * CPU time (ms, this process, all threads) of the study's three light cells (flow, pressure and the
 * 2 × 300-station analysis, with its output's JSON) computed here through computeCellOutput, a fresh
 * study each time as the bench's jobs are: work a job does besides its 1,000 cases, which the loop
 * above does not, so part of the job's overhead as the bench counts it. Shown beside the figure, not
 * taken out of it.
 */
export function inProcessLightCells(label: string): number {
  const { inputs } = studyCells(label);
  const flow = { kind: 'flow' as const, inputs: parsed('flow', inputs.flow), upstream: {} };
  const pressure = { kind: 'pressure' as const, inputs: parsed('pressure', inputs.pressure), upstream: {} };
  const analysis = { kind: 'analysis' as const, inputs: parsed('analysis', inputs.analysis), upstream: { flowCellId: flow, pressureCellId: pressure } };
  const cpu = process.cpuUsage();
  for (const task of [flow, pressure, analysis]) computeCellOutput(task);
  const used = process.cpuUsage(cpu);
  return (used.user + used.system) / 1000;
}

if (process.argv[1]?.endsWith('sweep-case-loop.ts')) {
  const lines = createInterface({ input: process.stdin })[Symbol.asyncIterator]();
  const figures = await inProcessCases(async () => {
    process.stdout.write('ready\n');
    await lines.next();
  });
  process.stdout.write(`${JSON.stringify(figures)}\n`);
  process.exit(0);
}
