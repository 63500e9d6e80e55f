import { Router, type Request } from 'express';
import {
  commentTextSchema,
  createThreadSchema,
  giveVerdictSchema,
  inboxQuerySchema,
  readAboutSchema,
  requestReviewSchema,
  threadQuerySchema,
  updateNotificationPrefsSchema,
  isUuid,
} from '@laminote/contracts';
import { requireAction, studyAccess } from '../access/access';
import type { Config } from '../config';
import type { Db, Tx } from '../db/client';
import { notFound, parse } from '../http/problem';
import * as inbox from './inbox';
import * as threads from './threads';
import * as review from './verdicts';
import { resolveView } from './views';

/**
 * Review routes: threads and comments on cells, review requests and verdicts on versions, the inbox
 * and notification preferences. Every route checks the caller's role in the study's project; a thread,
 * comment or version of a project the caller is not in answers 404.
 */
export function reviewRouter({ db, config }: { db: Db; config: Pick<Config, 'PUBLIC_URL'> }): Router {
  const router = Router();
  const deps = { publicUrl: config.PUBLIC_URL };

  async function study(tx: Tx, req: Request, studyId: string) {
    const context = await studyAccess(tx, req.user!, studyId);
    const caller = { user: req.user!, access: context.access };
    const ref = { id: context.study.id, title: context.study.title, projectId: context.study.projectId };
    return { ...context, caller, ref };
  }

  /** The study of a thread, comment or version, as 404 when it does not exist or is not the caller's. */
  async function owning(tx: Tx, req: Request, what: 'thread' | 'comment' | 'version', id: string) {
    if (!isUuid(id)) throw notFound(what);
    const found = what === 'thread' ? await threads.threadStudy(tx, id) : what === 'comment' ? await threads.commentStudy(tx, id) : await review.versionStudy(tx, id);
    if (!found) throw notFound(what);
    return study(tx, req, found.studyId).catch(() => {
      throw notFound(what);
    });
  }

  /** The view the caller is looking at (?versionId= or ?branchId=), for "changed since" in answers. */
  async function viewOf(tx: Tx, req: Request, studyId: string) {
    const q = parse(threadQuerySchema, req.query);
    return { q, view: await resolveView(tx, studyId, q) };
  }

  // ------------------------------------------------------------------------------------------ threads

  router.get('/studies/:studyId/threads', async (req, res) => {
    const s = await study(db, req, req.params.studyId);
    const { q, view } = await viewOf(db, req, s.ref.id);
    res.json(await threads.listThreads(db, s.caller, s.ref.id, view, q.cellId ? { cellId: q.cellId } : {}));
  });

  router.post('/studies/:studyId/threads', async (req, res) => {
    const s = await study(db, req, req.params.studyId);
    requireAction(s.access, 'comment');
    const input = parse(createThreadSchema, req.body);
    const threadId = await db.transaction((tx) => threads.createThread(tx, deps, s.caller, s.ref, input));
    const view = await resolveView(db, s.ref.id, { versionId: input.versionId, branchId: input.branchId });
    res.status(201).json(await threads.getThread(db, s.caller, s.ref.id, threadId, view));
  });

  router.get('/threads/:threadId', async (req, res) => {
    const s = await owning(db, req, 'thread', req.params.threadId);
    const { view } = await viewOf(db, req, s.ref.id);
    res.json(await threads.getThread(db, s.caller, s.ref.id, req.params.threadId, view));
  });

  router.post('/threads/:threadId/comments', async (req, res) => {
    const s = await owning(db, req, 'thread', req.params.threadId);
    requireAction(s.access, 'comment');
    const { body } = parse(commentTextSchema, req.body);
    const { view } = await viewOf(db, req, s.ref.id);
    await db.transaction((tx) => threads.reply(tx, deps, s.caller, s.ref, req.params.threadId, body));
    res.status(201).json(await threads.getThread(db, s.caller, s.ref.id, req.params.threadId, view));
  });

  for (const [path, resolved] of [
    ['resolve', true],
    ['reopen', false],
  ] as const) {
    router.post(`/threads/:threadId/${path}`, async (req, res) => {
      const s = await owning(db, req, 'thread', req.params.threadId);
      requireAction(s.access, 'comment');
      const { view } = await viewOf(db, req, s.ref.id);
      await db.transaction((tx) => threads.setResolved(tx, s.caller, s.ref, req.params.threadId, resolved));
      res.json(await threads.getThread(db, s.caller, s.ref.id, req.params.threadId, view));
    });
  }

  router.patch('/comments/:commentId', async (req, res) => {
    const s = await owning(db, req, 'comment', req.params.commentId);
    requireAction(s.access, 'comment');
    const { body } = parse(commentTextSchema, req.body);
    const { view } = await viewOf(db, req, s.ref.id);
    await db.transaction((tx) => threads.editComment(tx, deps, s.caller, s.ref, req.params.commentId, body));
    const threadId = (await threads.commentStudy(db, req.params.commentId))!.threadId;
    res.json(await threads.getThread(db, s.caller, s.ref.id, threadId, view));
  });

  router.get('/comments/:commentId/revisions', async (req, res) => {
    await owning(db, req, 'comment', req.params.commentId);
    res.json(await threads.listRevisions(db, req.params.commentId));
  });

  // ------------------------------------------------------------------------- requests and verdicts

  router.get('/studies/:studyId/review', async (req, res) => {
    const s = await study(db, req, req.params.studyId);
    res.json(await review.studyReview(db, s.ref.id));
  });

  router.get('/versions/:versionId/review', async (req, res) => {
    const s = await owning(db, req, 'version', req.params.versionId);
    res.json(await review.versionReview(db, s.access, s.ref.id, req.params.versionId));
  });

  router.post('/versions/:versionId/review-requests', async (req, res) => {
    const s = await owning(db, req, 'version', req.params.versionId);
    requireAction(s.access, 'requestReview');
    const input = parse(requestReviewSchema, req.body);
    await db.transaction((tx) => review.requestReview(tx, deps.publicUrl, req.user!, s.ref, req.params.versionId, input));
    res.status(201).json(await review.versionReview(db, s.access, s.ref.id, req.params.versionId));
  });

  router.post('/versions/:versionId/verdicts', async (req, res) => {
    const s = await owning(db, req, 'version', req.params.versionId);
    requireAction(s.access, 'giveVerdict');
    const input = parse(giveVerdictSchema, req.body);
    await db.transaction((tx) => review.giveVerdict(tx, deps.publicUrl, req.user!, s.ref, req.params.versionId, input));
    res.status(201).json(await review.versionReview(db, s.access, s.ref.id, req.params.versionId));
  });

  // ---------------------------------------------------------------------------- inbox and settings

  router.get('/inbox', async (req, res) => {
    res.json(await inbox.listInbox(db, req.user!, parse(inboxQuerySchema, req.query)));
  });

  router.get('/inbox/unread-count', async (req, res) => {
    res.json({ unreadCount: await inbox.unreadCount(db, req.user!) });
  });

  router.post('/inbox/read-all', async (req, res) => {
    await inbox.markAllRead(db, req.user!);
    res.json({ unreadCount: await inbox.unreadCount(db, req.user!) });
  });

  router.post('/inbox/read-about', async (req, res) => {
    const about = parse(readAboutSchema, req.body);
    await inbox.markReadAbout(db, req.user!, about);
    res.json({ unreadCount: await inbox.unreadCount(db, req.user!) });
  });

  router.post('/inbox/:notificationId/read', async (req, res) => {
    if (!isUuid(req.params.notificationId)) throw notFound('inbox entry');
    await inbox.markRead(db, req.user!, req.params.notificationId);
    res.json({ unreadCount: await inbox.unreadCount(db, req.user!) });
  });

  router.get('/me/notification-prefs', async (req, res) => {
    res.json(await inbox.getPrefs(db, req.user!));
  });

  router.put('/me/notification-prefs', async (req, res) => {
    const change = parse(updateNotificationPrefsSchema, req.body);
    res.json(await db.transaction((tx) => inbox.updatePrefs(tx, req.user!, change)));
  });

  return router;
}
