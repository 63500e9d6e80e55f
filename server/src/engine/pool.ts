import { availableParallelism } from 'node:os';
import { Piscina } from 'piscina';
import type { CellTask, ComputedOutput } from '@laminote/aero';

export type { CellTask, ComputedOutput } from '@laminote/aero';

/**
 * The engine's worker-thread pool (piscina): each task is one cell for `computeCell` (libs/aero/src/cells),
 * run off the event loop so the server keeps answering while it computes.
 */
export interface EnginePool {
  run(task: CellTask): Promise<ComputedOutput>;
  /** Tasks the workers have finished since the pool started (tests use it to see that a cached run computed nothing). */
  readonly completed: number;
  readonly threads: number;
  close(): Promise<void>;
}

export interface EnginePoolOptions {
  /** Worker threads; 0 or absent picks from the number of cores. */
  threads?: number;
  /** A task running longer than this is stopped (its worker is replaced). */
  taskTimeoutMs?: number;
  /** Tasks waiting beyond this many per thread are refused at once (EngineBusyError). */
  queuePerThread?: number;
}

/** The pool is full: the caller should answer 503 and the client try again. */
export class EngineBusyError extends Error {}
/** A task ran past its time limit and was stopped. */
export class EngineTimeoutError extends Error {}

export function createEnginePool(options: EnginePoolOptions = {}): EnginePool {
  const threads = options.threads && options.threads > 0 ? options.threads : Math.max(1, availableParallelism());
  const timeoutMs = options.taskTimeoutMs ?? 60_000;
  const piscina = new Piscina<CellTask, ComputedOutput>({
    filename: new URL('./worker.mjs', import.meta.url).href,
    // The worker registers its own TypeScript loader; see worker.mjs.
    execArgv: [],
    minThreads: threads,
    maxThreads: threads,
    idleTimeout: 60_000,
    maxQueue: threads * (options.queuePerThread ?? 64),
    // Nobody reads the pool's run and wait time histograms; recording them costs every task.
    recordTiming: false,
  });
  let completed = 0;
  return {
    threads,
    get completed() {
      return completed;
    },
    async run(task) {
      if (piscina.queueSize >= piscina.options.maxQueue) throw new EngineBusyError(`the engine has ${piscina.queueSize} tasks waiting`);
      const abort = new AbortController();
      const timer = setTimeout(() => abort.abort(), timeoutMs);
      try {
        const outcome = await piscina.run(task, { signal: abort.signal });
        completed++;
        return outcome;
      } catch (error) {
        if (abort.signal.aborted) throw new EngineTimeoutError(`the computation took longer than ${timeoutMs / 1000} s and was stopped`);
        throw error;
      } finally {
        clearTimeout(timer);
      }
    },
    close: () => piscina.close({ force: true }),
  };
}
