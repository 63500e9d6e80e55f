import { Router } from 'express';
import { commentTextSchema } from '@laminote/contracts';
import { requireAction } from '../access/access';
import type { Config } from '../config';
import type { Db } from '../db/client';
import { parse } from '../http/problem';
import { owningStudy, viewOf } from '../review/context';
import * as threads from '../review/threads';

/** /api/threads: a comment thread on a cell, its replies, resolving and reopening. */
export function threadsRouter({ db, config }: { db: Db; config: Pick<Config, 'PUBLIC_URL'> }): Router {
  const router = Router();
  const deps = { publicUrl: config.PUBLIC_URL };

  router.get('/:threadId', async (req, res) => {
    const s = await owningStudy(db, req, 'thread', req.params.threadId);
    const { view } = await viewOf(db, req, s.ref.id);
    res.json(await threads.getThread(db, s.caller, s.ref.id, req.params.threadId, view));
  });

  router.post('/:threadId/comments', async (req, res) => {
    const s = await owningStudy(db, req, 'thread', req.params.threadId);
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
    router.post(`/:threadId/${path}`, async (req, res) => {
      const s = await owningStudy(db, req, 'thread', req.params.threadId);
      requireAction(s.access, 'comment');
      const { view } = await viewOf(db, req, s.ref.id);
      await db.transaction((tx) => threads.setResolved(tx, s.caller, s.ref, req.params.threadId, resolved));
      res.json(await threads.getThread(db, s.caller, s.ref.id, req.params.threadId, view));
    });
  }

  return router;
}
