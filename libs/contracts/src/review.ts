import { z } from 'zod';
import { COMMENT_MAX_LENGTH } from './limits';
import { safeText } from './text';

/**
 * Review: comment threads on cells, mentions, review requests and verdicts on versions, the inbox and
 * notification preferences. Comment bodies are stored as the author typed them (Markdown); the web app
 * renders them sanitised.
 */

const id = z.string().uuid();
const isoDate = z.string();
const person = z.object({ id, name: z.string() });
export type PersonRef = z.infer<typeof person>;

/** A place on a cell's plot: a surface of the analysis and a chordwise position x/c on it. */
export const plotAnchorSchema = z.object({
  surface: z.string({ error: 'anchor.surface must name a surface' }).trim().min(1, 'anchor.surface must name a surface').max(60, 'anchor.surface must be at most 60 characters'),
  x: z
    .number({ error: 'anchor.x must be a number' })
    .finite('anchor.x must be finite')
    .min(0, 'anchor.x is x/c, from 0 to 1')
    .max(1, 'anchor.x is x/c, from 0 to 1'),
});
export type PlotAnchor = z.infer<typeof plotAnchorSchema>;

export { COMMENT_MAX_LENGTH } from './limits';
export const commentBodySchema = safeText('body')
  .trim()
  .min(1, 'body must not be empty')
  .max(COMMENT_MAX_LENGTH, `body must be at most ${COMMENT_MAX_LENGTH} characters`);

/**
 * POST /api/studies/:studyId/threads (leads, engineers, reviewers). The thread is anchored to the cell
 * and to what the author was looking at: a version (`versionId`) or a branch's draft (`versionId: null`
 * with `branchId`).
 */
export const createThreadSchema = z
  .object({
    cellId: id.describe('cellId'),
    versionId: id.nullable(),
    branchId: id.optional(),
    body: commentBodySchema,
    anchor: plotAnchorSchema.nullable().default(null),
  })
  .refine((v) => v.versionId !== null || v.branchId !== undefined, {
    path: ['branchId'],
    message: 'branchId is required for a thread on a draft (versionId null)',
  });
export type CreateThread = z.input<typeof createThreadSchema>;

/** POST /api/threads/:threadId/comments (a reply) and PATCH /api/comments/:commentId (an edit, by its author). */
export const commentTextSchema = z.object({ body: commentBodySchema });
export type CommentText = z.input<typeof commentTextSchema>;

export const commentSchema = z.object({
  id,
  threadId: id,
  author: person.nullable(),
  /** The newest text. */
  body: z.string(),
  createdAt: isoDate,
  /** When the newest text was written, if the comment was edited. */
  editedAt: isoDate.nullable(),
  /** 1 for a comment never edited; the earlier texts are at GET /api/comments/:commentId/revisions. */
  revisionCount: z.number().int(),
  /** Whether the caller may edit it (only its author may). */
  canEdit: z.boolean(),
});
export type Comment = z.infer<typeof commentSchema>;

export const commentRevisionSchema = z.object({ revision: z.number().int(), body: z.string(), createdAt: isoDate });
export type CommentRevision = z.infer<typeof commentRevisionSchema>;

/** Where a thread was started. */
export const threadOriginSchema = z.object({
  /** Null when started on a draft. */
  versionId: id.nullable(),
  versionNumber: z.number().int().nullable(),
  branchId: id.nullable(),
  branchName: z.string().nullable(),
});
export type ThreadOrigin = z.infer<typeof threadOriginSchema>;

export const threadSchema = z.object({
  id,
  studyId: id,
  cellId: id,
  origin: threadOriginSchema,
  anchor: plotAnchorSchema.nullable(),
  resolved: z.boolean(),
  resolvedAt: isoDate.nullable(),
  resolvedBy: person.nullable(),
  createdBy: person.nullable(),
  createdAt: isoDate,
  comments: z.array(commentSchema),
  /**
   * Relative to the view asked for (a version or a draft): whether the thread was started on that very
   * version or draft, and whether the cell's content differs now from when the thread was started.
   * `cellChanged` is null when it cannot be told (no view given, or the cell is not in the view).
   */
  onThisView: z.boolean(),
  cellChanged: z.boolean().nullable(),
  /**
   * Whether the caller may resolve or reopen it: leads, the thread's author, and the author of the work
   * it is about (who saved the version it was started on, or created the cell); never a viewer.
   */
  canResolve: z.boolean(),
});
export type Thread = z.infer<typeof threadSchema>;

