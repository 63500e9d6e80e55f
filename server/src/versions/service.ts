import { and, asc, desc, eq, inArray, sql } from 'drizzle-orm';
import {
  can,
  CELL_KINDS,
  TRASH_LIMIT,
  type ProjectAccess,
  cellKindSchema,
  type BranchOverview,
  type CellKind,
  type CreateBranch,
  type RestoreResult,
  type SaveVersion,
  type StudyHistory,
  type UpdateBranch,
  type VersionCell,
  type VersionDetail,
  type VersionSummary,
} from '@laminote/contracts';
import type { Tx } from '../db/client';
import { branches, cellRevisions, cells, drafts, outputs, studies, users, versionCells, versions, type DraftCell } from '../db/schema';
import type { SessionUser } from '../auth/types';
import { audit } from '../audit/audit';
import { badRequest, conflict, notFound, ProblemError } from '../http/problem';
import { listBranches, MAIN_BRANCH } from '../studies/service';
import { diffCells, type SnapshotCell } from './cell-diff';
import { cellContentHash } from './content-hash';
import { storedCells, storedTrash, splitOutputKeys } from '../notebook/draft-keys';
import { planCells } from '../notebook/plan';
import { versionReviewColumn } from '../review/timeline';

/**
 * Versions and branches: saving a draft as an immutable version, history, restoring a version into
 * the draft, branching from a version, and the study's baseline. Every change runs in the caller's
 * transaction with the rows it depends on locked.
 */

export interface Place {
  studyId: string;
  projectId: string;
}

// ---------------------------------------------------------------------------------------------------
// Reading

const summaryColumns = {
  id: versions.id,
  studyId: versions.studyId,
  branchId: versions.branchId,
  branchName: branches.name,
  number: versions.number,
  message: versions.message,
  authorId: versions.authorId,
  authorName: users.name,
  createdAt: versions.createdAt,
  parentVersionId: versions.parentVersionId,
  baselineVersionId: studies.baselineVersionId,
  cellCount: sql<number>`(select count(*)::int from ${versionCells} where ${versionCells.versionId} = ${versions.id})`,
  review: versionReviewColumn(versions.id),
};

type SummaryRow = { [K in keyof typeof summaryColumns]: unknown } & {
  id: string;
  studyId: string;
  branchId: string;
  branchName: string;
  number: number;
  message: string;
  authorId: string | null;
  authorName: string | null;
  createdAt: Date;
  parentVersionId: string | null;
  baselineVersionId: string | null;
  cellCount: number;
  review: VersionSummary['review'];
};

function toSummary(r: SummaryRow): VersionSummary {
  return {
    id: r.id,
    studyId: r.studyId,
    branchId: r.branchId,
    branchName: r.branchName,
    number: r.number,
    message: r.message,
    author: r.authorId ? { id: r.authorId, name: r.authorName ?? '' } : null,
    createdAt: r.createdAt.toISOString(),
    parentVersionId: r.parentVersionId,
    cellCount: Number(r.cellCount),
    isBaseline: r.baselineVersionId === r.id,
    review: r.review ?? null,
  };
}

function summaries(tx: Tx) {
  return tx
    .select(summaryColumns)
    .from(versions)
    .innerJoin(branches, eq(branches.id, versions.branchId))
    .innerJoin(studies, eq(studies.id, versions.studyId))
    .leftJoin(users, eq(users.id, versions.authorId));
}

export async function versionSummary(tx: Tx, versionId: string): Promise<VersionSummary> {
  const [row] = await summaries(tx).where(eq(versions.id, versionId));
  if (!row) throw notFound('version');
  return toSummary(row as SummaryRow);
}

export async function branchVersions(tx: Tx, branchId: string): Promise<VersionSummary[]> {
  const rows = await summaries(tx).where(eq(versions.branchId, branchId)).orderBy(desc(versions.number));
  return rows.map((r) => toSummary(r as SummaryRow));
}

/**
 * Versions' cells in order, with their revision and the stored output of the cells whose kind is in
 * `outputsOf` (outputs can be large: load only what the caller shows).
 */
