import { TestKey } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { Me } from '@laminote/contracts';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { PROJECT_ID, STUDY_ID, me, provideTestApp, signInAs, study } from '../../testing/test-app';
import { CellThreads } from './cell-threads';
import { CellThreadsButton } from './cell-threads-button';
import { BRANCH_ID, CELL_ID, MEMBERS, thread } from './testing/review-fixtures';
import { CellThreadsButtonHarness, CellThreadsHarness } from './testing/review-harnesses';

function as(role: 'reviewer' | 'viewer'): Me {
  const person = me({ name: role === 'reviewer' ? 'Lotte Brandvik' : 'Pim Vasquez' });
  return { ...person, memberships: [{ projectId: PROJECT_ID, projectName: 'Larkspur T-62 wing', role }] };
}

describe('CellThreads', () => {
  let http: HttpTestingController;
  beforeEach(() => {
    TestBed.configureTestingModule({ providers: provideTestApp() });
    http = TestBed.inject(HttpTestingController);
  });
  afterEach(() => http.verify());

  async function render(role: 'reviewer' | 'viewer', threadList = [
      thread({ id: 'e4f5a6b7-c8d9-4e0f-9a1b-2c3d4e5f6a7b', anchor: { surface: 'upper', x: 0.42 }, onThisView: false, cellChanged: true }),
      thread({ id: 'f5a6b7c8-d9e0-4f1a-8b2c-3d4e5f6a7b8c', resolved: true }),
      thread({ id: 'a6b7c8d9-e0f1-4a2b-9c3d-4e5f6a7b8c9d', cellId: 'b7c8d9e0-f1a2-4b3c-8d4e-5f6a7b8c9d0e' }),
    ]) {
    await signInAs(as(role));
    const button = TestBed.createComponent(CellThreadsButton);
    const panel = TestBed.createComponent(CellThreads);
    for (const f of [button, panel]) {
      f.componentRef.setInput('cellId', CELL_ID);
      f.componentRef.setInput('studyId', STUDY_ID);
      f.componentRef.setInput('branchId', BRANCH_ID);
    }
    panel.componentRef.setInput('surfaces', ['upper', 'lower']);
    button.detectChanges();
    panel.detectChanges();
    // One request for the study's threads serves every cell on the page; the study and its members once.
    const threads = http.expectOne((r) => r.url === `/api/studies/${STUDY_ID}/threads`);
    expect(threads.request.params.get('branchId')).toBe(BRANCH_ID);
    threads.flush(threadList);
    for (const r of http.match(`/api/studies/${STUDY_ID}`)) r.flush(study());
    for (const r of http.match(`/api/projects/${PROJECT_ID}/members`)) r.flush(MEMBERS);
    const buttonHarness = await TestbedHarnessEnvironment.harnessForFixture(button, CellThreadsButtonHarness);
    const panelHarness = await TestbedHarnessEnvironment.harnessForFixture(panel, CellThreadsHarness);
    button.detectChanges();
    return { buttonHarness, panelHarness, panel, button };
  }

  it('opens from the cell head with this cell’s threads, open ones first, and the places they point at', async () => {
    const { buttonHarness, panelHarness } = await render('reviewer');
    expect(await buttonHarness.getLabel()).toBe('Show comments: 1 open of 2 threads');
    expect(await panelHarness.isOpen()).toBe(false);
    // Closed, the open thread that points at the plot still shows its pin beside it.
    expect(await panelHarness.getPins()).toEqual(['x/c 0.420 on upper: Is N_crit 9 right for cruise?']);
    await buttonHarness.toggle();
    expect(await panelHarness.isOpen()).toBe(true);
    expect(await panelHarness.getCounts()).toBe('1 open · 1 resolved');
    // Resolved threads are folded away until asked for.
    expect(await panelHarness.getThreads()).toHaveLength(1);
    await panelHarness.showResolved();
    const threads = await panelHarness.getThreads();
    expect(threads).toHaveLength(2);
    expect(await threads[0]!.saysCellChanged()).toBe(true);
    expect(await threads[1]!.getResolvedNote()).toBe('Resolved');
    expect(await panelHarness.getPins()).toEqual(['x/c 0.420 on upper: Is N_crit 9 right for cruise?']);
  });

  it('starts a thread on the draft pointing at x/c on a surface', async () => {
    const { buttonHarness, panelHarness } = await render('reviewer');
    await buttonHarness.toggle();
    await panelHarness.pointAt('lower', '0.35');
    const box = (await panelHarness.getNewThreadBox())!;
    await box.type('Laminar separation bubble here? @Dev');
    expect(await box.getSuggestions()).toEqual(['Dev Arjunan (engineer)']);
    await box.press(TestKey.ENTER);
    await box.send();
    const req = http.expectOne((r) => r.method === 'POST' && r.url === `/api/studies/${STUDY_ID}/threads`);
    expect(req.request.body).toEqual({ cellId: CELL_ID, versionId: null, branchId: BRANCH_ID, body: 'Laminar separation bubble here? @Dev Arjunan', anchor: { surface: 'lower', x: 0.35 } });
    req.flush(thread({ id: 'c8d9e0f1-a2b3-4c4d-9e5f-6a7b8c9d0e1f', anchor: { surface: 'lower', x: 0.35 } }));
    expect(await panelHarness.getThreads()).toHaveLength(2);
    expect(await (await panelHarness.getNewThreadBox())!.getText()).toBe('');
  });

  it('lets a viewer read but offers no box to write in', async () => {
    const { buttonHarness, panelHarness } = await render('viewer');
    await buttonHarness.toggle();
    expect(await panelHarness.getThreads()).toHaveLength(1);
    expect(await panelHarness.getNewThreadBox()).toBeNull();
    expect(await panelHarness.getReadOnlyNote()).toBe('You read these comments as viewer.');
  });

  it('brings the opened panel into view, as it opens below a cell that may be taller than the screen', async () => {
    const scrolled: Element[] = [];
    const original = Element.prototype.scrollIntoView;
    Element.prototype.scrollIntoView = vi.fn(function (this: Element) {
      scrolled.push(this);
    });
    try {
      const { buttonHarness, panel } = await render('reviewer');
      await buttonHarness.toggle();
      await new Promise((r) => setTimeout(r, 10));
      expect(scrolled).toContain((panel.nativeElement as HTMLElement).querySelector('.panel'));
    } finally {
      Element.prototype.scrollIntoView = original;
    }
  });

  it('offers a viewer no Comment button on a cell without comments, and the count where there are some', async () => {
    const quiet = await render('viewer', []);
    expect(await quiet.buttonHarness.isShown()).toBe(false);
    TestBed.resetTestingModule();
    TestBed.configureTestingModule({ providers: provideTestApp() });
    http = TestBed.inject(HttpTestingController);
    const busy = await render('viewer');
    expect(await busy.buttonHarness.isShown()).toBe(true);
    expect(await busy.buttonHarness.getLabel()).toBe('Show comments: 1 open of 2 threads');
  });
});
