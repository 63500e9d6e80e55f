import { Router } from 'express';
import type { ValidationReport } from '@laminote/contracts';
import { runValidationReport } from './validation';

/**
 * The engine's methods in the open: the validation page's reference cases, run on the server. They
 * are run once per process (about a second), on first request, as the engine cannot change while the
 * server runs; every signed-in person may read them (they hold no project data).
 */
export function methodsRouter(): Router {
  const router = Router();
  let report: ValidationReport | null = null;

  router.get('/validation', (_req, res) => {
    report ??= runValidationReport();
    res.json(report);
  });

  return router;
}
