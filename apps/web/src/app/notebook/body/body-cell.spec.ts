import { Component, inject } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonToggleHarness } from '@angular/material/button-toggle/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { computeCell } from '@laminote/aero';
import { CELL_SCHEMAS } from '@laminote/contracts';
import { beforeEach, describe, expect, it } from 'vitest';
import { provideTestApp } from '../../../testing/test-app';
import { DraftSession } from '../../shared/draft-session';
import { BRANCH_ID, cell, draft, output } from '../../../testing/notebook-fixtures';
import { BodyCell } from './body-cell';
import { bodyOutlineFigure } from './body-figures';

const BODY_ID = '11111111-2222-4333-8444-555555555509';

@Component({
  imports: [BodyCell],
  template: `@if (session.cell(id); as c) {
    <lam-body-cell [cell]="c" />
  }`,
})
class Host {
  protected readonly session = inject(DraftSession);
  protected readonly id = BODY_ID;
}

describe('BodyCell', () => {
  let session: DraftSession;
  // The engine's own result for a 6:1 prolate spheroid, as a run stores it.
  const result = computeCell('body', CELL_SCHEMAS.body.inputs.parse({ source: 'spheroid', fineness: 6 }), {});

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [...provideTestApp(), DraftSession] });
    session = TestBed.inject(DraftSession);
    session.open(BRANCH_ID, draft([cell('body', BODY_ID, { title: 'Pod (invented)', runState: 'current', output: output(result) })]));
    session.editable.set(true);
  });

  async function render() {
    const fixture = TestBed.createComponent(Host);
    fixture.detectChanges();
    await fixture.whenStable();
    return { fixture, loader: TestbedHarnessEnvironment.loader(fixture), el: fixture.nativeElement as HTMLElement };
  }

  it('starts from a 6:1 prolate spheroid and shows its geometry, meridian and Cp', async () => {
    const { loader, el } = await render();
    expect(await (await loader.getHarness(MatInputHarness.with({ selector: '[formControlName="fineness"]' }))).getValue()).toBe('6');
    const rows = Array.from(el.querySelectorAll('table.quantities tr')).map((tr) =>
      Array.from(tr.children)
        .map((c) => c.textContent!.replace(/\s+/g, ' ').trim())
        .join(' '),
    );
    // A spheroid's maximum radius is at mid-length, D = L / fineness (geometry).
    expect(rows).toContain('Fineness ratio L/D 6.000');
    expect(rows).toContain('Maximum radius r/L 0.0833 at x/L 0.500');
    expect(el.querySelector('lam-plot[label^="Body meridian"]')).not.toBeNull();
    expect(el.querySelector('lam-plot[label^="Pressure coefficient from the axisymmetric panel method"]')).not.toBeNull();
    expect(el.textContent).toContain('no compressibility');
  });

  it('reads a pasted meridian as it is typed, naming the line at fault, and keeps the text as typed', async () => {
    const { fixture, loader, el } = await render();
    await (await loader.getHarness(MatButtonToggleHarness.with({ text: 'Meridian' }))).check();
    const text = '# pod\n0 0\n0.2 0.07 0.1\n0.5 0.09\n1 0';
    await (await loader.getHarness(MatInputHarness.with({ selector: '[formControlName="coordinates"]' }))).setValue(text);
    fixture.detectChanges();
    expect(el.querySelector('.read-check')?.textContent).toContain('Line 3: expected two numbers, x and r');
    expect(session.cell(BODY_ID)?.inputs).toMatchObject({ source: 'coordinates', coordinates: text });
    // The same reader as the engine's: a tail off the axis is said while typing, not only after a run.
    await (await loader.getHarness(MatInputHarness.with({ selector: '[formControlName="coordinates"]' }))).setValue('0 0\n0.2 0.07\n0.5 0.09\n0.8 0.06\n1 0.03');
    fixture.detectChanges();
    expect(el.querySelector('.read-check')?.textContent).toContain('The meridian must start and end on the axis');
  });

  it('draws the meridian on both sides of the axis, with room round the widest point', () => {
    const figure = bodyOutlineFigure({ x: [0, 0.5, 1], r: [0, 0.1, 0] });
    expect(figure.traces[0]!.y).toEqual([0, 0.1, 0, 0, -0.1, 0]);
    const [low, high] = figure.y.range!;
    expect(low).toBeCloseTo(-0.14, 12);
    expect(high).toBeCloseTo(0.14, 12);
  });
});