export async function versionCellsOf(tx: Tx, versionIds: string[], outputsOf: readonly CellKind[] = []): Promise<Map<string, VersionCell[]>> {
  const withOutputs = outputsOf.length > 0;
  const byVersion = new Map<string, VersionCell[]>(versionIds.map((id) => [id, []]));
  if (versionIds.length === 0) return byVersion;
  const rows = await tx
    .select({
      versionId: versionCells.versionId,
      position: versionCells.position,
      cellId: versionCells.cellId,
      collapsed: versionCells.collapsed,
      outputKey: versionCells.outputKey,
      revisionId: cellRevisions.id,
      kind: cellRevisions.kind,
      title: cellRevisions.title,
      inputs: cellRevisions.inputs,
      contentHash: cellRevisions.contentHash,
      output: withOutputs
        ? sql<Record<string, unknown> | null>`case when ${outputs.key} is null or ${cellRevisions.kind} not in (${sql.join(
            outputsOf.map((k) => sql`${k}`),
            sql`, `,
          )}) then null else json_build_object(
            'key', ${outputs.key}, 'status', ${outputs.status}, 'result', ${outputs.result}, 'error', ${outputs.error},
            'engineVersion', ${outputs.engineVersion}, 'durationMs', ${outputs.durationMs}, 'computedAt', ${outputs.computedAt}) end`
        : sql<null>`null`,
    })
    .from(versionCells)
    .innerJoin(cellRevisions, eq(cellRevisions.id, versionCells.cellRevisionId))
    .leftJoin(outputs, eq(outputs.key, versionCells.outputKey))
    .where(inArray(versionCells.versionId, versionIds))
    .orderBy(asc(versionCells.versionId), asc(versionCells.position));
  for (const r of rows) {
    const output = r.output as (Record<string, unknown> & { computedAt: string }) | null;
    byVersion.get(r.versionId)!.push({
      cellId: r.cellId,
      position: r.position,
      kind: r.kind as CellKind,
      title: r.title,
      collapsed: r.collapsed !== 0,
      inputs: r.inputs,
      revisionId: r.revisionId,
      contentHash: r.contentHash,
      outputKey: r.outputKey,
      output: output
        ? {
            key: String(output['key']),
            status: output['status'] as 'ok' | 'error',
            result: output['result'] ?? null,
            error: (output['error'] as { message: string } | null) ?? null,
            engineVersion: String(output['engineVersion']),
            durationMs: Number(output['durationMs']),
            computedAt: new Date(output.computedAt).toISOString(),
          }
        : null,
    });
  }
  return byVersion;
}

export async function versionDetail(tx: Tx, versionId: string): Promise<VersionDetail> {
  const summary = await versionSummary(tx, versionId);
  const cellsOf = await versionCellsOf(tx, [versionId], CELL_KINDS);
  return { ...summary, cells: cellsOf.get(versionId) ?? [] };
}

export function toSnapshot(cells: VersionCell[]): SnapshotCell[] {
  return cells.map((c) => ({ cellId: c.cellId, kind: c.kind, title: c.title, collapsed: c.collapsed, inputs: c.inputs, outputKey: c.outputKey }));
}

/** The study's branches (as the study lists them) with where each came from and how far it has got. */
export async function branchOverviews(tx: Tx, studyId: string): Promise<BranchOverview[]> {
  const forked = sql.raw('forked');
  const [listed, extras] = [
    await listBranches(tx, studyId),
    await tx
      .select({
        id: branches.id,
        draftRevision: drafts.revision,
        draftBasedOnVersionId: drafts.basedOnVersionId,
        versionCount: sql<number>`(select count(*)::int from ${versions} where ${versions.branchId} = ${branches.id})`,
        forkedFrom: sql<BranchOverview['forkedFrom']>`(
          select json_build_object('versionId', ${forked}.id, 'branchId', ${forked}.branch_id, 'branchName', fb.name, 'number', ${forked}.number)
          from versions ${forked} join branches fb on fb.id = ${forked}.branch_id where ${forked}.id = ${branches.forkedFromVersionId})`,
      })
      .from(branches)
      .leftJoin(drafts, eq(drafts.branchId, branches.id))
      .where(eq(branches.studyId, studyId)),
  ];
  const byId = new Map(extras.map((e) => [e.id, e]));
  return listed.map((b) => {
    const e = byId.get(b.id)!;
    return {
      ...b,
      headNumber: b.headNumber ?? null,
      versionCount: Number(e.versionCount),
      draftRevision: e.draftRevision ?? 0,
      draftBasedOnVersionId: e.draftBasedOnVersionId ?? null,
      forkedFrom: e.forkedFrom,
    };
  });
}

