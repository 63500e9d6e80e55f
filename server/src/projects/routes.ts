import { Router } from 'express';
import { addMemberSchema, createProjectSchema, createStudySchema, importStudySchema, updateMemberSchema, updateProjectSchema } from '@laminote/contracts';
import type { Db } from '../db/client';
import { projectAccess, requireAction } from '../access/access';
import { forbidden, parse } from '../http/problem';
import { importStudy } from '../studies/import';
import * as studies from '../studies/service';
import * as service from './service';

/** /api/projects: projects, their members and settings, and the studies in each. */
export function projectsRouter({ db }: { db: Db }): Router {
  const router = Router();

  router.get('/', async (req, res) => {
    res.json(await service.listProjects(db, req.user!));
  });

  router.post('/', async (req, res) => {
    if (!req.user!.siteAdmin) throw forbidden('Only site admins create projects.');
    const input = parse(createProjectSchema, req.body);
    const project = await db.transaction((tx) => service.createProject(tx, req.user!, input));
    res.status(201).json(await service.getProject(db, req.user!, project.id));
  });

  router.get('/:projectId', async (req, res) => {
    const { projectId } = await projectAccess(db, req.user!, req.params.projectId);
    res.json(await service.getProject(db, req.user!, projectId));
  });

  router.patch('/:projectId', async (req, res) => {
    const { projectId, access } = await projectAccess(db, req.user!, req.params.projectId);
    const input = parse(updateProjectSchema, req.body);
    requireAction(access, input.settings ? 'manageSettings' : 'manageMembers');
    await db.transaction((tx) => service.updateProject(tx, req.user!, projectId, input));
    res.json(await service.getProject(db, req.user!, projectId));
  });

  router.get('/:projectId/members', async (req, res) => {
    const { projectId } = await projectAccess(db, req.user!, req.params.projectId);
    res.json(await service.listMembers(db, projectId));
  });

  router.post('/:projectId/members', async (req, res) => {
    const { projectId, access } = await projectAccess(db, req.user!, req.params.projectId);
    requireAction(access, 'manageMembers');
    const input = parse(addMemberSchema, req.body);
    res.status(201).json(await db.transaction((tx) => service.addMember(tx, req.user!, projectId, input)));
  });

  router.patch('/:projectId/members/:userId', async (req, res) => {
    const { projectId, access } = await projectAccess(db, req.user!, req.params.projectId);
    requireAction(access, 'manageMembers');
    const { role } = parse(updateMemberSchema, req.body);
    await db.transaction((tx) => service.changeMemberRole(tx, req.user!, projectId, req.params.userId, role));
    res.json((await service.listMembers(db, projectId)).find((m) => m.userId === req.params.userId));
  });

  router.delete('/:projectId/members/:userId', async (req, res) => {
    const { projectId, access } = await projectAccess(db, req.user!, req.params.projectId);
    requireAction(access, 'manageMembers');
    await db.transaction((tx) => service.removeMember(tx, req.user!, projectId, req.params.userId));
    res.status(204).end();
  });

  router.get('/:projectId/studies', async (req, res) => {
    const { projectId } = await projectAccess(db, req.user!, req.params.projectId);
    res.json(await studies.listStudies(db, projectId, req.query['archived'] === 'true'));
  });

  router.post('/:projectId/studies', async (req, res) => {
    const { projectId, access } = await projectAccess(db, req.user!, req.params.projectId);
    requireAction(access, 'editStudy');
    const input = parse(createStudySchema, req.body);
    const study = await db.transaction((tx) => studies.createStudy(tx, req.user!, projectId, input));
    res.status(201).json(await studies.getStudy(db, study.id));
  });

  router.post('/:projectId/studies/import', async (req, res) => {
    const { projectId, access } = await projectAccess(db, req.user!, req.params.projectId);
    requireAction(access, 'editStudy');
    const input = parse(importStudySchema, req.body);
    res.status(201).json(await db.transaction((tx) => importStudy(tx, req.user!, projectId, input)));
  });

  return router;
}
