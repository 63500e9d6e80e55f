import { Router } from 'express';
import { inboxQuerySchema, isUuid, readAboutSchema } from '@laminote/contracts';
import type { Db } from '../db/client';
import { notFound, parse } from '../http/problem';
import * as inbox from '../review/inbox';

/** /api/inbox: the signed-in person's notifications and what they have read. */
export function inboxRouter({ db }: { db: Db }): Router {
  const router = Router();

  router.get('/', async (req, res) => {
    res.json(await inbox.listInbox(db, req.user!, parse(inboxQuerySchema, req.query)));
  });

  router.get('/unread-count', async (req, res) => {
    res.json({ unreadCount: await inbox.unreadCount(db, req.user!) });
  });

  router.post('/read-all', async (req, res) => {
    await inbox.markAllRead(db, req.user!);
    res.json({ unreadCount: await inbox.unreadCount(db, req.user!) });
  });

  router.post('/read-about', async (req, res) => {
    const about = parse(readAboutSchema, req.body);
    await inbox.markReadAbout(db, req.user!, about);
    res.json({ unreadCount: await inbox.unreadCount(db, req.user!) });
  });

  router.post('/:notificationId/read', async (req, res) => {
    if (!isUuid(req.params.notificationId)) throw notFound('inbox entry');
    await inbox.markRead(db, req.user!, req.params.notificationId);
    res.json({ unreadCount: await inbox.unreadCount(db, req.user!) });
  });

  return router;
}
