import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatButtonToggleHarness } from '@angular/material/button-toggle/testing';
import type { VersionReviewDetail } from '@laminote/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { STUDY_ID, provideTestApp } from '../../testing/test-app';
import { BRANCH_ID, ENGINEER_ID, REVIEWER_ID, VERSION_ID } from './testing/review-fixtures';
import { VersionReview } from './version-review';

function detail(overrides: Partial<VersionReviewDetail> = {}): VersionReviewDetail {
  return {
    summary: {
      versionId: VERSION_ID,
      versionNumber: 2,
      branchId: BRANCH_ID,
      state: 'changes_requested',
      approvals: 0,
      changesRequested: 1,
      pendingReviewers: [],
      earlierVerdict: null,
    },
    requests: [
      {
        id: '9a8b7c6d-5e4f-4a3b-8c2d-1e0f9a8b7c6d',
        versionId: VERSION_ID,
        reviewer: { id: REVIEWER_ID, name: 'Lotte Brandvik' },
        requestedBy: { id: ENGINEER_ID, name: 'Dev Arjunan' },
        message: 'Please check the trip location',
        createdAt: '2026-03-05T09:00:00.000Z',
        answered: true,
      },
    ],
    verdicts: [
      {
        id: '8b7c6d5e-4f3a-4b2c-9d1e-0f9a8b7c6d5e',
        versionId: VERSION_ID,
        reviewer: { id: REVIEWER_ID, name: 'Lotte Brandvik' },
        verdict: 'changes_requested',
        summary: 'The lower-surface trip sits ahead of the pressure minimum; move it aft.',
        createdAt: '2026-03-05T10:00:00.000Z',
        current: true,
      },
    ],
    canRequest: false,
    canGiveVerdict: true,
    ...overrides,
  };
}

describe('VersionReview', () => {
  let http: HttpTestingController;
  beforeEach(() => {
    TestBed.configureTestingModule({ providers: provideTestApp() });
    http = TestBed.inject(HttpTestingController);
  });
  afterEach(() => http.verify());

  async function render(review: VersionReviewDetail) {
    const fixture = TestBed.createComponent(VersionReview);
    fixture.componentRef.setInput('versionId', VERSION_ID);
    fixture.componentRef.setInput('studyId', STUDY_ID);
    fixture.componentRef.setInput('branchName', 'main');
    fixture.detectChanges();
    http.expectOne(`/api/versions/${VERSION_ID}/review`).flush(review);
    await fixture.whenStable();
    return { fixture, loader: TestbedHarnessEnvironment.loader(fixture), text: () => (fixture.nativeElement as HTMLElement).textContent!.replace(/\s+/g, ' ') };
  }

  it('words verdicts, badges and the request as a design review, not as a code host’s pull request', async () => {
    const { loader, text } = await render(detail());
    const shown = text();
    expect(shown).toContain('Rework needed');
    expect(shown).toContain('Sent for review to');
    expect(shown).toContain('verdict given');
    const toggles = await loader.getAllHarnesses(MatButtonToggleHarness);
    expect(await Promise.all(toggles.map((t) => t.getText()))).toEqual(['task_altClear this version', 'buildSend back for rework']);
    for (const borrowed of ['Approve', 'Request changes', 'Changes requested', 'Asked to review']) expect(shown).not.toContain(borrowed);
  });

  it('says an older version’s verdict in the same words', async () => {
    const { text } = await render(
      detail({
        summary: { ...detail().summary, state: 'none', changesRequested: 0, earlierVerdict: { versionId: BRANCH_ID, versionNumber: 1, branchName: 'main', state: 'approved' } },
        requests: [],
        verdicts: [],
      }),
    );
    expect(text()).toContain('Version 1 (main) was cleared: that verdict applies to the older version, not to this one.');
    expect(text()).toContain('v1 cleared · not this version');
  });
});
