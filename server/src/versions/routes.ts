import { Router } from 'express';
import { eq } from 'drizzle-orm';
import { z } from 'zod';
import {
  compareQuerySchema,
  createBranchSchema,
  markBaselineSchema,
  restoreDraftSchema,
  saveVersionSchema,
  updateBranchSchema,
} from '@laminote/contracts';
import type { Db } from '../db/client';
import { versions } from '../db/schema';
import type { SessionUser } from '../auth/types';
import { requireAction, studyAccess } from '../access/access';
import { branchAccess, requireWritable } from '../notebook/branch';
import { studyDocumentFilename, versionDocument } from '../notebook/study-document';
import { badRequest, notFound, parse } from '../http/problem';
import { compareVersions, studiesOf } from './compare';
import * as service from './service';

/** A branch's place for the services: its study and project. */
async function branchPlace(db: Db, user: SessionUser, branchId: string) {
  const ctx = await branchAccess(db, user, branchId);
  return { ...ctx, place: { studyId: ctx.study.id, projectId: ctx.projectId } };
}

async function versionAccess(db: Db, user: SessionUser, versionId: string) {
  if (!z.uuid().safeParse(versionId).success) throw notFound('version');
  const [version] = await db.select({ id: versions.id, studyId: versions.studyId }).from(versions).where(eq(versions.id, versionId));
  if (!version) throw notFound('version');
  const context = await studyAccess(db, user, version.studyId).catch(() => {
    throw notFound('version');
  });
  return { version, ...context, place: { studyId: context.study.id, projectId: context.projectId } };
}

/** Versions, history, branches, the baseline and comparison (issue 5). */
export function versionsRouter({ db }: { db: Db }): Router {
  const router = Router();

  router.post('/branches/:branchId/versions', async (req, res) => {
    const ctx = await branchPlace(db, req.user!, req.params.branchId);
    const { branch, access, place } = ctx;
    requireAction(access, 'saveVersion');
    requireWritable(ctx);
    const input = parse(saveVersionSchema, req.body);
    const versionId = await db.transaction((tx) => service.saveVersion(tx, req.user!, place, branch.id, input));
    res.status(201).json(await service.versionSummary(db, versionId));
  });

  router.get('/branches/:branchId/versions', async (req, res) => {
    const { branch } = await branchPlace(db, req.user!, req.params.branchId);
    res.json(await service.branchVersions(db, branch.id));
  });

  router.post('/branches/:branchId/draft/restore', async (req, res) => {
    const ctx = await branchPlace(db, req.user!, req.params.branchId);
    const { branch, access, place } = ctx;
    requireAction(access, 'editStudy');
    requireWritable(ctx);
    const input = parse(restoreDraftSchema, req.body);
    res.json(await db.transaction((tx) => service.restoreIntoDraft(tx, req.user!, place, branch.id, input.versionId, input.baseRevision)));
  });

  router.patch('/branches/:branchId', async (req, res) => {
    const { branch, access, place } = await branchPlace(db, req.user!, req.params.branchId);
    requireAction(access, 'branch');
    const input = parse(updateBranchSchema, req.body);
    await db.transaction((tx) => service.updateBranch(tx, req.user!, place, branch.id, input));
    res.json((await service.branchOverviews(db, place.studyId)).find((b) => b.id === branch.id));
  });

  router.get('/versions/:versionId', async (req, res) => {
    const { version } = await versionAccess(db, req.user!, req.params.versionId);
    res.json(await service.versionDetail(db, version.id));
  });

  /** The version as one study document (cells, inputs, the outputs it kept), as a download. */
  router.get('/versions/:versionId/export', async (req, res) => {
    const { version, study } = await versionAccess(db, req.user!, req.params.versionId);
    const document = versionDocument(study, await service.versionDetail(db, version.id));
    res.attachment(studyDocumentFilename(document)).type('application/json').send(JSON.stringify(document, null, 1));
  });

  router.post('/versions/:versionId/branches', async (req, res) => {
    const { version, access, place } = await versionAccess(db, req.user!, req.params.versionId);
    requireAction(access, 'branch');
    const input = parse(createBranchSchema, req.body);
    const branchId = await db.transaction((tx) => service.createBranch(tx, req.user!, place, version.id, input));
    res.status(201).json((await service.branchOverviews(db, place.studyId)).find((b) => b.id === branchId));
  });

  router.get('/studies/:studyId/versions', async (req, res) => {
    const { study, access } = await studyAccess(db, req.user!, req.params.studyId);
    res.json(await service.studyHistory(db, study.id, access));
  });

  router.post('/studies/:studyId/baseline', async (req, res) => {
    const { study, access, projectId } = await studyAccess(db, req.user!, req.params.studyId);
    requireAction(access, 'markBaseline');
    const { versionId } = parse(markBaselineSchema, req.body);
    await db.transaction((tx) => service.markBaseline(tx, req.user!, { studyId: study.id, projectId }, versionId));
    res.json(await service.studyHistory(db, study.id, access));
  });

  router.get('/compare', async (req, res) => {
    const { a, b } = parse(compareQuerySchema, req.query);
    const studyOf = await studiesOf(db, [a, b]);
    for (const [field, id] of [['a', a], ['b', b]] as const) {
      const studyId = studyOf.get(id);
      if (!studyId) throw notFound('version');
      await studyAccess(db, req.user!, studyId).catch(() => {
        throw notFound(`version (${field})`);
      });
    }
    if (studyOf.get(a) !== studyOf.get(b)) throw badRequest('a and b must be versions of the same study', 'b');
    res.json(await compareVersions(db, a, b));
  });

  return router;
}
