import { DeferBlockBehavior, DeferBlockState, TestBed } from '@angular/core/testing';
import { HttpTestingController } from '@angular/common/http/testing';
import { TestKey } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatMenuItemHarness } from '@angular/material/menu/testing';
import type { Branch, Draft, Me } from '@laminote/contracts';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { PROJECT_ID, STUDY_ID, me, problemResponse, provideTestApp, signInAs, study } from '../../testing/test-app';
import { PLOT_RENDERER } from '../shared/plot';
import { resetPlotScheduleForTests, scheduleDraw } from '../shared/plot-schedule';
import { AUTOSAVE_DELAY_MS } from '../shared/draft-session';
import { BranchJobs } from './branch-jobs';
import { NotebookPage } from './notebook-page';
import { CellFrameHarness } from './testing/cell-frame-harness';
import { ANALYSIS_ID, BRANCH_ID, FLOW_ID, NOTE_ID, PRESSURE_ID, cell, draft } from '../../testing/notebook-fixtures';

const branch: Branch = {
  id: BRANCH_ID,
  studyId: STUDY_ID,
  name: 'main',
  purpose: '',
  forkedFromVersionId: null,
  headVersionId: null,
  archived: false,
  createdBy: null,
  createdAt: '2026-03-03T10:00:00.000Z',
};

function stack(): Draft {
  return draft([
    cell('flow', FLOW_ID, { title: 'Cruise, M 0.78' }),
    cell('pressure', PRESSURE_ID, { title: 'Outboard Cp (invented)' }),
    cell('analysis', ANALYSIS_ID, { title: 'Free transition' }),
  ]);
}

function asRole(role: 'engineer' | 'viewer' | 'reviewer'): Me {
  const person = me();
  return { ...person, memberships: [{ projectId: PROJECT_ID, projectName: 'Larkspur T-62 wing', role }] };
}

const settle = (ms = 20) => new Promise((resolve) => setTimeout(resolve, ms));

/** Frames laid out 500 px apart in a 768-px window (this test DOM does no layout): the first two start on the screen. */
function layOutFrames500PxApart(): void {
  vi.spyOn(HTMLElement.prototype, 'getBoundingClientRect').mockImplementation(function (this: HTMLElement) {
    const frames = Array.from(document.querySelectorAll('lam-cell-frame'));
    const top = this.tagName === 'LAM-CELL-FRAME' ? frames.indexOf(this) * 500 : 0;
    return { top, bottom: top + 400, left: 0, right: 800, width: 800, height: 400, x: 0, y: top, toJSON: () => ({}) } as DOMRect;
  });
  vi.spyOn(window, 'innerHeight', 'get').mockReturnValue(768);
}

/** Five notes, `Note 1` … `Note 5` reading `Reading 1` …, ids ending in `idTail` and their index. */
function fiveNotes(idTail: string) {
  return Array.from({ length: 5 }, (_, i) => cell('note', `11111111-2222-4333-8444-555555555${idTail}${String(i).padStart(2, '0')}`, { title: `Note ${i + 1}`, inputs: { markdown: `Reading ${i + 1}` } }));
}

