import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { can, CELL_KIND_LABELS, findMentions, type CellKind, type Comment, type CommentRevision, type PlotAnchor, type ProjectAccess, type Thread } from '@laminote/contracts';
import { audit } from '../audit/audit';
import type { SessionUser } from '../auth/types';
import type { Tx } from '../db/client';
import { branches, cells, commentRevisions, comments, commentThreads, memberships, users, versions } from '../db/schema';
import { badRequest, forbidden, notFound } from '../http/problem';
import { excerpt, notify } from './notify';
import { cellHashes, cellHashInView, resolveView, type View } from './views';

/**
 * Comment threads on cells. A thread is anchored to the cell and to the version (or draft) it was
 * started on, with the cell's content hash then, so later views can say whether the cell changed
 * since. Comment texts are immutable revisions: an edit adds one, the earlier ones stay readable.
 */
export interface Caller {
  user: SessionUser;
  access: ProjectAccess;
}

export interface StudyRef {
  id: string;
  title: string;
  projectId: string;
}

const creator = alias(users, 'creator');
const resolver = alias(users, 'resolver');

/**
 * Who may resolve and reopen a thread (if they may comment at all): leads, the person who started it,
 * and the author of the work it is about: whoever saved the version it was made on, or created the
 * cell. So the engineer a reviewer writes to can close the point once it is answered.
 */
interface ThreadAuthors {
  createdBy: string | null;
  cellAuthor: string | null;
  versionAuthor: string | null;
}

function mayResolve(caller: Caller, authors: ThreadAuthors): boolean {
  if (!can(caller.access, 'comment')) return false;
  if (caller.access.role === 'lead') return true;
  return [authors.createdBy, authors.cellAuthor, authors.versionAuthor].includes(caller.user.id);
}

export function cellLink(studyId: string, cellId: string, threadId?: string): string {
  return `/studies/${studyId}?cell=${cellId}${threadId ? `&thread=${threadId}` : ''}`;
}

async function loadComments(tx: Tx, caller: Caller, threadIds: string[]): Promise<Map<string, Comment[]>> {
  const byThread = new Map<string, Comment[]>();
  if (threadIds.length === 0) return byThread;
  const rows = await tx
    .select({ id: comments.id, threadId: comments.threadId, authorId: comments.authorId, authorName: users.name, createdAt: comments.createdAt })
    .from(comments)
    .leftJoin(users, eq(users.id, comments.authorId))
    .where(inArray(comments.threadId, threadIds))
    .orderBy(asc(comments.createdAt), asc(comments.id));
  const revisions =
    rows.length === 0
      ? []
      : await tx
          .select()
          .from(commentRevisions)
          .where(
            inArray(
              commentRevisions.commentId,
              rows.map((r) => r.id),
            ),
          )
          .orderBy(asc(commentRevisions.commentId), asc(commentRevisions.revision));
  const newest = new Map<string, { body: string; revision: number; createdAt: Date }>();
  for (const r of revisions) newest.set(r.commentId, r);
  for (const row of rows) {
    const latest = newest.get(row.id);
    const list = byThread.get(row.threadId) ?? [];
    list.push({
      id: row.id,
      threadId: row.threadId,
      author: row.authorId ? { id: row.authorId, name: row.authorName ?? '' } : null,
      body: latest?.body ?? '',
      createdAt: row.createdAt.toISOString(),
      editedAt: latest && latest.revision > 1 ? latest.createdAt.toISOString() : null,
      revisionCount: latest?.revision ?? 0,
      canEdit: row.authorId === caller.user.id && can(caller.access, 'comment'),
    });
    byThread.set(row.threadId, list);
  }
  return byThread;
}

