import { TestBed } from '@angular/core/testing';
import { HttpTestingController } from '@angular/common/http/testing';
import type { CellRunReport, DraftCell, RunResponse } from '@laminote/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { provideTestApp } from '../../testing/test-app';
import { ANALYSIS_ID, BRANCH_ID, FLOW_ID, PRESSURE_ID, cell, draft, output } from '../../testing/notebook-fixtures';
import { AUTOSAVE_DELAY_MS, DraftSession } from './draft-session';

/**
 * How a session takes a run the server computed at once: the answer carries only the cells whose
 * outputs changed (RunResponse), which are merged into the stack as it stands.
 */

const RUN_URL = `/api/branches/${BRANCH_ID}/run`;
const DRAFT_URL = `/api/branches/${BRANCH_ID}/draft`;

function opened() {
  const flowOutput = output({ reynolds: 8e6 }, { key: 'f'.repeat(64) });
  return draft([
    cell('flow', FLOW_ID, { title: 'Cruise, M 0.78', runState: 'current', output: flowOutput }),
    cell('pressure', PRESSURE_ID, { title: 'Outboard Cp (invented)', runState: 'current', output: output({ rowCount: 3 }, { key: 'p'.repeat(64) }) }),
    cell('analysis', ANALYSIS_ID, { title: 'Free transition', runState: 'outdated', output: output({ cd: 0.004 }, { key: 'o'.repeat(64) }) }),
  ]);
}

const report = (cellId: string, kind: DraftCell['kind'], overrides: Partial<CellRunReport> = {}): CellRunReport => ({
  cellId,
  kind,
  status: 'ok',
  reused: false,
  key: 'k'.repeat(64),
  durationMs: 3,
  error: null,
  ...overrides,
});

/** A session on the opened draft, for a person who may edit and run. */
function openSession(): { http: HttpTestingController; session: DraftSession } {
  TestBed.configureTestingModule({ providers: [...provideTestApp(), DraftSession, { provide: AUTOSAVE_DELAY_MS, useValue: 5 }] });
  const session = TestBed.inject(DraftSession);
  session.open(BRANCH_ID, opened());
  session.mayRun.set(true);
  session.editable.set(true);
  return { http: TestBed.inject(HttpTestingController), session };
}

describe('DraftSession, a run computed at once', () => {
  let http: HttpTestingController;
  let session: DraftSession;

  beforeEach(() => ({ http, session } = openSession()));

  afterEach(() => http.verify());

  const answer = (response: RunResponse) => http.expectOne({ method: 'POST', url: RUN_URL }).flush(response);

  it('takes the cells the answer carries and leaves every other cell as it was', async () => {
    const before = session.cells();
    const running = session.run([ANALYSIS_ID]);
    await Promise.resolve();
    const fresh = { ...opened().cells[2]!, runState: 'current' as const, output: output({ cd: 0.0031 }, { key: 'n'.repeat(64) }) };
    answer({ branchId: BRANCH_ID, studyId: opened().studyId, revision: 3, cells: [fresh], ran: [report(FLOW_ID, 'flow', { reused: true }), report(PRESSURE_ID, 'pressure', { reused: true }), report(ANALYSIS_ID, 'analysis')] });
    await running;
    const after = session.cells();
    expect(after.map((c) => c.cellId)).toEqual([FLOW_ID, PRESSURE_ID, ANALYSIS_ID]);
    expect(after[2]!.runState).toBe('current');
    expect(after[2]!.output!.key).toBe('n'.repeat(64));
    // The cells the answer left out keep their outputs (the same objects: nothing was replaced).
    expect(after[0]).toBe(before[0]);
    expect(after[1]).toBe(before[1]);
    expect(session.draft()!.cells[2]!.output!.key).toBe('n'.repeat(64));
    expect(session.draft()!.trash).toEqual([]);
    expect(session.revision()).toBe(3);
    expect(session.running().size).toBe(0);
    http.expectNone(DRAFT_URL);
  });

  it('reads the draft when the answer is on a newer revision (someone saved while it ran)', async () => {
    const running = session.run([ANALYSIS_ID]);
    await Promise.resolve();
    answer({ branchId: BRANCH_ID, studyId: opened().studyId, revision: 4, cells: [], ran: [report(ANALYSIS_ID, 'analysis', { reused: true })] });
    await Promise.resolve();
    const theirs = opened();
    theirs.cells[0] = { ...theirs.cells[0]!, title: 'Renamed by someone else' };
    http.expectOne({ method: 'GET', url: DRAFT_URL }).flush({ ...theirs, revision: 4 });
    await running;
    expect(session.revision()).toBe(4);
    expect(session.cells()[0]!.title).toBe('Renamed by someone else');
  });

  it('shows why a cell was not computed, from what ran', async () => {
    const running = session.run([ANALYSIS_ID]);
    await Promise.resolve();
    answer({
      branchId: BRANCH_ID,
      studyId: opened().studyId,
      revision: 3,
      cells: [],
      ran: [report(ANALYSIS_ID, 'analysis', { status: 'invalid', key: null, error: { message: 'flowCellId: names no flow cell', field: 'flowCellId' } })],
    });
    await running;
    expect(session.runProblems().get(ANALYSIS_ID)).toMatchObject({ title: 'Fix the inputs first', detail: 'flowCellId: names no flow cell', field: 'flowCellId' });
    expect(session.cells()[2]!.output!.key).toBe('o'.repeat(64));
  });
});

