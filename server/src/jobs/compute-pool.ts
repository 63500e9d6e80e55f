import { availableParallelism } from 'node:os';
import { setImmediate as yieldToEventLoop } from 'node:timers/promises';
import { Piscina } from 'piscina';
import { computeCellOutput, type CellTask, type ComputedOutput } from '@laminote/aero';
import { SweepCasesComputation, type SweepCasesOutput, type SweepCasesTask } from './sweep-cases';

/**
 * Where a job worker computes: cells and chunks of sweep cases. With more than one compute thread they
 * run on piscina threads, one piece per thread, off the event loop. A worker process with one thread
 * (`ENGINE_THREADS=1`, the process being the unit of parallelism) computes on its own main thread
 * instead: handing every piece to a second thread costs that thread's own heap, collector and
 * compiled code besides the copy both ways, for nothing, since the process has nothing else to do
 * meanwhile. A chunk there gives way to the event loop between cases (at most every YIELD_MS), so the
 * queue's upkeep, the database connections and the process's signals are still seen to promptly.
 */
export interface ComputePool {
  cell(task: CellTask): Promise<ComputedOutput>;
  sweepCases(task: SweepCasesTask): Promise<SweepCasesOutput>;
  readonly threads: number;
  close(): Promise<void>;
}

/** Longest a worker computing on its main thread goes without letting the event loop run. */
export const YIELD_MS = 25;

export function createComputePool(threads = 0): ComputePool {
  const size = threads > 0 ? threads : Math.max(1, availableParallelism());
  return size === 1 ? createInlinePool() : createThreadPool(size);
}

function createThreadPool(size: number): ComputePool {
  const piscina = new Piscina({
    filename: new URL('./compute-worker.mjs', import.meta.url).href,
    execArgv: [],
    minThreads: size,
    maxThreads: size,
    idleTimeout: 60_000,
  });
  return {
    threads: size,
    cell: (task) => piscina.run(task) as Promise<ComputedOutput>,
    sweepCases: (task) => piscina.run(task, { name: 'computeSweepCases' }) as Promise<SweepCasesOutput>,
    close: () => piscina.close({ force: true }),
  };
}

function createInlinePool(): ComputePool {
  return {
    threads: 1,
    async cell(task) {
      await yieldToEventLoop();
      return computeCellOutput(task);
    },
    async sweepCases(task) {
      const computation = new SweepCasesComputation(task);
      while (!computation.done) {
        computation.step(YIELD_MS);
        if (!computation.done) await yieldToEventLoop();
      }
      return computation.output();
    },
    close: async () => undefined,
  };
}
