import { execFile } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { collectPageProblems, launchBrowser, signInThroughProvider } from '../support/browser';
import { testEnv } from '../support/env';

/**
 * A version report taken in the browser (every cell, plots drawn), its PDF, and a personal API token
 * made in settings, used by a script and revoked.
 */
let browser: Browser;
let context: BrowserContext;
let page: Page;
const problems: string[] = [];

beforeAll(async () => {
  browser = await launchBrowser();
  context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
  page = await context.newPage();
  collectPageProblems(page, problems);
  await signInThroughProvider(page, 'lead');
  await page.getByRole('heading', { name: 'Projects' }).waitFor();
});
afterAll(async () => browser?.close());

/** The signed-in browser's own API session (its cookies and anti-forgery token), as the app uses it. */
async function api(method: 'GET' | 'POST', path: string, body?: object) {
  const xsrf = (await context.cookies()).find((c) => c.name === 'XSRF-TOKEN')?.value ?? '';
  const res = await context.request.fetch(`${testEnv.appUrl}${path}`, { method, headers: { 'x-xsrf-token': xsrf, 'content-type': 'application/json' }, data: body ? JSON.stringify(body) : undefined });
  return { status: res.status(), body: res.headers()['content-type']?.includes('json') ? await res.json() : await res.body() };
}

let studyId: string;

/**
 * The plots the report draws for a cell of each kind with a result, by their titles
 * (server/src/reports/cell-sections.ts); other kinds, and cells not run or refused, have none.
 */
const REPORT_PLOTS: Record<string, string[]> = {
  pressure: ['Pressure distribution'],
  body: ['Meridian', 'Pressure distribution (axisymmetric panel method, incompressible)'],
  analysis: ['Amplification N (envelope eᴺ)', 'Shape factor H', 'Skin friction cf'],
  sweep: ['Transition against the swept parameter', 'Profile drag against the swept parameter'],
};

