import { Router } from 'express';
import { restoreDraftSchema, saveVersionSchema, updateBranchSchema } from '@laminote/contracts';
import { requireAction } from '../access/access';
import { branchPlace, requireWritable } from '../access/branch';
import type { Db } from '../db/client';
import { parse } from '../http/problem';
import * as versions from '../versions/service';

/**
 * /api/branches: a branch itself (rename, purpose, archive), its saved versions and restoring one into
 * its draft. The draft, runs and exports of a branch are in notebook/routes.ts, also under /api/branches.
 */
export function branchesRouter({ db }: { db: Db }): Router {
  const router = Router();

  router.patch('/:branchId', async (req, res) => {
    const { branch, access, place } = await branchPlace(db, req.user!, req.params.branchId);
    requireAction(access, 'branch');
    const input = parse(updateBranchSchema, req.body);
    await db.transaction((tx) => versions.updateBranch(tx, req.user!, place, branch.id, input));
    res.json((await versions.branchOverviews(db, place.studyId)).find((b) => b.id === branch.id));
  });

  router.get('/:branchId/versions', async (req, res) => {
    const { branch } = await branchPlace(db, req.user!, req.params.branchId);
    res.json(await versions.branchVersions(db, branch.id));
  });

  router.post('/:branchId/versions', async (req, res) => {
    const ctx = await branchPlace(db, req.user!, req.params.branchId);
    requireAction(ctx.access, 'saveVersion');
    requireWritable(ctx);
    const input = parse(saveVersionSchema, req.body);
    const versionId = await db.transaction((tx) => versions.saveVersion(tx, req.user!, ctx.place, ctx.branch.id, input));
    res.status(201).json(await versions.versionSummary(db, versionId));
  });

  router.post('/:branchId/draft/restore', async (req, res) => {
    const ctx = await branchPlace(db, req.user!, req.params.branchId);
    requireAction(ctx.access, 'editStudy');
    requireWritable(ctx);
    const input = parse(restoreDraftSchema, req.body);
    res.json(await db.transaction((tx) => versions.restoreIntoDraft(tx, req.user!, ctx.place, ctx.branch.id, input.versionId, input.baseRevision)));
  });

  return router;
}
