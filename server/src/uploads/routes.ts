import { Router } from 'express';
import { projectAccess } from '../access/access';
import type { Db } from '../db/client';
import { ProblemError } from '../http/problem';
import { findUpload } from '../notebook/uploads';

/** /api/uploads: an uploaded file's bytes as received, always as a download. (Uploading is POST /api/studies/:studyId/uploads.) */
export function uploadsRouter({ db }: { db: Db }): Router {
  const router = Router();

  router.get('/:uploadId/content', async (req, res) => {
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