describe('DraftSession, a run queued as a job', () => {
  const JOB_ID = '11111111-2222-4333-8444-5555555555aa';
  let http: HttpTestingController;
  let session: DraftSession;

  beforeEach(() => ({ http, session } = openSession()));

  afterEach(() => http.verify());

  it('stops showing a cell as computing once its output has landed, while the rest of the job goes on', async () => {
    const job = {
      jobId: JOB_ID,
      branchId: BRANCH_ID,
      studyId: opened().studyId,
      state: 'running' as const,
      done: 0,
      total: 3,
      cells: [FLOW_ID, PRESSURE_ID, ANALYSIS_ID].map((cellId) => ({ cellId, kind: 'flow', done: 0, total: 1 })),
      createdAt: '2026-12-02T06:00:00.000Z',
      finishedAt: null,
      createdBy: null,
    };
    const running = session.run();
    await Promise.resolve();
    http.expectOne({ method: 'POST', url: RUN_URL }).flush({ jobId: JOB_ID, job }, { status: 202, statusText: 'Accepted' });
    await new Promise((resolve) => setTimeout(resolve, 0));
    expect([...session.running()]).toEqual([FLOW_ID, PRESSURE_ID, ANALYSIS_ID]);
    expect([...session.runJobs()]).toEqual([FLOW_ID, PRESSURE_ID, ANALYSIS_ID].map((id) => [id, JOB_ID]));
    // The job stored the flow cell's output; the page reads the draft and names what landed.
    const refreshed = session.refreshOutputs(new Map([[FLOW_ID, JOB_ID]]));
    http.expectOne({ method: 'GET', url: DRAFT_URL }).flush(opened());
    await refreshed;
    expect([...session.running()]).toEqual([PRESSURE_ID, ANALYSIS_ID]);
    expect([...session.runJobs().keys()]).toEqual([PRESSURE_ID, ANALYSIS_ID]);
    // Word of an output from an earlier job of the pressure cell's does not end this run of it.
    const earlier = session.refreshOutputs(new Map([[PRESSURE_ID, '11111111-2222-4333-8444-5555555555a0']]));
    http.expectOne({ method: 'GET', url: DRAFT_URL }).flush(opened());
    await earlier;
    expect([...session.running()]).toEqual([PRESSURE_ID, ANALYSIS_ID]);
    // The job ends: the rest stop computing too.
    http.expectOne({ method: 'GET', url: `/api/jobs/${JOB_ID}` }).flush({ ...job, state: 'completed', done: 3, finishedAt: '2026-12-02T06:01:00.000Z', ran: [] });
    await new Promise((resolve) => setTimeout(resolve, 0));
    http.expectOne({ method: 'GET', url: DRAFT_URL }).flush(opened());
    await running;
    expect(session.running().size).toBe(0);
    expect(session.runJobs().size).toBe(0);
  });
});
