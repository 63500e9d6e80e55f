import { Component, inject } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatSelectHarness } from '@angular/material/select/testing';
import { MatTabGroupHarness } from '@angular/material/tabs/testing';
import type { ComparisonResult } from '@laminote/contracts';
import { beforeEach, describe, expect, it } from 'vitest';
import { provideTestApp } from '../../../testing/test-app';
import { ANALYSIS_ID, BRANCH_ID, PRESSURE_ID, cell, draft, output } from '../../../testing/notebook-fixtures';
import { DraftSession } from '../../shared/draft-session';
import { PLOT_RENDERER } from '../../shared/plot';
import { ComparisonCell } from './comparison-cell';

const COMPARISON_ID = '11111111-2222-4333-8444-555555555509';

@Component({
  imports: [ComparisonCell],
  template: `@if (session.cell(id); as c) {
    <lam-comparison-cell [cell]="c" />
  }`,
})
class Host {
  protected readonly session = inject(DraftSession);
  protected readonly id = COMPARISON_ID;
}

/** An invented overlay: the wind-tunnel table and the analysis of it, upper surface only. */
const result: ComparisonResult = {
  entries: [
    { field: 'firstCellId', kind: 'pressure', flow: null, cd: null, surfaces: [{ name: 'upper', x: [0, 0.5, 1], cp: [1, -0.4, 0.1], n: null, H: null, transitionX: null, by: null, cd: null }] },
    {
      field: 'secondCellId',
      kind: 'analysis',
      flow: { reynolds: 2e7, mach: 0, nCrit: 9 },
      cd: 0.0051,
      surfaces: [{ name: 'upper', x: [0, 0.5, 1], cp: [1, -0.41, 0.1], n: [0, 6, null], H: [2.2, 2.6, 1.4], transitionX: 0.412, by: 'eN', cd: 0.0026 }],
    },
  ],
  warnings: ['pressure cells show Cp as given; analyses show the Cp their marched edge velocity implies'],
};

describe('ComparisonCell', () => {
  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [...provideTestApp(), DraftSession, { provide: PLOT_RENDERER, useValue: () => new Promise<never>(() => undefined) }] });
  });

  async function render(withResult: boolean) {
    const session = TestBed.inject(DraftSession);
    session.open(
      BRANCH_ID,
      draft([
        cell('pressure', PRESSURE_ID, { title: 'Tunnel run 14 (invented)' }),
        cell('analysis', ANALYSIS_ID, { title: 'Free transition' }),
        cell('flow', '11111111-2222-4333-8444-555555555501', { title: 'Cruise' }),
        cell('comparison', COMPARISON_ID, {
          title: 'Table against analysis',
          inputs: { firstCellId: PRESSURE_ID, secondCellId: ANALYSIS_ID, thirdCellId: null, fourthCellId: null },
          ...(withResult ? { output: output(result), runState: 'current' as const } : {}),
        }),
      ]),
    );
    session.editable.set(true);
    const fixture = TestBed.createComponent(Host);
    fixture.detectChanges();
    await fixture.whenStable();
    return { fixture, loader: TestbedHarnessEnvironment.loader(fixture), session };
  }

  it('offers the study’s pressure cells and analyses to compare, and keeps the choice', async () => {
    const { loader, session } = await render(false);
    const third = await loader.getHarness(MatSelectHarness.with({ selector: '[data-field="thirdCellId"]' }));
    await third.open();
    expect(await Promise.all((await third.getOptions()).map((o) => o.getText()))).toEqual(['None', 'Tunnel run 14 (invented) · Pressure distribution', 'Free transition · Transition analysis']);
    await third.clickOptions({ text: /Tunnel run 14/ });
    expect(session.cell(COMPARISON_ID)?.inputs).toMatchObject({ firstCellId: PRESSURE_ID, secondCellId: ANALYSIS_ID, thirdCellId: PRESSURE_ID });
  });

  it('overlays Cp, N-factor and H, and lists each analysis’s transition and drag under the cells’ titles', async () => {
    const { fixture, loader } = await render(true);
    const tabs = await loader.getHarness(MatTabGroupHarness);
    expect(await Promise.all((await tabs.getTabs()).map((t) => t.getLabel()))).toEqual(['Cp', 'N-factor', 'H']);
    const rows = Array.from((fixture.nativeElement as HTMLElement).querySelectorAll('table tbody tr')).map((tr) => Array.from(tr.querySelectorAll('td')).map((td) => td.textContent!.trim()));
    expect(rows).toEqual([['Free transition', 'upper', '0.412 (Envelope eᴺ)', '0.00260', '2.00e+7 · 0.000 · 9.00']]);
    expect((fixture.nativeElement as HTMLElement).textContent).toContain('Pressure cells show Cp as given');
  });
});
