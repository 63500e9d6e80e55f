import { expect } from 'vitest';
import { jobIsActive, runResponseSchema, type CellRunReport, type Draft, type Job } from '@laminote/contracts';
import type { SignedIn } from './sign-in';

/** Asks for a job until `until` holds (by default: it has finished); fails the test after `timeoutMs`. */
export async function waitForJob(who: SignedIn, jobId: string, { timeoutMs = 60_000, until = (job: Job) => !jobIsActive(job.state) } = {}): Promise<Job> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const res = await who.get(`/api/jobs/${jobId}`);
    // While the database is away the server answers 503; ask again.
    if (res.status === 503 && Date.now() < deadline) {
      await new Promise((resolve) => setTimeout(resolve, 500));
      continue;
    }
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const job = res.body as Job;
    if (until(job)) return job;
    if (Date.now() > deadline) throw new Error(`job ${jobId} is still ${job.state} (${job.done} of ${job.total}) after ${timeoutMs} ms`);
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
}

/**
 * Runs cells as a script would: POST /run, and when it answers 202 follows the job to its end, then
 * reads the draft. Answers the draft after the run with what ran, either way.
 *
 * A run computed at once answers only the cells whose outputs it changed (RunResponse); that answer is
 * checked here against the drafts read before and after it: the same cells, each as the draft now
 * holds it, and no other cell's output moved.
 */
export async function runAndWait(who: SignedIn, branchId: string, body: object = {}, timeoutMs = 60_000): Promise<Draft & { ran: CellRunReport[]; jobId: string | null }> {
  const before = (await who.get(`/api/branches/${branchId}/draft`).expect(200)).body as Draft;
  const res = await who.post(`/api/branches/${branchId}/run`, body);
  if (res.status === 200) {
    const answer = runResponseSchema.parse(res.body);
    const draft = (await who.get(`/api/branches/${branchId}/draft`).expect(200)).body as Draft;
    const keyOf = (d: Draft, cellId: string) => d.cells.find((c) => c.cellId === cellId)?.output?.key ?? null;
    const moved = draft.cells.filter((c) => keyOf(draft, c.cellId) !== keyOf(before, c.cellId)).map((c) => c.cellId);
    expect(answer.cells.map((c) => c.cellId), 'the run answers the cells whose outputs it changed, in draft order').toEqual(moved);
    for (const cell of answer.cells) expect(cell, `cell ${cell.cellId} as the draft holds it`).toEqual(draft.cells.find((c) => c.cellId === cell.cellId));
    expect(answer.revision).toBe(draft.revision);
    return { ...draft, ran: answer.ran, jobId: null };
  }
  expect(res.status, JSON.stringify(res.body)).toBe(202);
  const job = await waitForJob(who, res.body.jobId as string, { timeoutMs });
  expect(job.state, job.error).toBe('completed');
  const draft = await who.get(`/api/branches/${branchId}/draft`).expect(200);
  return { ...draft.body, ran: job.ran ?? [], jobId: job.jobId };
}