/** The threads of a study (optionally one cell, or given threads), told relative to `view`. */
export async function listThreads(tx: Tx, caller: Caller, studyId: string, view: View | null, filter: { cellId?: string; threadIds?: string[] } = {}): Promise<Thread[]> {
  const rows = await tx
    .select({
      t: commentThreads,
      creatorName: creator.name,
      resolverName: resolver.name,
      versionNumber: versions.number,
      versionAuthor: versions.authorId,
      cellAuthor: cells.createdBy,
      branchName: branches.name,
    })
    .from(commentThreads)
    .leftJoin(cells, eq(cells.id, commentThreads.cellId))
    .leftJoin(creator, eq(creator.id, commentThreads.createdBy))
    .leftJoin(resolver, eq(resolver.id, commentThreads.resolvedBy))
    .leftJoin(versions, eq(versions.id, commentThreads.versionId))
    .leftJoin(branches, eq(branches.id, commentThreads.branchId))
    .where(
      and(
        eq(commentThreads.studyId, studyId),
        filter.cellId ? eq(commentThreads.cellId, filter.cellId) : undefined,
        filter.threadIds ? inArray(commentThreads.id, filter.threadIds) : undefined,
      ),
    )
    .orderBy(asc(commentThreads.createdAt), asc(commentThreads.id));
  const commentsByThread = await loadComments(
    tx,
    caller,
    rows.map((r) => r.t.id),
  );
  const hashes = view ? await cellHashes(tx, view, [...new Set(rows.map((r) => r.t.cellId))]) : new Map<string, string>();
  return rows.map(({ t, creatorName, resolverName, versionNumber, versionAuthor, cellAuthor, branchName }) => {
    const now = hashes.get(t.cellId);
    const onThisView = view !== null && (view.kind === 'version' ? t.versionId === view.versionId : t.versionId === null && t.branchId === view.branchId);
    return {
      id: t.id,
      studyId: t.studyId,
      cellId: t.cellId,
      origin: { versionId: t.versionId, versionNumber: versionNumber ?? null, branchId: t.branchId, branchName: branchName ?? null },
      anchor: t.anchor ?? null,
      resolved: t.resolvedAt !== null,
      resolvedAt: t.resolvedAt?.toISOString() ?? null,
      resolvedBy: t.resolvedBy ? { id: t.resolvedBy, name: resolverName ?? '' } : null,
      createdBy: t.createdBy ? { id: t.createdBy, name: creatorName ?? '' } : null,
      createdAt: t.createdAt.toISOString(),
      comments: commentsByThread.get(t.id) ?? [],
      onThisView,
      cellChanged: now === undefined || !t.cellContentHash ? null : now !== t.cellContentHash,
      canResolve: mayResolve(caller, { createdBy: t.createdBy, cellAuthor, versionAuthor }),
    };
  });
}

export async function getThread(tx: Tx, caller: Caller, studyId: string, threadId: string, view: View | null): Promise<Thread> {
  const [thread] = await listThreads(tx, caller, studyId, view, { threadIds: [threadId] });
  if (!thread) throw notFound('thread');
  return thread;
}

/** The study a thread belongs to, to check access before anything else is told about it. */
export async function threadStudy(tx: Tx, threadId: string): Promise<{ studyId: string } | null> {
  const [row] = await tx.select({ studyId: commentThreads.studyId }).from(commentThreads).where(eq(commentThreads.id, threadId));
  return row ?? null;
}

export async function commentStudy(tx: Tx, commentId: string): Promise<{ studyId: string; threadId: string } | null> {
  const [row] = await tx
    .select({ studyId: commentThreads.studyId, threadId: comments.threadId })
    .from(comments)
    .innerJoin(commentThreads, eq(commentThreads.id, comments.threadId))
    .where(eq(comments.id, commentId));
  return row ?? null;
}

/** The project's members who can be mentioned, in the shape `findMentions` reads. */
async function mentionable(tx: Tx, projectId: string) {
  return tx
    .select({ userId: users.id, name: users.name, email: users.email })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.projectId, projectId));
}

async function cellTitle(tx: Tx, studyId: string, cellId: string): Promise<string> {
  // The title the cell has in a draft, else in its newest saved revision, else the name of its kind.
  const { rows } = await tx.execute<{ title: string | null; kind: string | null }>(sql`
    select coalesce(
      (select c->>'title' from drafts d join branches b on b.id = d.branch_id, jsonb_array_elements(d.cells) c
        where b.study_id = ${studyId} and c->>'cellId' = ${cellId} and coalesce(c->>'title', '') <> '' limit 1),
      (select r.title from cell_revisions r where r.cell_id = ${cellId} and r.title <> '' order by r.created_at desc limit 1)) as title,
      (select kind from cells where id = ${cellId}) as kind`);
  const row = rows[0];
  if (row?.title) return row.title;
  return row?.kind && row.kind in CELL_KIND_LABELS ? CELL_KIND_LABELS[row.kind as CellKind] : 'a cell';
}

