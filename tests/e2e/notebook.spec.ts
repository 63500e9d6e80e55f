import { readFileSync } from 'node:fs';
import { analyzeCase, computeStudy } from '@laminote/aero';
import { studyDocumentSchema } from '@laminote/contracts';
import { joukowskiLoop } from '../../libs/aero/test/joukowski';
import type { Browser, Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bodiesDrawn, collectPageProblems, launchBrowser, signInThroughProvider } from '../support/browser';

/**
 * The notebook in the browser: the demo engineer adds a flow condition, a pressure cell with a pasted
 * Cp table and a transition analysis to the demo study, runs it, reads the governing transition from
 * the summary table and sees the plots.
 */

// Invented test section from an exact solution: the symmetric Joukowski aerofoil (circle centre
// −0.1, about 12 % thick) at zero incidence, exact potential flow (libs/aero/test/joukowski.ts, after
// Milne-Thomson, "Theoretical Aerodynamics", ch. 7). The loop runs from the trailing edge over the upper
// side, round the nose and back.
function joukowskiTable(points: number): string {
  const loop = joukowskiLoop({ re: -0.1, im: 0 }, 0, points);
  const rows = ['# symmetric Joukowski section at zero incidence, exact potential flow (invented for the test)', 'x/c\ty/c\tCp'];
  loop.x.forEach((x, i) => rows.push([x, loop.y[i], loop.cp[i]].map((v) => v.toFixed(6)).join('\t')));
  return rows.join('\n');
}
const TABLE = joukowskiTable(161);
const REYNOLDS = 1e7;
// A tag per run keeps the titles unique when the test runs again on the same database.
const RUN = Date.now().toString(36);
const FLOW_TITLE = `E2E ${RUN}: Re 1e7, M 0 (invented)`;
const PRESSURE_TITLE = `E2E ${RUN}: Joukowski 12 % (invented)`;
const ANALYSIS_TITLE = `E2E ${RUN}: free transition`;

let browser: Browser;
let page: Page;
const problems: string[] = [];

beforeAll(async () => {
  browser = await launchBrowser();
  page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
  collectPageProblems(page, problems);
});
afterAll(async () => browser?.close());

function frame(title: string): Locator {
  return page.locator(`lam-cell-frame[data-cell-title="${title}"]`);
}

/** Adds a cell of `kind` at the end of the stack and names it. */
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

async function pick(cell: Locator, label: string, option: string): Promise<void> {
  await cell.getByRole('combobox', { name: label }).click();
  await page.getByRole('option', { name: option }).click();
}