describe('a version report', () => {
  let versionId: string;
  let cellIds: string[];
  type SavedCell = { cellId: string; kind: string; title: string; output: { status: string } | null };

  it('is offered on a saved version of the demo study and shows every cell with its plots drawn', async () => {
    const projects = (await api('GET', '/api/projects')).body as { id: string; name: string }[];
    const project = projects.find((p) => /Larkspur T-62 wing/.test(p.name))!;
    const studies = (await api('GET', `/api/projects/${project.id}/studies`)).body as { id: string; title: string }[];
    studyId = studies.find((s) => /Outboard section, cruise/.test(s.title))!.id;
    const branchId = ((await api('GET', `/api/studies/${studyId}/branches`)).body as { id: string }[])[0]!.id;
    const run = await api('POST', `/api/branches/${branchId}/run`, {});
    expect([200, 202]).toContain(run.status);
    if (run.status === 202) {
      await expect.poll(async () => ((await api('GET', `/api/jobs/${(run.body as { jobId: string }).jobId}`)).body as { state: string }).state, { timeout: 60_000 }).toBe('completed');
    }
    const history = (await api('GET', `/api/studies/${studyId}/versions`)).body as { branches: { id: string; headVersionId?: string | null }[]; versions: { id: string; branchId: string }[] };
    const head = history.versions.find((v) => v.branchId === branchId)?.id ?? null;
    const saved = await api('POST', `/api/branches/${branchId}/versions`, { message: 'Cruise as seeded, for the report (e2e)', expectedHeadVersionId: head });
    expect(saved.status, JSON.stringify(saved.body)).toBe(201);
    versionId = (saved.body as { id: string }).id;
    const cells = ((await api('GET', `/api/versions/${versionId}`)).body as { cells: SavedCell[] }).cells;
    cellIds = cells.map((c) => c.cellId);
    // The demo's own pressure, analysis and sweep cells were computed (other browser tests may have
    // added cells of their own to the demo study before this one, each with its plots).
    for (const title of ['Larkspur T-62 wing section, cruise (invented)', 'Transition and drag at cruise', 'Sensitivity to N_crit']) {
      expect(cells.find((c) => c.title === title)?.output?.status, title).toBe('ok');
    }

    await page.goto(`${testEnv.appUrl}/studies/${studyId}/versions/${versionId}`);
    const link = page.getByRole('link', { name: 'Report of this version (opens in a new tab)' });
    await link.waitFor();
    const [report] = await Promise.all([context.waitForEvent('page'), link.click()]);
    collectPageProblems(report, problems, 'report');
    await report.waitForLoadState('load');
    await report.getByRole('heading', { level: 1 }).waitFor();
    for (const id of cellIds) expect(await report.locator(`section.cell[data-cell-id="${id}"]`).count(), id).toBe(1);
    // Every cell with a result has the plots of its kind, named, and no other; so has the whole report.
    let expected = 0;
    for (const cell of cells) {
      const want = cell.output?.status === 'ok' ? (REPORT_PLOTS[cell.kind] ?? []) : [];
      const drawn = await report.locator(`section.cell[data-cell-id="${cell.cellId}"] figure.plot svg`).evaluateAll((svgs) => svgs.map((svg) => svg.getAttribute('aria-label')));
      expect(drawn, `${cell.kind} cell '${cell.title}'`).toEqual(want);
      expected += want.length;
    }
    const plots = report.locator('figure.plot svg');
    expect(await plots.count()).toBe(expected);
    for (let i = 0; i < (await plots.count()); i++) {
      const box = await plots.nth(i).boundingBox();
      expect(box!.width).toBeGreaterThan(300);
      expect(await plots.nth(i).locator('path').count()).toBeGreaterThan(0);
    }
    await report.screenshot({ path: '/tmp/laminote-e2e-report-top.png' });
    const demoAnalysis = cells.find((c) => c.title === 'Transition and drag at cruise')!;
    await report.locator(`section.cell[data-cell-id="${demoAnalysis.cellId}"]`).scrollIntoViewIfNeeded();
    await report.screenshot({ path: '/tmp/laminote-e2e-report-analysis.png' });
    await report.screenshot({ path: '/tmp/laminote-e2e-report-full.png', fullPage: true });
    await report.close();
  });

  it('comes as a PDF from the version page', async () => {
    const pdf = await api('GET', `/api/versions/${versionId}/report.pdf`);
    expect(pdf.status).toBe(200);
    const bytes = pdf.body as Buffer;
    expect(bytes.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    const link = page.getByRole('link', { name: 'Report of this version as PDF' });
    await expect(link.getAttribute('href')).resolves.toBe(`/api/versions/${versionId}/report.pdf?download=1`);
  });
});

describe('personal API tokens', () => {
  it('are made in settings, shown once, work as a bearer token, and stop when revoked', async () => {
    await page.goto(`${testEnv.appUrl}/projects`);
    await page.getByRole('button', { name: /Account/ }).click();
    await page.getByRole('menuitem', { name: 'API tokens' }).click();
    await page.getByRole('heading', { name: 'API tokens', level: 1 }).waitFor();
    await page.getByLabel('What it is for').fill('e2e: tunnel rig upload');
    await page.getByRole('radio', { name: 'Read and run' }).click();
    await page.getByRole('button', { name: 'Make token' }).click();
    const shown = page.locator('[data-token]');
    await shown.waitFor();
    const token = (await shown.textContent())!.trim();
    expect(token).toMatch(/^lmn_/);
    await page.screenshot({ path: '/tmp/laminote-e2e-tokens-made.png' });

    // A script, with no cookie: Node's own fetch.
    const asScript = (path: string) => fetch(`${testEnv.appUrl}${path}`, { headers: { authorization: `Bearer ${token}` } });
    expect((await asScript('/api/projects')).status).toBe(200);

    // The README's script, as printed there: put a Cp table in the demo study's draft, run, print transition.
    const readme = readFileSync(new URL('../../README.md', import.meta.url), 'utf8');
    const script = /## Scripts: API tokens[\s\S]*?```js\n([\s\S]*?)```/.exec(readme)![1]!;
    expect(script.trim().split('\n').length).toBeLessThanOrEqual(12);
    const dir = mkdtempSync(path.join(tmpdir(), 'laminote-readme-'));
    // On a branch of its own, from the main branch's newest version: the demo study's main draft is
    // read as seeded by other browser tests (the swept wing's crossflow transition against the engine).
    const mainId = ((await api('GET', `/api/studies/${studyId}/branches`)).body as { id: string }[])[0]!.id;
    const history = (await api('GET', `/api/studies/${studyId}/versions`)).body as { versions: { id: string; branchId: string; number: number }[] };
    let from = history.versions.filter((v) => v.branchId === mainId).sort((x, y) => y.number - x.number)[0]?.id;
    if (!from) {
      const saved = await api('POST', `/api/branches/${mainId}/versions`, { message: 'Cruise as seeded, for the token script (e2e)', expectedHeadVersionId: null });
      expect(saved.status, JSON.stringify(saved.body)).toBe(201);
      from = (saved.body as { id: string }).id;
    }
    const created = await api('POST', `/api/versions/${from}/branches`, { name: `Tunnel rig ${randomUUID().slice(0, 6)} (e2e)`, purpose: 'The README script’s upload (e2e)' });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const branchId = (created.body as { id: string }).id;
    const draft = (await (await asScript(`/api/branches/${branchId}/draft`)).json()) as { cells: { kind: string; inputs: { text?: string } }[] };
    // An invented variant of the demo table: every Cp 3 % stronger, so the run has something new to compute.
    const table = draft.cells.find((c) => c.kind === 'pressure')!.inputs.text!.replace(/^(\s*-?[\d.]+\s+-?[\d.]+\s+)(-?[\d.]+)\s*$/gm, (_m, head: string, cp: string) => `${head}${(Number(cp) * 1.03).toFixed(5)}`);
    writeFileSync(path.join(dir, 'transition.mjs'), script);
    writeFileSync(path.join(dir, 'cp.txt'), table);
    const { stdout } = await promisify(execFile)(process.execPath, [path.join(dir, 'transition.mjs'), branchId, path.join(dir, 'cp.txt')], {
      env: { ...process.env, LAMINOTE_URL: testEnv.appUrl, LAMINOTE_TOKEN: token },
      timeout: 60_000,
    });
    expect(stdout).toMatch(/· upper: transition at x\/c = 0\.\d{3} \(\w+\)/);
    expect(stdout).toMatch(/· lower: (transition at x\/c = 0\.\d{3} \(\w+\)|laminar to the end)/);
    const after = (await (await asScript(`/api/branches/${branchId}/draft`)).json()) as { cells: { kind: string; inputs: { text?: string } }[] };
    expect(after.cells.find((c) => c.kind === 'pressure')!.inputs.text).toBe(table);

    await page.reload();
    const row = page.getByRole('row', { name: /e2e: tunnel rig upload/ });
    await row.waitFor();
    await expect(row.textContent()).resolves.toMatch(/Read and run.*Active/s);
    expect(await page.locator('[data-token]').count()).toBe(0);
    await row.getByRole('button', { name: /Revoke/ }).click();
    await expect.poll(() => row.textContent()).toMatch(/Revoked/);
    await page.screenshot({ path: '/tmp/laminote-e2e-tokens-revoked.png' });
    expect((await asScript('/api/projects')).status).toBe(401);
  });

  it('met no script error and no content-security-policy violation', () => {
    expect(problems).toEqual([]);
  });
});
