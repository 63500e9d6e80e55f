import { computeSweepCase, roundedNumber, type CellTask } from '@laminote/aero';
import type { SweepInputs } from '@laminote/contracts';

/**
 * What a job worker's threads compute for a chunk of a sweep: each case on its own, as the sweep
 * cell computes it (libs/aero/src/cells/sweep.ts), kept as JSON text to store.
 */

export interface SweepCasesTask {
  /** The sweep cell's task (inputs and the cells it uses). */
  task: CellTask;
  indices: number[];
}

export interface SweepCaseOutput {
  index: number;
  /** The case (its step and warnings) as JSON, numbers to RESULT_DIGITS. */
  json: string;
}

export function computeSweepCases({ task, indices }: SweepCasesTask): SweepCaseOutput[] {
  const inputs = task.inputs as SweepInputs;
  return indices.map((index) => ({ index, json: JSON.stringify(computeSweepCase(inputs, task.upstream, index), roundedNumber) }));
}