/** GET /api/studies/:studyId/threads?versionId=… or ?branchId=… (the draft) */
export const threadQuerySchema = z.object({
  versionId: id.optional(),
  branchId: id.optional(),
  cellId: id.optional(),
});
export type ThreadQuery = z.infer<typeof threadQuerySchema>;

// ---------------------------------------------------------------- review requests and verdicts

export const VERDICTS = ['approved', 'changes_requested'] as const;
export const verdictKindSchema = z.enum(VERDICTS);
export type VerdictKind = z.infer<typeof verdictKindSchema>;
export const VERDICT_LABELS: Record<VerdictKind, string> = { approved: 'Approved', changes_requested: 'Changes requested' };

/** POST /api/versions/:versionId/review-requests (leads, engineers) */
export const requestReviewSchema = z.object({
  reviewerIds: z.array(id, { error: 'reviewerIds must list reviewers' }).min(1, 'reviewerIds: name at least one reviewer').max(20, 'reviewerIds: at most 20 reviewers'),
  message: safeText('message').trim().max(4000, 'message must be at most 4000 characters').default(''),
});
export type RequestReview = z.input<typeof requestReviewSchema>;

/** POST /api/versions/:versionId/verdicts (reviewers) */
export const giveVerdictSchema = z.object({
  verdict: verdictKindSchema,
  summary: safeText('summary')
    .trim()
    .min(1, 'summary must not be empty: say what was checked and what was found')
    .max(8000, 'summary must be at most 8000 characters'),
});
export type GiveVerdict = z.input<typeof giveVerdictSchema>;

export const reviewRequestSchema = z.object({
  id,
  versionId: id,
  reviewer: person,
  requestedBy: person.nullable(),
  message: z.string(),
  createdAt: isoDate,
  /** Whether this reviewer has given a verdict on the version since the request. */
  answered: z.boolean(),
});
export type ReviewRequest = z.infer<typeof reviewRequestSchema>;

export const verdictSchema = z.object({
  id,
  versionId: id,
  reviewer: person,
  verdict: verdictKindSchema,
  summary: z.string(),
  createdAt: isoDate,
  /** The newest verdict of this reviewer on this version counts; earlier ones are kept. */
  current: z.boolean(),
});
export type Verdict = z.infer<typeof verdictSchema>;

/**
 * The review state of one version, from the current verdicts (newest per reviewer): any "changes
 * requested" wins over approvals; with no verdict, `requested` if someone was asked, else `none`.
 */
export const REVIEW_STATES = ['none', 'requested', 'approved', 'changes_requested'] as const;
export const reviewStateSchema = z.enum(REVIEW_STATES);
export type ReviewState = z.infer<typeof reviewStateSchema>;
export const REVIEW_STATE_LABELS: Record<ReviewState, string> = {
  none: 'Not reviewed',
  requested: 'Review requested',
  approved: 'Approved',
  changes_requested: 'Changes requested',
};

export const reviewSummarySchema = z.object({
  versionId: id,
  versionNumber: z.number().int(),
  branchId: id,
  state: reviewStateSchema,
  approvals: z.number().int(),
  changesRequested: z.number().int(),
  /** Reviewers asked and not yet answered. */
  pendingReviewers: z.array(person),
  /**
   * For a version with no verdict of its own: the nearest earlier version (following parents) that has
   * one, so a newer version shows that the verdict applies to an older version.
   */
  earlierVerdict: z
    .object({ versionId: id, versionNumber: z.number().int(), branchName: z.string(), state: reviewStateSchema })
    .nullable(),
});
export type ReviewSummary = z.infer<typeof reviewSummarySchema>;

/** GET /api/versions/:versionId/review */
export const versionReviewDetailSchema = z.object({
  summary: reviewSummarySchema,
  requests: z.array(reviewRequestSchema),
  verdicts: z.array(verdictSchema),
  /** Whether the caller may ask for a review / give a verdict here. */
  canRequest: z.boolean(),
  canGiveVerdict: z.boolean(),
});
export type VersionReviewDetail = z.infer<typeof versionReviewDetailSchema>;

/** GET /api/studies/:studyId/review: every version's summary, and per branch the state of its head. */
export const studyReviewSchema = z.object({
  versions: z.array(reviewSummarySchema),
  branches: z.array(
    z.object({
      branchId: id,
      branchName: z.string(),
      headVersionId: id.nullable(),
      /** The head version's summary; null for a branch with no version yet. */
      head: reviewSummarySchema.nullable(),
    }),
  ),
});
export type StudyReview = z.infer<typeof studyReviewSchema>;

// ---------------------------------------------------------------- inbox and preferences