describe('NotebookPage', () => {
  let http: HttpTestingController;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [NotebookPage],
      providers: [
        ...provideTestApp(),
        { provide: AUTOSAVE_DELAY_MS, useValue: 5 },
        { provide: PLOT_RENDERER, useValue: () => new Promise<never>(() => undefined) },
      ],
    });
    // The cell bodies are deferred blocks (loaded apart from the page): their components resolve here.
    await TestBed.compileComponents();
    http = TestBed.inject(HttpTestingController);
  });

  // Only the notebook's own calls are checked here: the review and versions parts plugged into the page
  // make theirs, which their own tests cover.
  afterEach(() => {
    const open = http.match((request) => request.url.startsWith('/api/branches/') || request.url.endsWith('/run'));
    expect(open.map((r) => `${r.request.method} ${r.request.url}`)).toEqual([]);
  });

  /** The page, its study read (not waiting for it to settle: the tests that run the idle moments themselves). */
  async function openUnsettled(person: Me, opened: Draft = stack()) {
    await signInAs(person);
    const fixture = TestBed.createComponent(NotebookPage);
    fixture.componentRef.setInput('studyId', STUDY_ID);
    fixture.detectChanges();
    // The study, its branches and the draft in one read (GET …/opening).
    http.expectOne({ method: 'GET', url: `/api/studies/${STUDY_ID}/opening` }).flush({ study: study(), branches: [branch], draft: opened });
    return fixture;
  }

  async function open(person: Me, opened: Draft = stack()) {
    const fixture = await openUnsettled(person, opened);
    await fixture.whenStable();
    return {
      fixture,
      loader: TestbedHarnessEnvironment.loader(fixture),
      root: TestbedHarnessEnvironment.documentRootLoader(fixture),
    };
  }

  it('asks for the branch named in the address with the study, in one read; a name no branch has is not found', async () => {
    await signInAs(asRole('engineer'));
    const fixture = TestBed.createComponent(NotebookPage);
    fixture.componentRef.setInput('studyId', STUDY_ID);
    fixture.componentRef.setInput('branch', 'wing tip & fairing');
    fixture.detectChanges();
    // Written as early-reads.js writes it, so its early answer is taken.
    const read = http.expectOne({ method: 'GET', url: `/api/studies/${STUDY_ID}/opening?branch=wing%20tip%20%26%20fairing` });
    read.flush({ study: study(), branches: [branch], draft: null });
    await fixture.whenStable();
    expect((fixture.nativeElement as HTMLElement).querySelector('lam-not-found')).not.toBeNull();
    expect((fixture.nativeElement as HTMLElement).querySelector('lam-cell-frame')).toBeNull();
  });

  it('saves an edit on top of the revision it was made on', async () => {
    const { fixture, loader } = await open(asRole('engineer'));
    const frame = await loader.getHarness(CellFrameHarness.with({ title: 'Free transition' }));
    await frame.setTitle('Free transition, cruise');
    await settle();
    const save = http.expectOne({ method: 'PUT', url: `/api/branches/${BRANCH_ID}/draft` });
    expect(save.request.body.baseRevision).toBe(3);
    expect(save.request.body.cells.map((c: { title: string }) => c.title)).toEqual(['Cruise, M 0.78', 'Outboard Cp (invented)', 'Free transition, cruise']);
    save.flush({ ...stack(), revision: 4, cells: stack().cells.map((c) => (c.cellId === ANALYSIS_ID ? { ...c, title: 'Free transition, cruise' } : c)) });
    await fixture.whenStable();
    expect(await (await loader.getHarness(MatButtonHarness.with({ text: /Run study/ }))).isDisabled()).toBe(false);
  });

  it('on the way out, holds the page while an edit waits and sends it at once; a saved draft lets it go', async () => {
    const { fixture, loader } = await open(asRole('engineer'));
    const leave = () => {
      const event = new Event('beforeunload', { cancelable: true });
      window.dispatchEvent(event);
      return event.defaultPrevented;
    };
    expect(leave()).toBe(false);
    const frame = await loader.getHarness(CellFrameHarness.with({ title: 'Free transition' }));
    await frame.setTitle('Free transition, cruise');
    // Before the autosave's pause is over: the browser is asked to hold the page, and the edit goes now.
    expect(leave()).toBe(true);
    const save = http.expectOne({ method: 'PUT', url: `/api/branches/${BRANCH_ID}/draft` });
    expect(save.request.body.cells.map((c: { title: string }) => c.title)).toContain('Free transition, cruise');
    save.flush({ ...stack(), revision: 4, cells: stack().cells.map((c) => (c.cellId === ANALYSIS_ID ? { ...c, title: 'Free transition, cruise' } : c)) });
    await fixture.whenStable();
    expect(leave()).toBe(false);
    // A page that is gone no longer listens.
    await frame.setTitle('Free transition, climb');
    fixture.destroy();
    expect(leave()).toBe(false);
  });

  it('on 409 shows what the other person changed and, on “Keep mine”, saves again on their revision', async () => {
    const { fixture, loader, root } = await open(asRole('engineer'));
    await (await loader.getHarness(CellFrameHarness.with({ title: 'Free transition' }))).setTitle('Tripped at 5 %');
    await settle();

    // Meanwhile Mara renamed the flow cell and added a note (revision 4).
    const theirs: Draft = {
      ...stack(),
      revision: 4,
      updatedBy: { id: '9a8b7c6d-5e4f-4a3b-8c2d-1e0f9a8b7c6d', name: 'Mara Okonkwo' },
      cells: [
        cell('flow', FLOW_ID, { title: 'Cruise, M 0.80' }),
        cell('pressure', PRESSURE_ID, { title: 'Outboard Cp (invented)' }),
        cell('analysis', ANALYSIS_ID, { title: 'Free transition' }),
        cell('note', NOTE_ID, { title: 'Why M 0.80', inputs: { markdown: 'Tamsk asked for the faster cruise.' } }),
      ],
    };
    http
      .expectOne({ method: 'PUT', url: `/api/branches/${BRANCH_ID}/draft` })
      .flush(
        { type: 'https://laminote.example/problems/conflict', title: 'The draft changed', status: 409, current: theirs },
        problemResponse(409, 'Conflict'),
      );
    await fixture.whenStable();

    const dialog = await root.getHarness(MatDialogHarness);
    const text = await dialog.getText();
    expect(text).toContain('Mara Okonkwo saved');
    expect(text).toMatch(/Their changes.*Cruise, M 0\.80.*Flow condition.*changed \(title\).*Why M 0\.80.*Note.*added/s);
    expect(text).toMatch(/Your unsaved changes.*Tripped at 5 %.*Transition analysis.*changed \(title\)/s);
    // Nothing is saved while the person has not chosen.
    await settle();
    http.expectNone({ method: 'PUT' });

    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Keep mine' }))).click();
    await settle();
    const again = http.expectOne({ method: 'PUT', url: `/api/branches/${BRANCH_ID}/draft` });
    expect(again.request.body.baseRevision).toBe(4);
    expect(again.request.body.cells.map((c: { title: string }) => c.title)).toEqual(['Cruise, M 0.78', 'Outboard Cp (invented)', 'Tripped at 5 %']);
    again.flush({ ...theirs, revision: 5, cells: stack().cells.map((c) => (c.cellId === ANALYSIS_ID ? { ...c, title: 'Tripped at 5 %' } : c)) });
    await fixture.whenStable();
    expect(await root.getAllHarnesses(MatDialogHarness)).toHaveLength(0);
  });

  it('on “Take theirs” shows their stack and saves nothing', async () => {
    const { fixture, loader, root } = await open(asRole('engineer'));
    await (await loader.getHarness(CellFrameHarness.with({ title: 'Free transition' }))).setTitle('Mine');
    await settle();
    const theirs: Draft = { ...stack(), revision: 4, cells: [cell('flow', FLOW_ID, { title: 'Theirs only' })] };
    http
      .expectOne({ method: 'PUT' })
      .flush({ type: 'about:blank', title: 'Conflict', status: 409, current: theirs }, problemResponse(409, 'Conflict'));
    await fixture.whenStable();
    const dialog = await root.getHarness(MatDialogHarness);
    expect(await dialog.getText()).toMatch(/Their changes.*Outboard Cp \(invented\).*removed/s);
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Take theirs' }))).click();
    await settle();
    http.expectNone({ method: 'PUT' });
    const frames = await loader.getAllHarnesses(CellFrameHarness);
    expect(await Promise.all(frames.map((f) => f.getTitle()))).toEqual(['Theirs only']);
  });

  it('brings a removed cell back from “Recently removed”', async () => {
    const { fixture, loader } = await open(asRole('engineer'));
    await (await loader.getHarness(CellFrameHarness.with({ title: 'Outboard Cp (invented)' }))).chooseAction('Remove');
    expect(await loader.getAllHarnesses(CellFrameHarness)).toHaveLength(2);
    await (await loader.getHarness(MatButtonHarness.with({ text: /Bring back/ }))).click();
    const frames = await loader.getAllHarnesses(CellFrameHarness);
    expect(await Promise.all(frames.map((f) => f.getTitle()))).toEqual(['Cruise, M 0.78', 'Free transition', 'Outboard Cp (invented)']);
    await settle();
    const save = http.expectOne({ method: 'PUT' });
    expect(save.request.body.cells).toHaveLength(3);
    save.flush({ ...stack(), revision: 4 });
    await fixture.whenStable();
  });

  it('keeps the bodies it has drawn when a cell is added above them', async () => {
    // The drawn bodies were a count from the top: a copy of the first cell left the last one "Drawing…".
    const { fixture, loader } = await open(asRole('engineer'));
    const page = fixture.nativeElement as HTMLElement;
    expect(page.querySelectorAll('.body-pending')).toHaveLength(0);
    await (await loader.getHarness(CellFrameHarness.with({ title: 'Cruise, M 0.78' }))).chooseAction('Duplicate');
    await fixture.whenStable();
    expect(await loader.getAllHarnesses(CellFrameHarness)).toHaveLength(4);
    expect(page.querySelectorAll('.body-pending')).toHaveLength(0);
    expect(page.querySelectorAll('lam-add-cell')).toHaveLength(5);
    await settle();
    const save = http.expectOne({ method: 'PUT' });
    expect(save.request.body.cells).toHaveLength(4);
    save.flush({ ...stack(), revision: 4, cells: save.request.body.cells });
    await fixture.whenStable();
  });

  it('runs one cell after saving what waits, and shows the new run state', async () => {
    const { fixture, loader } = await open(asRole('engineer'));
    const flow = await loader.getHarness(CellFrameHarness.with({ title: 'Cruise, M 0.78' }));
    await flow.run();
    await settle();
    const run = http.expectOne({ method: 'POST', url: `/api/branches/${BRANCH_ID}/run` });
    expect(run.request.body).toEqual({ cellIds: [FLOW_ID] });
    expect(await flow.getRunState()).toBe('Computing…');
    const after = stack();
    after.cells[0] = { ...after.cells[0], runState: 'current' };
    run.flush({ ...after, ran: [{ cellId: FLOW_ID, kind: 'flow', status: 'ok', reused: false, key: 'k', durationMs: 3, error: null }] });
    await fixture.whenStable();
    expect(await flow.getRunState()).toBe('Up to date');
  });

  it('offers the whole study as one download, to a viewer too', async () => {
    const { loader } = await open(asRole('viewer'));
    const link = await loader.getHarness(MatButtonHarness.with({ selector: 'a.download-study' }));
    const host = await link.host();
    expect(await host.getAttribute('href')).toBe(`/api/branches/${BRANCH_ID}/export`);
    expect(await host.getAttribute('download')).not.toBeNull();
    expect(await host.getAttribute('aria-label')).toBe('Download the study');
  });

  it('saves a waiting edit before it runs, so the run computes what is on screen', async () => {
    const { fixture, loader } = await open(asRole('engineer'));
    const flow = await loader.getHarness(CellFrameHarness.with({ title: 'Cruise, M 0.78' }));
    await (await loader.getHarness(MatInputHarness.with({ selector: '[formControlName="mach"]' }))).setValue('0.8');
    await flow.run();
    const save = http.expectOne({ method: 'PUT', url: `/api/branches/${BRANCH_ID}/draft` });
    expect(save.request.body.cells[0].inputs.mach).toBe(0.8);
    http.expectNone({ method: 'POST' });
    const saved = stack();
    saved.cells[0] = { ...saved.cells[0], inputs: { ...saved.cells[0].inputs, mach: 0.8 } };
    save.flush({ ...saved, revision: 4 });
    await settle();
    const run = http.expectOne({ method: 'POST', url: `/api/branches/${BRANCH_ID}/run` });
    run.flush({ ...saved, revision: 4, ran: [] });
    await fixture.whenStable();
  });

  it('moves a cell with Alt+Shift+arrows and runs it with Ctrl+Enter', async () => {
    const { fixture, loader } = await open(asRole('engineer'));
    const titles = async () => Promise.all((await loader.getAllHarnesses(CellFrameHarness)).map((f) => f.getTitle()));
    const pressure = await loader.getHarness(CellFrameHarness.with({ title: 'Outboard Cp (invented)' }));
    await pressure.pressInTitle({ alt: true, shift: true }, TestKey.UP_ARROW);
    expect(await titles()).toEqual(['Outboard Cp (invented)', 'Cruise, M 0.78', 'Free transition']);
    await pressure.pressInTitle({ alt: true, shift: true }, TestKey.DOWN_ARROW);
    await pressure.pressInTitle({ alt: true, shift: true }, TestKey.DOWN_ARROW);
    expect(await titles()).toEqual(['Cruise, M 0.78', 'Free transition', 'Outboard Cp (invented)']);
    await settle();
    const save = http.expectOne({ method: 'PUT' });
    expect(save.request.body.cells.map((c: { cellId: string }) => c.cellId)).toEqual([FLOW_ID, ANALYSIS_ID, PRESSURE_ID]);
    save.flush({ ...stack(), revision: 4, cells: [stack().cells[0], stack().cells[2], stack().cells[1]] });
    await fixture.whenStable();

    await pressure.pressInTitle({ control: true }, TestKey.ENTER);
    await settle();
    const run = http.expectOne({ method: 'POST', url: `/api/branches/${BRANCH_ID}/run` });
    expect(run.request.body).toEqual({ cellIds: [PRESSURE_ID] });
    run.flush({ ...stack(), revision: 4, ran: [] });
    await fixture.whenStable();
  });

  it('adds the kind picked from one shared list where the control that opened it stands, and opens it below a cell with Alt+Enter', async () => {
    const { fixture, loader, root } = await open(asRole('engineer'));
    const page = fixture.nativeElement as HTMLElement;
    // One list of kinds for the page, whichever of its five controls opens it.
    expect(page.querySelectorAll('lam-add-cell')).toHaveLength(4);
    expect(page.querySelectorAll('lam-add-cell-menu')).toHaveLength(1);
    // The kinds are enabled once their schemas have loaded (at the first idle moment).
    await settle();
    await (await loader.getHarness(MatButtonHarness.with({ selector: '[aria-label="Insert a cell at position 3"]' }))).click();
    await (await root.getHarness(MatMenuItemHarness.with({ text: /Note\s*Markdown text/ }))).click();
    await fixture.whenStable();
    await (await loader.getHarness(MatButtonHarness.with({ text: /Add cell/ }))).click();
    await (await root.getHarness(MatMenuItemHarness.with({ text: /Flow condition/ }))).click();
    await fixture.whenStable();

    // Alt+Enter in the first cell opens the list from the line below it (position 2).
    const flow = await loader.getHarness(CellFrameHarness.with({ title: 'Cruise, M 0.78' }));
    await flow.pressInTitle({ alt: true }, TestKey.ENTER);
    await (await root.getHarness(MatMenuItemHarness.with({ text: /Note\s*Markdown text/ }))).click();
    await fixture.whenStable();
    // The edits are saved one after another: the last save holds all three.
    let saved: { baseRevision: number; cells: { kind: string }[] } | null = null;
    for (let save; await settle(), (save = http.match({ method: 'PUT' })[0]); ) {
      saved = save.request.body;
      save.flush({ ...stack(), revision: saved!.baseRevision + 1, cells: saved!.cells });
      await fixture.whenStable();
    }
    expect(saved!.cells.map((c) => c.kind)).toEqual(['flow', 'note', 'pressure', 'note', 'analysis', 'flow']);
  });

  it('draws every frame of a long study at once and the bodies below the first screen soon after', async () => {
    const cells = Array.from({ length: 9 }, (_, i) => cell('note', `11111111-2222-4333-8444-5555555556${String(i).padStart(2, '0')}`, { title: `Note ${i + 1}`, inputs: { markdown: `Reading ${i + 1}` } }));
    const { fixture, loader } = await open(asRole('engineer'), draft(cells));
    expect(await loader.getAllHarnesses(CellFrameHarness)).toHaveLength(9);
    await fixture.whenStable();
    const frames = await loader.getAllHarnesses(CellFrameHarness);
    expect(await frames[8].isCollapsed()).toBe(false);
    // The frames below the first screen get their buttons with their bodies.
    expect(await frames[8].hasActions()).toBe(true);
    expect((fixture.nativeElement as HTMLElement).querySelectorAll('.body-pending')).toHaveLength(0);
    expect((fixture.nativeElement as HTMLElement).textContent).toContain('Reading 9');
  });

  it('draws at once the bodies of the cells whose frames start on the screen, and the others one per idle moment', async () => {
    layOutFrames500PxApart();
    // Idle moments come when the test says (Angular's own idle triggers wait in the same queue).
    const idle: (() => void)[] = [];
    vi.stubGlobal('requestIdleCallback', (next: () => void) => idle.push(next));
    vi.stubGlobal('cancelIdleCallback', () => undefined);
    try {
      const fixture = await openUnsettled(asRole('engineer'), draft(fiveNotes('7')));
      const page = fixture.nativeElement as HTMLElement;
      const pending = () => page.querySelectorAll('.body-pending').length;
      const until = async (done: () => boolean) => {
        for (let i = 0; i < 100 && !done(); i++) await settle(10);
      };
      await until(() => page.textContent!.includes('Reading 2') && idle.length > 0);
      await settle(50);
      expect(page.querySelectorAll('lam-cell-frame')).toHaveLength(5);
      // The two on the screen are drawn; the three below wait for the browser to be idle.
      expect(page.textContent).toContain('Reading 2');
      expect(page.textContent).not.toContain('Reading 3');
      expect(page.querySelectorAll('.body-pending')).toHaveLength(3);
      // The insertion lines below the held cells come with their bodies; their places are kept meanwhile
      // (the top line, two below drawn cells, the end button; held places below cells 3 and 4).
      expect(page.querySelectorAll('lam-add-cell')).toHaveLength(4);
      expect(page.querySelectorAll('.add-held')).toHaveLength(2);
      // A held body is only its placeholder, as tall as a drawn note: its component (and its kind's code) comes when drawn.
      const held = page.querySelectorAll('lam-cell-frame')[4]!;
      expect(held.querySelector('lam-cell-body')).toBeNull();
      expect(held.querySelector<HTMLElement>('.body .body-pending')!.style.minHeight).toBe('90px');
      // Each idle moment draws one more body.
      const idleMoment = async () => {
        const before = pending();
        for (const next of idle.splice(0)) next();
        await until(() => pending() < before && idle.length > 0);
      };
      await idleMoment();
      const frames = page.querySelectorAll('lam-cell-frame');
      expect(frames[2]!.querySelector('.body-pending')).toBeNull();
      expect(frames[3]!.querySelector('.body-pending')).not.toBeNull();
      expect(pending()).toBe(2);
      expect(page.querySelectorAll('.add-held')).toHaveLength(1);
      // Alt+Enter in a held cell draws it, with the line below it, and opens the list from that line.
      const title = frames[3]!.querySelector<HTMLInputElement>('input.title-input')!;
      title.focus();
      title.dispatchEvent(new KeyboardEvent('keydown', { key: 'Enter', altKey: true, bubbles: true }));
      await until(() => document.querySelector('.lam-add-cell-menu') !== null);
      expect(frames[3]!.querySelector('.body-pending')).toBeNull();
      expect(page.querySelectorAll('.add-held')).toHaveLength(0);
      expect(page.querySelector('[aria-label="Insert a cell at position 5"]')!.getAttribute('aria-expanded')).toBe('true');
      for (const next of idle.splice(0)) next();
      await until(() => pending() === 0);
      for (const next of idle.splice(0)) next();
      await fixture.whenStable();
      expect(pending()).toBe(0);
      expect(page.querySelectorAll('lam-add-cell')).toHaveLength(6);
      expect(page.textContent).toContain('Reading 5');
    } finally {
      vi.restoreAllMocks();
      vi.unstubAllGlobals();
    }
  });

  it('holds the bodies out of sight back while a plot near the window waits for the page to go quiet', async () => {
    layOutFrames500PxApart();
    // Idle moments come when the test says, each a full idle period (50 ms with nothing else to do).
    const idle: ((deadline: IdleDeadline) => void)[] = [];
    vi.stubGlobal('requestIdleCallback', (next: (deadline: IdleDeadline) => void) => idle.push(next));
    vi.stubGlobal('cancelIdleCallback', () => undefined);
    resetPlotScheduleForTests();
    try {
      // A plot near the window has asked to be drawn (as a pressure cell's does when it comes near).
      const plot = vi.fn();
      scheduleDraw(plot);
      const fixture = await openUnsettled(asRole('engineer'), draft(fiveNotes('8')));
      const page = fixture.nativeElement as HTMLElement;
      const pending = () => page.querySelectorAll('.body-pending').length;
      const idleMoment = async () => {
        for (const next of idle.splice(0)) next({ didTimeout: false, timeRemaining: () => 50 });
        for (let i = 0; i < 5; i++) await settle(5);
      };
      for (let i = 0; i < 100 && !page.textContent!.includes('Reading 2'); i++) await settle(10);
      expect(pending()).toBe(3);
      // Quiet takes six full idle periods in a row: until then the three bodies below wait, and the plot too.
      for (let i = 0; i < 5; i++) await idleMoment();
      expect(pending()).toBe(3);
      expect(plot).not.toHaveBeenCalled();
      // Quiet: the plot is drawn at the next idle moment, and the bodies go on, one per idle moment.
      await idleMoment();
      await idleMoment();
      expect(plot).toHaveBeenCalledTimes(1);
      for (let i = 0; i < 10 && pending() > 0; i++) await idleMoment();
      expect(pending()).toBe(0);
      // The loop ends at its next idle moment (the page is busy until then).
      await idleMoment();
      await idleMoment();
      await fixture.whenStable();
    } finally {
      resetPlotScheduleForTests();
      vi.restoreAllMocks();
      vi.unstubAllGlobals();
    }
  });

  for (const role of ['viewer', 'reviewer'] as const) {
    it(`gives a ${role} a read-only notebook`, async () => {
      const { loader } = await open(asRole(role));
      expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /Add cell|Run study/ }))).toHaveLength(0);
      const frames = await loader.getAllHarnesses(CellFrameHarness);
      expect(frames).toHaveLength(3);
      for (const frame of frames) {
        expect(await frame.isTitleEditable()).toBe(false);
        expect(await frame.hasActions()).toBe(false);
        expect(await frame.canRun()).toBe(false);
      }
      const mach = await loader.getHarness(MatInputHarness.with({ selector: '[formControlName="mach"]' }));
      expect(await mach.isDisabled()).toBe(true);
      expect(await (await loader.getHarness(MatInputHarness.with({ selector: 'textarea' }))).isDisabled()).toBe(true);
    });
  }
});

