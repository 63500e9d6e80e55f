import type { Request, Response } from 'express';
import type { JobEvent } from '@laminote/contracts';
import type { Db } from '../db/client';
import type { JobEvents } from './events';
import { branchJobs, jobView, loadJob } from './store';

/** Progress of one job is sent at most this often; outputs as they land. */
const COALESCE_MS = 200;
const HEARTBEAT_MS = 15_000;

/**
 * GET /api/branches/:branchId/events for a caller already allowed to follow it: server-sent events of
 * the branch's jobs. First the true state (a snapshot), then progress and landed outputs as workers
 * report them; a snapshot again whenever the server had lost the database meanwhile. A browser that
 * reconnects (after a server restart) starts with a snapshot too.
 */
export function streamBranchJobs(db: Db, events: JobEvents, branchId: string, req: Request, res: Response): void {
  res.writeHead(200, {
    'content-type': 'text/event-stream; charset=utf-8',
    'cache-control': 'no-cache, no-transform',
    connection: 'keep-alive',
    'x-accel-buffering': 'no',
  });
  res.write('retry: 2000\n\n');
  let open = true;
  // Notices that come while the first snapshot is being read wait for it: the stream starts with the
  // true state, whatever lands meanwhile.
  let started = false;
  const held: JobEvent[] = [];
  const send = (event: JobEvent) => {
    if (!open) return;
    if (!started && event.type !== 'snapshot') held.push(event);
    else res.write(`data: ${JSON.stringify(event)}\n\n`);
  };
  const snapshot = async () => {
    send({ type: 'snapshot', jobs: await Promise.all((await branchJobs(db, branchId)).map((row) => jobView(db, row))) });
    if (!started) {
      started = true;
      for (const event of held.splice(0)) send(event);
    }
  };
  const pending = new Map<string, NodeJS.Timeout>();
  const sendJob = (jobId: string) => {
    if (pending.has(jobId)) return;
    pending.set(
      jobId,
      setTimeout(() => {
        pending.delete(jobId);
        void loadJob(db, jobId)
          .then(async (row) => row && send({ type: 'job', job: await jobView(db, row) }))
          // The database went away: the snapshot after it is back tells the rest.
          .catch(() => undefined);
      }, COALESCE_MS),
    );
  };
  const unsubscribe = events.subscribe(
    branchId,
    (notice) => {
      if (notice.type === 'output') send({ type: 'output', jobId: notice.jobId, cellId: notice.cellId });
      sendJob(notice.jobId);
    },
    () => void snapshot().catch(() => undefined),
  );
  const heartbeat = setInterval(() => open && res.write(': still here\n\n'), HEARTBEAT_MS);
  req.on('close', () => {
    open = false;
    unsubscribe();
    clearInterval(heartbeat);
    for (const timer of pending.values()) clearTimeout(timer);
  });
  void snapshot().catch(() => undefined);
}
