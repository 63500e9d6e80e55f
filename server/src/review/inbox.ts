import { and, count, desc, eq, exists, isNull, lt, or, sql } from 'drizzle-orm';
import { NOTIFICATION_KINDS, type Inbox, type Notification, type NotificationKind, type NotificationPrefs, type UpdateNotificationPrefs } from '@laminote/contracts';
import { audit } from '../audit/audit';
import type { SessionUser } from '../auth/types';
import type { Tx } from '../db/client';
import { memberships, notifications, projects, studies, users } from '../db/schema';
import { notFound } from '../http/problem';

/**
 * A person's inbox: mentions, review requests, replies and verdicts, newest first, with unread state.
 * Entries of a project the person has left are not shown (it answers 404 for them now).
 */
function visible(user: SessionUser) {
  return and(
    eq(notifications.userId, user.id),
    user.siteAdmin
      ? undefined
      : or(
          isNull(notifications.projectId),
          exists(
            sql`(select 1 from ${memberships} where ${memberships.projectId} = ${notifications.projectId} and ${memberships.userId} = ${user.id})`,
          ),
        ),
  );
}

const str = (value: unknown): string => (typeof value === 'string' ? value : '');

export async function unreadCount(tx: Tx, user: SessionUser): Promise<number> {
  const [row] = await tx.select({ n: count() }).from(notifications).where(and(visible(user), isNull(notifications.readAt)));
  return row?.n ?? 0;
}

export async function listInbox(tx: Tx, user: SessionUser, q: { unread?: 'true' | 'false' | undefined; limit: number; before?: string | undefined }): Promise<Inbox> {
  const rows = await tx
    .select({ n: notifications, projectName: projects.name, studyTitle: studies.title })
    .from(notifications)
    .leftJoin(projects, eq(projects.id, notifications.projectId))
    .leftJoin(studies, eq(studies.id, notifications.studyId))
    .where(
      and(visible(user), q.unread === 'true' ? isNull(notifications.readAt) : undefined, q.before ? lt(notifications.createdAt, new Date(q.before)) : undefined),
    )
    .orderBy(desc(notifications.createdAt), desc(notifications.id))
    .limit(q.limit);
  const items = rows.map(({ n, projectName, studyTitle }): Notification => {
    const p = n.payload;
    return {
      id: n.id,
      kind: (NOTIFICATION_KINDS as readonly string[]).includes(n.kind) ? (n.kind as NotificationKind) : 'mention',
      actor: typeof p['actorId'] === 'string' ? { id: p['actorId'], name: str(p['actorName']) } : null,
      project: n.projectId ? { id: n.projectId, name: projectName ?? '' } : null,
      study: n.studyId ? { id: n.studyId, title: studyTitle ?? '' } : null,
      title: str(p['title']),
      excerpt: str(p['excerpt']),
      link: str(p['link']) || '/projects',
      createdAt: n.createdAt.toISOString(),
      read: n.readAt !== null,
    };
  });
  return { items, unreadCount: await unreadCount(tx, user) };
}

export async function markRead(tx: Tx, user: SessionUser, notificationId: string): Promise<void> {
  const updated = await tx
    .update(notifications)
    .set({ readAt: sql`coalesce(${notifications.readAt}, now())` })
    .where(and(eq(notifications.id, notificationId), visible(user)))
    .returning({ id: notifications.id });
  if (updated.length === 0) throw notFound('inbox entry');
}

/** Marks read what the person's inbox holds about one thread or one version (they are looking at it). */
export async function markReadAbout(tx: Tx, user: SessionUser, about: { threadId?: string | undefined; versionId?: string | undefined }): Promise<void> {
  const key = about.threadId ? 'threadId' : 'versionId';
  const value = about.threadId ?? about.versionId;
  if (!value) return;
  await tx
    .update(notifications)
    .set({ readAt: sql`now()` })
    .where(and(visible(user), isNull(notifications.readAt), sql`${notifications.payload}->>${key} = ${value}`));
}

export async function markAllRead(tx: Tx, user: SessionUser): Promise<void> {
  await tx.update(notifications).set({ readAt: sql`now()` }).where(and(visible(user), isNull(notifications.readAt)));
}

export async function getPrefs(tx: Tx, user: SessionUser): Promise<NotificationPrefs> {
  const [row] = await tx.select({ prefs: users.notificationPrefs }).from(users).where(eq(users.id, user.id));
  const stored = row?.prefs ?? {};
  // A kind the person never set is on.
  return Object.fromEntries(NOTIFICATION_KINDS.map((k) => [k, stored[k] !== false])) as NotificationPrefs;
}

export async function updatePrefs(tx: Tx, user: SessionUser, change: UpdateNotificationPrefs): Promise<NotificationPrefs> {
  const next = { ...(await getPrefs(tx, user)), ...change };
  await tx.update(users).set({ notificationPrefs: next }).where(eq(users.id, user.id));
  await audit(tx, { actorId: user.id, action: 'user.notificationPrefs', targetType: 'user', targetId: user.id, detail: change });
  return next;
}
