import { computeCell } from '@laminote/aero';
import { CELL_SCHEMAS, type CellInputs } from '@laminote/contracts';
import type { Browser, Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bodiesDrawn, collectPageProblems, launchBrowser, signInThroughProvider } from '../support/browser';

/**
 * From a shape to a drag polar in the browser: the demo engineer adds a flow condition, a section cell
 * from a NACA designation, runs it and reads its lift; adds a polar of it, runs it and sees the drag
 * bucket, the lift curve, the transition plot and the outline with transition marks; and points a
 * transition analysis at the section cell instead of a pressure cell.
 */

const RUN = Date.now().toString(36);
const FLOW_TITLE = `E2E ${RUN}: Re 6e6, M 0 (invented)`;
const SECTION_TITLE = `E2E ${RUN}: NACA 2412 at 2°`;
const POLAR_TITLE = `E2E ${RUN}: polar −4° to 8°`;
const ANALYSIS_TITLE = `E2E ${RUN}: analysis of the section`;
const BODY_TITLE = `E2E ${RUN}: pod, 5:1 spheroid (invented)`;
const BODY_ANALYSIS_TITLE = `E2E ${RUN}: analysis of the pod`;

let browser: Browser;
let page: Page;
const problems: string[] = [];

beforeAll(async () => {
  browser = await launchBrowser();
  page = await browser.newPage({ viewport: { width: 1400, height: 1000 } });
  collectPageProblems(page, problems);
});
afterAll(async () => browser?.close());

function frame(title: string): Locator {
  return page.locator(`lam-cell-frame[data-cell-title="${title}"]`);
}

async function addCell(kind: string, title: string): Promise<Locator> {
  const before = await page.locator('lam-cell-frame').count();
  await bodiesDrawn(page);
  const add = page.getByRole('button', { name: 'Add cell' });
  // In the middle of the window, as a person adding a cell has it, with room for the menu either way.
  await add.evaluate((button) => button.scrollIntoView({ block: 'center' }));
  await add.click();
  await page.getByRole('menuitem', { name: new RegExp(kind) }).click();
  await expect.poll(() => page.locator('lam-cell-frame').count()).toBe(before + 1);
  const added = page.locator('lam-cell-frame').last();
  await added.locator('input.title-input').fill(title);
  return frame(title);
}

async function pick(cell: Locator, label: string | RegExp, option: string): Promise<void> {
  await cell.getByRole('combobox', { name: label }).click();
  await page.getByRole('option', { name: option }).click();
}

async function run(cell: Locator): Promise<void> {
  await cell.getByRole('button', { name: 'Run' }).click();
  await expect.poll(() => cell.locator('.run-state-label').textContent(), { timeout: 60_000 }).toBe('Up to date');
}

const inputs = <K extends 'section' | 'flow' | 'polar' | 'body' | 'analysis'>(kind: K, given: Record<string, unknown>) => CELL_SCHEMAS[kind].inputs.parse(given) as CellInputs[K];

