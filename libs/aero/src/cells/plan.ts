import {
  CELL_KIND_LABELS,
  CELL_KIND_REGISTRY,
  CELL_SCHEMAS,
  isCellKind,
  referenceFields,
  RUN_RANK,
  type CellInputs,
  type CellKind,
  type CellProblem,
  type PressureInputs,
} from '@laminote/contracts';
import { parsePressureTable } from '../pressure-table';
import type { CellSource } from './types';

/**
 * What a study's cells are before anything runs: each cell's inputs validated by its kind's schema,
 * the cells its reference fields name (checked against the kinds the registry allows), and the
 * problems to show beside it. The server adds an output key to each; the command line computes them.
 */

export interface PlannableCell {
  cellId: string;
  kind: string;
  inputs: unknown;
}

export interface CellPlan<C extends PlannableCell = PlannableCell> {
  cell: C;
  kind: CellKind;
  /** Validated inputs, defaults applied; null when the schema refuses them. */
  inputs: CellInputs[CellKind] | null;
  problems: CellProblem[];
  /** The cells this one uses, by the input that names them. */
  refs: { field: string; cellId: string }[];
  /** Whether it can be computed: a kind that computes, valid inputs, no problem short of a table line, every cell it uses runnable. */
  runnable: boolean;
}

function formatPath(path: readonly PropertyKey[]): string {
  return path.reduce<string>((out, key) => (typeof key === 'number' ? `${out}[${key}]` : out ? `${out}.${String(key)}` : String(key)), '');
}

/** The cells planned in run order (every cell after the cells it uses), keyed by cell id. */
export function planCells<C extends PlannableCell>(cells: readonly C[]): Map<string, CellPlan<C>> {
  const plans = new Map<string, CellPlan<C>>();
  const byId = new Map(cells.map((cell) => [cell.cellId, cell]));
  const rank = (cell: C) => (isCellKind(cell.kind) ? RUN_RANK[cell.kind] : 0);
  const ordered = [...cells].sort((a, b) => rank(a) - rank(b));
  for (const cell of ordered) {
    if (!isCellKind(cell.kind)) {
      plans.set(cell.cellId, { cell, kind: cell.kind as CellKind, inputs: null, problems: [{ field: 'kind', message: `"${cell.kind}" is not a kind of cell` }], refs: [], runnable: false });
      continue;
    }
    const kind = cell.kind;
    const parsed = CELL_SCHEMAS[kind].inputs.safeParse(cell.inputs);
    const problems: CellProblem[] = parsed.success ? [] : parsed.error.issues.map((i) => ({ field: formatPath(i.path) || 'inputs', message: i.message }));
    const inputs = parsed.success ? (parsed.data as CellInputs[CellKind]) : null;
    const refs: CellPlan['refs'] = [];
    for (const [field, reference] of referenceFields(kind)) {
      const id = inputs ? (inputs as Record<string, unknown>)[field] : null;
      if (typeof id !== 'string') continue;
      const target = byId.get(id);
      const wanted = reference.kinds.map((k) => CELL_KIND_LABELS[k]).join(' or ');
      if (!target) problems.push({ field, message: `${field} names no cell of this draft` });
      else if (!reference.kinds.includes(target.kind as CellKind)) {
        problems.push({ field, message: `${field} names a ${isCellKind(target.kind) ? CELL_KIND_LABELS[target.kind] : target.kind} cell, not a ${wanted}` });
      } else {
        refs.push({ field, cellId: id });
        if (!plans.get(id)!.runnable) problems.push({ field, message: `the ${CELL_KIND_LABELS[target.kind as CellKind].toLowerCase()} it uses has problems to fix first` });
      }
    }
    if (inputs && kind === 'pressure') problems.push(...tableProblems(inputs as PressureInputs));
    const blocking = problems.some((p) => p.line === undefined);
    plans.set(cell.cellId, { cell, kind, inputs, problems, refs, runnable: CELL_KIND_REGISTRY[kind].runs && inputs !== null && !blocking });
  }
  return plans;
}

/** A runnable plan as its computation sees it, with the cells it uses (and theirs). */
export function sourceOf(plan: CellPlan, plans: ReadonlyMap<string, CellPlan>): CellSource {
  const upstream: Record<string, CellSource> = {};
  for (const ref of plan.refs) upstream[ref.field] = sourceOf(plans.get(ref.cellId)!, plans);
  return { kind: plan.kind, inputs: plan.inputs!, upstream };
}

/**
 * A pasted table's problems by line, shown as it is typed. They do not stop a run: running the cell
 * stores the same problems as its failed output, which is what the cell then shows.
 */
function tableProblems(p: PressureInputs): CellProblem[] {
  if (p.text.trim() === '') return [{ field: 'text', message: 'paste a table of x [y] cp rows, or upload a file', line: 0 }];
  const cacheKey = `${p.hasRadius ? 'r' : '-'}${p.text}`;
  const cached = problemsByText.get(cacheKey);
  if (cached) return cached;
  const table = parsePressureTable(p.text, { radius: p.hasRadius });
  const problems = table.ok ? [] : table.problems.map((problem) => ({ field: 'text', message: problem.line > 0 ? `line ${problem.line}: ${problem.message}` : problem.message, line: problem.line }));
  // A draft is planned on every answer; the same text gives the same problems.
  if (problemsByText.size >= 200) problemsByText.delete(problemsByText.keys().next().value!);
  problemsByText.set(cacheKey, problems);
  return problems;
}

const problemsByText = new Map<string, CellProblem[]>();
