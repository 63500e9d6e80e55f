import { createHash } from 'node:crypto';
import { ENGINE_VERSION, parsePressureTable } from '@laminote/aero';
import {
  CELL_INPUT_SCHEMAS,
  CELL_KIND_LABELS,
  type AnalysisInputs,
  type CellInputs,
  type CellKind,
  type CellProblem,
  type FlowInputs,
  type LeadingEdgeInputs,
  type PressureInputs,
  type SweepInputs,
} from '@laminote/contracts';
import type { DraftCell as StoredDraftCell } from '../db/schema';
import { formatPath } from '../http/problem';
import type { EngineTask } from '../engine/pool';

/**
 * What a draft's cells are, before anything runs: each cell's inputs validated by its kind's schema,
 * the cells it names, the problems to show beside it, and the key its output would have. The key is
 * the SHA-256 of the kind, the canonical inputs (defaults applied, keys sorted), the keys of the
 * outputs it depends on, and the engine version: a change anywhere upstream changes it, which is how
 * a cell is seen to be outdated without running anything.
 */

/** A cell as kept in drafts.cells, with the output keys the server records there. */
export interface StoredCell extends StoredDraftCell {
  /** The newest output of this cell that was ok (kept visible when a later run fails). */
  lastGoodOutputKey?: string | null;
}

export interface CellPlan {
  cell: StoredCell;
  kind: CellKind;
  /** Validated inputs; null when the schema refuses them. */
  inputs: CellInputs[CellKind] | null;
  problems: CellProblem[];
  /** The cells this one uses, by the input that names them. */
  refs: { field: string; cellId: string }[];
  /** The key of this cell's output for its inputs as they stand; null when it cannot run (problems, or a note). */
  key: string | null;
}

/** Dependency order: the kinds a cell may name all have a lower rank, so the order has no cycles. */
export const KIND_RANK: Record<CellKind, number> = { flow: 0, pressure: 0, flatPlate: 0, note: 0, analysis: 1, leadingEdge: 1, sweep: 2 };

const REF_KINDS: Partial<Record<CellKind, Record<string, CellKind>>> = {
  analysis: { flowCellId: 'flow', pressureCellId: 'pressure' },
  sweep: { analysisCellId: 'analysis' },
  leadingEdge: { flowCellId: 'flow' },
};

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

export function planCells(cells: readonly StoredCell[]): Map<string, CellPlan> {
  const plans = new Map<string, CellPlan>();
  const byId = new Map(cells.map((cell) => [cell.cellId, cell]));
  const ordered = [...cells].sort((a, b) => KIND_RANK[a.kind as CellKind] - KIND_RANK[b.kind as CellKind]);
  for (const cell of ordered) {
    const kind = cell.kind as CellKind;
    const parsed = CELL_INPUT_SCHEMAS[kind].safeParse(cell.inputs);
    const problems: CellProblem[] = parsed.success ? [] : parsed.error.issues.map((i) => ({ field: formatPath(i.path) || 'inputs', message: i.message }));
    const inputs = parsed.success ? (parsed.data as CellInputs[CellKind]) : null;
    const refs: CellPlan['refs'] = [];
    for (const [field, wantKind] of Object.entries(REF_KINDS[kind] ?? {})) {
      const id = inputs ? (inputs as Record<string, unknown>)[field] : null;
      if (typeof id !== 'string') continue;
      const target = byId.get(id);
      if (!target) problems.push({ field, message: `${field} names no cell of this draft` });
      else if (target.kind !== wantKind) problems.push({ field, message: `${field} names a ${CELL_KIND_LABELS[target.kind as CellKind]} cell, not a ${CELL_KIND_LABELS[wantKind]}` });
      else {
        refs.push({ field, cellId: id });
        const upstream = plans.get(id)!;
        if (upstream.key === null) problems.push({ field, message: `the ${CELL_KIND_LABELS[wantKind].toLowerCase()} it uses has problems to fix first` });
      }
    }
    if (inputs && kind === 'pressure') problems.push(...tableProblems(inputs as PressureInputs));
    const blocking = problems.some((p) => p.line === undefined);
    const key =
      kind === 'note' || !inputs || blocking ? null : outputKey(kind, keyedInputs(kind, inputs), refs.map((r) => plans.get(r.cellId)!.key!));
    plans.set(cell.cellId, { cell, kind, inputs, problems, refs, key });
  }
  return plans;
}

/**
 * A pasted table's problems by line, shown as it is typed. They do not stop a run: running the cell
 * stores the same problems as its failed output, which is what the cell then shows.
 */
function tableProblems(p: PressureInputs): CellProblem[] {
  if (p.text.trim() === '') return [{ field: 'text', message: 'paste a table of x [y] cp rows, or upload a file', line: 0 }];
  const cached = problemsByText.get(p.text);
  if (cached) return cached;
  const table = parsePressureTable(p.text);
  const problems = table.ok ? [] : table.problems.map((problem) => ({ field: 'text', message: problem.line > 0 ? `line ${problem.line}: ${problem.message}` : problem.message, line: problem.line }));
  // Every draft answer reads its tables again; the same text gives the same problems.
  if (problemsByText.size >= 200) problemsByText.delete(problemsByText.keys().next().value!);
  problemsByText.set(p.text, problems);
  return problems;
}

const problemsByText = new Map<string, CellProblem[]>();

/** The worker task of a planned cell, with the inputs of the cells it uses. Null for a note. */
export function taskOf(plan: CellPlan, plans: Map<string, CellPlan>): EngineTask | null {
  const ref = (field: string) => {
    const id = plan.refs.find((r) => r.field === field)?.cellId;
    return id ? plans.get(id)! : null;
  };
  switch (plan.kind) {
    case 'note':
      return null;
    case 'flow':
      return { kind: 'flow', inputs: plan.inputs as FlowInputs };
    case 'pressure':
      return { kind: 'pressure', inputs: plan.inputs as PressureInputs };
    case 'flatPlate':
      return { kind: 'flatPlate', inputs: plan.inputs as CellInputs['flatPlate'] };
    case 'analysis':
      return { kind: 'analysis', inputs: plan.inputs as AnalysisInputs, flow: ref('flowCellId')!.inputs as FlowInputs, pressure: ref('pressureCellId')!.inputs as PressureInputs };
    case 'leadingEdge':
      return { kind: 'leadingEdge', inputs: plan.inputs as LeadingEdgeInputs, flow: (ref('flowCellId')?.inputs as FlowInputs | undefined) ?? null };
    case 'sweep': {
      const analysis = ref('analysisCellId')!;
      const up = (field: string) => plans.get(analysis.refs.find((r) => r.field === field)!.cellId)!.inputs;
      return {
        kind: 'sweep',
        inputs: plan.inputs as SweepInputs,
        analysis: analysis.inputs as AnalysisInputs,
        flow: up('flowCellId') as FlowInputs,
        pressure: up('pressureCellId') as PressureInputs,
      };
    }
  }
}
