import { Router, type Request, type Response } from 'express';
import { eq } from 'drizzle-orm';
import { ENGINE_VERSION } from '@laminote/aero';
import { compareQuerySchema } from '@laminote/contracts';
import { studyAccess } from '../access/access';
import type { Db } from '../db/client';
import { projects } from '../db/schema';
import { badRequest, notFound, parse } from '../http/problem';
import { renderCompareReportHtml } from '../reports/compare-html';
import { buildCompareReport } from '../reports/compare-model';
import { renderPdfOffThread } from '../reports/pdf-pool';
import { disposition } from '../reports/respond';
import { compareVersions, compareVersionsJson, studiesOf } from '../versions/compare';

/** /api/compare?a=…&b=…: two versions of one study side by side, cell by cell. */
export function compareRouter({ db }: { db: Db }): Router {
  const router = Router();

  /** Both versions readable by the caller and of one study; answers that study's access context. */
  async function access(req: Request) {
    const { a, b } = parse(compareQuerySchema, req.query);
    const studyOf = await studiesOf(db, [a, b]);
    // A version of a project the caller is not in gets the very answer an id that names nothing gets.
    let context: Awaited<ReturnType<typeof studyAccess>> | null = null;
    for (const [field, id] of [['a', a], ['b', b]] as const) {
      const studyId = studyOf.get(id);
      const found = studyId === undefined ? null : await studyAccess(db, req.user!, studyId).catch(() => null);
      if (!found) throw notFound(`version (${field})`);
      context ??= found;
    }
    if (studyOf.get(a) !== studyOf.get(b)) throw badRequest('a and b must be versions of the same study', 'b');
    return { a, b, context: context! };
  }

  router.get('/', async (req, res) => {
    const { a, b } = await access(req);
    res.type('json').send(await compareVersionsJson(db, a, b));
  });

  /** The comparison as a report: one self-contained HTML file to send on or print, or a PDF of the same (?download=1 to save it). */
  async function report(req: Request, res: Response, format: 'html' | 'pdf') {
    const { a, b, context } = await access(req);
    const comparison = await compareVersions(db, a, b);
    const [project] = await db.select({ name: projects.name }).from(projects).where(eq(projects.id, context.study.projectId));
    const model = buildCompareReport(comparison, { project: project?.name ?? '', studyTitle: context.study.title, generatedBy: req.user!.name, engineVersion: ENGINE_VERSION });
    disposition(res, `${model.fileBase}.${format}`, req.query['download'] === '1');
    res.setHeader('cache-control', 'private, no-store');
    if (format === 'html') res.type('html').send(renderCompareReportHtml(model));
    else res.type('application/pdf').send(await renderPdfOffThread({ kind: 'compare', model }));
  }
  router.get('/report.html', (req, res) => report(req, res, 'html'));
  router.get('/report.pdf', (req, res) => report(req, res, 'pdf'));

  return router;
}
