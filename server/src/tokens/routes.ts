import { Router } from 'express';
import { createTokenSchema } from '@laminote/contracts';
import type { Db } from '../db/client';
import { notFound, parse } from '../http/problem';
import * as service from './service';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** The signed-in person's personal API tokens (signed in only: a token cannot reach these). */
export function tokensRouter({ db }: { db: Db }): Router {
  const router = Router();

  router.get('/me/tokens', async (req, res) => {
    res.json(await service.listTokens(db, req.user!));
  });

  router.post('/me/tokens', async (req, res) => {
    const input = parse(createTokenSchema, req.body);
    const created = await db.transaction((tx) => service.createToken(tx, req.user!, input));
    res.setHeader('cache-control', 'no-store');
    res.status(201).json(created);
  });

  router.delete('/me/tokens/:tokenId', async (req, res) => {
    if (!UUID.test(req.params.tokenId)) throw notFound('token');
    res.json(await db.transaction((tx) => service.revokeToken(tx, req.user!, req.params.tokenId)));
  });

  return router;
}
