import { TestBed } from '@angular/core/testing';
import type { Job, JobEvent } from '@laminote/contracts';
import { Subject, of } from 'rxjs';
import { beforeEach, describe, expect, it } from 'vitest';
import { JobsApi } from '../shared/jobs-api';
import { BranchJobs } from './branch-jobs';

const BRANCH = '11111111-2222-4333-8444-555555555501';
const SWEEP = '11111111-2222-4333-8444-555555555505';
const FLOW = '11111111-2222-4333-8444-555555555502';

const job = (done: number, state: Job['state'] = 'running'): Job => ({
  jobId: '11111111-2222-4333-8444-5555555555aa',
  branchId: BRANCH,
  studyId: '11111111-2222-4333-8444-5555555555bb',
  state,
  done: done + 1,
  total: 1001,
  cells: [
    { cellId: FLOW, kind: 'flow', done: 1, total: 1 },
    { cellId: SWEEP, kind: 'sweep', done, total: 1000 },
  ],
  createdAt: '2026-12-02T06:00:00.000Z',
  finishedAt: state === 'running' ? null : '2026-12-02T06:01:00.000Z',
  createdBy: null,
});

describe('BranchJobs', () => {
  let events: Subject<JobEvent>;
  let jobs: BranchJobs;
  let landed: (string | null)[];

  beforeEach(() => {
    events = new Subject<JobEvent>();
    TestBed.configureTestingModule({
      providers: [BranchJobs, { provide: JobsApi, useValue: { events: () => events, cancel: () => of(job(500, 'cancelled')) } }],
    });
    jobs = TestBed.inject(BranchJobs);
    jobs.follow(BRANCH);
    landed = [];
    jobs.outputs.subscribe((o) => landed.push(o.cellId));
  });

  it('shows the true state from the snapshot, then the progress of each cell still being computed', () => {
    events.next({ type: 'snapshot', jobs: [job(370)] });
    expect(jobs.active().map((j) => j.done)).toEqual([371]);
    // The flow cell is done; only the sweep has a bar, with its cases.
    expect([...jobs.cells().entries()].map(([id, p]) => [id, p.done, p.total])).toEqual([[SWEEP, 370, 1000]]);
    events.next({ type: 'job', job: job(420) });
    expect(jobs.cells().get(SWEEP)?.done).toBe(420);
  });

  it('names the cells each job has computed, from the snapshot a page gets when it connects late', () => {
    // The flow cell's output landed before the page's stream connected: no output notice, but the count.
    events.next({ type: 'snapshot', jobs: [job(370)] });
    expect([...(jobs.computedCells().get(job(0).jobId) ?? [])]).toEqual([FLOW]);
    events.next({ type: 'job', job: job(1000, 'completed') });
    expect([...(jobs.computedCells().get(job(0).jobId) ?? [])]).toEqual([FLOW, SWEEP]);
  });

  it('lists active jobs oldest first and the last that ended by when it ended', () => {
    const other = (id: string, createdAt: string, state: Job['state'] = 'running', finishedAt: string | null = null): Job => ({ ...job(1, state), jobId: id, createdAt, finishedAt });
    events.next({
      type: 'snapshot',
      jobs: [
        other('11111111-2222-4333-8444-5555555555a3', '2026-12-02T06:00:09.000Z'),
        other('11111111-2222-4333-8444-5555555555a1', '2026-12-02T05:59:59.999Z'),
        other('11111111-2222-4333-8444-5555555555a4', '2026-12-02T05:00:00.000Z', 'completed', '2026-12-02T05:10:00.000Z'),
        other('11111111-2222-4333-8444-5555555555a5', '2026-12-02T05:00:00.000Z', 'cancelled', '2026-12-02T05:30:00.000Z'),
      ],
    });
    expect(jobs.active().map((j) => j.jobId.slice(-2))).toEqual(['a1', 'a3']);
    expect(jobs.lastFinished()?.jobId.slice(-2)).toBe('a5');
  });

  it('never shows a count going back when events overtake one another', () => {
    events.next({ type: 'job', job: job(600) });
    events.next({ type: 'job', job: job(550) });
    expect(jobs.active()[0]!.done).toBe(601);
  });

  it('says when an output lands and when a job ends, so the notebook reads its draft again', () => {
    events.next({ type: 'job', job: job(990) });
    events.next({ type: 'output', jobId: job(0).jobId, cellId: SWEEP });
    events.next({ type: 'job', job: job(1000, 'completed') });
    expect(landed).toEqual([SWEEP, null]);
    expect(jobs.active()).toEqual([]);
    expect(jobs.cells().size).toBe(0);
  });

  it('takes a cancelled job off the running ones', async () => {
    events.next({ type: 'job', job: job(500) });
    await jobs.cancel(job(0).jobId);
    expect(jobs.active()).toEqual([]);
    expect(jobs.lastFinished()?.state).toBe('cancelled');
  });
});