describe('NotebookPage, when code fetched on first use does not load', () => {
  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [NotebookPage],
      providers: [...provideTestApp(), { provide: PLOT_RENDERER, useValue: () => new Promise<never>(() => undefined) }],
      // The deferred blocks are put in each state by the test (DeferBlockFixture.render).
      deferBlockBehavior: DeferBlockBehavior.Manual,
    });
    await TestBed.compileComponents();
  });

  it('says so in place of a run’s progress and of the recently removed cells', async () => {
    await signInAs(asRole('engineer'));
    const fixture = TestBed.createComponent(NotebookPage);
    fixture.componentRef.setInput('studyId', STUDY_ID);
    fixture.detectChanges();
    const removed = { cellId: NOTE_ID, kind: 'note' as const, title: 'Old note', collapsed: false, inputs: {}, deletedAt: '2026-03-03T11:00:00.000Z', deletedBy: null };
    TestBed.inject(HttpTestingController)
      .expectOne({ method: 'GET', url: `/api/studies/${STUDY_ID}/opening` })
      .flush({ study: study(), branches: [branch], draft: { ...stack(), trash: [removed] } });
    await fixture.whenStable();
    fixture.debugElement.injector.get(BranchJobs).add({
      jobId: '11111111-2222-4333-8444-5555555555aa',
      branchId: BRANCH_ID,
      studyId: STUDY_ID,
      state: 'running',
      done: 1,
      total: 10,
      cells: [{ cellId: ANALYSIS_ID, kind: 'analysis', done: 1, total: 10 }],
      createdAt: '2026-03-03T11:05:00.000Z',
      finishedAt: null,
      createdBy: null,
    });
    fixture.detectChanges();
    // Every deferred block that has words for a failed load shows them (the others show nothing).
    for (const block of await fixture.getDeferBlocks()) await block.render(DeferBlockState.Error).catch(() => undefined);
    const said = Array.from((fixture.nativeElement as HTMLElement).querySelectorAll('.lam-load-failed[role="alert"]'), (p) => p.textContent?.trim());
    expect(said).toEqual([
      'A run is under way, but its progress could not be shown: its code did not load. Reload the page to follow it or stop it.',
      'The recently removed cells could not be listed: their code did not load. Reload the page to see them.',
    ]);
  });
});
