import express, { Router, type RequestHandler, type Response } from 'express';
import { z } from 'zod';
import { restoreDraftSchema, runRequestSchema, saveDraftSchema, saveVersionSchema, updateBranchSchema } from '@laminote/contracts';
import { requireAction } from '../access/access';
import { branchAccess, branchAccessWithDraft, branchPlace, requireWritable } from '../access/branch';
import type { Db } from '../db/client';
import { parse, ProblemError } from '../http/problem';
import type { JobEvents } from '../jobs/events';
import type { JobService } from '../jobs/service';
import { streamBranchJobs } from '../jobs/stream';
import { isQuickRun, needsComputing } from '../jobs/work';
import { exportCell } from '../notebook/export';
import { draftBytes, draftObject, runBytes, type NotebookService } from '../notebook/service';
import { draftDocument, studyDocumentFilename } from '../notebook/study-document';
import * as versions from '../versions/service';

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

/**
 * /api/branches: a branch's working draft (autosave), runs and their events, exports of a cell or the
 * whole study, the branch itself (rename, purpose, archive), its saved versions and restoring one.
 */
export function branchesRouter({ db, notebook, jobs, events }: { db: Db; notebook: NotebookService; jobs: JobService; events: JobEvents }): Router {
  const router = Router();
  const sendJson = (res: Response, json: Buffer) => res.type('application/json').send(json);
  /**
   * JSON text as the answer of a change, without the ETag Express would hash the whole body for: an
   * answer to a PUT or POST is never revalidated, and a draft with its outputs runs to 100 kB or more.
   */
  const sendJsonOnce = (res: Response, json: string | Buffer) => {
    const body = typeof json === 'string' ? Buffer.from(json) : json;
    res.type('application/json').setHeader('content-length', body.length);
    res.end(body);
  };

  router.get('/:branchId/draft', async (req, res) => {
    const { ctx, draft } = await branchAccessWithDraft(db, req.user!, req.params.branchId);
    sendJson(res, draftBytes(await notebook.getDraft(ctx, draft)));
  });

  router.put('/:branchId/draft', async (req, res) => {
    const ctx = await branchAccess(db, req.user!, req.params.branchId);
    requireAction(ctx.access, 'editStudy');
    requireWritable(ctx);
    const body = parse(saveDraftSchema, req.body);
    sendJsonOnce(res, draftBytes(await notebook.saveDraft(ctx, req.user!, body)));
  });

  /**
   * Runs the named cells (and what they use), or every cell: 202 with the job when more than a few
   * quick cells have to be computed (workers take it from the queue), 200 at once when every output is
   * stored or the server has just computed the few that were missing, with what ran and the cells
   * whose outputs changed (RunResponse).
   */
  router.post('/:branchId/run', async (req, res) => {
    // The outputs the run will look for are asked with the access, from the cells this app holds;
    // a body that does not parse is refused below, after the access is checked.
    const asked = runRequestSchema.safeParse(req.body ?? {});
    const guess = notebook.runKeysGuess(req.params.branchId, asked.success ? asked.data.cellIds : undefined);
    const { ctx, draft, storedKeys } = await branchAccessWithDraft(db, req.user!, req.params.branchId, guess);
    requireAction(ctx.access, 'runCells');
    requireWritable(ctx);
    const body = parse(runRequestSchema, req.body ?? {});
    // The draft is read once, with the access: the plan decides between computing at once and
    // queueing, and is what runs.
    const planned = await notebook.planRun(ctx, body.cellIds, draft, storedKeys);
    const work = jobs.work(planned);
    // A few quick cells are computed at once on this server's engine pool and stored by key exactly as
    // a worker stores them, so a small run answers in milliseconds; longer work goes to the queue.
    if (needsComputing(work) && !isQuickRun(work)) {
      const job = await jobs.enqueue(ctx, req.user!, work);
      res.status(202).location(`/api/jobs/${job.jobId}`).json({ jobId: job.jobId, job });
      return;
    }
    sendJsonOnce(res, runBytes(await notebook.run(ctx, req.user!, planned)));
  });

  /** The branch's jobs as server-sent events; for those who may run its cells. */
  router.get('/:branchId/events', async (req, res) => {
    const ctx = await branchAccess(db, req.user!, req.params.branchId);
    requireAction(ctx.access, 'runCells');
    streamBranchJobs(db, events, ctx.branch.id, req, res);
  });

  /** The whole study of the branch's draft as one document (cells, inputs, outputs), as a download. */
  router.get('/:branchId/export', async (req, res) => {
    const ctx = await branchAccess(db, req.user!, req.params.branchId);
    const document = draftDocument(ctx.study, ctx.branch, draftObject(await notebook.getDraft(ctx)));
    res.attachment(studyDocumentFilename(document)).type('application/json').send(JSON.stringify(document, null, 1));
  });

  router.get('/:branchId/cells/:cellId/export', async (req, res) => {
    const ctx = await branchAccess(db, req.user!, req.params.branchId);
    const { format } = parse(exportQuerySchema, req.query);
    const file = exportCell(draftObject(await notebook.getDraft(ctx), req.params.cellId), ctx.study.title, req.params.cellId, format);
    res.attachment(file.filename).type(file.contentType).send(file.body);
  });


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
