import { eq } from 'drizzle-orm';
import type { SessionUser } from '../auth/types';
import type { Tx } from '../db/client';
import { branches } from '../db/schema';
import { studyAccess, type ProjectContext } from '../access/access';
import { notFound, ProblemError } from '../http/problem';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export interface BranchContext extends ProjectContext {
  branch: typeof branches.$inferSelect;
  study: Awaited<ReturnType<typeof studyAccess>>['study'];
}

/** The caller's access to a branch, through its study's project: 404 for a branch they cannot see. */
export async function branchAccess(tx: Tx, user: SessionUser, branchId: string): Promise<BranchContext> {
  if (!UUID.test(branchId)) throw notFound('branch');
  const [branch] = await tx.select().from(branches).where(eq(branches.id, branchId));
  if (!branch) throw notFound('branch');
  const context = await studyAccess(tx, user, branch.studyId).catch(() => {
    throw notFound('branch');
  });
  return { ...context, branch };
}

/** Archived studies and branches are read-only until restored. */
export function requireWritable(ctx: BranchContext): void {
  if (ctx.study.archivedAt || ctx.branch.archivedAt) {
    throw new ProblemError(409, 'archived', 'This is archived', { detail: `The ${ctx.study.archivedAt ? 'study' : 'branch'} is archived; restore it to edit or run its cells.` });
  }
}
