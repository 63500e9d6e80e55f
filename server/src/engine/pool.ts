import { availableParallelism } from 'node:os';
import { Piscina } from 'piscina';
import type { CellTask, ComputedOutput } from '@laminote/aero';

export type { CellTask, ComputedOutput } from '@laminote/aero';

/**
 * A cell's output as an engine thread hands it back: the result's JSON as UTF-8 bytes, written as
 * bytes on that thread, so the server's main thread never encodes it (it goes to PostgreSQL and into
 * the run's answer as these bytes: about 57 kB for a 2 × 300-station analysis).
 */
export type EngineOutput = ComputedOutput<Uint8Array>;

/**
 * The engine's worker-thread pool (piscina): each task is one cell for `computeCell` (libs/aero/src/cells),
 * run off the event loop so the server keeps answering while it computes.
 */
export interface EnginePool {
  run(task: CellTask): Promise<EngineOutput>;
  /**
   * Several cells in one task of one worker: one hand-over each way instead of one per cell (a flow
   * condition is microseconds of arithmetic, its message costs more). Each cell's promise settles
   * on its own: a defect in one rejects that one only.
   */
  runAll(tasks: CellTask[]): Promise<EngineOutput>[];
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

/** One cell of a task of several (worker.mjs computeCellOutputs). */
type BatchEntry = { output: EngineOutput } | { defect: string };

/** The pool is full: the caller should answer 503 and the client try again. */
export class EngineBusyError extends Error {}
/** A task ran past its time limit and was stopped. */
export class EngineTimeoutError extends Error {}

export function createEnginePool(options: EnginePoolOptions = {}): EnginePool {
  const threads = options.threads && options.threads > 0 ? options.threads : Math.max(1, availableParallelism());
  const timeoutMs = options.taskTimeoutMs ?? 60_000;
  const piscina = new Piscina<CellTask | CellTask[], EngineOutput | BatchEntry[]>({
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
  /** One task on the pool: refused at once when the queue is full, stopped past the time limit. */
  const submit = async <T>(task: CellTask | CellTask[], name?: string): Promise<T> => {
    if (piscina.queueSize >= piscina.options.maxQueue) throw new EngineBusyError(`the engine has ${piscina.queueSize} tasks waiting`);
    const abort = new AbortController();
    const timer = setTimeout(() => abort.abort(), timeoutMs);
    try {
      return (await piscina.run(task, name ? { signal: abort.signal, name } : { signal: abort.signal })) as T;
    } catch (error) {
      if (abort.signal.aborted) throw new EngineTimeoutError(`the computation took longer than ${timeoutMs / 1000} s and was stopped`);
      throw error;
    } finally {
      clearTimeout(timer);
    }
  };
  return {
    threads,
    get completed() {
      return completed;
    },
    async run(task) {
      const outcome = await submit<EngineOutput>(task);
      completed++;
      return outcome;
    },
    runAll(tasks) {
      const batch = submit<BatchEntry[]>(tasks, 'computeCellOutputs');
      return tasks.map(async (_task, i) => {
        const entry = (await batch)[i]!;
        if ('defect' in entry) throw new Error(entry.defect);
        completed++;
        return entry.output;
      });
    },
    close: () => piscina.close({ force: true }),
  };
}
