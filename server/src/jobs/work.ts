import { CELL_KIND_REGISTRY, type CellError, type CellKind, type SweepInputs } from '@laminote/contracts';
import { sweepCaseCount, type CellTask } from '@laminote/aero';
import { taskOf, type CellPlan } from '../notebook/plan';

/**
 * What a run job has to do, planned from the draft when the run was asked for: every cell it takes, in
 * run order (each after the cells it uses), with the key its output will be stored under and the
 * computation to hand a worker. A later edit of the draft does not change a job under way; its outputs
 * are still stored by key and shown only where the draft's cell still has that key.
 */
export interface JobWork {
  cellId: string;
  kind: CellKind;
  /** The output's key; null when the cell cannot run (its problems are its report). */
  key: string | null;
  problem: CellError | null;
  task: CellTask | null;
  refs: { field: string; cellId: string }[];
  /** Cases of a sweep, each computed and stored on its own; 0 for other kinds. */
  cases: number;
  /** Its output was stored already when the run was asked for. */
  cached: boolean;
  /** Its place in the draft: reports list the cells as the notebook shows them. */
  position: number;
}

/**
 * Sweep cases per queue job: about a tenth of a second of computing for a 2 × 300-station analysis
 * (0.3-0.4 ms a case since the engine keeps a table's surfaces prepared), so a lost worker costs
 * little and the progress bar still moves every tenth of a second, while what a chunk costs besides its
 * cases (five round trips, its JSON and the collector's work around them) is spread over enough cases:
 * at 100 a chunk the job's own code was +40 to +84 % of the engine's time, at 300 +35 to +37 %
 * (npm run bench -- jobs, the drift-free figure, load 8-15).
 */
export const CASES_PER_CHUNK = 300;

export function planWork(order: readonly string[], plans: Map<string, CellPlan>, stored: ReadonlySet<string>, draftOrder: readonly string[]): JobWork[] {
  return order.map((cellId) => {
    const plan = plans.get(cellId)!;
    const first = plan.problems[0];
    return {
      cellId,
      kind: plan.kind,
      key: plan.key,
      problem: plan.key === null ? (first ? { message: `${first.field}: ${first.message}`, field: first.field } : { message: 'the cell cannot run' }) : null,
      task: taskOf(plan, plans),
      refs: plan.refs,
      cases: plan.kind === 'sweep' && plan.inputs ? sweepCaseCount(plan.inputs as SweepInputs) : 0,
      cached: plan.key !== null && stored.has(plan.key),
      position: draftOrder.indexOf(cellId),
    };
  });
}

/** Units of progress of one cell: one, or one per sweep case. */
export const unitsOf = (work: JobWork): number => (work.cases > 0 ? work.cases : 1);

/** Whether anything of the run is left to compute. */
export const needsComputing = (work: readonly JobWork[]): boolean => work.some((w) => w.key !== null && !w.cached);

/**
 * How many cells a run may have left to compute and still be computed at once by the server instead
 * of queued, when every one of them is of a quick kind (`quick` in the cell-kind registry: one engine
 * call, no cases or points): waiting for a worker to take a job would cost the person more than the
 * work itself. Sweeps, polars and anything larger are queued.
 */
export const QUICK_RUN_CELLS = 4;

/** Whether what is left to compute is a few quick cells, which the server computes at once. */
export function isQuickRun(work: readonly JobWork[]): boolean {
  const todo = work.filter((w) => w.key !== null && !w.cached);
  return todo.length <= QUICK_RUN_CELLS && todo.every((w) => w.cases === 0 && CELL_KIND_REGISTRY[w.kind].quick);
}
