import { randomUUID } from 'node:crypto';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { collectPageProblems, launchBrowser, signInThroughProvider } from '../support/browser';
import { testEnv } from '../support/env';

/**
 * Issue 16 follow-up in the browser: each notebook result links the methods its numbers come from; a
 * study export is imported from the project page (a file that is not one is named); the compare page
 * gives a report of A against B.
 */
let browser: Browser;
let context: BrowserContext;
let page: Page;
const problems: string[] = [];
let projectId: string;
let studyId: string;
let branchId: string;

async function api(method: 'GET' | 'POST' | 'PUT', url: string, body?: object) {
  const xsrf = (await context.cookies()).find((c) => c.name === 'XSRF-TOKEN')?.value ?? '';
  const res = await context.request.fetch(`${testEnv.appUrl}${url}`, { method, headers: { 'x-xsrf-token': xsrf, 'content-type': 'application/json' }, data: body ? JSON.stringify(body) : undefined });
  return { status: res.status(), body: res.headers()['content-type']?.includes('json') ? await res.json() : await res.text() };
}

async function runBranch(branch = branchId) {
  const run = await api('POST', `/api/branches/${branch}/run`, {});
  expect([200, 202]).toContain(run.status);
  // Followed by hand: expect.poll is for inside a test, and beforeAll runs this too.
  for (let state = run.status === 202 ? 'queued' : 'completed', tries = 0; state !== 'completed'; tries++) {
    expect(state).not.toMatch(/failed|cancelled/);
    expect(tries).toBeLessThan(600);
    await new Promise((resolve) => setTimeout(resolve, 100));
    state = ((await api('GET', `/api/jobs/${(run.body as { jobId: string }).jobId}`)).body as { state: string }).state;
  }
}

async function saveVersion(message: string, branch = branchId): Promise<string> {
  const history = (await api('GET', `/api/studies/${studyId}/versions`)).body as { versions: { id: string; branchId: string; number: number }[] };
  const head = history.versions.filter((v) => v.branchId === branch).sort((a, b) => b.number - a.number)[0]?.id ?? null;
  const saved = await api('POST', `/api/branches/${branch}/versions`, { message, expectedHeadVersionId: head });
  expect(saved.status, JSON.stringify(saved.body)).toBe(201);
  return (saved.body as { id: string }).id;
}

beforeAll(async () => {
  browser = await launchBrowser();
  context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
  page = await context.newPage();
  collectPageProblems(page, problems);
  await signInThroughProvider(page, 'lead');
  await page.getByRole('heading', { name: 'Projects' }).waitFor();
  const projects = (await api('GET', '/api/projects')).body as { id: string; name: string }[];
  projectId = projects.find((p) => /Larkspur T-62 wing/.test(p.name))!.id;
  const studies = (await api('GET', `/api/projects/${projectId}/studies`)).body as { id: string; title: string }[];
  studyId = studies.find((s) => /Outboard section, cruise/.test(s.title))!.id;
  branchId = ((await api('GET', `/api/studies/${studyId}/branches`)).body as { id: string }[])[0]!.id;
  await runBranch();
}, 120_000);
afterAll(async () => browser?.close());

