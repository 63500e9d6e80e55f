import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { VALIDATION_SUITES } from '@laminote/aero';
import { collectPageProblems, launchBrowser, signInThroughProvider } from '../support/browser';
import { testEnv } from '../support/env';

let browser: Browser;
let page: Page;
const problems: string[] = [];

beforeAll(async () => {
  browser = await launchBrowser();
  page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
  collectPageProblems(page, problems);
  await signInThroughProvider(page, 'viewer');
  await page.getByRole('heading', { name: 'Projects' }).waitFor();
});
afterAll(async () => browser?.close());

describe('methods and validation pages', () => {
  it('opens a method from the top bar with its formulas typeset, symbols, limits and sources', async () => {
    await page.getByRole('link', { name: 'Methods and validation' }).click();
    await page.getByRole('link', { name: 'Thwaites’ laminar method' }).click();
    await page.getByRole('heading', { name: 'Thwaites’ laminar method', level: 1 }).waitFor();
    // KaTeX draws each display formula as .katex-display with MathML beside it for screen readers.
    expect(await page.locator('section[aria-label="Formulas"] .katex-display').count()).toBeGreaterThanOrEqual(4);
    expect(await page.locator('section[aria-label="Formulas"] math').count()).toBeGreaterThanOrEqual(4);
    await expect(page.getByText(/Aeronautical Quarterly 1 \(1949\)/).count()).resolves.toBe(1);
    await expect(page.getByText(/separation comes about 3 % late/i).count()).resolves.toBe(1);
    // The KaTeX fonts ship with the app: the formula's glyphs are drawn in KaTeX_Main or KaTeX_Math.
    const fonts = await page.evaluate(async () => {
      await document.fonts.ready;
      const loaded: string[] = [];
      document.fonts.forEach((f) => {
        if (f.family.replace(/"/g, '').startsWith('KaTeX') && f.status === 'loaded') loaded.push(f.family);
      });
      return loaded;
    });
    expect(fonts.length).toBeGreaterThan(0);
    await page.screenshot({ path: '/tmp/laminote-e2e-method.png', fullPage: true });
  });

  it('lists every shared reference case on the validation page, each passing, with its source', async () => {
    await page.getByRole('link', { name: 'Validation against published results' }).click();
    await page.getByRole('status').filter({ hasText: 'cases pass' }).waitFor({ timeout: 30_000 });
    const cases = VALIDATION_SUITES.flatMap((s) => s.cases());
    await expect(page.getByRole('status').filter({ hasText: 'cases pass' }).textContent()).resolves.toContain(`${cases.length} of ${cases.length}`);
    for (const suite of VALIDATION_SUITES) await page.getByRole('heading', { name: suite.title, level: 2 }).waitFor();
    const rows = page.locator('tr[data-case]');
    expect(await rows.count()).toBe(cases.length);
    expect(await page.locator('tr[data-case].fail').count()).toBe(0);
    const blasius = page.locator('tr[data-case="blasius.CF"]');
    await expect(blasius.textContent()).resolves.toMatch(/1\.328.*pass.*Blasius/s);
    await page.screenshot({ path: '/tmp/laminote-e2e-validation.png' });
    await page.locator('#suite-mangler-cone').scrollIntoViewIfNeeded();
    await page.screenshot({ path: '/tmp/laminote-e2e-validation-mangler.png' });
  });

  it('reads the API reference from the server’s OpenAPI description, every route with its token scope', async () => {
    await page.goto(`${testEnv.appUrl}/api-reference`);
    await page.getByRole('heading', { name: 'API reference', level: 1 }).waitFor();
    await page.locator('article.route').first().waitFor();
    const doc = await page.evaluate(async () => (await fetch('/api/openapi.json')).json());
    const routes = Object.values(doc.paths as Record<string, object>).reduce((n: number, ops) => n + Object.keys(ops).length, 0);
    expect(await page.locator('article.route').count()).toBe(routes);
    const report = page.locator('article.route[data-route="GET /api/versions/{versionId}/report.pdf"]');
    await expect(report.textContent()).resolves.toMatch(/token: Read.*application\/pdf/s);
    const create = page.locator('article.route[data-route="POST /api/me/tokens"]');
    await create.getByText('CreateToken').click();
    await expect(create.locator('pre').first().textContent()).resolves.toContain('"expiresInDays"');
    await page.screenshot({ path: '/tmp/laminote-e2e-api-reference.png' });
  });

  it('met no script error and no content-security-policy violation', () => {
    expect(problems).toEqual([]);
  });
});
