import { and, eq } from 'drizzle-orm';
import { can, DEFAULT_PROJECT_SETTINGS, type ProjectAccess, type ProjectAction, isUuid } from '@laminote/contracts';
import type { Tx } from '../db/client';
import { memberships, projects, studies } from '../db/schema';
import type { SessionUser } from '../auth/types';
import { forbidden, notFound } from '../http/problem';

export interface ProjectContext {
  projectId: string;
  access: ProjectAccess;
}

const ACTION_WORDS: Record<ProjectAction, string> = {
  read: 'read this project',
  editStudy: 'edit studies',
  runCells: 'run cells',
  saveVersion: 'save versions',
  branch: 'branch design variants',
  markBaseline: 'mark the baseline',
  manageMembers: 'manage members',
  manageSettings: 'change project settings',
  comment: 'comment',
  giveVerdict: 'give verdicts',
  requestReview: 'request reviews',
};

/**
 * The caller's access to a project. A project the caller is not a member of does not exist for them:
 * it answers 404, exactly as a project that does not exist. Site admins see every project.
 */
export async function projectAccess(tx: Tx, user: SessionUser, projectId: string): Promise<ProjectContext> {
  if (!isUuid(projectId)) throw notFound('project');
  const [row] = await tx
    .select({ id: projects.id, settings: projects.settings, role: memberships.role })
    .from(projects)
    .leftJoin(memberships, and(eq(memberships.projectId, projects.id), eq(memberships.userId, user.id)))
    .where(eq(projects.id, projectId));
  if (!row || (!row.role && !user.siteAdmin)) throw notFound('project');
  return { projectId: row.id, access: { role: row.role, siteAdmin: user.siteAdmin, settings: row.settings ?? DEFAULT_PROJECT_SETTINGS } };
}

export async function studyAccess(tx: Tx, user: SessionUser, studyId: string) {
  if (!isUuid(studyId)) throw notFound('study');
  const [row] = await tx.select().from(studies).where(eq(studies.id, studyId));
  if (!row) throw notFound('study');
  const context = await projectAccess(tx, user, row.projectId).catch(() => {
    throw notFound('study');
  });
  return { study: row, ...context };
}

/** 403 for a member whose role does not allow the action (they know the project exists). */
export function requireAction(access: ProjectAccess, action: ProjectAction): void {
  if (!can(access, action)) {
    const role = access.role ?? (access.siteAdmin ? 'site admin (not a member)' : 'none');
    throw forbidden(`Your role (${role}) cannot ${ACTION_WORDS[action]} in this project.`);
  }
}
