import { DeferBlockBehavior, DeferBlockState, TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import type { DraftCell } from '@laminote/contracts';
import { beforeEach, describe, expect, it } from 'vitest';
import { provideTestApp } from '../../testing/test-app';
import { CellFrame } from './cell-frame';
import { CellFrameHarness } from './testing/cell-frame-harness';
import { FLOW_ID, cell, output } from '../../testing/notebook-fixtures';

describe('CellFrame', () => {
  beforeEach(async () => {
    // The comments are a deferred block (loaded apart from the first screen): its components resolve here.
    TestBed.configureTestingModule({ imports: [CellFrame], providers: provideTestApp() });
    await TestBed.compileComponents();
  });

  async function render(frameCell: DraftCell, options: { index?: number; count?: number; editable?: boolean; mayRun?: boolean } = {}) {
    const fixture = TestBed.createComponent(CellFrame);
    fixture.componentRef.setInput('cell', frameCell);
    fixture.componentRef.setInput('index', options.index ?? 0);
    fixture.componentRef.setInput('count', options.count ?? 3);
    fixture.componentRef.setInput('editable', options.editable ?? true);
    fixture.componentRef.setInput('mayRun', options.mayRun ?? true);
    const events: string[] = [];
    const frame = fixture.componentInstance;
    frame.runRequested.subscribe(() => events.push('run'));
    frame.duplicateRequested.subscribe(() => events.push('duplicate'));
    frame.moveRequested.subscribe((delta) => events.push(`move ${delta}`));
    frame.removeRequested.subscribe(() => events.push('remove'));
    frame.titleChange.subscribe((title) => events.push(`title ${title}`));
    frame.collapsedChange.subscribe((collapsed) => events.push(`collapsed ${collapsed}`));
    fixture.detectChanges();
    const harness = await TestbedHarnessEnvironment.harnessForFixture(fixture, CellFrameHarness);
    return { fixture, harness, events };
  }

  it('shows the kind, the title and the run state in Laminote’s words', async () => {
    const { harness, fixture } = await render(cell('flow', FLOW_ID, { title: 'Cruise, FL370' }));
    expect(await harness.getKindLabel()).toBe('Flow condition');
    expect(await harness.getTitle()).toBe('Cruise, FL370');
    expect(await harness.getRunState()).toBe('Not run yet');

    fixture.componentRef.setInput('cell', cell('flow', FLOW_ID, { runState: 'outdated', output: output({}) }));
    expect(await harness.getRunState()).toBe('Needs a rerun');
    fixture.componentRef.setInput('running', true);
    expect(await harness.getRunState()).toBe('Computing…');
    expect(await harness.canRun()).toBe(false);
  });

  it('reports each action the person picks', async () => {
    const { harness, events } = await render(cell('pressure', FLOW_ID), { index: 1, count: 3 });
    await harness.setTitle('Upper surface, tap data');
    await harness.run();
    await harness.chooseAction('Duplicate');
    await harness.chooseAction('Move up');
    await harness.chooseAction('Move down');
    await harness.chooseAction('Remove');
    await harness.toggleCollapsed();
    // The title goes out as it is typed, keystroke by keystroke; the autosave gathers them.
    expect(events.filter((e) => e.startsWith('title')).at(-1)).toBe('title Upper surface, tap data');
    expect(events.filter((e) => !e.startsWith('title'))).toEqual(['run', 'duplicate', 'move -1', 'move 1', 'remove', 'collapsed true']);
  });

  it('offers no move past the ends of the stack', async () => {
    const first = await render(cell('flow', FLOW_ID), { index: 0, count: 2 });
    expect(await first.harness.getActions()).toEqual([
      { text: 'Duplicate', enabled: true },
      { text: 'Move up', enabled: false },
      { text: 'Move down', enabled: true },
      { text: 'Remove', enabled: true },
    ]);
  });

  it('hides the body when collapsed', async () => {
    const { harness, fixture } = await render(cell('note', FLOW_ID, { collapsed: false }));
    expect(await harness.isCollapsed()).toBe(false);
    fixture.componentRef.setInput('cell', cell('note', FLOW_ID, { collapsed: true }));
    expect(await harness.isCollapsed()).toBe(true);
    // A note computes nothing: no run state, no Run.
    expect(await harness.getRunState()).toBeNull();
    expect(await harness.canRun()).toBe(false);
  });

  it('shows the engine’s message on a failed run and says the last good result is kept', async () => {
    const failed = cell('analysis', FLOW_ID, {
      runState: 'failed',
      output: output(null, { status: 'error', error: { message: 'laminar separation at the first station', field: 'pressureCellId' } }),
      lastGoodOutput: output({ surfaces: [] }),
    });
    const { harness } = await render(failed);
    const [message] = await harness.getFailures();
    expect(message).toContain('Laminar separation at the first station');
    // The field by its label on the screen, not its name in the API.
    expect(message).toContain('(Pressure, section or body cell)');
    expect(message).not.toContain('pressureCellId');
    expect(message).toContain('last good result is kept');
    expect(await harness.getRunState()).toBe('Run failed');
  });

  it('says the fields in an engine message by their labels', async () => {
    const failed = cell('flow', FLOW_ID, {
      runState: 'failed',
      output: output(null, {
        status: 'error',
        error: { message: "turbulenceIntensity 0.0002 is outside the range of Mack's relation; mach 0.5: the trip lies beyond the surface (trips.upper)", field: 'trips.upper' },
      }),
    });
    const { harness } = await render(failed);
    const [message] = await harness.getFailures();
    expect(message).toContain("Turbulence level 0.0002 is outside the range of Mack's relation; mach 0.5: the trip lies beyond the surface (Trip on upper at x/c)");
    expect(message).toContain('(Trip on upper at x/c)');
    expect(message).not.toMatch(/turbulenceIntensity|trips\.upper/);
  });

  it('gives a reader no way to change or run the cell', async () => {
    const { harness } = await render(cell('flow', FLOW_ID, { title: 'Cruise' }), { editable: false, mayRun: false });
    expect(await harness.isTitleEditable()).toBe(false);
    expect(await harness.getTitle()).toBe('Cruise');
    expect(await harness.hasActions()).toBe(false);
    expect(await harness.canRun()).toBe(false);
  });
});

describe('CellFrame, when code fetched on first use does not load', () => {
  beforeEach(async () => {
    // The deferred blocks are put in each state by the test (DeferBlockFixture.render).
    TestBed.configureTestingModule({ imports: [CellFrame], providers: provideTestApp(), deferBlockBehavior: DeferBlockBehavior.Manual });
    await TestBed.compileComponents();
  });

  it('keeps the run state’s icon in place of the spinner and says the comments could not be shown', async () => {
    const fixture = TestBed.createComponent(CellFrame);
    fixture.componentRef.setInput('cell', cell('analysis', FLOW_ID, { title: 'Free transition' }));
    fixture.componentRef.setInput('index', 0);
    fixture.componentRef.setInput('count', 1);
    fixture.componentRef.setInput('editable', true);
    fixture.componentRef.setInput('mayRun', true);
    fixture.componentRef.setInput('running', true);
    fixture.detectChanges();
    const element = fixture.nativeElement as HTMLElement;
    // In template order: the running spinner, the comment button, the comments.
    const [spinner, , comments] = await fixture.getDeferBlocks();
    await spinner!.render(DeferBlockState.Error);
    await comments!.render(DeferBlockState.Error);
    expect(element.querySelector('.run-state mat-icon')?.textContent?.trim()).toBeTruthy();
    expect(element.querySelector('mat-spinner')).toBeNull();
    expect(element.querySelector('.run-state-label')?.textContent).toContain('Computing');
    expect(element.querySelector('.lam-load-failed')?.textContent).toContain(
      'The comments on this cell could not be shown: their code did not load. Reload the page to see them.',
    );
  });
});