describe('issue 16 follow-up', () => {
  it('links each result of the notebook to the methods pages its numbers come from', async () => {
    await page.goto(`${testEnv.appUrl}/studies/${studyId}`);
    const analysisLink = page.locator('.method-links a', { hasText: 'Thwaites’ laminar method' }).first();
    await analysisLink.waitFor({ timeout: 30_000 });
    await analysisLink.scrollIntoViewIfNeeded();
    await page.screenshot({ path: '/tmp/laminote-e2e-method-links.png' });
    const hrefs = await page.locator('.method-links a').evaluateAll((as) => as.map((a) => a.getAttribute('href')));
    expect(hrefs).toContain('/methods/thwaites');
    expect(hrefs).toContain('/methods/envelope-en');
    expect(hrefs).toContain('/methods/poll'); // the leading-edge check cell
    await analysisLink.click();
    await page.waitForURL(/\/methods\/thwaites$/);
    await page.getByRole('heading', { name: 'Thwaites’ laminar method' }).waitFor();
  });

  it('imports a study export from the project page, naming a file that is not one', async () => {
    const versionId = await saveVersion('For import and compare (e2e)');
    const exported = await api('GET', `/api/versions/${versionId}/export`);
    expect(exported.status).toBe(200);
    const dir = mkdtempSync(path.join(tmpdir(), 'laminote-import-'));
    const good = path.join(dir, 'outboard-cruise.json');
    writeFileSync(good, typeof exported.body === 'string' ? exported.body : JSON.stringify(exported.body));
    const bad = path.join(dir, 'taps.csv');
    writeFileSync(bad, 'x/c,Cp\n0,1\n');

    await page.goto(`${testEnv.appUrl}/projects/${projectId}`);
    await page.getByRole('button', { name: 'Import a study' }).waitFor();
    await page.locator('input[type="file"]').setInputFiles(bad);
    const alert = page.getByRole('alert').filter({ hasText: 'taps.csv' });
    await alert.waitFor();
    expect(await alert.textContent()).toContain('“taps.csv” is not a study export: it is not JSON text.');
    await page.screenshot({ path: '/tmp/laminote-e2e-import-bad.png' });

    await page.locator('input[type="file"]').setInputFiles(good);
    // The dialog says what the file holds and offers the export's title, which the engineer changes.
    const dialog = page.getByRole('dialog', { name: 'Import a study' });
    await dialog.waitFor();
    expect(await dialog.textContent()).toMatch(/“outboard-cruise\.json”: \d+ cells from version \d+ on main of “/);
    const title = dialog.getByRole('textbox', { name: 'Title of the new study' });
    const imported = `Outboard cruise, imported ${randomUUID().slice(0, 6)} (invented)`;
    await title.fill(imported);
    await page.screenshot({ path: '/tmp/laminote-e2e-import-dialog.png' });
    await dialog.getByRole('button', { name: 'Import study' }).click();
    await page.waitForURL((url) => /\/studies\/[0-9a-f-]{36}$/.test(url.pathname) && !url.pathname.endsWith(studyId), { timeout: 30_000 });
    await page.locator('.method-links').first().waitFor({ timeout: 30_000 });
    await page.getByRole('heading', { level: 1, name: imported }).waitFor();
    await page.screenshot({ path: '/tmp/laminote-e2e-import-opened.png' });
  });

  it('gives a report of a comparison from the compare page', async () => {
    const a = ((await api('GET', `/api/studies/${studyId}/versions`)).body as { versions: { id: string; branchId: string; number: number }[] }).versions
      .filter((v) => v.branchId === branchId)
      .sort((x, y) => y.number - x.number)[0]!.id;
    // B is a variant on a branch of its own: the demo study's main draft is shared by the other browser
    // tests, which read it as seeded (swept-wing, versions), so it is left as it was.
    const created = await api('POST', `/api/versions/${a}/branches`, { name: `Cruise 2000 m lower ${randomUUID().slice(0, 6)} (e2e)`, purpose: 'Compare report (e2e)' });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const variant = (created.body as { id: string }).id;
    const draft = (await api('GET', `/api/branches/${variant}/draft`)).body as { revision: number; cells: { cellId: string; kind: string; title: string; inputs: Record<string, unknown> }[] };
    const cells = draft.cells.map((c) => ({ cellId: c.cellId, kind: c.kind, title: c.title, collapsed: false, inputs: c.kind === 'flow' ? { ...c.inputs, altitude_m: (c.inputs['altitude_m'] as number) - 2000 } : c.inputs }));
    const put = await api('PUT', `/api/branches/${variant}/draft`, { baseRevision: draft.revision, cells });
    expect(put.status, JSON.stringify(put.body)).toBe(200);
    await runBranch(variant);
    const b = await saveVersion('Cruise 2000 m lower (e2e)', variant);

    await page.goto(`${testEnv.appUrl}/studies/${studyId}/compare?a=${a}&b=${b}`);
    const link = page.getByRole('link', { name: 'Report of this comparison (opens in a new tab)' });
    await link.waitFor({ timeout: 30_000 });
    await page.screenshot({ path: '/tmp/laminote-e2e-compare-page.png' });
    const [report] = await Promise.all([context.waitForEvent('page'), link.click()]);
    collectPageProblems(report, problems, 'compare report');
    await report.waitForLoadState('load');
    await report.getByRole('heading', { level: 1 }).waitFor();
    expect(await report.getByRole('heading', { level: 1 }).textContent()).toMatch(/against v\d+/);
    const plots = report.locator('figure.plot svg');
    expect(await plots.count()).toBeGreaterThanOrEqual(2);
    expect(await plots.first().locator('path').count()).toBeGreaterThan(0);
    await report.screenshot({ path: '/tmp/laminote-e2e-compare-report-top.png' });
    await report.locator('section.cell[data-kind="analysis"]').first().scrollIntoViewIfNeeded();
    await report.screenshot({ path: '/tmp/laminote-e2e-compare-report-analysis.png' });
    await report.close();
    // The same report as a PDF file, downloaded from the page.
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Report of this comparison as PDF' }).click()]);
    expect(download.suggestedFilename()).toMatch(/\.pdf$/);
    const stream = await download.createReadStream();
    const chunks: Buffer[] = [];
    for await (const chunk of stream) chunks.push(chunk as Buffer);
    expect(Buffer.concat(chunks).subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(problems).toEqual([]);
  });
});
