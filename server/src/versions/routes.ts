import { Router } from 'express';
import { createBranchSchema, giveVerdictSchema, requestReviewSchema } from '@laminote/contracts';
import type { Config } from '../config';
import type { Db } from '../db/client';
import { requireAction } from '../access/access';
import { versionAccess } from '../access/version';
import { parse } from '../http/problem';
import { studyDocumentFilename, versionDocument } from '../notebook/study-document';
import { sendVersionReport } from '../reports/respond';
import { owningStudy } from '../review/context';
import * as review from '../review/verdicts';
import * as service from './service';

/** /api/versions: a saved version, its export and reports, branching from it, review requests and verdicts. */
export function versionsRouter({ db, config }: { db: Db; config: Pick<Config, 'PUBLIC_URL'> }): Router {
  const router = Router();

  router.get('/:versionId', async (req, res) => {
    const { version } = await versionAccess(db, req.user!, req.params.versionId);
    res.json(await service.versionDetail(db, version.id));
  });

  /** The version as one study document (cells, inputs, the outputs it kept), as a download. */
  router.get('/:versionId/export', async (req, res) => {
    const { version, study } = await versionAccess(db, req.user!, req.params.versionId);
    const document = versionDocument(study, await service.versionDetail(db, version.id));
    res.attachment(studyDocumentFilename(document)).type('application/json').send(JSON.stringify(document, null, 1));
  });

  router.get('/:versionId/report.html', (req, res) => sendVersionReport(db, req, res, req.params.versionId, 'html'));
  router.get('/:versionId/report.pdf', (req, res) => sendVersionReport(db, req, res, req.params.versionId, 'pdf'));

  router.post('/:versionId/branches', async (req, res) => {
    const { version, access, place } = await versionAccess(db, req.user!, req.params.versionId);
    requireAction(access, 'branch');
    const input = parse(createBranchSchema, req.body);
    const branchId = await db.transaction((tx) => service.createBranch(tx, req.user!, place, version.id, input));
    res.status(201).json((await service.branchOverviews(db, place.studyId)).find((b) => b.id === branchId));
  });

  router.get('/:versionId/review', async (req, res) => {
    const s = await owningStudy(db, req, 'version', req.params.versionId);
    res.json(await review.versionReview(db, s.access, s.ref.id, req.params.versionId));
  });

  router.post('/:versionId/review-requests', async (req, res) => {
    const s = await owningStudy(db, req, 'version', req.params.versionId);
    requireAction(s.access, 'requestReview');
    const input = parse(requestReviewSchema, req.body);
    await db.transaction((tx) => review.requestReview(tx, config.PUBLIC_URL, req.user!, s.ref, req.params.versionId, input));
    res.status(201).json(await review.versionReview(db, s.access, s.ref.id, req.params.versionId));
  });

  router.post('/:versionId/verdicts', async (req, res) => {
    const s = await owningStudy(db, req, 'version', req.params.versionId);
    requireAction(s.access, 'giveVerdict');
    const input = parse(giveVerdictSchema, req.body);
    await db.transaction((tx) => review.giveVerdict(tx, config.PUBLIC_URL, req.user!, s.ref, req.params.versionId, input));
    res.status(201).json(await review.versionReview(db, s.access, s.ref.id, req.params.versionId));
  });

  return router;
}
