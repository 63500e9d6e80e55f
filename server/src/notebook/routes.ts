import express, { Router, type RequestHandler, type Response } from 'express';
import { z } from 'zod';
import { runRequestSchema, saveDraftSchema } from '@laminote/contracts';
import type { Db } from '../db/client';
import { projectAccess, requireAction, studyAccess } from '../access/access';
import { parse, ProblemError } from '../http/problem';
import { branchAccess, requireWritable } from '../access/branch';
import { exportCell } from './export';
import { draftDocument, studyDocumentFilename } from './study-document';
import type { JobEvents } from '../jobs/events';
import type { JobService } from '../jobs/service';
import { streamBranchJobs } from '../jobs/stream';
import { isQuickRun, needsComputing } from '../jobs/work';
import { draftJson, draftObject, type NotebookService } from './service';
import { findUpload, receiveFile, storeUpload } from './uploads';

/** A draft carries its pasted tables whole, so its save may be larger than the API's usual 2 MB. */
export const DRAFT_BODY_LIMIT_MB = 16;

const jsonForDrafts = express.json({ limit: `${DRAFT_BODY_LIMIT_MB}mb` });

/**
 * Parses draft saves with the larger limit; mounted ahead of the app's JSON parser, which then leaves
 * the parsed body alone.
 */
export const draftBodyParser: RequestHandler = (req, res, next) => {
  if (req.method !== 'PUT' || !/^\/[^/]+\/draft\/?$/.test(req.path)) return next();
  jsonForDrafts(req, res, (err?: unknown) => {
    const e = err as { type?: string } | undefined;
    if (e?.type === 'entity.too.large') {
      return next(new ProblemError(413, 'too-large', 'The draft is too large', { detail: `A draft save is limited to ${DRAFT_BODY_LIMIT_MB} MB; move large tables into uploads or split the study.` }));
    }
    next(err);
  });
};

const exportQuerySchema = z.object({ format: z.enum(['csv', 'json'], { error: 'format must be csv or json' }).default('json') });

export function notebookRouter({ db, notebook, jobs, events }: { db: Db; notebook: NotebookService; jobs: JobService; events: JobEvents }): Router {
  const router = Router();
  const sendJson = (res: Response, json: string) => res.type('application/json').send(json);

  router.get('/branches/:branchId/draft', async (req, res) => {
    const ctx = await branchAccess(db, req.user!, req.params.branchId);
    sendJson(res, draftJson(await notebook.getDraft(ctx)));
  });

  router.put('/branches/:branchId/draft', async (req, res) => {
    const ctx = await branchAccess(db, req.user!, req.params.branchId);
    requireAction(ctx.access, 'editStudy');
    requireWritable(ctx);
    const body = parse(saveDraftSchema, req.body);
    sendJson(res, draftJson(await notebook.saveDraft(ctx, req.user!, body)));
  });

  /**
   * Runs the named cells (and what they use), or every cell: 202 with the job when more than a few
   * quick cells have to be computed (workers take it from the queue), 200 with the draft at once when
   * every output is stored or the server has just computed the few that were missing.
   */
  router.post('/branches/:branchId/run', async (req, res) => {
    const ctx = await branchAccess(db, req.user!, req.params.branchId);
    requireAction(ctx.access, 'runCells');
    requireWritable(ctx);
    const body = parse(runRequestSchema, req.body ?? {});
    const work = await jobs.plan(ctx, body.cellIds);
    // A few quick cells are computed at once on this server's engine pool and stored by key exactly as
    // a worker stores them, so a small run answers in milliseconds; longer work goes to the queue.
    if (needsComputing(work) && !isQuickRun(work)) {
      const job = await jobs.enqueue(ctx, req.user!, work);
      res.status(202).location(`/api/jobs/${job.jobId}`).json({ jobId: job.jobId, job });
      return;
    }
    const { doc, ran } = await notebook.run(ctx, req.user!, body.cellIds);
    sendJson(res, draftJson(doc, { ran }));
  });

  /** The branch's jobs as server-sent events; for those who may run its cells. */
  router.get('/branches/:branchId/events', async (req, res) => {
    const ctx = await branchAccess(db, req.user!, req.params.branchId);
    requireAction(ctx.access, 'runCells');
    streamBranchJobs(db, events, ctx.branch.id, req, res);
  });

  /** The whole study of the branch's draft as one document (cells, inputs, outputs), as a download. */
  router.get('/branches/:branchId/export', async (req, res) => {
    const ctx = await branchAccess(db, req.user!, req.params.branchId);
    const document = draftDocument(ctx.study, ctx.branch, draftObject(await notebook.getDraft(ctx)));
    res.attachment(studyDocumentFilename(document)).type('application/json').send(JSON.stringify(document, null, 1));
  });

  router.get('/branches/:branchId/cells/:cellId/export', async (req, res) => {
    const ctx = await branchAccess(db, req.user!, req.params.branchId);
    const { format } = parse(exportQuerySchema, req.query);
    const file = exportCell(draftObject(await notebook.getDraft(ctx), req.params.cellId), ctx.study.title, req.params.cellId, format);
    res.attachment(file.filename).type(file.contentType).send(file.body);
  });

  router.post('/studies/:studyId/uploads', async (req, res) => {
    const { study, projectId, access } = await studyAccess(db, req.user!, req.params.studyId);
    requireAction(access, 'editStudy');
    const file = await receiveFile(req, res);
    res.status(201).json(await storeUpload(db, req.user!, { projectId, studyId: study.id }, file));
  });

  router.get('/uploads/:uploadId/content', async (req, res) => {
    const upload = await findUpload(db, req.params.uploadId);
    await projectAccess(db, req.user!, upload.projectId).catch(() => {
      throw new ProblemError(404, 'not-found', 'Not found', { detail: 'No upload here, or it is not shared with you.' });
    });
    res.setHeader('x-content-sha256', upload.sha256);
    // Always a download, never rendered on this origin.
    res.attachment(upload.filename).type(upload.contentType).send(upload.content);
  });

  return router;
}