interface Notifier {
  publicUrl: string;
}

async function notifyMentionsAndReplies(
  tx: Tx,
  deps: Notifier,
  caller: Caller,
  study: StudyRef,
  thread: { id: string; cellId: string; createdBy: string | null },
  body: string,
  opts: { isReply: boolean; alreadyMentioned?: Set<string> },
): Promise<string[]> {
  const members = await mentionable(tx, study.projectId);
  const mentioned = findMentions(body, members)
    .map((m) => m.userId)
    .filter((id) => !opts.alreadyMentioned?.has(id));
  const title = await cellTitle(tx, study.id, thread.cellId);
  const link = cellLink(study.id, thread.cellId, thread.id);
  const text = excerpt(body);
  const refs = { threadId: thread.id, cellId: thread.cellId };
  await notify(tx, deps.publicUrl, {
    kind: 'mention',
    recipientIds: mentioned,
    actor: caller.user,
    projectId: study.projectId,
    study,
    title: `${caller.user.name} mentioned you on “${title}”`,
    excerpt: text,
    link,
    refs,
  });
  if (opts.isReply) {
    // The thread's author and everyone who wrote in it, still in the project, and not just mentioned.
    const participants = await tx
      .selectDistinct({ id: comments.authorId })
      .from(comments)
      .where(eq(comments.threadId, thread.id));
    const memberIds = new Set(members.map((m) => m.userId));
    const recipients = [thread.createdBy, ...participants.map((p) => p.id)].filter(
      (id): id is string => id !== null && memberIds.has(id) && !mentioned.includes(id),
    );
    await notify(tx, deps.publicUrl, {
      kind: 'reply',
      recipientIds: recipients,
      actor: caller.user,
      projectId: study.projectId,
      study,
      title: `${caller.user.name} replied on “${title}”`,
      excerpt: text,
      link,
      refs,
    });
  }
  return mentioned;
}

export interface NewThread {
  cellId: string;
  versionId: string | null;
  branchId?: string | undefined;
  body: string;
  anchor: PlotAnchor | null;
}

export async function createThread(tx: Tx, deps: Notifier, caller: Caller, study: StudyRef, input: NewThread): Promise<string> {
  const view = await resolveView(tx, study.id, { versionId: input.versionId, branchId: input.branchId });
  if (!view) throw badRequest('branchId is required for a thread on a draft (versionId null)', 'branchId');
  if (view.kind === 'version' && input.branchId && input.branchId !== view.branchId) {
    throw badRequest('branchId: the version is on another branch', 'branchId');
  }
  const hash = await cellHashInView(tx, view, input.cellId);
  // The draft save gives every cell its identity row; the thread refers to it.
  const [cell] = await tx.select({ studyId: cells.studyId }).from(cells).where(eq(cells.id, input.cellId));
  if (cell?.studyId !== study.id) throw badRequest('cellId: no such cell in this study', 'cellId');
  const [thread] = await tx
    .insert(commentThreads)
    .values({
      studyId: study.id,
      cellId: input.cellId,
      branchId: view.branchId,
      versionId: view.kind === 'version' ? view.versionId : null,
      cellContentHash: hash,
      anchor: input.anchor,
      createdBy: caller.user.id,
    })
    .returning();
  const [comment] = await tx.insert(comments).values({ threadId: thread!.id, authorId: caller.user.id }).returning();
  await tx.insert(commentRevisions).values({ commentId: comment!.id, revision: 1, body: input.body });
  const mentioned = await notifyMentionsAndReplies(tx, deps, caller, study, { id: thread!.id, cellId: input.cellId, createdBy: caller.user.id }, input.body, { isReply: false });
  await audit(tx, {
    actorId: caller.user.id,
    projectId: study.projectId,
    action: 'comment.thread.create',
    targetType: 'commentThread',
    targetId: thread!.id,
    detail: { cellId: input.cellId, versionId: thread!.versionId, branchId: view.branchId, anchor: input.anchor, mentioned },
  });
  return thread!.id;
}

