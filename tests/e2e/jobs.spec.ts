import { randomUUID } from 'node:crypto';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { joukowskiLoop } from '../../libs/aero/test/joukowski';
import { collectPageProblems, launchBrowser, signInThroughProvider } from '../support/browser';
import { testEnv } from '../support/env';

/**
 * A long sweep in the browser: the engineer runs a study whose sweep has 2,000 cases, follows the
 * run's progress bar (the study's and the sweep cell's), stops it, opens the page again while a new
 * run goes on (it shows how far the run is, not from zero), and sees the cells fill in as it ends.
 * Screenshots go to SCREENSHOT_DIR when set.
 */
let browser: Browser;
let context: BrowserContext;
let page: Page;
const problems: string[] = [];
const shots = process.env['SCREENSHOT_DIR'];
const shot = async (name: string) => {
  if (shots) await page.screenshot({ path: `${shots}/${name}.png`, fullPage: false });
};

beforeAll(async () => {
  browser = await launchBrowser();
  context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
  page = await context.newPage();
  collectPageProblems(page, problems);
  await signInThroughProvider(page, 'engineer');
});
afterAll(async () => browser?.close());

async function api(method: 'GET' | 'POST' | 'PUT', path: string, body?: object) {
  const xsrf = (await context.cookies()).find((c) => c.name === 'XSRF-TOKEN')?.value ?? '';
  const res = await context.request.fetch(`${testEnv.appUrl}${path}`, { method, headers: { 'x-xsrf-token': xsrf, 'content-type': 'application/json' }, data: body ? JSON.stringify(body) : undefined });
  return { status: res.status(), body: (await res.json()) as Record<string, unknown> };
}

/** Pause the job worker process (SIGSTOP, as a machine that has stalled) while fn runs, then let it go on. */
async function whileWorkerPaused(fn: () => Promise<void>) {
  process.kill(testEnv.workerPid, 'SIGSTOP');
  try {
    await fn();
  } finally {
    process.kill(testEnv.workerPid, 'SIGCONT');
  }
}

const progressText = () => page.locator('lam-run-progress').first().textContent();
const doneOf = async () => Number((/([\d,]+) of 2,003/.exec((await progressText()) ?? '')?.[1] ?? '-1').replace(/,/g, ''));

