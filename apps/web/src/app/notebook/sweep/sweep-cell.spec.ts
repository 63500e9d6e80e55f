import { Component, inject } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { beforeEach, describe, expect, it } from 'vitest';
import { provideTestApp } from '../../../testing/test-app';
import { PLOT_RENDERER } from '../../shared/plot';
import { DraftSession } from '../../shared/draft-session';
import { ANALYSIS_ID, BRANCH_ID, cell, draft, output } from '../../../testing/notebook-fixtures';
import { SweepCell } from './sweep-cell';

const SWEEP_ID = '11111111-2222-4333-8444-555555555505';

@Component({
  imports: [SweepCell],
  template: `@if (session.cell(id); as c) {
    <lam-sweep-cell [cell]="c" />
  }`,
})
class Host {
  protected readonly session = inject(DraftSession);
  protected readonly id = SWEEP_ID;
}

describe('SweepCell', () => {
  let session: DraftSession;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [...provideTestApp(), DraftSession, { provide: PLOT_RENDERER, useValue: () => new Promise<never>(() => undefined) }],
    });
    session = TestBed.inject(DraftSession);
  });

  async function render(sweep = cell('sweep', SWEEP_ID, { title: 'Re sweep' })) {
    session.open(BRANCH_ID, draft([cell('analysis', ANALYSIS_ID, { title: 'Cruise analysis' }), sweep]));
    session.editable.set(true);
    const fixture = TestBed.createComponent(Host);
    fixture.detectChanges();
    await fixture.whenStable();
    return { fixture, loader: TestbedHarnessEnvironment.loader(fixture) };
  }

  it('gives the swept parameter’s range in the notation the fields use', async () => {
    const { loader } = await render();
    const parameter = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'Parameter' }));
    expect(await parameter.getTextHints()).toEqual(['1 to 20']);
    const select = await loader.getHarness(MatSelectHarness.with({ selector: '[formControlName="parameter"]' }));
    await select.open();
    await select.clickOptions({ text: 'Reynolds number Re' });
    expect(await parameter.getTextHints()).toEqual(['1 × 10⁴ to 1 × 10¹⁰']);
  });

  it('plots every criterion, the laminar extent and the drag against the swept parameter', async () => {
    const step = (value: number, eN: number, michel: number, cd: number) => ({
      value,
      status: 'ok' as const,
      error: null,
      reynolds: value,
      cd,
      surfaces: [{ name: 'upper', transitionS: eN, transitionX: eN, by: 'eN', laminarSeparationS: null, cd: cd / 2, criteria: { eN, michel }, laminarExtent: eN }],
      attachmentLine: null,
    });
    // Invented numbers: transition moving forward with Reynolds number, drag rising.
    const result = { parameter: 'reynolds' as const, values: [5e6, 1e7, 2e7], steps: [step(5e6, 0.62, 0.55, 0.0042), step(1e7, 0.41, 0.36, 0.0049), step(2e7, 0.22, 0.19, 0.0056)], warnings: [] };
    const { fixture } = await render(
      cell('sweep', SWEEP_ID, { title: 'Re sweep', inputs: { analysisCellId: ANALYSIS_ID, parameter: 'reynolds', from: 5e6, to: 2e7, steps: 3 }, output: output(result), runState: 'current' }),
    );
    const labels = Array.from((fixture.nativeElement as HTMLElement).querySelectorAll('lam-plot')).map((p) => p.getAttribute('aria-label'));
    expect(labels).toEqual([
      'Governing transition location against the swept parameter',
      'Transition by every criterion against the swept parameter',
      'Laminar extent against the swept parameter',
      'Profile drag against the swept parameter',
    ]);
  });
});
