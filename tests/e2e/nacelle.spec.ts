import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { collectPageProblems, launchBrowser, signInThroughProvider } from '../support/browser';

/**
 * The nacelle team's demo study (invented data) as its engineer meets it: the pod's meridian and Cp,
 * a run of the whole study, and an analysis of a body of revolution told in its own terms — locations
 * as x/L from the nose, plots along the body, no section drag coefficient — with Re_θ on powers of ten.
 */

let browser: Browser;
let page: Page;
const problems: string[] = [];

beforeAll(async () => {
  browser = await launchBrowser();
  page = await browser.newPage({ viewport: { width: 1400, height: 1000 } });
  collectPageProblems(page, problems);
});
afterAll(async () => browser?.close());

const frame = (title: string) => page.locator(`lam-cell-frame[data-cell-title="${title}"]`);

describe('the nacelle demo study', () => {
  it('opens from the nacelle project', async () => {
    await signInThroughProvider(page, 'engineer');
    await page.getByRole('link', { name: /Larkspur T-62 nacelles/ }).first().click();
    await page.getByRole('link', { name: /Nacelle pod, cruise/ }).first().click();
    await page.getByRole('button', { name: 'Run study' }).waitFor();
    await expect.poll(() => page.locator('lam-cell-frame').count()).toBe(5);
  });

  it('runs, and tells the pod’s transition along its length', async () => {
    await page.getByRole('button', { name: 'Run study' }).click();
    const analysis = frame('Transition on the pod at cruise');
    await expect.poll(() => analysis.locator('.run-state-label').textContent(), { timeout: 90_000 }).toBe('Up to date');
    await expect(analysis.locator('p.units').textContent()).resolves.toMatch(/Locations as x\/L, from the nose on the body length\. No drag coefficient/);
    const headers = await analysis.locator('th').allTextContents();
    expect(headers.map((h) => h.trim())).not.toContain('c_d');
    // The engine's words, whole and with labels (a sentence once ended at "transition and separation are").
    const warnings = await analysis.locator('ul.warnings li').allTextContents();
    expect(warnings.join('\n')).toMatch(/transition and separation are given as on any surface/);
    expect(warnings.join('\n')).not.toMatch(/\bmach\b/);
    const plotLabels = await analysis.locator('lam-plot').evaluateAll((plots) => plots.map((p) => p.getAttribute('label') ?? p.getAttribute('aria-label') ?? ''));
    expect(plotLabels.join(' | ')).not.toMatch(/along the chord/);
    await analysis.locator('[data-plot="retheta"]').scrollIntoViewIfNeeded();
    await analysis.locator('[data-plot="retheta"] .main-svg').first().waitFor({ timeout: 30_000 });
    // Tick values as powers of ten (a superscript exponent), not the charting library's SI prefixes.
    const ticks = await analysis.locator('[data-plot="retheta"] .ytick text').allTextContents();
    expect(ticks.join(' ')).not.toMatch(/\d[kMG]\b/);
    await analysis.screenshot({ path: '/tmp/laminote-e2e-nacelle-analysis.png' });
    const body = frame('Larkspur T-62 nacelle pod, outer lines (invented)');
    await body.scrollIntoViewIfNeeded();
    await body.screenshot({ path: '/tmp/laminote-e2e-nacelle-body.png' });
    expect(problems).toEqual([]);
  });
});
