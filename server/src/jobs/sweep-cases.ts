import { computeSweepCase, resultJson, type CellTask, type SweepCase } from '@laminote/aero';
import type { SweepInputs } from '@laminote/contracts';
import { threadCpuMs } from './thread-cpu';

/**
 * What a job worker computes for a chunk of a sweep: each case on its own, as the sweep cell computes
 * it (libs/aero/src/cells/sweep.ts), kept as JSON text to store.
 */

export interface SweepCasesTask {
  /** The sweep cell's task (inputs and the cells it uses). */
  task: CellTask;
  indices: number[];
}

export interface SweepCasesOutput {
  indices: number[];
  /** The cases (each its step and warnings) in the order of `indices`, as one JSON array, numbers to RESULT_DIGITS. */
  json: string;
  /** CPU time the computing thread spent inside the engine for these cases, in ms (its own thread's, not the process's). */
  engineCpuMs: number;
}

/**
 * A chunk of cases computed a slice at a time, so a worker computing on its main thread can let its
 * event loop run between slices. The engine's calls are timed apart from writing the cases out.
 */
export class SweepCasesComputation {
  private readonly computed: SweepCase[] = [];
  private engineCpuMs = 0;

  constructor(private readonly chunk: SweepCasesTask) {}

  get done(): boolean {
    return this.computed.length === this.chunk.indices.length;
  }

  /** Computes the next cases, until all are done or at least `budgetMs` of wall time has gone. */
  step(budgetMs = Infinity): void {
    const { task, indices } = this.chunk;
    const started = performance.now();
    const cpu = threadCpuMs();
    do {
      this.computed.push(computeSweepCase(task.inputs as SweepInputs, task.upstream, indices[this.computed.length]!));
    } while (!this.done && performance.now() - started < budgetMs);
    this.engineCpuMs += threadCpuMs() - cpu;
  }

  output(): SweepCasesOutput {
    // One text for the chunk: one walk of the rounding and one string to send, not one of each per case.
    return { indices: this.chunk.indices, json: resultJson(this.computed), engineCpuMs: this.engineCpuMs };
  }
}

/** A chunk of cases at once (on a compute thread). */
export function computeSweepCases(chunk: SweepCasesTask): SweepCasesOutput {
  const computation = new SweepCasesComputation(chunk);
  while (!computation.done) computation.step();
  return computation.output();
}