export async function studyHistory(tx: Tx, studyId: string, access: ProjectAccess): Promise<StudyHistory> {
  const [study] = await tx.select({ baselineVersionId: studies.baselineVersionId, archivedAt: studies.archivedAt }).from(studies).where(eq(studies.id, studyId));
  const rows = await summaries(tx).where(eq(versions.studyId, studyId)).orderBy(desc(versions.createdAt), desc(versions.number));
  const open = !study?.archivedAt;
  return {
    studyId,
    baselineVersionId: study?.baselineVersionId ?? null,
    permissions: {
      saveVersion: open && can(access, 'saveVersion'),
      branch: open && can(access, 'branch'),
      markBaseline: can(access, 'markBaseline'),
      editStudy: open && can(access, 'editStudy'),
    },
    branches: await branchOverviews(tx, studyId),
    versions: rows.map((r) => toSummary(r as SummaryRow)),
  };
}

// ---------------------------------------------------------------------------------------------------
// Saving a version

function draftCellToSnapshot(c: DraftCell): SnapshotCell {
  return { cellId: c.cellId, kind: c.kind as CellKind, title: c.title ?? '', collapsed: Boolean(c.collapsed), inputs: c.inputs ?? {}, outputKey: c.lastOutputKey ?? null };
}

/** The cells of a version as they were, or none for "no version yet". */
async function snapshotOf(tx: Tx, versionId: string | null): Promise<SnapshotCell[]> {
  if (!versionId) return [];
  return toSnapshot((await versionCellsOf(tx, [versionId])).get(versionId) ?? []);
}

/**
 * 409 for a save that did not see the newest version: that version (and any between), and what it
 * changed against the version the client saw, cell by cell. The draft on the server is untouched.
 */
async function staleHead(tx: Tx, branchId: string, studyId: string, expected: string | null, head: string, draftRevision: number): Promise<ProblemError> {
  const all = await branchVersions(tx, branchId);
  const headSummary = all.find((v) => v.id === head) ?? null;
  const seen = expected ? all.find((v) => v.id === expected) : undefined;
  const newer = all.filter((v) => (seen ? v.number > seen.number : true)).reverse();
  // The version the client saw may be the fork point on another branch of this study.
  const [expectedRow] = expected ? await tx.select({ id: versions.id }).from(versions).where(and(eq(versions.id, expected), eq(versions.studyId, studyId))) : [];
  const changes = diffCells(await snapshotOf(tx, expectedRow?.id ?? null), await snapshotOf(tx, head)).filter((d) => d.change !== 'unchanged');
  const who = headSummary?.author?.name ?? 'someone';
  return conflict(
    `${who} saved version ${headSummary?.number ?? '?'} of this branch ("${headSummary?.message ?? ''}") after the one you last saw. Your draft is unchanged; look at what changed, then save again on top of it.`,
    { reason: 'headMoved', currentHead: headSummary, newerVersions: newer, changes, draftRevision },
  );
}

/**
 * Snapshot the branch's draft as a new version and move the branch head, in one transaction with
 * the branch row locked. Unchanged cells reuse their revision (by content hash); all rows go in with
 * one insert per table.
 */
