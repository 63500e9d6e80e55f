import { computeSweepCases as computeEngineCases, resultBytes, type CellTask, type SweepCase } from '@laminote/aero';
import type { SweepInputs } from '@laminote/contracts';
import { threadCpuMs } from './thread-cpu';

/**
 * What a job worker computes for a chunk of a sweep: its cases through the engine's chunk entry
 * (computeSweepCases in libs/aero/src/cells/sweep.ts: each case exactly as the sweep cell computes it,
 * what they share prepared once), kept as the JSON bytes to store.
 */

export interface SweepCasesTask {
  /** The sweep cell's task (inputs and the cells it uses). */
  task: CellTask;
  indices: number[];
}

export interface SweepCasesOutput {
  indices: number[];
  /**
   * The cases (each its step and warnings) in the order of `indices`, as one JSON array, numbers to
   * RESULT_DIGITS: the UTF-8 bytes resultBytes writes (resultJson's text, to the byte), which go to
   * PostgreSQL as a parameter as they are.
   */
  json: Uint8Array;
  /** CPU time the computing thread spent inside the engine for these cases, in ms (its own thread's, not the process's). */
  engineCpuMs: number;
}

/**
 * A chunk of cases computed a slice at a time, so a worker computing on its main thread can let its
 * event loop run between slices. The engine's calls are timed apart from writing the cases out.
 */
export class SweepCasesComputation {
  private readonly computed: SweepCase[] = [];
  /** CPU time the engine has taken so far, in ms (the computing thread's). */
  engineCpuMs = 0;
  /** Cases the next slice takes: one at first, then as many as fit half the time given to a step. */
  private sliceCases = 1;

  constructor(private readonly chunk: SweepCasesTask) {}

  get done(): boolean {
    return this.computed.length === this.chunk.indices.length;
  }

  /** Computes the next cases, until all are done or at least `budgetMs` of wall time has gone (all at once when no budget is given). */
  step(budgetMs = Infinity): void {
    const { task, indices } = this.chunk;
    const started = performance.now();
    const cpu = threadCpuMs();
    do {
      const from = this.computed.length;
      const slice = budgetMs === Infinity ? indices.slice(from) : indices.slice(from, from + this.sliceCases);
      const sliceStarted = performance.now();
      for (const c of computeEngineCases(task.inputs as SweepInputs, task.upstream, slice)) this.computed.push(c);
      const msPerCase = (performance.now() - sliceStarted) / slice.length;
      this.sliceCases = Math.max(1, Math.floor(budgetMs / 2 / Math.max(msPerCase, 0.001)));
    } while (!this.done && performance.now() - started < budgetMs);
    this.engineCpuMs += threadCpuMs() - cpu;
  }

  output(): SweepCasesOutput {
    // One JSON array for the chunk: one walk of the rounding and one parameter to send, not one of each per case.
    return { indices: this.chunk.indices, json: resultBytes(this.computed), engineCpuMs: this.engineCpuMs };
  }
}

/** A chunk of cases at once (on a compute thread). */
export function computeSweepCases(chunk: SweepCasesTask): SweepCasesOutput {
  const computation = new SweepCasesComputation(chunk);
  while (!computation.done) computation.step();
  return computation.output();
}
