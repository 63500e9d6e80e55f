import { TestBed } from '@angular/core/testing';
import { HttpTestingController } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatSelectHarness } from '@angular/material/select/testing';
import { MatTabGroupHarness } from '@angular/material/tabs/testing';
import { Router } from '@angular/router';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { PROJECT_ID, project, provideTestApp, study } from '../../testing/test-app';
import { PLOT_RENDERER } from '../shared/plot';
import { ComparePage } from './compare-page';
import { CellDiffListHarness, DeltaTableHarness } from './testing/version-harnesses';
import { STUDY_ID, V1_ID, V2_ID, analysisResult, comparison, history } from './testing/version-fixtures';

describe('ComparePage', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [...provideTestApp(), { provide: PLOT_RENDERER, useValue: () => new Promise<never>(() => undefined) }],
    });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  async function render(query: { a?: string; b?: string }) {
    const fixture = TestBed.createComponent(ComparePage);
    fixture.componentRef.setInput('studyId', STUDY_ID);
    if (query.a) fixture.componentRef.setInput('a', query.a);
    if (query.b) fixture.componentRef.setInput('b', query.b);
    fixture.detectChanges();
    http.expectOne(`/api/studies/${STUDY_ID}`).flush(study());
    http.expectOne(`/api/studies/${STUDY_ID}/versions`).flush(history());
    await fixture.whenStable();
    // The breadcrumb's project name (not a member here: asked of the project).
    http.expectOne(`/api/projects/${PROJECT_ID}`).flush(project());
    return { fixture, loader: TestbedHarnessEnvironment.loader(fixture) };
  }

  it('tells a forward transition and a drag rise apart as adverse, with the flow change that caused them', async () => {
    const { fixture, loader } = await render({ a: V1_ID, b: V2_ID });
    const request = http.expectOne((r) => r.url === '/api/compare' && r.params.get('a') === V1_ID && r.params.get('b') === V2_ID);
    request.flush(comparison());
    await fixture.whenStable();

    const text = (fixture.nativeElement as HTMLElement).textContent ?? '';
    const crumbs = (fixture.nativeElement as HTMLElement).querySelectorAll('nav.breadcrumb a');
    expect(Array.from(crumbs).map((a) => a.textContent?.trim())).toEqual(['Projects', 'Larkspur T-62 wing', 'Cruise upper surface, M 0.78']);
    expect(text).toContain('main v1');
    expect(text).toContain('Reynolds number');
    expect(text).toMatch(/engineering estimates/);

    const table = await loader.getHarness(DeltaTableHarness);
    expect(await table.getLabel()).toBe('Deltas on the upper surface');
    const rows = await table.getRows();
    expect(rows.find((r) => r.quantity === 'Transition (governing)')).toEqual({
      quantity: 'Transition (governing)',
      a: '0.580 (Envelope eᴺ)',
      b: '0.296 (Envelope eᴺ)',
      delta: '−0.284 x/c',
      effect: 'adverse',
      cue: 'Adverse: forward: shorter laminar run',
    });
    expect(rows.find((r) => r.quantity === 'Laminar extent (share of the run)')).toMatchObject({ a: '58.0 %', b: '29.6 %', delta: '−28.4 pts', effect: 'adverse' });
    // Drag in counts (1 count = 0.0001): 23.8 → 25.4, up 1.6 counts.
    expect(rows.find((r) => r.quantity === 'cd (Squire–Young)')).toMatchObject({ a: '23.80 cts', b: '25.40 cts', delta: '+1.60 cts', effect: 'adverse', cue: 'Adverse: drag up' });

    const tabs = await loader.getHarness(MatTabGroupHarness);
    expect(await Promise.all((await tabs.getTabs()).map((t) => t.getLabel()))).toEqual(['Cp', 'N-factor', 'H']);

    const cells = await loader.getHarness(CellDiffListHarness);
    expect(await cells.getItems()).toEqual([{ change: 'changed', title: 'Cruise flow', fields: ['Reynolds number: 4e6 → 8e6 (+100.0 %)'] }]);
  });

  it('offers the comparison as a report that opens in a new tab', async () => {
    const { fixture } = await render({ a: V1_ID, b: V2_ID });
    const c = comparison();
    http.expectOne((r) => r.url === '/api/compare').flush(c);
    await fixture.whenStable();
    const link = Array.from((fixture.nativeElement as HTMLElement).querySelectorAll<HTMLAnchorElement>('.head-actions a')).find((a) => a.textContent?.includes('Report'));
    expect(link?.getAttribute('href')).toBe(`/api/compare/report.html?a=${c.a.id}&b=${c.b.id}`);
    expect(link?.getAttribute('target')).toBe('_blank');
    const pdf = Array.from((fixture.nativeElement as HTMLElement).querySelectorAll<HTMLAnchorElement>('.head-actions a')).find((a) => a.textContent?.includes('PDF'));
    expect(pdf?.getAttribute('href')).toBe(`/api/compare/report.pdf?a=${c.a.id}&b=${c.b.id}&download=1`);
    expect(pdf?.hasAttribute('download')).toBe(true);
  });

  it('folds an analysis whose numbers did not change into one line', async () => {
    const { fixture, loader } = await render({ a: V1_ID, b: V2_ID });
    const c = comparison();
    const same = analysisResult();
    const unchanged = { ...same, cellId: '00000000-0000-4000-8000-0000000000cc', title: 'Lower-speed check', surfaces: same.surfaces.map((s) => ({ ...s, transition: { ...s.transition, b: s.transition.a, delta: 0, shift: 'none' as const, effect: 'neutral' as const }, criteria: [], laminarExtent: { ...s.laminarExtent, b: s.laminarExtent.a }, cd: { ...s.cd, b: s.cd.a }, cdFriction: { ...s.cdFriction, b: s.cdFriction.a } })), flow: { ...same.flow, reynolds: { ...same.flow.reynolds, b: same.flow.reynolds.a } }, cd: { ...same.cd, b: same.cd.a } };
    http.expectOne((r) => r.url === '/api/compare').flush({ ...c, results: [...c.results, unchanged] });
    await fixture.whenStable();
    expect(await loader.getAllHarnesses(DeltaTableHarness)).toHaveLength(1);
    expect((fixture.nativeElement as HTMLElement).textContent).toContain('Same results in A and B.');
  });

  it('compares a sweep by its results when only a cell upstream of it changed', async () => {
    const { fixture, loader } = await render({ a: V1_ID, b: V2_ID });
    const c = comparison();
    const SWEEP = '00000000-0000-4000-8000-0000000000dd';
    const step = (value: number, a: number, b: number, cdA: number, cdB: number) => ({
      value,
      cd: { a: cdA, b: cdB, delta: cdB - cdA, effect: 'adverse' as const },
      surfaces: [{ name: 'upper', transition: { a, b, delta: b - a, effect: 'adverse' as const, coordinate: 'x' as const, shift: 'forward' as const, byA: 'eN', byB: 'eN' } }],
    });
    // The sweep's own inputs (N_crit 7 to 11) are the same in A and B; the flow above it changed.
    const sweepCell = { ...c.cells[0]!, cellId: SWEEP, kind: 'sweep' as const, change: 'unchanged' as const, titleA: 'N_crit sweep', titleB: 'N_crit sweep', positionA: 3, positionB: 3, fields: [], outputChanged: true };
    http.expectOne((r) => r.url === '/api/compare').flush({
      ...c,
      cells: [...c.cells, sweepCell],
      sweeps: [{ cellId: SWEEP, title: 'N_crit sweep', parameter: 'nCrit', statusA: 'ok', statusB: 'ok', errorA: null, errorB: null, resultsDiffer: true, steps: [step(7, 0.42, 0.35, 0.0051, 0.0056), step(9, 0.48, 0.4, 0.0048, 0.0053)] }],
    });
    await fixture.whenStable();
    const page = fixture.nativeElement as HTMLElement;
    const sweep = page.querySelector('article[aria-label="Sweep results of N_crit sweep"]');
    expect(sweep).not.toBeNull();
    const rows = Array.from(sweep!.querySelectorAll('tbody tr')).map((tr) => Array.from(tr.querySelectorAll('th, td')).map((td) => td.textContent!.trim()));
    expect(rows).toEqual([
      ['7', '0.420 → 0.350', '−0.070 x/c', '51.00 → 56.00', '+5.00 cts'],
      ['9', '0.480 → 0.400', '−0.080 x/c', '48.00 → 53.00', '+5.00 cts'],
    ]);
    // In the list of cells, the sweep shows though its inputs did not change, and says why.
    const items = await (await loader.getHarness(CellDiffListHarness)).getItems();
    expect(items.map((i) => [i.change, i.title])).toEqual([
      ['changed', 'Cruise flow'],
      ['unchanged', 'N_crit sweep'],
    ]);
    expect(page.querySelector(`li[aria-label="Result changed: N_crit sweep"]`)).not.toBeNull();
    expect(page.querySelector('.upstream')?.textContent).toContain('a cell it uses changed');
  });

  it('takes the version before B as A when only B is named, and puts it in the address', async () => {
    const navigate = vi.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
    const { fixture } = await render({ b: V2_ID });
    await fixture.whenStable();
    expect(navigate).toHaveBeenCalledWith([], { queryParams: { a: V1_ID }, queryParamsHandling: 'merge', replaceUrl: true });
  });

  it('changes a side through its picker, which changes the address', async () => {
    const navigate = vi.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
    const { fixture, loader } = await render({ a: V1_ID, b: V2_ID });
    http.expectOne((r) => r.url === '/api/compare').flush(comparison());
    await fixture.whenStable();
    const [pickA] = await loader.getAllHarnesses(MatSelectHarness);
    await pickA!.open();
    await pickA!.clickOptions({ text: /main v2/ });
    expect(navigate).toHaveBeenCalledWith([], { queryParams: { a: V2_ID }, queryParamsHandling: 'merge' });
  });
});