export const NOTIFICATION_KINDS = ['mention', 'reviewRequest', 'reply', 'verdict'] as const;
export const notificationKindSchema = z.enum(NOTIFICATION_KINDS);
export type NotificationKind = z.infer<typeof notificationKindSchema>;
export const NOTIFICATION_KIND_LABELS: Record<NotificationKind, string> = {
  mention: 'Someone mentions me',
  reviewRequest: 'Someone asks me to review a version',
  reply: 'Someone replies in a thread I started or took part in',
  verdict: 'A reviewer gives a verdict on a version I saved or sent for review',
};

export const notificationSchema = z.object({
  id,
  kind: notificationKindSchema,
  actor: person.nullable(),
  project: z.object({ id, name: z.string() }).nullable(),
  study: z.object({ id, title: z.string() }).nullable(),
  /** One line: what happened. */
  title: z.string(),
  /** The start of the comment, message or summary. */
  excerpt: z.string(),
  /** Where in the app it happened (a path, e.g. /studies/…?cell=…). */
  link: z.string(),
  createdAt: isoDate,
  read: z.boolean(),
});
export type Notification = z.infer<typeof notificationSchema>;

/** GET /api/inbox?unread=true&limit=50&before=<ISO date> */
export const inboxQuerySchema = z.object({
  unread: z.enum(['true', 'false']).optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
  before: z.string().datetime({ message: 'before must be an ISO date-time' }).optional(),
});
/** POST /api/inbox/read-about: marks read the entries about a thread or a version the person opened. */
export const readAboutSchema = z
  .object({ threadId: id.optional(), versionId: id.optional() })
  .refine((v) => (v.threadId === undefined) !== (v.versionId === undefined), { message: 'give threadId or versionId' });
export type ReadAbout = z.infer<typeof readAboutSchema>;

export const inboxSchema = z.object({ items: z.array(notificationSchema), unreadCount: z.number().int() });
export type Inbox = z.infer<typeof inboxSchema>;

/** What marking notifications read answers: how many are still unread. */
export const unreadCountSchema = z.object({ unreadCount: z.number().int() });
export type UnreadCount = z.infer<typeof unreadCountSchema>;

/** GET/PUT /api/me/notification-prefs: which notifications reach the person by e-mail (the inbox gets all). */
export const notificationPrefsSchema = z.object({
  mention: z.boolean(),
  reviewRequest: z.boolean(),
  reply: z.boolean(),
  verdict: z.boolean(),
});
export type NotificationPrefs = z.infer<typeof notificationPrefsSchema>;
export const updateNotificationPrefsSchema = notificationPrefsSchema.partial().strict();
export type UpdateNotificationPrefs = z.infer<typeof updateNotificationPrefsSchema>;

// ---------------------------------------------------------------- development mail sink

/** A message the development SMTP sink received (GET /api/dev/mail, site admins, outside production). */
export const sinkMessageSchema = z.object({
  id: z.string(),
  receivedAt: isoDate,
  envelopeFrom: z.string(),
  envelopeTo: z.array(z.string()),
  from: z.string(),
  to: z.string(),
  subject: z.string(),
  messageId: z.string(),
  text: z.string(),
  html: z.string().nullable(),
});
export type SinkMessage = z.infer<typeof sinkMessageSchema>;

/** Finds `@Name` or `@e-mail` mentions of the given people in a comment body (case-insensitive). */
export function findMentions<P extends { userId: string; name: string; email: string }>(body: string, people: readonly P[]): P[] {
  const lower = body.toLowerCase();
  const found = new Map<string, P>();
  // Longer names first, so "@Dev Arjunan" is not taken for a person called "Dev".
  const candidates = people.flatMap((p) => [p.name, p.email].filter((s) => s.trim()).map((s) => ({ person: p, token: `@${s.toLowerCase()}` })));
  candidates.sort((a, b) => b.token.length - a.token.length);
  const taken: [number, number][] = [];
  for (const { person: p, token } of candidates) {
    let at = lower.indexOf(token);
    while (at >= 0) {
      const end = at + token.length;
      const before = at === 0 ? '' : lower[at - 1]!;
      const after = lower[end] ?? '';
      const boundary = !/[\p{L}\p{N}_.-]/u.test(before) && !/[\p{L}\p{N}_@]/u.test(after);
      const overlaps = taken.some(([s, e]) => at < e && end > s);
      if (boundary && !overlaps) {
        taken.push([at, end]);
        found.set(p.userId, p);
      }
      at = lower.indexOf(token, at + 1);
    }
  }
  return [...found.values()];
}
