import { Component, inject } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonToggleHarness } from '@angular/material/button-toggle/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { beforeEach, describe, expect, it } from 'vitest';
import { provideTestApp } from '../../../testing/test-app';
import { DraftSession } from '../../shared/draft-session';
import { FlowCellHarness } from '../testing/cell-body-harnesses';
import { BRANCH_ID, FLOW_ID, cell, draft } from '../../../testing/notebook-fixtures';
import { FlowCell } from './flow-cell';

@Component({
  imports: [FlowCell],
  template: `@if (session.cell(id); as c) {
    <lam-flow-cell [cell]="c" />
  }`,
})
class Host {
  protected readonly session = inject(DraftSession);
  protected readonly id = FLOW_ID;
}

describe('FlowCell', () => {
  let session: DraftSession;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [...provideTestApp(), DraftSession] });
    session = TestBed.inject(DraftSession);
    session.open(BRANCH_ID, draft([cell('flow', FLOW_ID, { title: 'Cruise' })]));
    session.editable.set(true);
  });

  async function render() {
    const fixture = TestBed.createComponent(Host);
    fixture.detectChanges();
    await fixture.whenStable();
    const loader = TestbedHarnessEnvironment.loader(fixture);
    const field = (name: string) => loader.getHarness(MatInputHarness.with({ selector: `[formControlName="${name}"]` }));
    return { fixture, loader, field, flow: await loader.getHarness(FlowCellHarness) };
  }

  it('derives Re, ν, V and q from ISA altitude, Mach and length as they are typed', async () => {
    const { field, flow } = await render();
    await (await field('mach')).setValue('0.78');
    await (await field('referenceLength_m')).setValue('2.5');

    // Reference: U.S. Standard Atmosphere 1976, table at 11 000 m geopotential (values from memory):
    // T = 216.65 K, ρ = 0.36392 kg/m³, a = 295.07 m/s, μ = 1.4216e-5 Pa s.
    const speed = 0.78 * 295.07;
    const nu = 1.4216e-5 / 0.36392;
    const reynolds = (speed * 2.5) / nu;
    const q = 0.5 * 0.36392 * speed * speed;
    const derived = await flow.getDerived();
    expect(derived['V∞']).toBe(`${speed.toFixed(1)} m/s`);
    expect(derived['ν∞']).toBe(`${nu.toExponential(2).replace('e-5', ' × 10⁻⁵')} m²/s`);
    expect(derived['Re']).toBe(`${reynolds.toExponential(2).replace('e+7', ' × 10⁷')}`);
    expect(derived['q∞']).toBe(`${(q / 1000).toFixed(2)} kPa`);
    expect(derived['T∞']).toBe('216.65 K');
    // What was typed is what the draft keeps.
    expect(session.cell(FLOW_ID)?.inputs).toMatchObject({ mach: 0.78, referenceLength_m: 2.5, altitude_m: 11000 });
  });

  it('shows the N_crit a turbulence level implies', async () => {
    const { loader, field, flow } = await render();
    expect(await flow.getImpliedNCrit()).toBeNull();
    await (await loader.getHarness(MatButtonToggleHarness.with({ text: 'Turbulence level' }))).check();
    await (await field('turbulencePercent')).setValue('0.2');
    // Mack's relation N_crit = −8.43 − 2.4 ln Tu (L. M. Mack, JPL Publication 77-15, 1977; from memory):
    // Tu = 0.002 gives 6.485.
    expect(await flow.getImpliedNCrit()).toBe((-8.43 - 2.4 * Math.log(0.002)).toFixed(2));
    expect(session.cell(FLOW_ID)?.inputs).toMatchObject({ turbulenceMode: 'intensity', turbulenceIntensity: 0.002 });
  });

  it('gives the usual N_crit 9 at a turbulence level of 0.07 % without calling it out of range', async () => {
    const { loader, field, flow } = await render();
    await (await loader.getHarness(MatButtonToggleHarness.with({ text: 'Turbulence level' }))).check();
    await (await field('turbulencePercent')).setValue('0.07');
    // Mack's relation at Tu = 0.0007: −8.43 − 2.4 ln 0.0007 = 9.00 (arithmetic); the relation is
    // usually quoted for 0.07 % to 2.98 %, i.e. N_crit 9 down to 0 (range from memory).
    expect(await flow.getImpliedNCrit()).toBe('9.00');
    expect(await flow.getImpliedNote()).toBeNull();
    await (await field('turbulencePercent')).setValue('0.05');
    expect(await flow.getImpliedNote()).toBe(
      'Outside 0.07 % to 2.98 %, the turbulence levels Mack’s relation is quoted for (N_crit 9 down to 0): the value is extrapolated.',
    );
  });

  it('takes a Reynolds number directly and then shows no dimensional quantities', async () => {
    const { loader, field, flow } = await render();
    await (await loader.getHarness(MatButtonToggleHarness.with({ text: 'Reynolds number' }))).check();
    await (await field('reynolds')).setValue('20e6');
    expect(await flow.getDerived()).toEqual({ Re: '2.00 × 10⁷' });
  });

  it('keeps a mistyped number as typed and names the problem on its field', async () => {
    const { loader, field, flow } = await render();
    await (await field('mach')).setValue('0.7B');
    const machField = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'Mach number M∞' }));
    expect(await machField.getTextErrors()).toEqual(['Must be a number']);
    expect(await (await field('mach')).getValue()).toBe('0.7B');
    expect(session.cell(FLOW_ID)?.inputs['mach']).toBe('0.7B');
    expect(await flow.getDerived()).toEqual({});
    expect(await flow.getWaitingReason()).toContain('mach');

    await (await field('mach')).setValue('1.2');
    expect(await machField.getTextErrors()).toEqual(['Must be below 1 (subsonic free stream)']);
  });
});
