import { analyzeCase, inventedDemoSections } from '@laminote/aero';
import { locatedCriterion } from '@laminote/contracts';
import type { Browser, Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { collectPageProblems, launchBrowser, signInThroughProvider } from '../support/browser';

/**
 * Versions in the browser: the demo lead saves a version of the demo study, branches a variant from
 * it, doubles the reference length of the flow condition (so the Reynolds number doubles), runs and
 * saves the variant, then compares it with the version it came from and reads the transition shift.
 */

// The demo study's cells (server/src/notebook/demo-filler.ts): invented Larkspur T-62 cruise section.
const FLOW_TITLE = 'Cruise, 12 500 m (invented)';
const ANALYSIS_TITLE = 'Transition and drag at cruise';
// A tag per run keeps the branch name unique when the test runs again on the same database.
const RUN = Date.now().toString(36);
const BRANCH = `double chord ${RUN}`;

let browser: Browser;
let page: Page;
const problems: string[] = [];

beforeAll(async () => {
  browser = await launchBrowser();
  page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
  collectPageProblems(page, problems);
});
afterAll(async () => browser?.close());

const bar = () => page.getByRole('toolbar', { name: 'Versions' });
const frame = (title: string): Locator => page.locator(`lam-cell-frame[data-cell-title="${title}"]`);

async function runStudy(): Promise<void> {
  await page.getByText('All edits saved').waitFor({ timeout: 20_000 });
  await page.getByRole('button', { name: 'Run study' }).click();
  await expect
    .poll(() => frame(ANALYSIS_TITLE).locator('.run-state-label').textContent(), { timeout: 60_000 })
    .toBe('Up to date')
    .catch(async (error: unknown) => {
      await page.screenshot({ path: '/tmp/laminote-e2e-versions-run-failed.png', fullPage: true });
      throw error;
    });
  await expect.poll(() => page.getByRole('button', { name: 'Run study' }).isEnabled(), { timeout: 60_000 }).toBe(true);
}

/** Saves a version through the version bar's dialog; answers the number the snackbar names. */
async function saveVersion(message: string, branch: string): Promise<number> {
  await bar().getByRole('button', { name: 'Save version' }).click();
  const dialog = page.getByRole('dialog');
  await dialog.getByLabel('What changed, and why').fill(message);
  await dialog.getByRole('button', { name: 'Save version' }).click();
  const notice = page.getByText(new RegExp(`Saved version (\\d+) of ${branch}`));
  await notice.waitFor({ timeout: 20_000 });
  return Number(/Saved version (\d+)/.exec((await notice.textContent()) ?? '')![1]);
}

/** What the compare page's delta table says in one row. */
async function deltaRow(table: Locator, quantity: string) {
  const row = table.locator('tbody tr').filter({ has: page.getByRole('rowheader', { name: quantity, exact: true }) });
  const cells = row.locator('td');
  return {
    a: Number.parseFloat((await cells.nth(0).textContent()) ?? ''),
    b: Number.parseFloat((await cells.nth(1).textContent()) ?? ''),
    delta: ((await cells.nth(2).textContent()) ?? '').trim(),
    effect: await row.getAttribute('data-effect'),
    cue: ((await cells.nth(3).textContent()) ?? '').trim(),
  };
}

describe('versions, branches and comparison', () => {
  it('saves a version of the demo study with its results', async () => {
    await signInThroughProvider(page, 'lead');
    await page.getByRole('link', { name: /Larkspur T-62 wing/ }).first().click();
    await page.getByRole('link', { name: /Outboard section, cruise/ }).first().click();
    await page.getByRole('heading', { level: 1, name: /Outboard section, cruise/ }).waitFor();
    await bar().waitFor();
    await runStudy();
    const number = await saveVersion(`Cruise as seeded (e2e ${RUN})`, 'main');
    await expect.poll(() => bar().textContent()).toContain(`v${number}`);
  });

  it('branches a variant from that version and lands on its draft', async () => {
    await bar().getByRole('button', { name: 'New branch' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByLabel('Branch name').fill(BRANCH);
    await dialog.getByLabel('Purpose').fill('Twice the chord: what a higher Reynolds number does to the laminar run (invented)');
    await dialog.getByRole('button', { name: 'Create branch' }).click();
    await page.waitForURL(/[?&]branch=/);
    await expect.poll(() => bar().getByRole('combobox', { name: 'Branch' }).textContent()).toContain(BRANCH);
    await expect.poll(() => bar().textContent()).toContain('No version of this branch yet');
    // The draft starts as the version: the analysis still has its result.
    await expect.poll(() => frame(ANALYSIS_TITLE).locator('.run-state-label').textContent()).toBe('Up to date');
  });

  it('changes the flow condition, runs and saves the variant', async () => {
    await frame(FLOW_TITLE).getByLabel(/Reference length L/).fill('4.2');
    await expect.poll(() => frame(ANALYSIS_TITLE).locator('.run-state-label').textContent()).not.toBe('Up to date');
    await runStudy();
    expect(await saveVersion('Chord 4.2 m: Reynolds number doubled', BRANCH)).toBe(1);
    await page.screenshot({ path: '/tmp/laminote-e2e-versions-notebook.png' });
  });

  it('compares the variant with the version it came from and reads the transition moving forward', async () => {
    await bar().getByRole('link', { name: 'Compare' }).click();
    await page.waitForURL(/\/compare\?.*a=.*/);
    await page.getByRole('heading', { name: 'Compare versions' }).waitFor();
    const result = page.getByRole('article', { name: `Results of ${ANALYSIS_TITLE}` });
    const upper = result.getByRole('table', { name: 'Deltas on the upper surface' });
    await upper.waitFor({ timeout: 30_000 });
    // The compare page has an address of its own: it opens the same for a colleague.
    const address = page.url();
    expect(new URL(address).searchParams.get('a')).toBeTruthy();
    expect(new URL(address).searchParams.get('b')).toBeTruthy();

    const eN = await deltaRow(upper, 'Envelope eᴺ');
    expect(eN.b).toBeLessThan(eN.a);
    expect(eN.delta).toMatch(/^−\d/);
    expect(eN.effect).toBe('adverse');
    expect(eN.cue).toContain('forward: shorter laminar run');

    // The same two cases through the engine library: the page shows what the engine finds, x/c of the
    // e^N transition on the upper side at chord 2.1 m and 4.2 m (Re doubled, transition forward).
    const section = inventedDemoSections().find((s) => s.id === 'larkspur-t62-cruise')!;
    const direct = (chord: number) => {
      const r = analyzeCase({ flow: { altitude_m: section.flow.altitude_m, mach: section.flow.mach, referenceLength_m: chord, nCrit: 9 }, pressureTable: section.pressureTable, sweepDeg: 18 });
      const surface = r.surfaces.find((s) => s.name === 'upper')!;
      const at = locatedCriterion(surface.transition.criteria.eN)!.s;
      const { s, x } = surface.stations;
      const k = s.findIndex((v) => v >= at);
      return x![k - 1]! + ((at - s[k - 1]!) / (s[k]! - s[k - 1]!)) * (x![k]! - x![k - 1]!);
    };
    expect(eN.a).toBeCloseTo(direct(2.1), 3);
    expect(eN.b).toBeCloseTo(direct(4.2), 3);

    const governing = await deltaRow(upper, 'Transition (governing)');
    expect(governing.effect).toBe('adverse');
    expect(governing.cue).toContain('forward');
    const extent = await deltaRow(upper, 'Laminar extent (share of the run)');
    expect(extent.effect).toBe('adverse');

    // The cell list names the changed input, old and new.
    const cells = page.getByRole('list', { name: 'Cell differences' });
    await expect(cells.getByText('Reference length (m)').isVisible()).resolves.toBe(true);
    await expect(cells.textContent()).resolves.toMatch(/2\.1 → 4\.2/);

    await result.getByRole('tab', { name: 'N-factor' }).first().click();
    await result.locator('lam-plot .main-svg').first().waitFor({ timeout: 30_000 });
    await page.screenshot({ path: '/tmp/laminote-e2e-versions-compare.png', fullPage: true });
  });

  it('opens the saved variant read-only from the history', async () => {
    await page.goBack();
    await bar().getByRole('button', { name: 'History' }).click();
    const drawer = page.getByRole('dialog');
    await drawer.getByText('Chord 4.2 m: Reynolds number doubled').waitFor();
    await page.screenshot({ path: '/tmp/laminote-e2e-versions-history.png' });
    await drawer.getByRole('link', { name: 'Open' }).first().click();
    await page
      .getByRole('heading', { level: 1, name: /Chord 4\.2 m: Reynolds number doubled/ })
      .waitFor()
      .catch(async (error: unknown) => {
        await page.screenshot({ path: '/tmp/laminote-e2e-versions-version-failed.png', fullPage: true });
        throw error;
      });
    await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toMatch(/^v1\s*Chord/);
    await page.getByText('A saved version, read-only.').waitFor();
    await page.screenshot({ path: '/tmp/laminote-e2e-versions-version.png', fullPage: true });
  });

  it('met no script error and no content-security-policy violation', () => {
    expect(problems).toEqual([]);
  });
});
