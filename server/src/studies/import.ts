import { randomUUID } from 'node:crypto';
import { and, eq } from 'drizzle-orm';
import { CELL_REFERENCE_FIELDS, isCellKind, type ImportStudyResult, type StudyDocument } from '@laminote/contracts';
import { ENGINE_VERSION } from '@laminote/aero';
import { audit } from '../audit/audit';
import type { SessionUser } from '../auth/types';
import type { Tx } from '../db/client';
import { branches, cells, drafts, outputs } from '../db/schema';
import { badRequest } from '../http/problem';
import { planCells, type StoredCell } from '../notebook/plan';
import { splitOutputKeys } from '../notebook/draft-keys';
import { createStudy, MAIN_BRANCH } from './service';

/**
 * A study document (GET …/export, from this Laminote or another) made a new study in a project: its
 * cells with their titles and inputs in order, each under a new id (the names between cells follow),
 * and each stored output kept when it was computed by this engine version from the same inputs, so the
 * cell is current at once; otherwise the cell is stale and a run computes it again. An uploaded file
 * does not travel with the document; the table text in the inputs does.
 */
export async function importStudy(tx: Tx, actor: SessionUser, projectId: string, input: { document: StudyDocument; title?: string | undefined }): Promise<ImportStudyResult> {
  const doc = input.document;
  doc.cells.forEach((c, i) => {
    if (!isCellKind(c.kind)) throw badRequest(`cells[${i}].kind: "${c.kind}" is not a kind of cell this Laminote knows`, `document.cells[${i}].kind`);
  });
  const ids = new Map(doc.cells.map((c) => [c.cellId, randomUUID()]));
  if (ids.size !== doc.cells.length) throw badRequest('two cells of the document have the same cellId', 'document.cells');
  const rename = (field: string, value: unknown) => (CELL_REFERENCE_FIELDS.has(field) && typeof value === 'string' ? (ids.get(value) ?? value) : value);
  const stored: StoredCell[] = doc.cells.map((c) => {
    const inputs = Object.fromEntries(Object.entries(c.inputs).map(([k, v]) => [k, rename(k, v)]));
    if (c.kind === 'pressure' && 'uploadId' in inputs) inputs['uploadId'] = null;
    return { cellId: ids.get(c.cellId)!, kind: c.kind, title: c.title, collapsed: false, inputs, lastOutputKey: null, lastGoodOutputKey: null };
  });

  const title = input.title ?? doc.study.title;
  const study = await createStudy(tx, actor, projectId, { title, description: `Imported from a study export (${doc.source.kind}${doc.source.versionNumber ? ` v${doc.source.versionNumber}` : ''}, ${doc.exportedAt.slice(0, 10)}).` });
  const [branch] = await tx.select().from(branches).where(and(eq(branches.studyId, study.id), eq(branches.name, MAIN_BRANCH)));
  if (stored.length) await tx.insert(cells).values(stored.map((c) => ({ id: c.cellId, studyId: study.id, kind: c.kind, createdBy: actor.id })));

  const plans = planCells(stored);
  let kept = 0;
  let left = 0;
  doc.cells.forEach((c, i) => {
    const cell = stored[i]!;
    const key = plans.get(cell.cellId)?.key ?? null;
    if (!c.output) return;
    if (key && c.output.engineVersion === ENGINE_VERSION) {
      cell.lastOutputKey = key;
      if (c.output.status === 'ok') cell.lastGoodOutputKey = key;
      kept++;
    } else left++;
  });
  const keptOutputs = doc.cells
    .map((c, i) => ({ c, cell: stored[i]! }))
    .filter(({ c, cell }) => c.output && cell.lastOutputKey)
    .map(({ c, cell }) => ({ key: cell.lastOutputKey!, kind: c.kind, status: c.output!.status, result: c.output!.result, error: c.output!.error, engineVersion: c.output!.engineVersion }));
  // An output is a pure function of its key: one already stored under the same key is the same.
  if (keptOutputs.length) await tx.insert(outputs).values(keptOutputs).onConflictDoNothing();
  const written = splitOutputKeys(stored);
  await tx.update(drafts).set({ cells: written.cells, outputKeys: written.outputKeys, revision: 1, updatedBy: actor.id }).where(eq(drafts.branchId, branch!.id));
  await audit(tx, {
    actorId: actor.id,
    projectId,
    action: 'study.import',
    targetType: 'study',
    targetId: study.id,
    detail: { title, fromStudy: doc.study.id, source: doc.source, cells: stored.length, outputsKept: kept },
  });
  return { studyId: study.id, branchId: branch!.id, title, cellCount: stored.length, outputsKept: kept, outputsLeft: left };
}