export async function saveVersion(tx: Tx, actor: SessionUser, place: Place, branchId: string, input: SaveVersion): Promise<string> {
  const [branch] = await tx.select().from(branches).where(eq(branches.id, branchId)).for('update');
  if (!branch) throw notFound('branch');
  const [draft] = await tx.select().from(drafts).where(eq(drafts.branchId, branchId)).for('update');
  if (!draft) throw notFound('draft');
  if (branch.archivedAt) throw conflict(`The branch "${branch.name}" is archived; restore it before saving versions on it.`, { field: 'branch' });
  if ((branch.headVersionId ?? null) !== (input.expectedHeadVersionId ?? null)) {
    throw await staleHead(tx, branchId, place.studyId, input.expectedHeadVersionId ?? null, branch.headVersionId!, draft.revision);
  }
  if (input.draftRevision !== undefined && input.draftRevision !== draft.revision) {
    throw conflict(`The draft changed since you last saw it (revision ${draft.revision}, you saw ${input.draftRevision}). Reload the draft to see the change, then save.`, {
      reason: 'draftChanged',
      currentHead: null,
      newerVersions: [],
      changes: [],
      draftRevision: draft.revision,
    });
  }

  // A cell keeps its output only while that output matches its inputs and upstream (the notebook's
  // output key); a result of older inputs would misstate what the version computes.
  const keyed = storedCells(draft);
  const plans = planCells(keyed);
  const draftCells = keyed.map((c) => {
    const snapshot = draftCellToSnapshot(c);
    return plans.get(c.cellId)?.key === snapshot.outputKey ? snapshot : { ...snapshot, outputKey: null };
  });
  draftCells.forEach((c, i) => {
    if (!cellKindSchema.safeParse(c.kind).success) throw badRequest(`cell ${i + 1} of the draft has an unknown kind "${c.kind}"`, `cells[${i}].kind`);
  });
  const ids = draftCells.map((c) => c.cellId);
  if (new Set(ids).size !== ids.length) throw badRequest('the draft holds the same cell twice', 'cells');

  if (ids.length > 0) {
    // Cell identities: a cell first seen in this save gets its row; a cell of another study is refused.
    const known = await tx.select({ id: cells.id, studyId: cells.studyId }).from(cells).where(inArray(cells.id, ids));
    const foreign = known.find((k) => k.studyId !== place.studyId);
    if (foreign) throw badRequest(`cell ${foreign.id}: this id cannot be used here; give the cell an id of its own`, `cells[${ids.indexOf(foreign.id)}].cellId`);
    const knownIds = new Set(known.map((k) => k.id));
    const fresh = draftCells.filter((c) => !knownIds.has(c.cellId));
    if (fresh.length) await tx.insert(cells).values(fresh.map((c) => ({ id: c.cellId, studyId: place.studyId, kind: c.kind, createdBy: actor.id }))).onConflictDoNothing();
  }

  // Revisions: reuse the row of an unchanged cell, insert the rest in one statement.
  const hashes = draftCells.map(cellContentHash);
  const revisionOf = new Map<string, string>();
  let missing: { c: SnapshotCell; hash: string }[] = [];
  if (ids.length > 0) {
    const existing = await tx
      .select({ id: cellRevisions.id, cellId: cellRevisions.cellId, contentHash: cellRevisions.contentHash })
      .from(cellRevisions)
      .where(and(inArray(cellRevisions.cellId, ids), inArray(cellRevisions.contentHash, hashes)));
    for (const r of existing) revisionOf.set(`${r.cellId}:${r.contentHash}`, r.id);
    missing = draftCells.map((c, i) => ({ c, hash: hashes[i]! })).filter(({ c, hash }) => !revisionOf.has(`${c.cellId}:${hash}`));
    if (missing.length) {
      const inserted = await tx
        .insert(cellRevisions)
        .values(missing.map(({ c, hash }) => ({ cellId: c.cellId, kind: c.kind, title: c.title, inputs: c.inputs, contentHash: hash })))
        .onConflictDoNothing()
        .returning({ id: cellRevisions.id, cellId: cellRevisions.cellId, contentHash: cellRevisions.contentHash });
      for (const r of inserted) revisionOf.set(`${r.cellId}:${r.contentHash}`, r.id);
      // Another transaction may have inserted the same revision a moment ago: read those back.
      const late = missing.filter(({ c, hash }) => !revisionOf.has(`${c.cellId}:${hash}`));
      if (late.length) {
        const rows = await tx
          .select({ id: cellRevisions.id, cellId: cellRevisions.cellId, contentHash: cellRevisions.contentHash })
          .from(cellRevisions)
          .where(and(inArray(cellRevisions.cellId, late.map(({ c }) => c.cellId)), inArray(cellRevisions.contentHash, late.map(({ hash }) => hash))));
        for (const r of rows) revisionOf.set(`${r.cellId}:${r.contentHash}`, r.id);
      }
    }
  }

  // Outputs: a version keeps the output each cell had, when it is still stored.
  const keys = [...new Set(draftCells.map((c) => c.outputKey).filter((k): k is string => !!k))];
  const stored = keys.length ? new Set((await tx.select({ key: outputs.key }).from(outputs).where(inArray(outputs.key, keys))).map((r) => r.key)) : new Set<string>();

  const [{ next }] = (await tx.select({ next: sql<number>`coalesce(max(${versions.number}), 0)::int + 1` }).from(versions).where(eq(versions.branchId, branchId))) as [{ next: number }];
  const [version] = await tx
    .insert(versions)
    .values({
      studyId: place.studyId,
      branchId,
      number: Number(next),
      parentVersionId: branch.headVersionId ?? branch.forkedFromVersionId,
      message: input.message,
      authorId: actor.id,
    })
    .returning({ id: versions.id, number: versions.number });
  if (draftCells.length) {
    await tx.insert(versionCells).values(
      draftCells.map((c, position) => ({
        versionId: version!.id,
        position,
        cellId: c.cellId,
        cellRevisionId: revisionOf.get(`${c.cellId}:${hashes[position]}`)!,
        collapsed: c.collapsed ? 1 : 0,
        outputKey: c.outputKey && stored.has(c.outputKey) ? c.outputKey : null,
      })),
    );
  }
  await tx.update(branches).set({ headVersionId: version!.id }).where(eq(branches.id, branchId));
  // The draft now sits on the new head; its content and revision are unchanged.
  await tx.update(drafts).set({ basedOnVersionId: version!.id }).where(eq(drafts.branchId, branchId));
  await tx.update(studies).set({ updatedAt: sql`now()` }).where(eq(studies.id, place.studyId));
  await audit(tx, {
    actorId: actor.id,
    projectId: place.projectId,
    action: 'version.save',
    targetType: 'version',
    targetId: version!.id,
    detail: { branchId, number: version!.number, message: input.message, cells: draftCells.length, newRevisions: missing.length },
  });
  return version!.id;
}

