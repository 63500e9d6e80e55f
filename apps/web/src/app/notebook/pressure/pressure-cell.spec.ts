import { Component, inject } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatInputHarness } from '@angular/material/input/testing';
import { HttpTestingController } from '@angular/common/http/testing';
import { MatButtonToggleHarness } from '@angular/material/button-toggle/testing';
import { beforeEach, describe, expect, it } from 'vitest';
import { provideTestApp } from '../../../testing/test-app';
import { PLOT_RENDERER } from '../../shared/plot';
import { DraftSession } from '../../shared/draft-session';
import { PressureCellHarness } from '../testing/cell-body-harnesses';
import { BRANCH_ID, PRESSURE_ID, cell, draft } from '../../../testing/notebook-fixtures';
import { PressureCell } from './pressure-cell';

@Component({
  imports: [PressureCell],
  template: `@if (session.cell(id); as c) {
    <lam-pressure-cell [cell]="c" />
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

  it('says when a table read as one surface is a closed loop, or does not start at a stagnation point', async () => {
    const { fixture, table, pressure } = await render();
    const loader = TestbedHarnessEnvironment.loader(fixture);
    await (await loader.getHarness(MatButtonToggleHarness.with({ text: 'One surface' }))).check();
    await table.setValue(ellipseTable(41));
    expect(await pressure.getLineProblems()).toEqual([]);
    expect(await pressure.getWarnings()).toEqual([
      'x/c runs 1.000 → 0.000 (line 22) → 1.000: this looks like a closed loop over both surfaces, not one surface; choose “Closed loop” so it is split at the stagnation point',
    ]);
    await table.setValue('x/c Cp\n0.02 0.80\n0.1 -0.35\n0.5 -0.3\n1.0 0.1');
    const [warning] = await pressure.getWarnings();
    expect(warning).toMatch(/^The surface does not start at a stagnation point: the first Cp \(line 2\) is 0\.80, where about 1 is expected/);
  });

  it('reads a decimal-comma table with semicolons, and lists at most 20 problems with a count of the rest', async () => {
    const { table, pressure } = await render();
    // As a spreadsheet set to a decimal comma exports it (invented values).
    await table.setValue('x/c;Cp\n1,0;0,12\n0,5;-0,40\n0,0;1,0\n0,5;-0,2\n1,0;0,1');
    expect(await pressure.getLineProblems()).toEqual([]);
    await table.setValue(['x y cp', ...Array.from({ length: 45 }, (_, i) => `${(i / 45).toFixed(3)} 0 bad${i}`)].join('\n'));
    const listed = await pressure.getLineProblems();
    expect(listed).toHaveLength(21);
    expect(listed[0]).toEqual({ line: 'Line 2', message: '"bad0" is not a number (cp)' });
    expect(listed[20]).toEqual({ line: 'Table', message: 'and 25 more lines with problems, not listed' });
  });

  describe('uploading a file', () => {
    async function choose(fixture: Awaited<ReturnType<typeof render>>['fixture'], file: File) {
      const input = (fixture.nativeElement as HTMLElement).querySelector<HTMLInputElement>('input[type="file"]')!;
      Object.defineProperty(input, 'files', { value: [file], configurable: true });
      input.dispatchEvent(new Event('change'));
      await new Promise((r) => setTimeout(r, 20));
      await fixture.whenStable();
    }

    it('refuses a file that is not text, and keeps the pasted table', async () => {
      const { fixture, table, pressure } = await render();
      await table.setValue('x cp\n0 1\n1 0.1');
      // An .xlsx workbook is a zip archive: it starts "PK\x03\x04" (PKWARE APPNOTE.TXT, from memory).
      await choose(fixture, new File([Uint8Array.from([0x50, 0x4b, 0x03, 0x04, 0x14, 0x00, 0x06, 0x00])], 'taps.xlsx'));
      expect(await pressure.getUploadProblem()).toBe(
        'taps.xlsx is not a text table: it holds binary data (control byte 0x03 at byte 3). Save the sheet as CSV or text (x [y] Cp rows) and upload that; the table above is unchanged.',
      );
      TestBed.inject(HttpTestingController).expectNone(() => true);
      expect(await table.getValue()).toBe('x cp\n0 1\n1 0.1');
    });

    it('keeps the table an upload replaced, to put back with one click', async () => {
      const { fixture, table, pressure } = await render();
      const pasted = 'x cp # typed by hand\n0 1\n1 0.1';
      await table.setValue(pasted);
      await choose(fixture, new File(['x cp\n0 1\n0.5 -0.3\n1 0.12\n'], 'run14.txt'));
      TestBed.inject(HttpTestingController)
        .expectOne((r) => r.method === 'POST' && r.url.endsWith('/uploads'))
        .flush({ uploadId: 'a1b2c3d4-0000-4000-8000-000000000009', filename: 'run14.txt', size: 27, sha256: 'b'.repeat(64), contentType: 'text/plain', encoding: 'utf-8', text: 'x cp\n0 1\n0.5 -0.3\n1 0.12\n' });
      await fixture.whenStable();
      expect(await table.getValue()).toBe('x cp\n0 1\n0.5 -0.3\n1 0.12\n');
      expect(await pressure.getReplacedNote()).toBe('The table now comes from run14.txt; the one it replaced is kept.');
      await pressure.putBack();
      expect(await table.getValue()).toBe(pasted);
      expect(session.cell(PRESSURE_ID)?.inputs).toMatchObject({ text: pasted, uploadId: null });
      expect(await pressure.getReplacedNote()).toBeNull();
    });
  });
});
