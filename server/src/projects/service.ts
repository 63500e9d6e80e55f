import { and, asc, count, eq, isNull, sql } from 'drizzle-orm';
import type { AddMember, Member, Me, Project, ProjectRole, UpdateProject } from '@laminote/contracts';
import type { Tx } from '../db/client';
import { memberships, projects, studies, users } from '../db/schema';
import type { SessionUser } from '../auth/types';
import { audit } from '../audit/audit';
import { badRequest, conflict, notFound } from '../http/problem';

const iso = (d: Date) => d.toISOString();

export async function me(tx: Tx, user: SessionUser): Promise<Me> {
  const rows = await tx
    .select({ projectId: projects.id, projectName: projects.name, role: memberships.role })
    .from(memberships)
    .innerJoin(projects, eq(projects.id, memberships.projectId))
    .where(eq(memberships.userId, user.id))
    .orderBy(asc(projects.name));
  return { user: { id: user.id, email: user.email, name: user.name, siteAdmin: user.siteAdmin }, memberships: rows };
}

export async function listProjects(tx: Tx, user: SessionUser): Promise<Project[]> {
  const studyCounts = tx
    .select({ projectId: studies.projectId, n: count().as('study_n') })
    .from(studies)
    .where(isNull(studies.archivedAt))
    .groupBy(studies.projectId)
    .as('sc');
  const memberCounts = tx
    .select({ projectId: memberships.projectId, n: count().as('member_n') })
    .from(memberships)
    .groupBy(memberships.projectId)
    .as('mc');
  const mine = tx.select().from(memberships).where(eq(memberships.userId, user.id)).as('mine');
  const rows = await tx
    .select({
      id: projects.id,
      name: projects.name,
      description: projects.description,
      settings: projects.settings,
      createdAt: projects.createdAt,
      role: mine.role,
      studyCount: sql<number>`coalesce(${studyCounts.n}, 0)::int`,
      memberCount: sql<number>`coalesce(${memberCounts.n}, 0)::int`,
    })
    .from(projects)
    .leftJoin(mine, eq(mine.projectId, projects.id))
    .leftJoin(studyCounts, eq(studyCounts.projectId, projects.id))
    .leftJoin(memberCounts, eq(memberCounts.projectId, projects.id))
    .where(user.siteAdmin ? undefined : sql`${mine.role} is not null`)
    .orderBy(asc(projects.name));
  return rows.map((r) => ({ ...r, role: r.role ?? null, createdAt: iso(r.createdAt) }));
}

export async function getProject(tx: Tx, user: SessionUser, projectId: string): Promise<Project> {
  const project = (await listProjects(tx, user)).find((p) => p.id === projectId);
  if (!project) throw notFound('project');
  return project;
}

/** Find a person by e-mail, or make a placeholder that their first sign-in will bind. */
async function userByEmail(tx: Tx, email: string, name?: string) {
  const [found] = await tx.select().from(users).where(eq(users.email, email));
  if (found) return found;
  const [created] = await tx.insert(users).values({ email, name: name || email }).returning();
  return created!;
}

export async function createProject(tx: Tx, actor: SessionUser, input: { name: string; description: string; leadEmail: string }) {
  const [project] = await tx.insert(projects).values({ name: input.name, description: input.description, createdBy: actor.id }).returning();
  const lead = await userByEmail(tx, input.leadEmail);
  await tx.insert(memberships).values({ projectId: project!.id, userId: lead.id, role: 'lead' });
  await audit(tx, { actorId: actor.id, projectId: project!.id, action: 'project.create', targetType: 'project', targetId: project!.id, detail: { name: input.name, lead: lead.email } });
  return project!;
}

export async function updateProject(tx: Tx, actor: SessionUser, projectId: string, input: UpdateProject) {
  const [current] = await tx.select().from(projects).where(eq(projects.id, projectId));
  if (!current) throw notFound('project');
  const settings = input.settings ? { ...current.settings, ...input.settings } : current.settings;
  await tx
    .update(projects)
    .set({ ...(input.name !== undefined ? { name: input.name } : {}), ...(input.description !== undefined ? { description: input.description } : {}), settings })
    .where(eq(projects.id, projectId));
  await audit(tx, { actorId: actor.id, projectId, action: 'project.update', targetType: 'project', targetId: projectId, detail: { ...input } });
}

export async function listMembers(tx: Tx, projectId: string): Promise<Member[]> {
  const rows = await tx
    .select({ userId: users.id, email: users.email, name: users.name, role: memberships.role, subject: users.subject, addedAt: memberships.createdAt })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.projectId, projectId))
    .orderBy(asc(users.name));
  return rows.map(({ subject, addedAt, ...r }) => ({ ...r, hasSignedIn: subject !== null, addedAt: iso(addedAt) }));
}

export async function addMember(tx: Tx, actor: SessionUser, projectId: string, input: AddMember & { role: ProjectRole }) {
  const user = await userByEmail(tx, input.email, input.name);
  const [existing] = await tx.select().from(memberships).where(and(eq(memberships.projectId, projectId), eq(memberships.userId, user.id)));
  if (existing) throw conflict(`${input.email} is already a member (${existing.role}).`, { field: 'email' });
  await tx.insert(memberships).values({ projectId, userId: user.id, role: input.role });
  await audit(tx, { actorId: actor.id, projectId, action: 'member.add', targetType: 'user', targetId: user.id, detail: { email: user.email, role: input.role } });
  return (await listMembers(tx, projectId)).find((m) => m.userId === user.id)!;
}

/** A project always keeps at least one lead, so it can still be managed. */
async function assertKeepsALead(tx: Tx, projectId: string, userId: string, newRole: ProjectRole | null) {
  const leads = await tx.select({ userId: memberships.userId }).from(memberships).where(and(eq(memberships.projectId, projectId), eq(memberships.role, 'lead')));
  if (newRole !== 'lead' && leads.length === 1 && leads[0]!.userId === userId) {
    throw badRequest('A project needs at least one lead: make someone else lead first.', 'role');
  }
}

export async function changeMemberRole(tx: Tx, actor: SessionUser, projectId: string, userId: string, role: ProjectRole) {
  const [existing] = await tx.select().from(memberships).where(and(eq(memberships.projectId, projectId), eq(memberships.userId, userId)));
  if (!existing) throw notFound('member');
  await assertKeepsALead(tx, projectId, userId, role);
  await tx.update(memberships).set({ role }).where(and(eq(memberships.projectId, projectId), eq(memberships.userId, userId)));
  await audit(tx, { actorId: actor.id, projectId, action: 'member.role', targetType: 'user', targetId: userId, detail: { from: existing.role, to: role } });
}

export async function removeMember(tx: Tx, actor: SessionUser, projectId: string, userId: string) {
  const [existing] = await tx.select().from(memberships).where(and(eq(memberships.projectId, projectId), eq(memberships.userId, userId)));
  if (!existing) throw notFound('member');
  await assertKeepsALead(tx, projectId, userId, null);
  await tx.delete(memberships).where(and(eq(memberships.projectId, projectId), eq(memberships.userId, userId)));
  await audit(tx, { actorId: actor.id, projectId, action: 'member.remove', targetType: 'user', targetId: userId, detail: { role: existing.role } });
}
