import type { Request, Response } from 'express';
import { versionAccess } from '../access/version';
import type { Db } from '../db/client';
import { versionDetail } from '../versions/service';
import { versionReview } from '../review/verdicts';
import { buildVersionReport, reportFileName } from './model';
import { renderReportHtml } from './html';
import { renderPdfOffThread } from './pdf-pool';

/** RFC 6266: an ASCII fallback name and the UTF-8 one. */
export function disposition(res: Response, name: string, download: boolean) {
  const ascii = name.replace(/[^\x20-\x7e]/g, '_').replace(/"/g, '');
  res.setHeader('content-disposition', `${download ? 'attachment' : 'inline'}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(name)}`);
}

/**
 * A saved version as a report to send on, answered for GET /api/versions/:versionId/report.html (one
 * self-contained file) and /report.pdf (versions/routes.ts). Anyone who may read the study may make
 * one; a version outside the caller's projects answers 404.
 */
export async function sendVersionReport(db: Db, req: Request, res: Response, versionId: string, format: 'html' | 'pdf'): Promise<void> {
  const context = await versionAccess(db, req.user!, versionId);
  const [version, review] = [await versionDetail(db, versionId), await versionReview(db, context.access, context.study.id, versionId)];
  const m = await buildVersionReport(db, {
    projectId: context.projectId,
    study: { id: context.study.id, title: context.study.title },
    version,
    review,
    generatedBy: req.user!.name,
  });
  disposition(res, reportFileName(m, format), req.query['download'] === '1');
  res.setHeader('cache-control', 'private, no-store');
  if (format === 'html') res.type('html').send(renderReportHtml(m));
  else res.type('application/pdf').send(await renderPdfOffThread({ kind: 'version', model: m }));
}
