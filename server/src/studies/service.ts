import { and, asc, desc, eq, isNotNull, isNull, sql } from 'drizzle-orm';
import type { Branch, CreateStudy, Study, UpdateStudy } from '@laminote/contracts';
import type { Tx } from '../db/client';
import { branches, drafts, studies, users } from '../db/schema';
import type { SessionUser } from '../auth/types';
import { audit } from '../audit/audit';
import { notFound } from '../http/problem';

/** The branch every study starts with. */
export const MAIN_BRANCH = 'main';

const columns = {
  id: studies.id,
  projectId: studies.projectId,
  title: studies.title,
  description: studies.description,
  archivedAt: studies.archivedAt,
  createdAt: studies.createdAt,
  updatedAt: studies.updatedAt,
  creatorId: users.id,
  creatorName: users.name,
};

interface Row {
  id: string;
  projectId: string;
  title: string;
  description: string;
  archivedAt: Date | null;
  createdAt: Date;
  updatedAt: Date;
  creatorId: string | null;
  creatorName: string | null;
}

function toStudy(r: Row): Study {
  return {
    id: r.id,
    projectId: r.projectId,
    title: r.title,
    description: r.description,
    archived: r.archivedAt !== null,
    createdBy: r.creatorId ? { id: r.creatorId, name: r.creatorName ?? '' } : null,
    createdAt: r.createdAt.toISOString(),
    updatedAt: r.updatedAt.toISOString(),
  };
}

export async function listStudies(tx: Tx, projectId: string, archived: boolean): Promise<Study[]> {
  const rows = await tx
    .select(columns)
    .from(studies)
    .leftJoin(users, eq(users.id, studies.createdBy))
    .where(and(eq(studies.projectId, projectId), archived ? isNotNull(studies.archivedAt) : isNull(studies.archivedAt)))
    .orderBy(desc(studies.updatedAt), asc(studies.title));
  return rows.map(toStudy);
}

export async function getStudy(tx: Tx, studyId: string): Promise<Study> {
  const [row] = await tx.select(columns).from(studies).leftJoin(users, eq(users.id, studies.createdBy)).where(eq(studies.id, studyId));
  if (!row) throw notFound('study');
  return toStudy(row);
}

/** A new study comes with its main branch and an empty draft, so it can be edited at once. */
export async function createStudy(tx: Tx, actor: SessionUser, projectId: string, input: Required<CreateStudy>) {
  const [study] = await tx.insert(studies).values({ projectId, title: input.title, description: input.description, createdBy: actor.id }).returning();
  const [branch] = await tx.insert(branches).values({ studyId: study!.id, name: MAIN_BRANCH, purpose: 'Main line of the study', createdBy: actor.id }).returning();
  await tx.insert(drafts).values({ branchId: branch!.id, updatedBy: actor.id });
  await audit(tx, { actorId: actor.id, projectId, action: 'study.create', targetType: 'study', targetId: study!.id, detail: { title: input.title } });
  return study!;
}

export async function updateStudy(tx: Tx, actor: SessionUser, projectId: string, studyId: string, input: UpdateStudy) {
  await tx
    .update(studies)
    .set({
      ...(input.title !== undefined ? { title: input.title } : {}),
      ...(input.description !== undefined ? { description: input.description } : {}),
      ...(input.archived !== undefined ? { archivedAt: input.archived ? sql`now()` : null } : {}),
      updatedAt: sql`now()`,
    })
    .where(eq(studies.id, studyId));
  const action = input.archived === true ? 'study.archive' : input.archived === false ? 'study.restore' : 'study.update';
  await audit(tx, { actorId: actor.id, projectId, action, targetType: 'study', targetId: studyId, detail: { ...input } });
}

/** The branches of a study, main first, then by creation. */
export async function listBranches(tx: Tx, studyId: string): Promise<Branch[]> {
  const rows = await tx
    .select({ b: branches, creatorName: users.name, headNumber: sql<number | null>`(select v.number from versions v where v.id = ${branches.headVersionId})` })
    .from(branches)
    .leftJoin(users, eq(users.id, branches.createdBy))
    .where(eq(branches.studyId, studyId))
    .orderBy(sql`${branches.name} <> ${MAIN_BRANCH}`, asc(branches.createdAt));
  return rows.map(({ b, creatorName, headNumber }) => ({
    id: b.id,
    studyId: b.studyId,
    name: b.name,
    purpose: b.purpose,
    forkedFromVersionId: b.forkedFromVersionId,
    headVersionId: b.headVersionId,
    headNumber: headNumber === null ? null : Number(headNumber),
    archived: b.archivedAt !== null,
    createdBy: b.createdBy ? { id: b.createdBy, name: creatorName ?? '' } : null,
    createdAt: b.createdAt.toISOString(),
  }));
}
