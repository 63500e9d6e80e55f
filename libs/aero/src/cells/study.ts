import type { StudyDocument, StudyDocumentOutput } from '@laminote/contracts';
import { ENGINE_VERSION } from '../analyze';
import { computeCellOutput, upstreamFailedError, type CellTask } from './compute';
import { planCells, sourceOf } from './plan';

/**
 * Compute every cell of a study document from its inputs, in dependency order, as the server runs a
 * study: a cell whose inputs have problems is not computed (its problems are listed), a cell that
 * uses a failed cell fails with the message naming that input. Returns the document with fresh outputs.
 */
export function computeStudy(document: StudyDocument, now: Date = new Date()): StudyDocument {
  const plans = planCells(document.cells);
  const outputs = new Map<string, StudyDocumentOutput>();
  for (const plan of plans.values()) {
    if (!plan.runnable) continue;
    const failedRef = plan.refs.find((ref) => outputs.get(ref.cellId)?.status === 'error');
    if (failedRef) {
      const upstream = outputs.get(failedRef.cellId)!;
      outputs.set(plan.cell.cellId, { status: 'error', result: null, error: upstreamFailedError(plans.get(failedRef.cellId)!.kind, failedRef.field, upstream.error), engineVersion: ENGINE_VERSION });
      continue;
    }
    const source = sourceOf(plan, plans);
    const computed = computeCellOutput({ kind: source.kind, inputs: source.inputs, upstream: source.upstream } as CellTask);
    outputs.set(plan.cell.cellId, {
      status: computed.status,
      result: computed.resultJson === null ? null : JSON.parse(computed.resultJson),
      error: computed.error,
      engineVersion: ENGINE_VERSION,
    });
  }
  return {
    ...document,
    exportedAt: now.toISOString(),
    engineVersion: ENGINE_VERSION,
    cells: document.cells.map((cell) => {
      const { problems: _old, ...rest } = cell;
      const problems = plans.get(cell.cellId)?.problems.filter((p) => p.line === undefined) ?? [];
      return { ...rest, output: outputs.get(cell.cellId) ?? null, ...(problems.length > 0 ? { problems } : {}) };
    }),
  };
}
