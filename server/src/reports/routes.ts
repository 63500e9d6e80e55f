import { Router, type Request, type Response } from 'express';
import { isUuid } from '@laminote/contracts';
import { studyAccess } from '../access/access';
import type { Db } from '../db/client';
import { notFound } from '../http/problem';
import { versionDetail } from '../versions/service';
import { versionReview, versionStudy } from '../review/verdicts';
import { buildVersionReport, reportFileName, type VersionReportModel } from './model';
import { renderReportHtml } from './html';
import { renderReportPdf } from './pdf';

/**
 * A saved version as a report to send on: GET /api/versions/:versionId/report.html (one
 * self-contained file) and /report.pdf. Anyone who may read the study may make one; a version outside
 * the caller's projects answers 404.
 */
export function reportsRouter({ db }: { db: Db }): Router {
  const router = Router();

  async function model(req: Request, versionId: string): Promise<VersionReportModel> {
    if (!isUuid(versionId)) throw notFound('version');
    const found = await versionStudy(db, versionId);
    if (!found) throw notFound('version');
    const context = await studyAccess(db, req.user!, found.studyId).catch(() => {
      throw notFound('version');
    });
    const [version, review] = [await versionDetail(db, versionId), await versionReview(db, context.access, context.study.id, versionId)];
    return buildVersionReport(db, {
      projectId: context.projectId,
      study: { id: context.study.id, title: context.study.title },
      version,
      review,
      generatedBy: req.user!.name,
    });
  }

  function disposition(res: Response, name: string, download: boolean) {
    // RFC 6266: an ASCII fallback name and the UTF-8 one.
    const ascii = name.replace(/[^\x20-\x7e]/g, '_').replace(/"/g, '');
    res.setHeader('content-disposition', `${download ? 'attachment' : 'inline'}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(name)}`);
  }

  router.get('/versions/:versionId/report.html', async (req, res) => {
    const m = await model(req, req.params.versionId);
    disposition(res, reportFileName(m, 'html'), req.query['download'] === '1');
    res.type('html').setHeader('cache-control', 'private, no-store');
    res.send(renderReportHtml(m));
  });

  router.get('/versions/:versionId/report.pdf', async (req, res) => {
    const m = await model(req, req.params.versionId);
    const pdf = await renderReportPdf(m);
    disposition(res, reportFileName(m, 'pdf'), req.query['download'] === '1');
    res.type('application/pdf').setHeader('cache-control', 'private, no-store');
    res.send(pdf);
  });

  return router;
}
