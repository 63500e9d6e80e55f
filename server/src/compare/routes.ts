import { Router } from 'express';
import { compareQuerySchema } from '@laminote/contracts';
import { studyAccess } from '../access/access';
import type { Db } from '../db/client';
import { badRequest, notFound, parse } from '../http/problem';
import { compareVersions, studiesOf } from '../versions/compare';

/** /api/compare?a=…&b=…: two versions of one study side by side, cell by cell. */
export function compareRouter({ db }: { db: Db }): Router {
  const router = Router();

  router.get('/', async (req, res) => {
    const { a, b } = parse(compareQuerySchema, req.query);
    const studyOf = await studiesOf(db, [a, b]);
    // A version of a project the caller is not in gets the very answer an id that names nothing gets.
    for (const [field, id] of [['a', a], ['b', b]] as const) {
      const studyId = studyOf.get(id);
      const visible = studyId !== undefined && (await studyAccess(db, req.user!, studyId).then(() => true, () => false));
      if (!visible) throw notFound(`version (${field})`);
    }
    if (studyOf.get(a) !== studyOf.get(b)) throw badRequest('a and b must be versions of the same study', 'b');
    res.json(await compareVersions(db, a, b));
  });

  return router;
}
