import type { RunState } from '@laminote/contracts';
import { CELL_KIND_REGISTRY, type CellKind } from '@laminote/contracts/cell-kinds';
import { runtimeChecks } from './runtime-checks';

/** How each kind of cell shows itself in the stack (from the cell-kind registry in libs/contracts). */
export interface CellKindInfo {
  readonly kind: CellKind;
  readonly label: string;
  /** A Material Symbols name. */
  readonly icon: string;
  /** One line in the add-cell menu. */
  readonly hint: string;
  /** Whether the kind computes something (and so has a run state and a Run button). */
  readonly runs: boolean;
}

export { ADDABLE_KINDS } from '@laminote/contracts/cell-kinds';

export function cellKindInfo(kind: CellKind): CellKindInfo {
  const { label, icon, hint, runs } = CELL_KIND_REGISTRY[kind];
  return { kind, label, icon, hint, runs };
}

/**
 * Inputs of a new cell: every field filled, so nothing falls back to a default the user never saw. The
 * defaults come from the kind's schema, so the notebook offers to add a cell only once the schemas have
 * loaded (`loadRuntimeChecks`).
 */
export function defaultInputs(kind: CellKind): Record<string, unknown> {
  const checks = runtimeChecks();
  if (!checks) throw new Error(`A ${CELL_KIND_REGISTRY[kind].label} cell cannot be added before the cell schemas have loaded`);
  return checks.newCellInputs(kind);
}

/** Laminote's words for a cell's run state, with the symbol shown beside them. */
export const RUN_STATE_INFO: Record<RunState | 'running', { readonly label: string; readonly icon: string; readonly description: string }> = {
  idle: { label: 'Not run yet', icon: 'radio_button_unchecked', description: 'This cell has not been computed.' },
  current: { label: 'Up to date', icon: 'check_circle', description: 'The result matches the inputs and everything above.' },
  outdated: {
    label: 'Needs a rerun',
    icon: 'update',
    description: 'The inputs, or a cell this one uses, changed since the result shown was computed.',
  },
  failed: { label: 'Run failed', icon: 'error', description: 'The last run failed; the last good result stays below.' },
  running: { label: 'Computing…', icon: 'progress_activity', description: 'The server is computing this cell.' },
};
