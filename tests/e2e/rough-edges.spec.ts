import type { Browser, Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { collectPageProblems, launchBrowser, signInThroughProvider } from '../support/browser';
import { testEnv } from '../support/env';

/**
 * The rough edges a practitioner met, checked where only a browser shows them: how the add-cell menu
 * and the projects table are set, a new study opening at once, a narrow window's analysis table, the
 * plots' own toolbar and a print of a whole study, a comment panel opened below a tall cell, names in
 * the breadcrumbs, sending a version for review, and the review's own words. Screenshots go to
 * /tmp/laminote-e2e-rough-*.png.
 */

const RUN = Date.now().toString(36);
const shots = '/tmp/laminote-e2e-rough';
const ANALYSIS_TITLE = 'Transition and drag at cruise';

let browser: Browser;
let page: Page;
const problems: string[] = [];

beforeAll(async () => {
  browser = await launchBrowser();
  page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
  collectPageProblems(page, problems);
});
afterAll(async () => browser?.close());

const frame = (title: string): Locator => page.locator(`lam-cell-frame[data-cell-title="${title}"]`);
const style = (locator: Locator, property: string) => locator.evaluate((e, p) => getComputedStyle(e).getPropertyValue(p), property);

async function openDemoStudy(): Promise<string> {
  await page.goto(testEnv.appUrl + '/projects');
  await page.getByRole('link', { name: /Larkspur T-62 wing/ }).first().click();
  await page.getByRole('link', { name: /Outboard section, cruise/ }).first().click();
  await page.getByRole('heading', { level: 1, name: /Outboard section, cruise/ }).waitFor();
  return /\/studies\/([^/?]+)/.exec(page.url())![1]!;
}

describe('rough edges of the notebook', () => {
  it('sets number columns’ headers of the projects table in the text face', async () => {
    await signInThroughProvider(page, 'lead');
    await page.getByRole('link', { name: /Larkspur T-62 wing/ }).first().waitFor();
    const header = page.getByRole('columnheader', { name: 'Studies' });
    expect(await style(header, 'font-family')).not.toMatch(/JetBrains Mono/);
    expect(await style(page.locator('td.lam-number').first(), 'font-family')).toMatch(/JetBrains Mono/);
    await page.screenshot({ path: `${shots}-projects.png` });
  });

  it('opens a new study as soon as it is created, and lists each kind on two lines in the add-cell menu', async () => {
    await page.getByRole('link', { name: /Larkspur T-62 wing/ }).first().click();
    await page.getByRole('button', { name: /New study/ }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByLabel('Title').fill(`Rough edges ${RUN} (invented)`);
    await dialog.getByRole('button', { name: 'Create study' }).click();
    await page.getByRole('heading', { level: 1, name: `Rough edges ${RUN} (invented)` }).waitFor();
    expect(page.url()).toMatch(/\/studies\/[0-9a-f-]{36}/);

    await page.getByRole('button', { name: 'Add cell' }).click();
    const item = page.getByRole('menuitem', { name: /Flow condition/ });
    const name = item.locator('.kind-name');
    const hint = item.locator('.kind-hint');
    const [nameBox, hintBox] = [await name.boundingBox(), await hint.boundingBox()];
    // Two lines: the description starts below the name, in a lighter weight.
    expect(hintBox!.y).toBeGreaterThanOrEqual(nameBox!.y + nameBox!.height - 1);
    expect(Number(await style(name, 'font-weight'))).toBeGreaterThan(Number(await style(hint, 'font-weight')));
    // Two columns, so the whole list fits above or below the button in a window of ordinary height.
    const second = await page.getByRole('menuitem', { name: /Pressure distribution/ }).boundingBox();
    const first = await item.boundingBox();
    expect(second!.y).toBeCloseTo(first!.y, 0);
    expect(second!.x).toBeGreaterThan(first!.x + first!.width / 2);
    await page.screenshot({ path: `${shots}-add-cell.png` });
    await page.keyboard.press('Escape');
  });

  it('opens the add-cell menu whole from a button low in the window', async () => {
    await openDemoStudy();
    await page.waitForFunction(() => document.querySelectorAll('.body-pending').length === 0);
    const add = page.getByRole('button', { name: 'Add cell' });
    // Put the button 60 px above the bottom of the window, where a menu placed below it cannot fit.
    await add.evaluate((button) => window.scrollBy(0, button.getBoundingClientRect().bottom - window.innerHeight + 60));
    await add.click();
    const first = page.getByRole('menuitem', { name: /Flow condition/ });
    const last = page.getByRole('menuitem', { name: /Note/ });
    await last.waitFor();
    const viewport = page.viewportSize()!;
    for (const item of [first, last]) {
      const box = (await item.boundingBox())!;
      expect(box.y).toBeGreaterThanOrEqual(0);
      expect(box.y + box.height).toBeLessThanOrEqual(viewport.height);
    }
    await page.keyboard.press('Escape');
  });

  it('shows the plots with a toolbar of its own, not the charting library’s', async () => {
    await openDemoStudy();
    // The demo study is seeded without results: run its analysis (with the cells it uses) for the plots.
    await page.getByText('All edits saved').waitFor({ timeout: 20_000 });
    await frame(ANALYSIS_TITLE).getByRole('button', { name: 'Run', exact: true }).click();
    await expect.poll(() => frame(ANALYSIS_TITLE).locator('.run-state-label').textContent(), { timeout: 180_000 }).toBe('Up to date');
    const analysis = frame(ANALYSIS_TITLE);
    await analysis.scrollIntoViewIfNeeded();
    const plot = analysis.locator('lam-plot').first();
    await plot.locator('.js-plotly-plot').waitFor({ timeout: 30_000 });
    await plot.hover();
    expect(await page.locator('.modebar').count()).toBe(0);
    const tools = plot.getByRole('toolbar');
    await expect.poll(() => tools.getByRole('button').evaluateAll((b) => b.map((x) => x.getAttribute('aria-label')))).toEqual(['Export PNG', 'Export SVG', 'Reset view']);
    const download = page.waitForEvent('download');
    await tools.getByRole('button', { name: 'Export SVG' }).click();
    expect((await download).suggestedFilename()).toMatch(/\.svg$/);
    await plot.screenshot({ path: `${shots}-plot-toolbar.png` });
  }, 300_000);

  it('draws every plot of a study for print, not the placeholders of plots nobody scrolled to', async () => {
    await page.setViewportSize({ width: 1280, height: 600 });
    await openDemoStudy();
    const plots = page.locator('lam-plot');
    await expect.poll(() => plots.count(), { timeout: 20_000 }).toBeGreaterThan(1);
    await page.emulateMedia({ media: 'print' });
    await expect.poll(() => page.locator('lam-plot .placeholder').count(), { timeout: 30_000 }).toBe(0);
    await expect.poll(async () => (await plots.count()) === (await page.locator('lam-plot .js-plotly-plot').count()), { timeout: 30_000 }).toBe(true);
    await page.screenshot({ path: `${shots}-print.png`, fullPage: true });
    await page.emulateMedia({ media: 'screen' });
    await page.setViewportSize({ width: 1280, height: 900 });
  });

  it('says where the analysis table has columns out of view in an 800 px window', async () => {
    await page.setViewportSize({ width: 800, height: 900 });
    await openDemoStudy();
    const analysis = frame(ANALYSIS_TITLE);
    await analysis.scrollIntoViewIfNeeded();
    const cue = analysis.getByRole('button', { name: /More columns to the right/ });
    await cue.waitFor();
    await analysis.locator('.table-wrap').evaluate((e) => e.scrollIntoView({ block: 'center' }));
    await page.screenshot({ path: `${shots}-narrow-table.png` });
    await cue.click();
    await expect.poll(() => analysis.locator('.table-wrap').evaluate((e) => e.scrollLeft)).toBeGreaterThan(0);
    await page.setViewportSize({ width: 1280, height: 900 });
  });

  it('brings the comment panel of a tall cell into view', async () => {
    await openDemoStudy();
    const analysis = frame(ANALYSIS_TITLE);
    await analysis.scrollIntoViewIfNeeded();
    await analysis.locator('lam-cell-threads-button button').click();
    const panel = analysis.getByRole('region', { name: 'Comments on this cell' });
    await panel.waitFor();
    await expect.poll(() => panel.evaluate((e) => { const r = e.getBoundingClientRect(); return r.top >= 0 && r.top < window.innerHeight; }), { timeout: 5_000 }).toBe(true);
    await page.screenshot({ path: `${shots}-comment-panel.png` });
    await analysis.getByRole('button', { name: 'Hide comments', exact: true }).click();
  });

  it('saves a version and sends it for review from the same dialog, and names project and study in the breadcrumbs', async () => {
    const studyId = await openDemoStudy();
    const bar = page.getByRole('toolbar', { name: 'Versions' });
    await page.getByText('All edits saved').waitFor({ timeout: 20_000 });
    await bar.getByRole('button', { name: 'Save version' }).click();
    const save = page.getByRole('dialog');
    await save.getByLabel('What changed, and why').fill(`Rough edges check ${RUN} (invented)`);
    await save.getByRole('checkbox', { name: 'Send it for review once saved' }).check();
    await save.getByRole('button', { name: 'Save version' }).click();
    const send = page.getByRole('dialog').filter({ hasText: 'for review' });
    await send.getByRole('heading', { name: /^Send version \d+ of main for review$/ }).waitFor({ timeout: 20_000 });
    await send.getByRole('combobox', { name: 'Reviewers' }).click();
    await page.getByRole('option', { name: 'Lotte Brandvik' }).click();
    await page.keyboard.press('Escape');
    await send.getByLabel('Note to the reviewers (optional)').fill('Transition and drag at cruise, please.');
    await page.screenshot({ path: `${shots}-send-for-review.png` });
    await send.getByRole('button', { name: 'Send for review' }).click();
    await page.getByText('Sent for review; the reviewer was notified').waitFor();
    await expect.poll(() => bar.locator('lam-review-state .state').textContent(), { timeout: 10_000 }).toContain('Awaiting review');
    await bar.screenshot({ path: `${shots}-version-bar.png` });

    // The version page: the project and the study by name, the review in Laminote's words.
    await bar.locator('lam-study-review-state a').click();
    const crumbs = page.getByRole('navigation', { name: 'Breadcrumb' });
    await expect.poll(() => crumbs.getByRole('link').allTextContents()).toEqual(['Projects', 'Larkspur T-62 wing', 'Outboard section, cruise: laminar run and drag (invented data)']);
    const review = page.locator('lam-version-review');
    await review.getByText('Sent for review to').waitFor();
    await page.screenshot({ path: `${shots}-version-page.png`, fullPage: true });

    await page.goto(`${testEnv.appUrl}/studies/${studyId}/compare?b=${/versions\/([^/?]+)/.exec(page.url())![1]}`);
    await expect.poll(() => page.getByRole('navigation', { name: 'Breadcrumb' }).getByRole('link').allTextContents()).toEqual(['Projects', 'Larkspur T-62 wing', 'Outboard section, cruise: laminar run and drag (invented data)']);
  });

  it('offers a viewer no Comment button on a cell nobody has commented on', async () => {
    const viewer = await browser.newPage({ viewport: { width: 1280, height: 900 } });
    collectPageProblems(viewer, problems, 'viewer');
    const saved = page;
    page = viewer;
    try {
      await signInThroughProvider(page, 'viewer');
      await openDemoStudy();
      await page.locator('lam-cell-frame').first().waitFor();
      const withThreads = await page.locator('lam-cell-threads-button button').count();
      const cells = await page.locator('lam-cell-frame').count();
      expect(withThreads).toBeLessThan(cells);
      expect(await page.getByRole('button', { name: /Comment on this cell/ }).count()).toBe(0);
    } finally {
      page = saved;
      await viewer.close();
    }
  });

  it('met no script error and no failed request', () => {
    expect(problems).toEqual([]);
  });
});
