import { TestBed } from '@angular/core/testing';
import { HttpTestingController } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatMenuHarness } from '@angular/material/menu/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { Router } from '@angular/router';
import type { ProjectAccess, SaveConflict, VersionReviewDetail } from '@laminote/contracts';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { PROJECT_ID, problemResponse, provideTestApp, study } from '../../testing/test-app';
import { MatCheckboxHarness } from '@angular/material/checkbox/testing';
import { MEMBERS, REVIEWER_ID } from '../review/testing/review-fixtures';
import { DraftSession } from '../shared/draft-session';
import { cell, draft } from '../../testing/notebook-fixtures';
import { CellDiffListHarness } from './testing/version-harnesses';
import { MAIN_ID, STUDY_ID, V1_ID, V2_ID, V3_ID, VARIANT_ID, branch, flowChange, history, summary } from './testing/version-fixtures';
import { VersionBar } from './version-bar';

const lead: ProjectAccess = { role: 'lead', siteAdmin: false };
const viewer: ProjectAccess = { role: 'viewer', siteAdmin: false };

describe('VersionBar', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [...provideTestApp(), DraftSession] });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    // Review state shown inside the bar is the review part's to test; its requests are left unanswered here.
    http.match((r) => /\/api\/studies\/[^/]+\/review/.test(r.url));
    http.verify();
  });

  async function render(access: ProjectAccess) {
    // The draft open on the page, at revision 3, all cells with current results.
    TestBed.inject(DraftSession).open(MAIN_ID, draft([cell('flow', '11111111-2222-4333-8444-555555555501', { title: 'Cruise flow', runState: 'current' })], { branchId: MAIN_ID }));
    const fixture = TestBed.createComponent(VersionBar);
    fixture.componentRef.setInput('studyId', STUDY_ID);
    fixture.componentRef.setInput('branchId', MAIN_ID);
    fixture.componentRef.setInput('branches', [branch(), branch({ id: VARIANT_ID, name: 'thin nose', headVersionId: null, headNumber: null, forkedFromVersionId: V1_ID })]);
    fixture.componentRef.setInput('access', access);
    fixture.detectChanges();
    await fixture.whenStable();
    return { fixture, loader: TestbedHarnessEnvironment.loader(fixture), root: TestbedHarnessEnvironment.documentRootLoader(fixture) };
  }

  it('opens one dialog for two quick clicks while its code is on its way', async () => {
    const { fixture, root } = await render(lead);
    const button = Array.from((fixture.nativeElement as HTMLElement).querySelectorAll('button')).find((b) => /Save version/.test(b.textContent ?? ''))!;
    button.click();
    button.click();
    await fixture.whenStable();
    expect(await root.getAllHarnesses(MatDialogHarness)).toHaveLength(1);
  });

  it('shows the branch and its head, and saves the draft as the next version', async () => {
    const { fixture, loader, root } = await render(lead);
    expect((fixture.nativeElement as HTMLElement).textContent).toContain('v2');

    await (await loader.getHarness(MatButtonHarness.with({ text: /Save version/ }))).click();
    const dialog = await root.getHarness(MatDialogHarness);
    expect(await dialog.getTitleText()).toBe('Save version of “main”');
    expect(await dialog.getContentText()).toContain('The draft becomes version 3, after version 2');
    await (await dialog.getHarness(MatInputHarness)).setValue('Thinner nose, Re 8 million');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Save version' }))).click();

    const save = http.expectOne({ method: 'POST', url: `/api/branches/${MAIN_ID}/versions` });
    expect(save.request.body).toEqual({ message: 'Thinner nose, Re 8 million', expectedHeadVersionId: V2_ID, draftRevision: 3 });
    save.flush(summary({ id: V3_ID, number: 3, message: 'Thinner nose, Re 8 million', parentVersionId: V2_ID }), { status: 201, statusText: 'Created' });
    await fixture.whenStable();
    expect(await root.getAllHarnesses(MatDialogHarness)).toHaveLength(0);
    expect((fixture.nativeElement as HTMLElement).textContent).toContain('v3');
  });

  it('on a stale save shows what the other version changed, keeps the message and saves on top when asked', async () => {
    const { fixture, loader, root } = await render(lead);
    await (await loader.getHarness(MatButtonHarness.with({ text: /Save version/ }))).click();
    const dialog = await root.getHarness(MatDialogHarness);
    await (await dialog.getHarness(MatInputHarness)).setValue('My variant');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Save version' }))).click();

    const conflict: SaveConflict = {
      type: '/problems/conflict',
      title: 'Someone else changed this first',
      status: 409,
      detail: 'Oskar Lind saved version 3 of this branch first.',
      reason: 'headMoved',
      currentHead: summary({ id: V3_ID, number: 3, message: 'Re 8 million', parentVersionId: V2_ID }),
      newerVersions: [summary({ id: V3_ID, number: 3, message: 'Re 8 million', parentVersionId: V2_ID })],
      changes: [flowChange()],
      draftRevision: 3,
    };
    http.expectOne({ method: 'POST', url: `/api/branches/${MAIN_ID}/versions` }).flush(conflict, problemResponse(409, 'Conflict'));
    await fixture.whenStable();

    expect(await dialog.getContentText()).toContain('Oskar Lind saved version 3 first');
    const changes = await dialog.getHarness(CellDiffListHarness);
    expect(await changes.getItems()).toEqual([{ change: 'changed', title: 'Cruise flow', fields: ['Reynolds number: 4e6 → 8e6 (+100.0 %)'] }]);
    expect(await (await dialog.getHarness(MatInputHarness)).getValue()).toBe('My variant');

    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Save mine as version 4' }))).click();
    const again = http.expectOne({ method: 'POST', url: `/api/branches/${MAIN_ID}/versions` });
    expect(again.request.body).toMatchObject({ message: 'My variant', expectedHeadVersionId: V3_ID });
    again.flush(summary({ id: '00000000-0000-4000-8000-0000000000aa', number: 4, message: 'My variant' }), { status: 201, statusText: 'Created' });
    await fixture.whenStable();
    expect(await root.getAllHarnesses(MatDialogHarness)).toHaveLength(0);
  });

  it('offers a viewer the history and compare, not saving or branching', async () => {
    const { loader, root, fixture } = await render(viewer);
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /Save version/ }))).toHaveLength(0);
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /New branch/ }))).toHaveLength(0);
    const compare = await loader.getHarness(MatButtonHarness.with({ text: /Compare/ }));
    expect(await (await compare.host()).getAttribute('href')).toBe(`/studies/${STUDY_ID}/compare?b=${V2_ID}`);

    await (await loader.getHarness(MatButtonHarness.with({ text: /History/ }))).click();
    http.expectOne(`/api/studies/${STUDY_ID}/versions`).flush(history({ permissions: { saveVersion: false, branch: false, markBaseline: false, editStudy: false } }));
    await fixture.whenStable();
    const drawer = await root.getHarness(MatDialogHarness);
    const text = await drawer.getContentText();
    expect(text).toContain('Re 8 million');
    expect(text).toContain('Cruise baseline');
    // Open and "What changed" only: no menu of changes for a viewer.
    expect(await drawer.getAllHarnesses(MatMenuHarness)).toHaveLength(0);
    expect(await drawer.getAllHarnesses(MatButtonHarness.with({ text: 'What changed' }))).toHaveLength(1);
  });

  it('branches from a version of the history and opens the new branch', async () => {
    const { fixture, loader, root } = await render(lead);
    const navigate = vi.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
    await (await loader.getHarness(MatButtonHarness.with({ text: /History/ }))).click();
    http.expectOne(`/api/studies/${STUDY_ID}/versions`).flush(history());
    await fixture.whenStable();
    const drawer = await root.getHarness(MatDialogHarness);
    const menu = await drawer.getHarness(MatMenuHarness.with({ selector: '[aria-label="More for version 1 of main"]' }));
    await menu.clickItem({ text: /Branch from here/ });
    await fixture.whenStable();

    const dialog = await root.getHarness(MatDialogHarness.with({ selector: '.mat-mdc-dialog-container:has(lam-branch-dialog)' }));
    expect(await dialog.getTitleText()).toBe('New branch from version 1');
    // One sentence, no stray space before its punctuation.
    expect(await dialog.getContentText()).toContain('Its draft starts as version 1 of main (“Cruise baseline”); its own versions are numbered from 1.');
    await (await dialog.getHarness(MatInputHarness.with({ selector: '[formControlName="name"]' }))).setValue('thin nose');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Create branch' }))).click();
    const create = http.expectOne({ method: 'POST', url: `/api/versions/${V1_ID}/branches` });
    expect(create.request.body).toEqual({ name: 'thin nose', purpose: '' });
    create.flush({ ...history().branches[0]!, id: VARIANT_ID, name: 'thin nose', headVersionId: null, headNumber: null, forkedFromVersionId: V1_ID, versionCount: 0 }, { status: 201, statusText: 'Created' });
    await fixture.whenStable();
    await new Promise((r) => setTimeout(r, 0));
    expect(navigate).toHaveBeenCalledWith(['/studies', STUDY_ID], { queryParams: { branch: VARIANT_ID } });
  });

  it('restores a version into the open draft after asking, and reopens the draft the server now has', async () => {
    const { fixture, loader, root } = await render(lead);
    const session = TestBed.inject(DraftSession);
    await (await loader.getHarness(MatButtonHarness.with({ text: /History/ }))).click();
    http.expectOne(`/api/studies/${STUDY_ID}/versions`).flush(history());
    await fixture.whenStable();
    const drawer = await root.getHarness(MatDialogHarness);
    await (await drawer.getHarness(MatMenuHarness.with({ selector: '[aria-label="More for version 1 of main"]' }))).clickItem({ text: /Restore into the draft/ });
    await fixture.whenStable();

    const confirm = await root.getHarness(MatDialogHarness.with({ selector: '.mat-mdc-dialog-container:has(lam-confirm-dialog)' }));
    expect(await confirm.getTitleText()).toBe('Restore version 1?');
    await (await confirm.getHarness(MatButtonHarness.with({ text: 'Restore into the draft' }))).click();
    await fixture.whenStable();

    const restore = http.expectOne({ method: 'POST', url: `/api/branches/${MAIN_ID}/draft/restore` });
    expect(restore.request.body).toEqual({ versionId: V1_ID, baseRevision: 3 });
    restore.flush({ branchId: MAIN_ID, revision: 4, restoredFromVersionId: V1_ID, cellCount: 1, movedToTrash: [] });
    const restored = draft([cell('flow', '11111111-2222-4333-8444-555555555501', { title: 'Cruise flow, as in v1', runState: 'current' })], { branchId: MAIN_ID, revision: 4 });
    http.expectOne(`/api/branches/${MAIN_ID}/draft`).flush(restored);
    await fixture.whenStable();
    expect(session.revision()).toBe(4);
    expect(session.cells().map((c) => c.title)).toEqual(['Cruise flow, as in v1']);
  });

  it('switches branches through the notebook address', async () => {
    const { loader } = await render(lead);
    const navigate = vi.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
    const select = await loader.getHarness(MatSelectHarness);
    await select.open();
    await select.clickOptions({ text: /thin nose/ });
    await new Promise((r) => setTimeout(r, 0));
    expect(navigate).toHaveBeenCalledWith(['/studies', STUDY_ID], { queryParams: { branch: VARIANT_ID } });
  });

  /** The server's answer to a review request: the version's review, waiting for Lotte. */
  function sentForReview(versionId: string, versionNumber: number): VersionReviewDetail {
    const lotte = MEMBERS.find((m) => m.userId === REVIEWER_ID)!;
    return {
      summary: {
        versionId,
        versionNumber,
        branchId: MAIN_ID,
        state: 'none',
        approvals: 0,
        changesRequested: 0,
        pendingReviewers: [{ id: REVIEWER_ID, name: lotte.name }],
        earlierVerdict: null,
      },
      requests: [],
      verdicts: [],
      canRequest: true,
      canGiveVerdict: false,
    };
  }

  /** Answers the send-for-review dialog's look-up of the project's reviewers, then picks Lotte and sends. */
  async function sendToLotte(root: ReturnType<typeof TestbedHarnessEnvironment.documentRootLoader>, versionId: string) {
    // The dialog's code is fetched on first use: it asks for the reviewers once it is open.
    const dialog = await root.getHarness(MatDialogHarness.with({ selector: '.mat-mdc-dialog-container:has(lam-send-for-review-dialog)' }));
    for (const r of http.match(`/api/studies/${STUDY_ID}`)) r.flush(study({ id: STUDY_ID }));
    for (const r of http.match(`/api/projects/${PROJECT_ID}/members`)) r.flush(MEMBERS);
    const reviewers = await dialog.getHarness(MatSelectHarness);
    await reviewers.open();
    expect(await Promise.all((await reviewers.getOptions()).map((o) => o.getText()))).toEqual(['Lotte Brandvik']);
    await reviewers.clickOptions({ text: 'Lotte Brandvik' });
    await (await dialog.getHarness(MatInputHarness)).setValue('Cruise case, please check N_crit');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Send for review' }))).click();
    const sent = http.expectOne({ method: 'POST', url: `/api/versions/${versionId}/review-requests` });
    expect(sent.request.body).toEqual({ reviewerIds: [REVIEWER_ID], message: 'Cruise case, please check N_crit' });
    return { dialog, sent };
  }

  it('sends the head for review from the version bar', async () => {
    const { fixture, loader, root } = await render(lead);
    await (await loader.getHarness(MatButtonHarness.with({ text: /Send for review/ }))).click();
    await fixture.whenStable();
    const { sent } = await sendToLotte(root, V2_ID);
    sent.flush(sentForReview(V2_ID, 2));
    await fixture.whenStable();
    expect(await root.getAllHarnesses(MatDialogHarness)).toHaveLength(0);
  });

  it('offers to send a version for review as it is saved, and does so once it is', async () => {
    const { fixture, loader, root } = await render(lead);
    await (await loader.getHarness(MatButtonHarness.with({ text: /Save version/ }))).click();
    const save = await root.getHarness(MatDialogHarness);
    await (await save.getHarness(MatInputHarness)).setValue('Thinner nose, Re 8 million');
    await (await save.getHarness(MatCheckboxHarness.with({ label: 'Send it for review once saved' }))).check();
    await (await save.getHarness(MatButtonHarness.with({ text: 'Save version' }))).click();
    http
      .expectOne({ method: 'POST', url: `/api/branches/${MAIN_ID}/versions` })
      .flush(summary({ id: V3_ID, number: 3, message: 'Thinner nose, Re 8 million', parentVersionId: V2_ID }), { status: 201, statusText: 'Created' });
    await fixture.whenStable();
    const { dialog, sent } = await sendToLotte(root, V3_ID);
    expect(await dialog.getTitleText()).toBe('Send version 3 of main for review');
    sent.flush(sentForReview(V3_ID, 3));
  });

  it('offers a viewer no way to send for review', async () => {
    const { loader } = await render(viewer);
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /Send for review/ }))).toHaveLength(0);
  });
});