// ---------------------------------------------------------------------------------------------------
// Restoring a version into the draft

function snapshotToDraftCell(c: VersionCell): DraftCell {
  return { cellId: c.cellId, kind: c.kind, title: c.title, collapsed: c.collapsed, inputs: c.inputs, lastOutputKey: c.outputKey };
}

/**
 * Put a version's cells into the draft as a normal draft change: the revision goes up, a stale base
 * revision answers 409, and draft cells the version does not have go to the draft's trash.
 */
export async function restoreIntoDraft(tx: Tx, actor: SessionUser, place: Place, branchId: string, versionId: string, baseRevision: number): Promise<RestoreResult> {
  const [draft] = await tx.select().from(drafts).where(eq(drafts.branchId, branchId)).for('update');
  if (!draft) throw notFound('draft');
  if (draft.revision !== baseRevision) {
    throw conflict(`The draft changed since you last saw it (revision ${draft.revision}, you saw ${baseRevision}). Reload it, then restore again.`, {
      field: 'baseRevision',
      reason: 'draftChanged',
      draftRevision: draft.revision,
    });
  }
  const [version] = await tx.select({ id: versions.id, studyId: versions.studyId, number: versions.number }).from(versions).where(eq(versions.id, versionId));
  if (!version || version.studyId !== place.studyId) throw notFound('version');
  const restored = ((await versionCellsOf(tx, [versionId])).get(versionId) ?? []).map(snapshotToDraftCell);
  const keep = new Set(restored.map((c) => c.cellId));
  const now = new Date().toISOString();
  const dropped = storedCells(draft).filter((c) => !keep.has(c.cellId));
  const trash = [
    ...dropped.map((c) => ({ ...c, deletedAt: now, deletedBy: actor.id })),
    ...storedTrash(draft).filter((t) => !keep.has(t.cellId)),
  ].slice(0, TRASH_LIMIT);
  const written = splitOutputKeys(restored, trash);
  const [updated] = await tx
    .update(drafts)
    .set({ cells: written.cells, trash: written.trash, outputKeys: written.outputKeys, revision: draft.revision + 1, updatedBy: actor.id, updatedAt: sql`now()` })
    .where(eq(drafts.branchId, branchId))
    .returning({ revision: drafts.revision });
  await audit(tx, {
    actorId: actor.id,
    projectId: place.projectId,
    action: 'draft.restore',
    targetType: 'branch',
    targetId: branchId,
    detail: { versionId, number: version.number, revision: updated!.revision, movedToTrash: dropped.map((c) => c.cellId) },
  });
  return {
    branchId,
    revision: updated!.revision,
    restoredFromVersionId: versionId,
    cellCount: restored.length,
    movedToTrash: dropped.map((c) => ({ cellId: c.cellId, title: c.title, kind: c.kind as CellKind })),
  };
}

