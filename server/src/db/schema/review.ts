import { bigserial, index, integer, jsonb, pgEnum, pgTable, primaryKey, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { users } from './identity';
import { projects } from './projects';
import { branches, cells, studies, versions } from './studies';

/**
 * Review: threads of comments anchored to a cell and the version they were made on, review requests,
 * verdicts, the per-user inbox and the mail outbox.
 */
export const commentThreads = pgTable(
  'comment_threads',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    studyId: uuid('study_id')
      .notNull()
      .references(() => studies.id, { onDelete: 'cascade' }),
    cellId: uuid('cell_id')
      .notNull()
      .references(() => cells.id, { onDelete: 'cascade' }),
    branchId: uuid('branch_id').references(() => branches.id, { onDelete: 'set null' }),
    /** The version the thread was started on; null when started on a draft. */
    versionId: uuid('version_id').references(() => versions.id),
    /** Content hash of the cell when the thread started, to tell whether it changed since. */
    cellContentHash: text('cell_content_hash'),
    /** Optional place on the cell's plot, e.g. { surface: 'upper', x: 0.42 }. */
    anchor: jsonb('anchor').$type<{ surface: string; x: number } | null>(),
    resolvedAt: timestamp('resolved_at', { withTimezone: true }),
    resolvedBy: uuid('resolved_by').references(() => users.id),
    createdBy: uuid('created_by').references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('comment_threads_study_cell_idx').on(t.studyId, t.cellId)],
);

export const comments = pgTable(
  'comments',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    threadId: uuid('thread_id')
      .notNull()
      .references(() => commentThreads.id, { onDelete: 'cascade' }),
    authorId: uuid('author_id').references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('comments_thread_idx').on(t.threadId)],
);

/** Immutable: every text a comment has had; the newest is shown, the earlier ones stay viewable. */
export const commentRevisions = pgTable(
  'comment_revisions',
  {
    commentId: uuid('comment_id')
      .notNull()
      .references(() => comments.id, { onDelete: 'cascade' }),
    revision: integer('revision').notNull(),
    body: text('body').notNull(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.commentId, t.revision] })],
);

export const reviewRequests = pgTable(
  'review_requests',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    versionId: uuid('version_id')
      .notNull()
      .references(() => versions.id, { onDelete: 'cascade' }),
    requestedBy: uuid('requested_by').references(() => users.id),
    reviewerId: uuid('reviewer_id')
      .notNull()
      .references(() => users.id),
    message: text('message').notNull().default(''),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('review_requests_version_idx').on(t.versionId)],
);

export const verdictKind = pgEnum('verdict_kind', ['approved', 'changes_requested']);

/** Immutable: a reviewer's verdict on a version; the newest per reviewer counts. */
export const verdicts = pgTable(
  'verdicts',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    versionId: uuid('version_id')
      .notNull()
      .references(() => versions.id, { onDelete: 'cascade' }),
    reviewerId: uuid('reviewer_id')
      .notNull()
      .references(() => users.id),
    verdict: verdictKind('verdict').notNull(),
    summary: text('summary').notNull().default(''),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('verdicts_version_idx').on(t.versionId)],
);

/** A person's inbox: mentions, review requests, replies to their threads. */
export const notifications = pgTable(
  'notifications',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    kind: text('kind').$type<'mention' | 'reviewRequest' | 'reply' | 'verdict'>().notNull(),
    projectId: uuid('project_id').references(() => projects.id, { onDelete: 'cascade' }),
    studyId: uuid('study_id').references(() => studies.id, { onDelete: 'cascade' }),
    payload: jsonb('payload').$type<Record<string, unknown>>().notNull(),
    readAt: timestamp('read_at', { withTimezone: true }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('notifications_user_idx').on(t.userId, t.createdAt)],
);

/**
 * Mail waiting to be sent. A mail server that is down delays mail but never loses it: the sender
 * retries with back-off until `sentAt` is set.
 */
export const mailOutbox = pgTable(
  'mail_outbox',
  {
    id: bigserial('id', { mode: 'number' }).primaryKey(),
    toEmail: text('to_email').notNull(),
    subject: text('subject').notNull(),
    text: text('text').notNull(),
    html: text('html'),
    attempts: integer('attempts').notNull().default(0),
    nextAttemptAt: timestamp('next_attempt_at', { withTimezone: true }).notNull().defaultNow(),
    sentAt: timestamp('sent_at', { withTimezone: true }),
    lastError: text('last_error'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('mail_outbox_pending_idx').on(t.sentAt, t.nextAttemptAt)],
);
