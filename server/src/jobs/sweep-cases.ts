import { computeSweepCase as computeCase, roundedNumber, type CellTask } from '@laminote/aero';
import type { SweepInputs } from '@laminote/contracts';

/**
 * What a job worker computes for a chunk of a sweep: each case on its own, as the sweep cell computes
 * it (libs/aero/src/cells/sweep.ts), kept as JSON text to store.
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

/** One case of the sweep `task`, as stored. */
export function computeSweepCase(task: CellTask, index: number): SweepCaseOutput {
  return { index, json: JSON.stringify(computeCase(task.inputs as SweepInputs, task.upstream, index), roundedNumber) };
}

export function computeSweepCases({ task, indices }: SweepCasesTask): SweepCaseOutput[] {
  return indices.map((index) => computeSweepCase(task, index));
}