// ---------------------------------------------------------------------------------------------------
// Branches and the baseline

function isUniqueViolation(error: unknown): boolean {
  const e = error as { code?: string; cause?: { code?: string } };
  return e?.code === '23505' || e?.cause?.code === '23505';
}

/** A new branch whose draft starts as the version it is made from; it has no versions of its own yet. */
export async function createBranch(tx: Tx, actor: SessionUser, place: Place, versionId: string, input: Required<CreateBranch>): Promise<string> {
  const [taken] = await tx.select({ id: branches.id }).from(branches).where(and(eq(branches.studyId, place.studyId), eq(branches.name, input.name)));
  if (taken) throw conflict(`This study already has a branch named "${input.name}".`, { field: 'name' });
  const start = ((await versionCellsOf(tx, [versionId])).get(versionId) ?? []).map(snapshotToDraftCell);
  let branchId: string;
  try {
    const [row] = await tx
      .insert(branches)
      .values({ studyId: place.studyId, name: input.name, purpose: input.purpose, forkedFromVersionId: versionId, headVersionId: null, createdBy: actor.id })
      .returning({ id: branches.id });
    branchId = row!.id;
  } catch (error) {
    if (isUniqueViolation(error)) throw conflict(`This study already has a branch named "${input.name}".`, { field: 'name' });
    throw error;
  }
  const written = splitOutputKeys(start);
  await tx.insert(drafts).values({ branchId, cells: written.cells, outputKeys: written.outputKeys, basedOnVersionId: versionId, updatedBy: actor.id });
  await audit(tx, { actorId: actor.id, projectId: place.projectId, action: 'branch.create', targetType: 'branch', targetId: branchId, detail: { name: input.name, fromVersionId: versionId } });
  return branchId;
}

export async function updateBranch(tx: Tx, actor: SessionUser, place: Place, branchId: string, input: UpdateBranch): Promise<void> {
  const [branch] = await tx.select().from(branches).where(eq(branches.id, branchId)).for('update');
  if (!branch) throw notFound('branch');
  if (branch.name === MAIN_BRANCH && branch.forkedFromVersionId === null) {
    if (input.archived === true) throw badRequest('the main branch is the study’s main line and cannot be archived', 'archived');
    if (input.name !== undefined && input.name !== MAIN_BRANCH) throw badRequest('the main branch keeps its name', 'name');
  }
  if (input.name !== undefined && input.name !== branch.name) {
    const [taken] = await tx.select({ id: branches.id }).from(branches).where(and(eq(branches.studyId, place.studyId), eq(branches.name, input.name)));
    if (taken) throw conflict(`This study already has a branch named "${input.name}".`, { field: 'name' });
  }
  try {
    await tx
      .update(branches)
      .set({
        ...(input.name !== undefined ? { name: input.name } : {}),
        ...(input.purpose !== undefined ? { purpose: input.purpose } : {}),
        ...(input.archived !== undefined ? { archivedAt: input.archived ? sql`now()` : null } : {}),
      })
      .where(eq(branches.id, branchId));
  } catch (error) {
    if (isUniqueViolation(error)) throw conflict(`This study already has a branch named "${input.name}".`, { field: 'name' });
    throw error;
  }
  const action = input.archived === true ? 'branch.archive' : input.archived === false ? 'branch.restore' : 'branch.update';
  await audit(tx, { actorId: actor.id, projectId: place.projectId, action, targetType: 'branch', targetId: branchId, detail: { ...input, previousName: branch.name } });
}

export async function markBaseline(tx: Tx, actor: SessionUser, place: Place, versionId: string | null): Promise<void> {
  if (versionId) {
    const [version] = await tx.select({ studyId: versions.studyId }).from(versions).where(eq(versions.id, versionId));
    if (!version || version.studyId !== place.studyId) throw badRequest('versionId must name a version of this study', 'versionId');
  }
  await tx.update(studies).set({ baselineVersionId: versionId, updatedAt: sql`now()` }).where(eq(studies.id, place.studyId));
  await audit(tx, { actorId: actor.id, projectId: place.projectId, action: versionId ? 'study.baseline' : 'study.baselineClear', targetType: 'study', targetId: place.studyId, detail: { versionId } });
}
