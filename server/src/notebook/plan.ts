import { createHash } from 'node:crypto';
import { ENGINE_VERSION, isComputedKind, planCells as planStudyCells, sourceOf, type CellPlan as StudyCellPlan, type CellTask } from '@laminote/aero';
import type { AnalysisInputs, CellInputs, CellKind } from '@laminote/contracts';
import type { DraftCell as StoredDraftCell } from '../db/schema';

/**
 * What a draft's cells are, before anything runs: the engine's plan (each cell's inputs validated by
 * its kind's schema, the cells it names, the problems to show beside it; libs/aero/src/cells/plan.ts)
 * and the key its output would have. The key is
 * the SHA-256 of the kind, the canonical inputs (defaults applied, keys sorted), the keys of the
 * outputs it depends on, and the engine version: a change anywhere upstream changes it, which is how
 * a cell is seen to be outdated without running anything.
 */

/** A cell as kept in drafts.cells, with the output keys the server records there. */
export interface StoredCell extends StoredDraftCell {
  /** The newest output of this cell that was ok (kept visible when a later run fails). */
  lastGoodOutputKey?: string | null;
}

export interface CellPlan extends StudyCellPlan<StoredCell> {
  /** The key of this cell's output for its inputs as they stand; null when it cannot run (problems, or a note). */
  key: string | null;
}

/** JSON with object keys sorted at every level, so equal values hash equal. */
export function canonicalJson(value: unknown): string {
  return JSON.stringify(value, (_key, v: unknown) =>
    v && typeof v === 'object' && !Array.isArray(v) ? Object.fromEntries(Object.entries(v as Record<string, unknown>).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))) : v,
  );
}

export function outputKey(kind: CellKind, inputs: unknown, upstreamKeys: readonly string[], engineVersion = ENGINE_VERSION): string {
  return createHash('sha256').update(canonicalJson(['laminote.output/1', kind, inputs, upstreamKeys, engineVersion])).digest('hex');
}

/** Inputs as they enter the key: the order of chosen criteria does not change the result. */
function keyedInputs(kind: CellKind, inputs: CellInputs[CellKind]): unknown {
  if (kind === 'analysis') {
    const a = inputs as AnalysisInputs;
    return { ...a, criteria: [...new Set(a.criteria)].sort() };
  }
  return inputs;
}

/**
 * `memo` holds the plans of one draft content (the entry of draft-cells.ts whose cells these are, by
 * their token): given, the plans are made once for it and the fingerprint below is not needed.
 */
export function planCells(cells: readonly StoredCell[], memo?: { plans?: Map<string, CellPlan> }): Map<string, CellPlan> {
  if (memo) {
    const plans = (memo.plans ??= planCells(cells));
    const byId = new Map(cells.map((c) => [c.cellId, c]));
    return new Map([...plans].map(([id, plan]) => [id, { ...plan, cell: byId.get(id)! }]));
  }
  // A plan reads only each cell's id, kind and inputs: the same draft content plans the same, so a
  // draft answered, run and saved in turn is validated (tables parsed) and hashed once.
  const fingerprint = JSON.stringify(cells.map((c) => [c.cellId, c.kind, c.inputs]));
  const known = recentPlans.get(fingerprint);
  if (known) {
    recentPlans.delete(fingerprint);
    recentPlans.set(fingerprint, known);
    // The cells themselves (with their output keys) are the ones given now.
    const byId = new Map(cells.map((c) => [c.cellId, c]));
    return new Map([...known].map(([id, plan]) => [id, { ...plan, cell: byId.get(id)! }]));
  }
  const planned = planStudyCells(cells);
  const plans = new Map<string, CellPlan>();
  for (const plan of planned.values()) {
    const key = plan.runnable ? outputKey(plan.kind, keyedInputs(plan.kind, plan.inputs!), plan.refs.map((r) => plans.get(r.cellId)!.key!)) : null;
    plans.set(plan.cell.cellId, { ...plan, key });
  }
  recentPlans.set(fingerprint, plans);
  recentPlanChars += fingerprint.length;
  for (const [old] of recentPlans) {
    if (recentPlanChars <= RECENT_PLAN_CHARS) break;
    recentPlans.delete(old);
    recentPlanChars -= old.length;
  }
  return new Map([...plans].map(([id, plan]) => [id, { ...plan }]));
}

/** Plans of the drafts planned lately, by their content; bounded by the characters of that content. */
const RECENT_PLAN_CHARS = 16 * 1024 * 1024;
const recentPlans = new Map<string, Map<string, CellPlan>>();
let recentPlanChars = 0;

/** The worker task of a planned cell, with the inputs of the cells it uses (and theirs). Null when it cannot run. */
export function taskOf(plan: CellPlan, plans: Map<string, CellPlan>): CellTask | null {
  if (plan.key === null || !isComputedKind(plan.kind)) return null;
  const source = sourceOf(plan, plans);
  return { kind: plan.kind, inputs: source.inputs, upstream: source.upstream } as CellTask;
}
