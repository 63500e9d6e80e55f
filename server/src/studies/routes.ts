import { Router } from 'express';
import { createStudySchema, updateStudySchema } from '@laminote/contracts';
import type { Db } from '../db/client';
import { projectAccess, requireAction, studyAccess } from '../access/access';
import { parse } from '../http/problem';
import * as service from './service';

export function studiesRouter({ db }: { db: Db }): Router {
  const router = Router();

  router.get('/projects/:projectId/studies', async (req, res) => {
    const { projectId } = await projectAccess(db, req.user!, req.params.projectId);
    res.json(await service.listStudies(db, projectId, req.query['archived'] === 'true'));
  });

  router.post('/projects/:projectId/studies', async (req, res) => {
    const { projectId, access } = await projectAccess(db, req.user!, req.params.projectId);
    requireAction(access, 'editStudy');
    const input = parse(createStudySchema, req.body);
    const study = await db.transaction((tx) => service.createStudy(tx, req.user!, projectId, input));
    res.status(201).json(await service.getStudy(db, study.id));
  });

  router.get('/studies/:studyId', async (req, res) => {
    const { study } = await studyAccess(db, req.user!, req.params.studyId);
    res.json(await service.getStudy(db, study.id));
  });

  router.get('/studies/:studyId/branches', async (req, res) => {
    const { study } = await studyAccess(db, req.user!, req.params.studyId);
    res.json(await service.listBranches(db, study.id));
  });

  router.patch('/studies/:studyId', async (req, res) => {
    const { study, access } = await studyAccess(db, req.user!, req.params.studyId);
    requireAction(access, 'editStudy');
    const input = parse(updateStudySchema, req.body);
    await db.transaction((tx) => service.updateStudy(tx, req.user!, study.projectId, study.id, input));
    res.json(await service.getStudy(db, study.id));
  });

  return router;
}
