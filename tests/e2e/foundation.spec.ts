import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { collectPageProblems, launchBrowser, signInThroughProvider } from '../support/browser';
import { testEnv } from '../support/env';

let browser: Browser;
let page: Page;
const problems: string[] = [];

beforeAll(async () => {
  browser = await launchBrowser();
  page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
  collectPageProblems(page, problems);
});
afterAll(async () => browser?.close());

describe('signed-out landing → sign-in → projects → project → sign-out', () => {
  it('signs the demo engineer in through the provider page and lists their projects', async () => {
    await signInThroughProvider(page, 'engineer');
    await page.getByRole('heading', { name: 'Projects' }).waitFor();
    // The list arrives after the heading: wait for the row, then check the role shown beside it.
    const row = page.getByRole('row', { name: /Larkspur T-62 wing/ });
    await row.waitFor();
    await expect(row.textContent()).resolves.toMatch(/Engineer/);
    await page.screenshot({ path: '/tmp/laminote-e2e-projects.png' });
  });

  it('opens the demo project and shows its studies', async () => {
    await page.getByRole('link', { name: 'Larkspur T-62 wing' }).click();
    await page.getByText(/Outboard section, cruise/).first().waitFor();
    await page.screenshot({ path: '/tmp/laminote-e2e-project.png' });
  });

  it('signs out through the provider and lands signed out', async () => {
    await page.getByRole('button', { name: /Dev Arjunan|account|user menu/i }).first().click();
    await page.getByRole('menuitem', { name: 'Sign out' }).click();
    await page.waitForURL((url) => url.href.startsWith(testEnv.appUrl) && !url.pathname.startsWith('/projects'), { timeout: 20_000 });
    await page.getByRole('button', { name: /sign in/i }).first().waitFor();
    const me = await page.evaluate(async () => (await fetch('/api/me')).status);
    expect(me).toBe(401);
  });

  it('met no script error and no content-security-policy violation', () => {
    expect(problems).toEqual([]);
  });
});
