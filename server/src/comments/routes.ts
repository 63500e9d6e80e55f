import { Router } from 'express';
import { commentTextSchema } from '@laminote/contracts';
import { requireAction } from '../access/access';
import type { Config } from '../config';
import type { Db } from '../db/client';
import { parse } from '../http/problem';
import { owningStudy, viewOf } from '../review/context';
import * as threads from '../review/threads';

/** /api/comments: editing a comment (its earlier wordings are kept) and reading those revisions. */
export function commentsRouter({ db, config }: { db: Db; config: Pick<Config, 'PUBLIC_URL'> }): Router {
  const router = Router();
  const deps = { publicUrl: config.PUBLIC_URL };

  router.patch('/:commentId', async (req, res) => {
    const s = await owningStudy(db, req, 'comment', req.params.commentId);
    requireAction(s.access, 'comment');
    const { body } = parse(commentTextSchema, req.body);
    const { view } = await viewOf(db, req, s.ref.id);
    await db.transaction((tx) => threads.editComment(tx, deps, s.caller, s.ref, req.params.commentId, body));
    const threadId = (await threads.commentStudy(db, req.params.commentId))!.threadId;
    res.json(await threads.getThread(db, s.caller, s.ref.id, threadId, view));
  });

  router.get('/:commentId/revisions', async (req, res) => {
    await owningStudy(db, req, 'comment', req.params.commentId);
    res.json(await threads.listRevisions(db, req.params.commentId));
  });

  return router;
}