describe('a long sweep as a job, in the browser', () => {
  let studyId: string;
  let ids: { flow: string; pressure: string; analysis: string; sweep: string };

  it('shows the run with a progress bar on the study and on the sweep, and stops it', async () => {
    const projects = (await api('GET', '/api/projects')).body as unknown as { id: string; name: string }[];
    const project = projects.find((p) => /Larkspur T-62 wing/.test(p.name))!;
    const title = `Off-design envelope ${randomUUID().slice(0, 6)} (invented)`;
    studyId = ((await api('POST', `/api/projects/${project.id}/studies`, { title })).body as { id: string }).id;
    const branchId = ((await api('GET', `/api/studies/${studyId}/branches`)).body as unknown as { id: string }[])[0]!.id;
    // Exact potential flow past a symmetric Joukowski section (Milne-Thomson, "Theoretical Aerodynamics", ch. 7), 2 × 300 stations.
    // A long sweep even for a fast engine and workers that take work the moment it is queued: 2,000 Mach
    // numbers (each a compressible layer of its own) over a 2 × 4,000-station section. The engine is fast
    // enough that the whole run takes seconds, so the test pauses the worker process (SIGSTOP) where it
    // must see the run under way, rather than race the run's end.
    const loop = joukowskiLoop({ re: -0.08, im: 0 }, 0, 8001);
    const table = [`# ${title}`, 'x y cp', ...loop.x.map((x, i) => `${x.toFixed(8)} ${loop.y[i]!.toFixed(8)} ${loop.cp[i]!.toFixed(8)}`)].join('\n');
    ids = { flow: randomUUID(), pressure: randomUUID(), analysis: randomUUID(), sweep: randomUUID() };
    const cells = [
      { cellId: ids.flow, kind: 'flow', title: 'Cruise, Re 6 million', inputs: { mode: 'reynolds', reynolds: 6e6, mach: 0, nCrit: 9 } },
      { cellId: ids.pressure, kind: 'pressure', title: 'Joukowski 12 % (exact)', inputs: { text: table } },
      { cellId: ids.analysis, kind: 'analysis', title: 'Free transition', inputs: { flowCellId: ids.flow, pressureCellId: ids.pressure, criteria: ['eN', 'michel'] } },
      { cellId: ids.sweep, kind: 'sweep', title: 'Mach number envelope', inputs: { analysisCellId: ids.analysis, parameter: 'mach', from: 0.1, to: 0.6, steps: 2000 } },
    ].map((c) => ({ collapsed: false, ...c }));
    expect((await api('PUT', `/api/branches/${branchId}/draft`, { baseRevision: 0, cells })).status).toBe(200);

    await page.goto(`${testEnv.appUrl}/studies/${studyId}`);
    await page.getByRole('heading', { level: 1, name: title }).waitFor();
    await page.getByRole('button', { name: /Run study/ }).click();
    await page.locator('lam-run-progress').waitFor();
    await expect.poll(doneOf, { timeout: 60_000 }).toBeGreaterThan(40);
    // Paused while the page is checked and the run stopped: the run is under way however fast the engine.
    await whileWorkerPaused(async () => {
      expect(await progressText()).toMatch(/Mach number envelope: [\d,]+ of 2,000 cases/);
      // The sweep cell carries its own bar with the cases done.
      await expect.poll(() => page.locator('lam-cell-progress').filter({ hasText: 'of 2,000 cases' }).count()).toBe(1);
      // The light cells' outputs landed first: they show as computed while the sweep goes on, not
      // "Computing…". The pressure cell's (its table is this study's own) was computed by this job; the flow
      // cell's may have been stored before by another study with the same flow (the whole suite's order
      // decides), and is shown as soon as the job finds it, not when the job ends.
      for (const cellTitle of ['Joukowski 12 % (exact)', 'Cruise, Re 6 million'])
        await expect.poll(async () => (await page.locator(`lam-cell-frame[data-cell-title="${cellTitle}"]`).getAttribute('class')) ?? '', { timeout: 10_000 }).toContain('lam-cell-state-current');
      expect(await page.locator('lam-run-progress').count()).toBe(1);
      await shot('jobs-1-running');

      await page.getByRole('button', { name: 'Stop run' }).click();
    });
    await page.locator('lam-run-progress').waitFor({ state: 'detached', timeout: 30_000 });
    // What it had computed is kept; the sweep has no output yet.
    await expect.poll(async () => (await page.locator('lam-cell-frame[data-cell-title="Free transition"]').getAttribute('class')) ?? '', { timeout: 15_000 }).toContain('lam-cell-state-current');
    // (The analysis shows its output as soon as it lands, before the run has ended: wait for the sweep too.)
    await expect.poll(async () => (await page.locator('lam-cell-frame[data-cell-title="Mach number envelope"]').getAttribute('class')) ?? '', { timeout: 15_000 }).toContain('lam-cell-state-idle');
    await shot('jobs-2-stopped');
  });

  it('shows a run under way as it stands when the page is opened again, and fills the cells in as it ends', async () => {
    // The run is queued again (202); anything else is told with the server's answer and the page's messages.
    const [answer] = await Promise.all([
      page.waitForResponse((r) => r.request().method() === 'POST' && /\/api\/branches\/[^/]+\/run$/.test(r.url()), { timeout: 30_000 }),
      page.getByRole('button', { name: /Run study/ }).click(),
    ]);
    expect(answer.status(), `${await answer.text().catch(() => '')} ${JSON.stringify(problems)}`).toBe(202);
    await page.locator('lam-run-progress').waitFor();
    await expect.poll(doneOf, { timeout: 60_000 }).toBeGreaterThan(100);
    // The worker is paused (SIGSTOP, as a machine that has stalled) while the page is opened again, so
    // the run is still under way however fast the engine: the page shows it from the server's state.
    await whileWorkerPaused(async () => {
      await page.reload();
      await page.locator('lam-run-progress').waitFor();
      // Not from zero: the stopped run's cases were kept, and the new run's count comes from the server.
      expect(await doneOf()).toBeGreaterThan(100);
      await shot('jobs-3-reopened');
    });
    await page.locator('lam-run-progress').waitFor({ state: 'detached', timeout: 240_000 });
    const sweep = page.locator('lam-cell-frame[data-cell-title="Mach number envelope"]');
    await expect.poll(async () => (await sweep.getAttribute('class')) ?? '', { timeout: 30_000 }).toContain('lam-cell-state-current');
    await sweep.scrollIntoViewIfNeeded();
    await shot('jobs-4-done');
    // A long sweep's table lists a spread of its steps; the plot has them all.
    await expect.poll(() => sweep.locator('table.quantities tbody tr').count()).toBeLessThanOrEqual(120);
    await sweep.getByText(/The table lists \d+ of the 2,000 steps/).waitFor();
    // The steps from M 0.3 up each warn of the compressible laminar layer: said once, with the range of
    // Mach numbers and how many cases gave it, in the screen's words (not 1,200 lines, one per step).
    const compressible = sweep.locator('p.warning', { hasText: 'computed compressible' });
    expect(await compressible.count()).toBe(1);
    expect(await compressible.textContent()).toMatch(/^Mach number 0\.3\d*–0\.6: the laminar layer is computed compressible; .* \(in 1,\d{3} of 2,000 cases\)$/);
    await compressible.scrollIntoViewIfNeeded();
    await shot('jobs-4b-warnings');
    expect(problems).toEqual([]);
  }, 300_000);

  it('runs a grid of two parameters and draws where transition is over both', async () => {
    const branchId = ((await api('GET', `/api/studies/${studyId}/branches`)).body as unknown as { id: string }[])[0]!.id;
    const draft = (await api('GET', `/api/branches/${branchId}/draft`)).body as { revision: number; cells: { cellId: string; kind: string; title: string; collapsed: boolean; inputs: Record<string, unknown> }[] };
    const cells = draft.cells.map(({ cellId, kind, title, collapsed, inputs }) => ({ cellId, kind, title, collapsed, inputs }));
    const gridId = randomUUID();
    cells.push({
      cellId: gridId,
      kind: 'sweep',
      title: 'Reynolds number and N_crit grid',
      collapsed: false,
      inputs: { analysisCellId: ids.analysis, parameter: 'reynolds', from: 2e6, to: 2e7, steps: 20, second: { parameter: 'nCrit', from: 5, to: 12, steps: 15 } },
    });
    expect((await api('PUT', `/api/branches/${branchId}/draft`, { baseRevision: draft.revision, cells })).status).toBe(200);
    await page.reload();
    const grid = page.locator('lam-cell-frame[data-cell-title="Reynolds number and N_crit grid"]');
    await grid.scrollIntoViewIfNeeded();
    await grid.getByRole('button', { name: 'Run' }).first().click();
    await expect.poll(async () => (await grid.getAttribute('class')) ?? '', { timeout: 120_000 }).toContain('lam-cell-state-current');
    await grid.getByRole('checkbox', { name: /Vary a second parameter/ }).isChecked().then((checked) => expect(checked).toBe(true));
    const map = grid.locator('lam-plot[aria-label^="Map of the upper transition"]');
    await map.scrollIntoViewIfNeeded();
    // The map is drawn as an image of coloured cells, with its colour bar.
    await expect.poll(() => map.locator('svg image').count(), { timeout: 30_000 }).toBeGreaterThan(0);
    await expect.poll(() => map.locator('.colorbar').count()).toBeGreaterThan(0);
    await shot('jobs-5-grid-map');
    expect(problems).toEqual([]);
  }, 180_000);
});