describe('sections and polars in the notebook', () => {
  it('opens the demo study', async () => {
    await signInThroughProvider(page, 'engineer');
    await page.getByRole('link', { name: /Larkspur T-62 wing/ }).first().click();
    await page.getByRole('link', { name: /Outboard section, cruise/ }).first().click();
    await page.getByRole('button', { name: 'Add cell' }).waitFor();
  });

  it('adds a flow condition and a NACA 2412 section, runs it and reads the engine’s lift', async () => {
    const flow = await addCell('Flow condition', FLOW_TITLE);
    await flow.getByText('Reynolds number', { exact: true }).click();
    await flow.getByLabel(/Reynolds number Re/).fill('6e6');
    await flow.getByLabel(/Mach number/).fill('0');

    const section = await addCell('Section', SECTION_TITLE);
    await expect(section.getByLabel('NACA designation').inputValue()).resolves.toBe('2412');
    await section.getByLabel(/Incidence α/).fill('2');
    await run(section);
    const expected = computeCell('section', inputs('section', { naca: '2412', alphaDeg: 2 }), {});
    const clCell = section.locator('table.quantities tr', { hasText: 'Lift coefficient' }).locator('td');
    await expect(clCell.textContent()).resolves.toBe(expected.inviscid.cl.toFixed(4));
    await section.locator('lam-plot').first().scrollIntoViewIfNeeded();
    await section.locator('lam-plot .main-svg').nth(1).waitFor({ timeout: 30_000 });
    await section.screenshot({ path: '/tmp/laminote-e2e-section.png' });
  });

  it('shows the line at fault in pasted coordinates and keeps the text as typed', async () => {
    const section = frame(SECTION_TITLE);
    await section.getByText('Coordinates', { exact: true }).click();
    const text = 'Tamsk test shape (invented)\n1 0\n0.5 0.06\n0 0\n0.5 -0.04 x\n1 0';
    await section.getByLabel(/Coordinates: x y/).fill(text);
    await section.getByText(/Line 5: expected two numbers/).waitFor();
    await expect(section.getByLabel(/Coordinates: x y/).inputValue()).resolves.toBe(text);
    await section.screenshot({ path: '/tmp/laminote-e2e-section-bad-line.png' });
    await section.getByText('NACA designation', { exact: true }).click();
    await run(section);
  });

  it('adds a polar of the section, runs it and sees the bucket, the lift curve, transition and the outline', async () => {
    const polar = await addCell('Polar', POLAR_TITLE);
    await pick(polar, 'Section cell', SECTION_TITLE);
    await pick(polar, 'Flow cell', FLOW_TITLE);
    await polar.getByLabel('From', { exact: true }).fill('-4');
    await polar.getByLabel('To', { exact: true }).fill('8');
    await polar.getByLabel('Points', { exact: true }).fill('13');
    await run(polar);
    const rows = polar.locator('.points tbody tr');
    await expect.poll(() => rows.count()).toBe(13);
    const expected = computeCell('polar', inputs('polar', { flowCellId: '00000000-0000-4000-8000-000000000001', sectionCellId: '00000000-0000-4000-8000-000000000002', from: -4, to: 8, points: 13 }), {
      flowCellId: { kind: 'flow', inputs: inputs('flow', { mode: 'reynolds', reynolds: 6e6, mach: 0 }), upstream: {} },
      sectionCellId: { kind: 'section', inputs: inputs('section', { naca: '2412', alphaDeg: 2 }), upstream: {} },
    });
    const cdShown = await rows.nth(6).locator('td').nth(2).textContent();
    expect(Number(cdShown)).toBeCloseTo(expected.points[6]!.cd!, 5);
    await polar.locator('lam-plot').first().scrollIntoViewIfNeeded();
    await expect.poll(() => polar.locator('lam-plot .main-svg').count(), { timeout: 30_000 }).toBeGreaterThanOrEqual(3);
    await polar.locator('lam-plot').nth(3).scrollIntoViewIfNeeded();
    await expect.poll(() => polar.locator('lam-plot .main-svg').count(), { timeout: 30_000 }).toBeGreaterThanOrEqual(4);
    await polar.getByText(/Engineering estimates from integral methods/).waitFor();
    await polar.screenshot({ path: '/tmp/laminote-e2e-polar.png' });
  });

  it('runs the polar again with two criteria and Michel governing, and reads the drag the engine gives for that choice', async () => {
    const polar = frame(POLAR_TITLE);
    for (const name of ['Crossflow R_cf', 'Crossflow C1', 'H–Re_x', 'Granville']) await polar.getByRole('checkbox', { name }).uncheck();
    await pick(polar, 'Governing criterion', 'Michel');
    await run(polar);
    const expected = computeCell(
      'polar',
      inputs('polar', { flowCellId: '00000000-0000-4000-8000-000000000001', sectionCellId: '00000000-0000-4000-8000-000000000002', from: -4, to: 8, points: 13, criteria: ['eN', 'michel'], governing: 'michel' }),
      {
        flowCellId: { kind: 'flow', inputs: inputs('flow', { mode: 'reynolds', reynolds: 6e6, mach: 0 }), upstream: {} },
        sectionCellId: { kind: 'section', inputs: inputs('section', { naca: '2412', alphaDeg: 2 }), upstream: {} },
      },
    );
    const rows = polar.locator('.points tbody tr');
    await expect.poll(async () => Number(await rows.nth(6).locator('td').nth(2).textContent())).toBeCloseTo(expected.points[6]!.cd!, 5);
    // After a reload the choice is still there (it is in the cell's inputs, not only the form).
    await page.reload();
    await frame(POLAR_TITLE).getByRole('checkbox', { name: 'Michel' }).waitFor();
    expect(await frame(POLAR_TITLE).getByRole('checkbox', { name: 'Granville' }).isChecked()).toBe(false);
    expect(await frame(POLAR_TITLE).getByRole('checkbox', { name: 'Envelope eᴺ' }).isChecked()).toBe(true);
    await expect.poll(() => frame(POLAR_TITLE).getByRole('combobox', { name: 'Governing criterion' }).textContent()).toContain('Michel');
    await frame(POLAR_TITLE).locator('form').screenshot({ path: '/tmp/laminote-e2e-polar-criteria.png' });
  });

  it('points a transition analysis at the section cell', async () => {
    const analysis = await addCell('Transition analysis', ANALYSIS_TITLE);
    await pick(analysis, 'Flow condition', FLOW_TITLE);
    await pick(analysis, /Pressure distribution, section or body/, SECTION_TITLE);
    await run(analysis);
    await analysis.getByRole('table', { name: 'Transition summary per surface' }).waitFor();
    // The section's outline with the governing transition of each surface (two diamonds) and the others' ticks.
    const outline = analysis.locator('lam-plot[data-plot="outline"]');
    await outline.scrollIntoViewIfNeeded();
    await expect.poll(() => outline.locator('.main-svg').count(), { timeout: 30_000 }).toBeGreaterThan(0);
    await expect.poll(() => outline.locator('.scatterlayer .trace').count()).toBeGreaterThanOrEqual(3);
    await expect.poll(() => outline.locator('.scatterlayer .trace').nth(1).locator('path.point').count()).toBe(2);
    await analysis.getByText(/◆ governing transition/).waitFor();
    await analysis.screenshot({ path: '/tmp/laminote-e2e-section-analysis.png' });
  });

  it('adds a body of revolution, runs it and reads its shape; an analysis of it gives the engine’s transition on the body', async () => {
    const body = await addCell('Body of revolution', BODY_TITLE);
    await expect(body.getByLabel(/Fineness ratio/).inputValue()).resolves.toBe('6');
    await body.getByLabel(/Fineness ratio/).fill('5');
    await run(body);
    const fineness = body.locator('table.quantities tr', { hasText: 'Fineness ratio' }).locator('td');
    await expect(fineness.textContent()).resolves.toBe('5.000');
    await body.locator('lam-plot').first().scrollIntoViewIfNeeded();
    await body.locator('lam-plot .main-svg').nth(1).waitFor({ timeout: 30_000 });
    await body.screenshot({ path: '/tmp/laminote-e2e-body.png' });

    const analysis = await addCell('Transition analysis', BODY_ANALYSIS_TITLE);
    await pick(analysis, 'Flow condition', FLOW_TITLE);
    await pick(analysis, /Pressure distribution, section or body/, BODY_TITLE);
    await analysis.getByText('A body of revolution is analysed in free transition.').waitFor();
    await run(analysis);
    const summary = analysis.getByRole('table', { name: 'Transition summary per surface' });
    await summary.waitFor();
    const expected = computeCell('analysis', inputs('analysis', { flowCellId: '00000000-0000-4000-8000-000000000001', pressureCellId: '00000000-0000-4000-8000-000000000002' }), {
      flowCellId: { kind: 'flow', inputs: inputs('flow', { mode: 'reynolds', reynolds: 6e6, mach: 0 }), upstream: {} },
      pressureCellId: { kind: 'body', inputs: inputs('body', { source: 'spheroid', fineness: 5 }), upstream: {} },
    });
    // The summary gives the governing transition at x/L, between the stations on each side of it.
    const { s: stations, x } = expected.surfaces[0]!.stations;
    const t = expected.surfaces[0]!.transition.s!;
    const i = stations.findIndex((v) => v >= t);
    const xAt = x![i - 1]! + ((t - stations[i - 1]!) / (stations[i]! - stations[i - 1]!)) * (x![i]! - x![i - 1]!);
    expect(await summary.textContent()).toContain(xAt.toFixed(3));
    await analysis.screenshot({ path: '/tmp/laminote-e2e-body-analysis.png' });
  });

  it('met no script error and no content-security-policy violation', () => {
    expect(problems).toEqual([]);
  });
});
