import { Router } from 'express';
import { createTokenSchema, isUuid, updateNotificationPrefsSchema } from '@laminote/contracts';
import type { Db } from '../db/client';
import { notFound, parse } from '../http/problem';
import { me } from '../projects/service';
import * as inbox from '../review/inbox';
import * as tokens from '../tokens/service';

/** /api/me: the signed-in person, their notification settings and their personal API tokens. */
export function meRouter({ db }: { db: Db }): Router {
  const router = Router();

  router.get('/', async (req, res) => {
    res.json(await me(db, req.user!));
  });

  router.get('/notification-prefs', async (req, res) => {
    res.json(await inbox.getPrefs(db, req.user!));
  });

  router.put('/notification-prefs', async (req, res) => {
    const change = parse(updateNotificationPrefsSchema, req.body);
    res.json(await db.transaction((tx) => inbox.updatePrefs(tx, req.user!, change)));
  });

  // Signed in only: a token cannot reach these (the bearer check keeps tokens away from /api/me/tokens).
  router.get('/tokens', async (req, res) => {
    res.json(await tokens.listTokens(db, req.user!));
  });

  router.post('/tokens', async (req, res) => {
    const input = parse(createTokenSchema, req.body);
    const created = await db.transaction((tx) => tokens.createToken(tx, req.user!, input));
    res.setHeader('cache-control', 'no-store');
    res.status(201).json(created);
  });

  router.delete('/tokens/:tokenId', async (req, res) => {
    if (!isUuid(req.params.tokenId)) throw notFound('token');
    res.json(await db.transaction((tx) => tokens.revokeToken(tx, req.user!, req.params.tokenId)));
  });

  return router;
}
