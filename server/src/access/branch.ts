import { and, eq, sql } from 'drizzle-orm';
import { DEFAULT_PROJECT_SETTINGS, isUuid } from '@laminote/contracts';
import type { SessionUser } from '../auth/types';
import type { Tx } from '../db/client';
import { branches, drafts, memberships, outputs, projects, studies } from '../db/schema';
import type { ProjectContext } from './access';
import { notFound, ProblemError } from '../http/problem';
import { keepCells, knownCells } from '../notebook/draft-cells';

type DraftRow = typeof drafts.$inferSelect;


export interface BranchContext extends ProjectContext {
  branch: typeof branches.$inferSelect;
  study: typeof studies.$inferSelect;
}

/**
 * The caller's access to a branch, through its study's project: 404 for a branch they cannot see,
 * exactly as for one that does not exist (the rule of access.ts, in one query because every
 * notebook request starts here).
 */
export async function branchAccess(tx: Tx, user: SessionUser, branchId: string): Promise<BranchContext> {
  if (!isUuid(branchId)) throw notFound('branch');
  const [row] = await accessQuery(tx).execute({ branchId, userId: user.id });
  return contextOf(row, user);
}

type AccessRow = Awaited<ReturnType<ReturnType<typeof buildAccessQuery>['execute']>>[number];

function contextOf(row: AccessRow | undefined, user: SessionUser): BranchContext {
  if (!row || (!row.role && !user.siteAdmin)) throw notFound('branch');
  return {
    branch: row.branch,
    study: row.study,
    projectId: row.study.projectId,
    access: { role: row.role, siteAdmin: user.siteAdmin, settings: row.settings ?? DEFAULT_PROJECT_SETTINGS },
  };
}

/**
 * The query, built once per database handle and prepared by name on each connection: every notebook
 * request asks it, and building it anew each time cost the event loop more than PostgreSQL's answer.
 */
function accessQuery(tx: Tx) {
  let query = accessQueries.get(tx);
  if (!query) accessQueries.set(tx, (query = buildAccessQuery(tx)));
  return query;
}

const buildAccessQuery = (tx: Tx) =>
  tx
    .select({ branch: branches, study: studies, settings: projects.settings, role: memberships.role })
    .from(branches)
    .innerJoin(studies, eq(studies.id, branches.studyId))
    .innerJoin(projects, eq(projects.id, studies.projectId))
    .leftJoin(memberships, and(eq(memberships.projectId, projects.id), eq(memberships.userId, sql.placeholder('userId'))))
    .where(eq(branches.id, sql.placeholder('branchId')))
    .prepare('branch_access');

const accessQueries = new WeakMap<Tx, ReturnType<typeof buildAccessQuery>>();

/** Which of some output keys were stored when the access was read (branchAccessWithDraft's `askKeys`). */
export interface StoredKeysAnswer {
  asked: ReadonlySet<string>;
  stored: ReadonlySet<string>;
}

/**
 * The caller's access to a branch (as branchAccess) and the branch's draft row, in one query: the
 * notebook's draft and run routes read both on every request. The draft is null when the branch has
 * none yet (a branch made before drafts existed). `askKeys`, output keys the caller expects to look
 * up next (a run's, from the cells this app holds), are answered in the same query with those of them
 * that are stored, so a run whose outputs are all new needs no lookup of its own.
 */
export async function branchAccessWithDraft(
  tx: Tx,
  user: SessionUser,
  branchId: string,
  askKeys: readonly string[] = [],
): Promise<{ ctx: BranchContext; draft: typeof drafts.$inferSelect | null; storedKeys: StoredKeysAnswer | null }> {
  if (!isUuid(branchId)) throw notFound('branch');
  let query = accessWithDraftQueries.get(tx);
  if (!query) accessWithDraftQueries.set(tx, (query = buildAccessWithDraftQuery(tx)));
  // The cells come only when they differ from those this app holds (drafts.cells_token).
  const known = knownCells(tx, branchId);
  const [row] = await query.execute({ branchId, userId: user.id, cellsToken: known?.token ?? -1, keys: askKeys });
  const ctx = contextOf(row, user);
  const storedKeys = askKeys.length ? { asked: new Set(askKeys), stored: new Set(row?.storedKeys ?? []) } : null;
  const read = row?.draft;
  if (!read) return { ctx, draft: null, storedKeys };
  if (read.cells === null || read.trash === null) {
    if (!known || read.cellsToken !== known.token) throw new Error(`the draft of branch ${branchId} came without its cells`);
    return { ctx, draft: { ...read, cells: known.cells, trash: known.trash }, storedKeys };
  }
  const kept = keepCells(tx, branchId, read.cellsToken, read.cells, read.trash);
  return { ctx, draft: { ...read, cells: kept.cells, trash: kept.trash }, storedKeys };
}

/** A column of the draft, or null when its cells token is the one given (the caller holds them). */
const unlessKnown = <T>(column: typeof drafts.cells | typeof drafts.trash) =>
  sql<T | null>`case when ${drafts.cellsToken} = ${sql.placeholder('cellsToken')} then null else ${column} end`;

const buildAccessWithDraftQuery = (tx: Tx) =>
  tx
    .select({
      branch: branches,
      study: studies,
      settings: projects.settings,
      role: memberships.role,
      storedKeys: sql<string[] | null>`(select array_agg(o.${sql.identifier(outputs.key.name)}) from ${outputs} o where o.${sql.identifier(outputs.key.name)} = any(${sql.placeholder('keys')}::text[]))`,
      draft: {
        branchId: drafts.branchId,
        revision: drafts.revision,
        cells: unlessKnown<DraftRow['cells']>(drafts.cells),
        trash: unlessKnown<DraftRow['trash']>(drafts.trash),
        outputKeys: drafts.outputKeys,
        cellsToken: drafts.cellsToken,
        basedOnVersionId: drafts.basedOnVersionId,
        updatedBy: drafts.updatedBy,
        updatedAt: drafts.updatedAt,
      },
    })
    .from(branches)
    .innerJoin(studies, eq(studies.id, branches.studyId))
    .innerJoin(projects, eq(projects.id, studies.projectId))
    .leftJoin(memberships, and(eq(memberships.projectId, projects.id), eq(memberships.userId, sql.placeholder('userId'))))
    .leftJoin(drafts, eq(drafts.branchId, branches.id))
    .where(eq(branches.id, sql.placeholder('branchId')))
    .prepare('branch_access_draft');

const accessWithDraftQueries = new WeakMap<Tx, ReturnType<typeof buildAccessWithDraftQuery>>();

/** Archived studies and branches are read-only until restored. */
export function requireWritable(ctx: BranchContext): void {
  if (ctx.study.archivedAt || ctx.branch.archivedAt) {
    throw new ProblemError(409, 'archived', 'This is archived', { detail: `The ${ctx.study.archivedAt ? 'study' : 'branch'} is archived; restore it to edit or run its cells.` });
  }
}

/** A branch's place for the services: its study and project. */
export async function branchPlace(tx: Tx, user: SessionUser, branchId: string) {
  const ctx = await branchAccess(tx, user, branchId);
  return { ...ctx, place: { studyId: ctx.study.id, projectId: ctx.projectId } };
}
