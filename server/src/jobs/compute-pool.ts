import { availableParallelism } from 'node:os';
import { Piscina } from 'piscina';
import type { CellTask, ComputedOutput } from '@laminote/aero';
import type { SweepCaseOutput, SweepCasesTask } from './sweep-cases';

/**
 * A job worker's compute threads (piscina): cells and chunks of sweep cases run off the event loop,
 * one per thread, so the process keeps talking to the database (and answering its signals) meanwhile.
 */
export interface ComputePool {
  cell(task: CellTask): Promise<ComputedOutput>;
  sweepCases(task: SweepCasesTask): Promise<SweepCaseOutput[]>;
  readonly threads: number;
  close(): Promise<void>;
}

export function createComputePool(threads = 0): ComputePool {
  const size = threads > 0 ? threads : Math.max(1, availableParallelism());
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
    sweepCases: (task) => piscina.run(task, { name: 'computeSweepCases' }) as Promise<SweepCaseOutput[]>,
    close: () => piscina.close({ force: true }),
  };
}