describe('the study notebook', () => {
  it('opens the demo study of the demo project', async () => {
    await signInThroughProvider(page, 'engineer');
    await page.getByRole('link', { name: /Larkspur T-62 wing/ }).first().click();
    await page.getByRole('link', { name: /Outboard section, cruise/ }).first().click();
    await page.getByRole('heading', { level: 1, name: /Outboard section, cruise/ }).waitFor();
    await page.getByRole('button', { name: 'Add cell' }).waitFor();
  });

  it('adds a flow condition given by Reynolds number', async () => {
    const flow = await addCell('Flow condition', FLOW_TITLE);
    await flow.getByText('Reynolds number', { exact: true }).click();
    await flow.getByLabel(/Reynolds number Re/).fill('1e7');
    await flow.getByLabel(/Mach number/).fill('0');
    await expect.poll(() => flow.locator('[data-quantity="Re"] dd').textContent()).toBe('1.00 × 10⁷');
  });

  it('adds a pressure cell, pastes a Cp table and sees it read and plotted', async () => {
    const pressure = await addCell('Pressure distribution', PRESSURE_TITLE);
    const table = pressure.getByLabel(/Cp table/);
    await table.fill(TABLE);
    await pressure.locator('lam-plot').scrollIntoViewIfNeeded();
    await expect(table.inputValue()).resolves.toBe(TABLE);
    await pressure.getByText('161 points with y').waitFor();
    // A symmetric section at zero incidence stagnates at its nose, x/c = 0.
    await expect(pressure.locator('.facts dd.lam-mono').first().textContent()).resolves.toBe('x/c 0.0000');
    await pressure.locator('lam-plot .main-svg').first().waitFor({ timeout: 30_000 });
  });

  it('points an analysis at them, runs it and reads the governing transition from the summary table', async () => {
    const analysis = await addCell('Transition analysis', ANALYSIS_TITLE);
    await pick(analysis, 'Flow condition', FLOW_TITLE);
    await pick(analysis, 'Pressure distribution', PRESSURE_TITLE);
    await analysis.getByRole('button', { name: 'Run' }).click();

    const table = analysis.getByRole('table', { name: 'Transition summary per surface' });
    await table.waitFor({ timeout: 60_000 }).catch(async (error: unknown) => {
      await page.screenshot({ path: '/tmp/laminote-e2e-notebook-failed.png', fullPage: true });
      throw error;
    });
    await expect.poll(() => analysis.locator('.run-state-label').textContent()).toBe('Up to date');
    const rows = await table.locator('tbody tr').all();
    const shown = new Map<string, { at: number; by: string }>();
    for (const row of rows) {
      const name = (await row.locator('td').first().textContent())?.trim() ?? '';
      const governing = row.locator('td.governing');
      shown.set(name, { at: Number(await governing.locator('strong').textContent()), by: ((await governing.locator('.by').textContent()) ?? '').trim() });
    }
    expect([...shown.keys()].sort()).toEqual(['lower', 'upper']);

    // The same case through the engine library directly: the page must show what the engine found.
    const direct = analyzeCase({ flow: { reynolds: REYNOLDS, mach: 0, nCrit: 9 }, pressureTable: TABLE });
    for (const surface of direct.surfaces) {
      const { s, x } = surface.stations;
      const at = surface.transition.s!;
      const k = s.findIndex((v) => v >= at);
      const xAt = x![k - 1] + ((at - s[k - 1]) / (s[k] - s[k - 1])) * (x![k] - x![k - 1]);
      expect(shown.get(surface.name)!.at).toBeCloseTo(xAt, 3);
      expect(shown.get(surface.name)!.at).toBeGreaterThan(0.05);
      expect(shown.get(surface.name)!.at).toBeLessThan(1);
    }
    // A symmetric section at zero incidence: both sides turn turbulent at the same place.
    expect(shown.get('upper')!.at).toBeCloseTo(shown.get('lower')!.at, 2);

    await analysis.getByText(/Engineering estimates from integral boundary-layer methods/).waitFor();
    // Plots are drawn as they come into view, as the person scrolls to them.
    // Each plot in view starts drawing on its own idle callback, so on a busy machine the N-factor plot
    // can be drawn while the skin-friction plot scrolled to still waits: wait for both.
    await analysis.locator('lam-plot[data-plot="cf"]').scrollIntoViewIfNeeded();
    await analysis.locator('lam-plot[data-plot="cf"] .main-svg').first().waitFor({ timeout: 30_000 });
    await analysis.locator('lam-plot[data-plot="n"] .main-svg').first().waitFor({ timeout: 30_000 });
    expect(await analysis.locator('lam-plot .main-svg').count()).toBeGreaterThanOrEqual(4);
    // The N-factor plot has its axis titles with what is plotted.
    await expect(analysis.locator('lam-plot[data-plot="n"]').textContent()).resolves.toMatch(/x\/c.*N \(envelope/s);
    await analysis.scrollIntoViewIfNeeded();
    await page.screenshot({ path: '/tmp/laminote-e2e-notebook.png', fullPage: true });
    await analysis.screenshot({ path: '/tmp/laminote-e2e-analysis.png' });
  });

  it('keeps the cells after a reload (the draft was saved)', async () => {
    await page.reload();
    await frame(ANALYSIS_TITLE).waitFor();
    await expect(frame(PRESSURE_TITLE).getByLabel(/Cp table/).inputValue()).resolves.toBe(TABLE);
    await expect.poll(() => frame(ANALYSIS_TITLE).locator('.run-state-label').textContent()).toBe('Up to date');
  });

  it('downloads the whole study as one document, which the engine computes again to the same numbers', async () => {
    const link = page.getByRole('link', { name: 'Download the study' });
    await link.scrollIntoViewIfNeeded();
    await page.locator('header.notebook-head').screenshot({ path: '/tmp/laminote-e2e-notebook-head.png' });
    const [download] = await Promise.all([page.waitForEvent('download'), link.click()]);
    expect(download.suggestedFilename()).toMatch(/^outboard-section-.+-main-draft\.laminote\.json$/);
    const document = studyDocumentSchema.parse(JSON.parse(readFileSync((await download.path())!, 'utf8')));
    const stored = document.cells.find((c) => c.title === ANALYSIS_TITLE)!;
    expect(stored.output?.status).toBe('ok');
    // What `npm run aero -- study` does with the file: every cell again from its inputs alone.
    const again = computeStudy(document).cells.find((c) => c.cellId === stored.cellId)!;
    const transition = (doc: typeof stored) => (doc.output!.result as { surfaces: { transition: { s: number | null } }[] }).surfaces.map((s) => s.transition.s);
    expect(transition(again)).toEqual(transition(stored));
  });

  it('met no script error and no content-security-policy violation', () => {
    expect(problems).toEqual([]);
  });
});
