import { Router } from 'express';
import { isUuid, jobIsActive, type JobState } from '@laminote/contracts';
import type { Db } from '../db/client';
import { projectAccess, requireAction } from '../access/access';
import { notFound, ProblemError } from '../http/problem';
import type { JobService } from './service';
import { jobView, loadJob } from './store';

/** /api/jobs: how far a run is, and cancelling it. A job in a project you are not in does not exist for you. */
export function jobsRouter({ db, jobs }: { db: Db; jobs: JobService }): Router {
  const router = Router();

  const visibleJob = async (user: Parameters<typeof projectAccess>[1], jobId: string) => {
    if (!isUuid(jobId)) throw notFound('job');
    const row = await loadJob(db, jobId);
    if (!row) throw notFound('job');
    const ctx = await projectAccess(db, user, row.projectId).catch(() => {
      throw notFound('job');
    });
    return { row, ctx };
  };

  router.get('/:jobId', async (req, res) => {
    const { row } = await visibleJob(req.user!, req.params.jobId);
    res.json(await jobView(db, row));
  });

  router.delete('/:jobId', async (req, res) => {
    const { row, ctx } = await visibleJob(req.user!, req.params.jobId);
    requireAction(ctx.access, 'runCells');
    if (!jobIsActive(row.state as JobState)) {
      throw new ProblemError(409, 'job-finished', 'The run has finished', { detail: `The run is ${row.state}; there is nothing left to cancel.` });
    }
    const cancelled = await jobs.cancel(row, req.user!);
    res.json(await jobView(db, cancelled ?? (await loadJob(db, row.id))!));
  });

  return router;
}
