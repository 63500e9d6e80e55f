import type { Request } from 'express';
import { isUuid, threadQuerySchema } from '@laminote/contracts';
import { studyAccess } from '../access/access';
import type { Tx } from '../db/client';
import { notFound, parse } from '../http/problem';
import * as threads from './threads';
import { versionStudy } from './verdicts';
import { resolveView } from './views';

/**
 * The study a review request is about, as the review services take it: the caller with their access,
 * and the study's id, title and project. Every review route starts here, so a thread, comment or
 * version of a project the caller is not in answers 404.
 */
export async function reviewStudy(tx: Tx, req: Request, studyId: string) {
  const context = await studyAccess(tx, req.user!, studyId);
  const caller = { user: req.user!, access: context.access };
  const ref = { id: context.study.id, title: context.study.title, projectId: context.study.projectId };
  return { ...context, caller, ref };
}

/** The study of a thread, comment or version, as 404 when it does not exist or is not the caller's. */
export async function owningStudy(tx: Tx, req: Request, what: 'thread' | 'comment' | 'version', id: string) {
  if (!isUuid(id)) throw notFound(what);
  const found = what === 'thread' ? await threads.threadStudy(tx, id) : what === 'comment' ? await threads.commentStudy(tx, id) : await versionStudy(tx, id);
  if (!found) throw notFound(what);
  return reviewStudy(tx, req, found.studyId).catch(() => {
    throw notFound(what);
  });
}

/** The view the caller is looking at (?versionId= or ?branchId=), for "changed since" in answers. */
export async function viewOf(tx: Tx, req: Request, studyId: string) {
  const q = parse(threadQuerySchema, req.query);
  return { q, view: await resolveView(tx, studyId, q) };
}
