import { and, eq, inArray } from 'drizzle-orm';
import type { Tx } from '../db/client';
import { branches, cellRevisions, drafts, versionCells, versions } from '../db/schema';
import { badRequest, notFound } from '../http/problem';
import { cellContentHash } from '../versions/content-hash';

/**
 * What a person is looking at when they read or start a thread: a saved version, or a branch's
 * working draft. Threads are anchored to it, and "has the cell changed since" is told against it.
 */
export type View = { kind: 'version'; versionId: string; branchId: string; number: number } | { kind: 'draft'; branchId: string };

/**
 * A draft cell's content hash, as the versions part computes it for the revision it would become: so
 * a thread started on a draft compares cleanly with later versions and the other way round.
 */
export function draftCellHash(cell: { kind: string; title?: string | null; inputs?: Record<string, unknown> | null }): string {
  return cellContentHash({ kind: cell.kind, title: cell.title ?? '', inputs: cell.inputs ?? {} });
}

export async function resolveView(tx: Tx, studyId: string, q: { versionId?: string | null | undefined; branchId?: string | undefined }): Promise<View | null> {
  if (q.versionId) {
    const [v] = await tx
      .select({ id: versions.id, branchId: versions.branchId, number: versions.number })
      .from(versions)
      .where(and(eq(versions.id, q.versionId), eq(versions.studyId, studyId)));
    if (!v) throw notFound('version');
    return { kind: 'version', versionId: v.id, branchId: v.branchId, number: v.number };
  }
  if (q.branchId) {
    const [b] = await tx.select({ id: branches.id }).from(branches).where(and(eq(branches.id, q.branchId), eq(branches.studyId, studyId)));
    if (!b) throw notFound('branch');
    return { kind: 'draft', branchId: b.id };
  }
  return null;
}

/** The content hash of the given cells as the view holds them (cells the view lacks are absent). */
export async function cellHashes(tx: Tx, view: View, cellIds: readonly string[]): Promise<Map<string, string>> {
  if (cellIds.length === 0) return new Map();
  if (view.kind === 'version') {
    const rows = await tx
      .select({ cellId: versionCells.cellId, hash: cellRevisions.contentHash })
      .from(versionCells)
      .innerJoin(cellRevisions, eq(cellRevisions.id, versionCells.cellRevisionId))
      .where(and(eq(versionCells.versionId, view.versionId), inArray(versionCells.cellId, [...cellIds])));
    return new Map(rows.map((r) => [r.cellId, r.hash]));
  }
  const [draft] = await tx.select({ cells: drafts.cells }).from(drafts).where(eq(drafts.branchId, view.branchId));
  const wanted = new Set(cellIds);
  return new Map((draft?.cells ?? []).filter((c) => wanted.has(c.cellId)).map((c) => [c.cellId, draftCellHash(c)]));
}

/** The hash of one cell in the view, or 400 naming `cellId` when the view does not hold that cell. */
export async function cellHashInView(tx: Tx, view: View, cellId: string): Promise<string> {
  const hash = (await cellHashes(tx, view, [cellId])).get(cellId);
  if (!hash) throw badRequest(view.kind === 'version' ? `cellId: that cell is not in version ${view.number}` : 'cellId: that cell is not in the draft', 'cellId');
  return hash;
}
