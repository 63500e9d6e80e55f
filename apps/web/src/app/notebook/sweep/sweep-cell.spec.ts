import { Component, inject } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { beforeEach, describe, expect, it } from 'vitest';
import { provideTestApp } from '../../../testing/test-app';
import { PLOT_RENDERER } from '../../shared/plot';
import { DraftSession } from '../../shared/draft-session';
import { ANALYSIS_ID, BRANCH_ID, cell, draft } from '../../../testing/notebook-fixtures';
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
});
