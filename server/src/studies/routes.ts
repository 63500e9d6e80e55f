import { Router } from 'express';
import { createThreadSchema, markBaselineSchema, pickBranch, studyOpeningQuerySchema, updateStudySchema } from '@laminote/contracts';
import type { Config } from '../config';
import type { Db } from '../db/client';
import { requireAction, studyAccess } from '../access/access';
import { branchAccessWithDraft } from '../access/branch';
import { parse } from '../http/problem';
import { draftBytes, type NotebookService } from '../notebook/service';
import { receiveFile, storeUpload } from '../notebook/uploads';
import { reviewStudy, viewOf } from '../review/context';
import * as threads from '../review/threads';
import * as review from '../review/verdicts';
import { resolveView } from '../review/views';
import * as versions from '../versions/service';
import * as service from './service';

/**
 * /api/studies: a study, its branches, its history and baseline, its comment threads and review state,
 * uploads to it.
 * (Listing and making studies is under /api/projects/:projectId/studies.) Files uploaded
 * to a study are read back under /api/uploads.
 */
export function studiesRouter({ db, config, notebook }: { db: Db; config: Pick<Config, 'PUBLIC_URL'>; notebook: NotebookService }): Router {
  const router = Router();

  router.get('/:studyId', async (req, res) => {
    const { study } = await studyAccess(db, req.user!, req.params.studyId);
    res.json(await service.getStudy(db, study.id));
  });

  router.patch('/:studyId', async (req, res) => {
    const { study, access } = await studyAccess(db, req.user!, req.params.studyId);
    requireAction(access, 'editStudy');
    const input = parse(updateStudySchema, req.body);
    await db.transaction((tx) => service.updateStudy(tx, req.user!, study.projectId, study.id, input));
    res.json(await service.getStudy(db, study.id));
  });

  router.get('/:studyId/branches', async (req, res) => {
    const { study } = await studyAccess(db, req.user!, req.params.studyId);
    res.json(await service.listBranches(db, study.id));
  });

  /**
   * The study, its branches and the opened branch's draft in one answer (StudyOpening): a notebook
   * opened in a fresh browser reads its draft beside the study instead of after the branches have
   * answered, a round trip on its first screen. The draft is put in as the bytes GET …/draft sends.
   */
  router.get('/:studyId/opening', async (req, res) => {
    const { study } = await studyAccess(db, req.user!, req.params.studyId);
    const { branch: wanted } = parse(studyOpeningQuerySchema, req.query);
    const [studyView, branches] = await Promise.all([service.getStudy(db, study.id), service.listBranches(db, study.id)]);
    const chosen = pickBranch(branches, wanted);
    let draft: Buffer = Buffer.from('null');
    if (chosen) {
      const opened = await branchAccessWithDraft(db, req.user!, chosen.id);
      draft = draftBytes(await notebook.getDraft(opened.ctx, opened.draft));
    }
    const head = Buffer.from(`{"study":${JSON.stringify(studyView)},"branches":${JSON.stringify(branches)},"draft":`);
    res.type('application/json').send(Buffer.concat([head, draft, Buffer.from('}')]));
  });

  router.get('/:studyId/versions', async (req, res) => {
    const { study, access } = await studyAccess(db, req.user!, req.params.studyId);
    res.json(await versions.studyHistory(db, study.id, access));
  });

  router.post('/:studyId/baseline', async (req, res) => {
    const { study, access, projectId } = await studyAccess(db, req.user!, req.params.studyId);
    requireAction(access, 'markBaseline');
    const { versionId } = parse(markBaselineSchema, req.body);
    await db.transaction((tx) => versions.markBaseline(tx, req.user!, { studyId: study.id, projectId }, versionId));
    res.json(await versions.studyHistory(db, study.id, access));
  });

  router.get('/:studyId/threads', async (req, res) => {
    const s = await reviewStudy(db, req, req.params.studyId);
    const { q, view } = await viewOf(db, req, s.ref.id);
    res.json(await threads.listThreads(db, s.caller, s.ref.id, view, q.cellId ? { cellId: q.cellId } : {}));
  });

  router.post('/:studyId/threads', async (req, res) => {
    const s = await reviewStudy(db, req, req.params.studyId);
    requireAction(s.access, 'comment');
    const input = parse(createThreadSchema, req.body);
    const threadId = await db.transaction((tx) => threads.createThread(tx, { publicUrl: config.PUBLIC_URL }, s.caller, s.ref, input));
    const view = await resolveView(db, s.ref.id, { versionId: input.versionId, branchId: input.branchId });
    res.status(201).json(await threads.getThread(db, s.caller, s.ref.id, threadId, view));
  });

  router.get('/:studyId/review', async (req, res) => {
    const s = await reviewStudy(db, req, req.params.studyId);
    res.json(await review.studyReview(db, s.ref.id));
  });

  router.post('/:studyId/uploads', async (req, res) => {
    const { study, projectId, access } = await studyAccess(db, req.user!, req.params.studyId);
    requireAction(access, 'editStudy');
    const file = await receiveFile(req, res);
    res.status(201).json(await storeUpload(db, req.user!, { projectId, studyId: study.id }, file));
  });

  return router;
}
