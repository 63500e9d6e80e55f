import { Component, inject } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatInputHarness } from '@angular/material/input/testing';
import { beforeEach, describe, expect, it } from 'vitest';
import { provideTestApp } from '../../../testing/test-app';
import { PLOT_RENDERER } from '../../shared/plot';
import { DraftSession } from '../draft-session';
import { PressureCellHarness } from '../testing/cell-body-harnesses';
import { BRANCH_ID, PRESSURE_ID, cell, draft } from '../testing/notebook-fixtures';
import { PressureCell } from './pressure-cell';

@Component({
  imports: [PressureCell],
  template: `@if (session.cell(id); as c) {
    <lam-pressure-cell [cell]="c" studyId="c3f5a7e9-0b2d-4f6a-8c1e-3a5b7d9f1e20" />
  }`,
})
class Host {
  protected readonly session = inject(DraftSession);
  protected readonly id = PRESSURE_ID;
}

/** A closed loop round a 12 % ellipse at zero incidence: q/V∞ = (1 + b/a) sin θ / √(sin²θ + (b/a)² cos²θ). */
function ellipseTable(points: number): string {
  const ratio = 0.12;
  const rows = ['x/c\ty/c\tCp'];
  for (let i = 0; i < points; i++) {
    const t = (2 * Math.PI * i) / (points - 1) + 1e-9;
    const q = ((1 + ratio) * Math.abs(Math.sin(t))) / Math.sqrt(Math.sin(t) ** 2 + ratio ** 2 * Math.cos(t) ** 2);
    rows.push([(1 + Math.cos(t)) / 2, (ratio / 2) * Math.sin(t), 1 - q * q].map((v) => v.toFixed(6)).join('\t'));
  }
  return rows.join('\n');
}

describe('PressureCell', () => {
  let session: DraftSession;

  beforeEach(() => {
    TestBed.configureTestingModule({
      // The plotting library itself is not loaded in unit tests; the plot shows its placeholder.
      providers: [...provideTestApp(), DraftSession, { provide: PLOT_RENDERER, useValue: () => new Promise<never>(() => undefined) }],
    });
    session = TestBed.inject(DraftSession);
    session.open(BRANCH_ID, draft([cell('pressure', PRESSURE_ID, { title: 'Upper and lower, cruise' })]));
    session.editable.set(true);
  });

  async function render() {
    const fixture = TestBed.createComponent(Host);
    fixture.detectChanges();
    await fixture.whenStable();
    const loader = TestbedHarnessEnvironment.loader(fixture);
    return {
      fixture,
      table: await loader.getHarness(MatInputHarness.with({ selector: 'textarea' })),
      pressure: await loader.getHarness(PressureCellHarness),
    };
  }

  it('names the line of a bad value and keeps the table exactly as pasted', async () => {
    const { table, pressure } = await render();
    // Invented tap data, with a comment, a tab-separated header, trailing spaces and a typo on line 5.
    const pasted = '# Tamsk tunnel run 14 (invented)\nx/c\ty/c\tCp  \n1.0\t0.0\t0.21\n0.5\t0.06\t-0.31\n0.25\t0.05\t-0.2g\n0.0\t0.0\t1.0\n';
    await table.setValue(pasted);

    expect(await pressure.getLineProblems()).toEqual([{ line: 'Line 5', message: '"-0.2g" is not a number (cp)' }]);
    expect(await table.getValue()).toBe(pasted);
    expect(session.cell(PRESSURE_ID)?.inputs['text']).toBe(pasted);
  });

  it('says which line does not match the others', async () => {
    const { table, pressure } = await render();
    await table.setValue('0.0 1.0\n0.5 -0.3 0.1\n1.0 0.2');
    expect(await pressure.getLineProblems()).toEqual([{ line: 'Line 2', message: '3 values, expected 2 as on line 1' }]);
  });

  it('reads a good closed loop and finds its stagnation point at the leading edge', async () => {
    const { table, pressure } = await render();
    await table.setValue(ellipseTable(81));
    expect(await pressure.getLineProblems()).toEqual([]);
    // The ellipse at zero incidence stagnates exactly at its nose, x/c = 0 (symmetry).
    expect(await pressure.getStagnationPoint()).toBe('x/c 0.0000');
  });
});