export async function reply(tx: Tx, deps: Notifier, caller: Caller, study: StudyRef, threadId: string, body: string): Promise<string> {
  const [thread] = await tx.select().from(commentThreads).where(eq(commentThreads.id, threadId));
  if (!thread) throw notFound('thread');
  // Participants are read before the reply is added, so the replier is not among them.
  const mentioned = await notifyMentionsAndReplies(tx, deps, caller, study, thread, body, { isReply: true });
  const [comment] = await tx.insert(comments).values({ threadId, authorId: caller.user.id }).returning();
  await tx.insert(commentRevisions).values({ commentId: comment!.id, revision: 1, body });
  await audit(tx, { actorId: caller.user.id, projectId: study.projectId, action: 'comment.reply', targetType: 'comment', targetId: comment!.id, detail: { threadId, mentioned } });
  return comment!.id;
}

/** Only a comment's author edits it; the new text is a new revision, the earlier ones are kept. */
export async function editComment(tx: Tx, deps: Notifier, caller: Caller, study: StudyRef, commentId: string, body: string): Promise<void> {
  const [row] = await tx
    .select({ authorId: comments.authorId, thread: commentThreads })
    .from(comments)
    .innerJoin(commentThreads, eq(commentThreads.id, comments.threadId))
    .where(eq(comments.id, commentId))
    .for('update', { of: comments });
  if (!row) throw notFound('comment');
  if (row.authorId !== caller.user.id) throw forbidden('Only its author can edit a comment.');
  const earlier = await tx.select().from(commentRevisions).where(eq(commentRevisions.commentId, commentId)).orderBy(asc(commentRevisions.revision));
  const last = earlier[earlier.length - 1];
  if (last && last.body === body) return;
  const revision = (last?.revision ?? 0) + 1;
  await tx.insert(commentRevisions).values({ commentId, revision, body });
  // People mentioned for the first time in this edit hear about it; those mentioned before already did.
  const members = await mentionable(tx, study.projectId);
  const before = new Set(earlier.flatMap((r) => findMentions(r.body, members).map((m) => m.userId)));
  const mentioned = await notifyMentionsAndReplies(tx, deps, caller, study, row.thread, body, { isReply: false, alreadyMentioned: before });
  await audit(tx, { actorId: caller.user.id, projectId: study.projectId, action: 'comment.edit', targetType: 'comment', targetId: commentId, detail: { revision, mentioned } });
}

export async function setResolved(tx: Tx, caller: Caller, study: StudyRef, threadId: string, resolved: boolean): Promise<void> {
  const [row] = await tx
    .select({ thread: commentThreads, cellAuthor: cells.createdBy, versionAuthor: versions.authorId })
    .from(commentThreads)
    .leftJoin(cells, eq(cells.id, commentThreads.cellId))
    .leftJoin(versions, eq(versions.id, commentThreads.versionId))
    .where(eq(commentThreads.id, threadId))
    .for('update', { of: commentThreads });
  if (!row) throw notFound('thread');
  const { thread } = row;
  if (!mayResolve(caller, { createdBy: thread.createdBy, cellAuthor: row.cellAuthor, versionAuthor: row.versionAuthor })) {
    throw forbidden(`Only a lead, the thread's author or the author of the version or cell can ${resolved ? 'resolve' : 'reopen'} it.`);
  }
  if ((thread.resolvedAt !== null) === resolved) return;
  await tx
    .update(commentThreads)
    .set(resolved ? { resolvedAt: sql`now()`, resolvedBy: caller.user.id } : { resolvedAt: null, resolvedBy: null })
    .where(eq(commentThreads.id, threadId));
  await audit(tx, {
    actorId: caller.user.id,
    projectId: study.projectId,
    action: resolved ? 'comment.thread.resolve' : 'comment.thread.reopen',
    targetType: 'commentThread',
    targetId: threadId,
  });
}

export async function listRevisions(tx: Tx, commentId: string): Promise<CommentRevision[]> {
  const rows = await tx.select().from(commentRevisions).where(eq(commentRevisions.commentId, commentId)).orderBy(asc(commentRevisions.revision));
  return rows.map((r) => ({ revision: r.revision, body: r.body, createdAt: r.createdAt.toISOString() }));
}
