import type { Browser, BrowserContext, Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SinkMessage } from '@laminote/contracts';
import { DEMO_USERS } from '../../oidc-fake/src/users';
import { collectPageProblems, launchBrowser, signInThroughProvider } from '../support/browser';
import { testEnv } from '../support/env';

/**
 * The review loop in the browser, for the demo people: the reviewer comments on the demo study's
 * analysis cell mentioning the engineer; the SMTP sink receives the e-mail and its link opens the cell
 * for the engineer, who replies and resolves; the reviewer clears the version.
 */
const reviewer = DEMO_USERS.find((u) => u.role === 'reviewer')!;
const engineer = DEMO_USERS.find((u) => u.role === 'engineer')!;
// One run's words, so the mail and the thread of this run are told from any earlier ones.
const stamp = `run ${Date.now().toString(36)}`;
const shots = '/tmp/laminote-e2e-review';

function sinkUrl(): string {
  const port = process.env['SMTP_SINK_HTTP_PORT'];
  if (!port) throw new Error('SMTP_SINK_HTTP_PORT is not set: run the browser tests through `npm test` (scripts/test.ts starts the mail sink).');
  return `http://127.0.0.1:${port}/messages`;
}

async function waitForMail(to: string, containing: string, timeoutMs = 30_000): Promise<SinkMessage> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const messages = (await (await fetch(`${sinkUrl()}?to=${encodeURIComponent(to)}`)).json()) as SinkMessage[];
    const found = messages.find((m) => m.text.includes(containing));
    if (found) return found;
    await new Promise((r) => setTimeout(r, 300));
  }
  throw new Error(`no mail to ${to} containing “${containing}” reached the sink within ${timeoutMs / 1000} s`);
}

let browser: Browser;
const contexts: BrowserContext[] = [];
const problems: string[] = [];

async function personPage(role: 'reviewer' | 'engineer'): Promise<Page> {
  const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
  contexts.push(context);
  const page = await context.newPage();
  collectPageProblems(page, problems, role);
  await signInThroughProvider(page, role);
  return page;
}

/** The demo study's transition-analysis cell (seeded by server/src/notebook/demo-filler.ts). */
function analysisCell(page: Page): Locator {
  return page
    .locator('lam-cell-frame[data-cell-title="Transition and drag at cruise"]')
    .filter({ has: page.locator('.kind-label', { hasText: 'Transition analysis' }) });
}

let reviewerPage: Page;
let engineerPage: Page;
let studyId: string;
let cellId: string;
let link: string;

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  for (const context of contexts) await context.close();
  await browser?.close();
});

describe('review: comment with a mention → e-mail → reply and resolve → verdict', () => {
  it('lets the reviewer open the demo study and comment on the analysis cell, mentioning the engineer', async () => {
    reviewerPage = await personPage('reviewer');
    const page = reviewerPage;
    await page.getByRole('link', { name: /Larkspur T-62 wing/ }).first().click();
    await page.getByRole('link', { name: /Outboard section, cruise/ }).first().click();
    await page.waitForURL(/\/studies\/[0-9a-f-]{36}/);
    studyId = /\/studies\/([0-9a-f-]{36})/.exec(page.url())![1]!;

    const cell = analysisCell(page);
    await cell.waitFor();
    cellId = (await cell.getAttribute('data-cell-id'))!;
    await cell.getByRole('button', { name: /comments/i }).click();
    const box = cell.getByRole('combobox', { name: 'Start a thread' });
    await box.click();
    await box.pressSequentially('Is N_crit 9 right for the cruise case? @De');
    const option = cell.getByRole('option', { name: new RegExp(engineer.name) });
    await option.waitFor();
    await page.screenshot({ path: `${shots}-mention.png` });
    await box.press('Enter');
    await box.pressSequentially(`please confirm the free-transition setting (${stamp}).`);
    await expect(box.inputValue()).resolves.toBe(`Is N_crit 9 right for the cruise case? @${engineer.name} please confirm the free-transition setting (${stamp}).`);
    await cell.getByRole('button', { name: 'Start thread' }).click();

    const thread = cell.locator('lam-comment-thread', { hasText: stamp });
    await thread.waitFor();
    await expect(thread.locator('.author').first().textContent()).resolves.toBe(reviewer.name);
    await expect(box.inputValue()).resolves.toBe('');
    await cell.screenshot({ path: `${shots}-thread.png` });
  });

  it('delivers the mention by e-mail with a link straight to the cell', async () => {
    const mail = await waitForMail(engineer.email, stamp);
    expect(mail.subject).toContain(`${reviewer.name} mentioned you on`);
    const found = new RegExp(`${testEnv.appUrl.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}/studies/\\S+`).exec(mail.text);
    expect(found, mail.text).not.toBeNull();
    link = found![0];
    const url = new URL(link);
    expect(url.pathname).toBe(`/studies/${studyId}`);
    expect(url.searchParams.get('cell')).toBe(cellId);
    expect(mail.html).toContain(`href="${link.replace(/&/g, '&amp;')}"`);
  });

  it('lets the engineer follow the link, reply and resolve the thread', async () => {
    engineerPage = await personPage('engineer');
    const page = engineerPage;
    await page.goto(link);
    const cell = analysisCell(page);
    const thread = cell.locator('lam-comment-thread.highlighted', { hasText: stamp });
    await thread.waitFor();
    await expect(thread.isVisible()).resolves.toBe(true);
    await page.screenshot({ path: `${shots}-link.png` });

    await thread.getByRole('button', { name: 'Reply' }).click();
    const reply = thread.getByRole('combobox', { name: 'Reply' });
    await reply.fill(`Yes: N_crit 9 stands for the invented cruise disturbance level; the Granville line agrees within 3 % chord (${stamp}).`);
    await thread.locator('lam-comment-box button.send').click();
    await expect.poll(() => thread.locator('.comment').count()).toBe(2);
    await expect(thread.locator('.comment .author').nth(1).textContent()).resolves.toBe(engineer.name);

    await thread.getByRole('button', { name: 'Resolve' }).click();
    await thread.locator('.resolved-tag', { hasText: `Resolved by ${engineer.name}` }).waitFor();
    await cell.screenshot({ path: `${shots}-resolved.png` });
  });

  it('lets the reviewer clear the version, and the study header shows it', async () => {
    // A version to review: the demo study's head, saved here through the API when there is none yet.
    const versionId = await engineerPage.evaluate(async (id) => {
      const token = decodeURIComponent(document.cookie.split('; ').find((c) => c.startsWith('XSRF-TOKEN='))?.slice('XSRF-TOKEN='.length) ?? '');
      const branches = (await (await fetch(`/api/studies/${id}/branches`)).json()) as { id: string; name: string; headVersionId: string | null }[];
      const main = branches.find((b) => b.name === 'main')!;
      if (main.headVersionId) return main.headVersionId;
      const saved = await fetch(`/api/branches/${main.id}/versions`, {
        method: 'POST',
        headers: { 'content-type': 'application/json', 'x-xsrf-token': token },
        body: JSON.stringify({ message: 'Cruise case for review (invented data)', expectedHeadVersionId: null }),
      });
      if (saved.status !== 201) throw new Error(`saving a version answered ${saved.status}: ${await saved.text()}`);
      return ((await saved.json()) as { id: string }).id;
    }, studyId);

    const page = reviewerPage;
    await page.goto(`${testEnv.appUrl}/studies/${studyId}/versions/${versionId}`);
    const review = page.locator('lam-version-review');
    // The verdict is one of two toggles (radio buttons).
    await review.getByRole('radio', { name: /Clear this version/ }).click();
    await review.getByRole('textbox', { name: 'Findings' }).fill(`Transition and drag consistent across the four criteria; thread on N_crit resolved (${stamp}).`);
    await review.getByRole('button', { name: 'Record verdict' }).click();
    await review.locator('.verdict', { hasText: stamp }).waitFor();
    await expect(review.locator('lam-review-state .state').textContent()).resolves.toContain('Cleared');
    await page.screenshot({ path: `${shots}-verdict.png` });

    await page.goto(`${testEnv.appUrl}/studies/${studyId}`);
    const header = page.locator('lam-study-review-state a');
    await header.waitFor();
    await expect(header.getAttribute('aria-label')).resolves.toMatch(/^Review of version \d+$/);
    await expect(header.locator('.state').textContent()).resolves.toContain('Cleared');
    await page.screenshot({ path: `${shots}-header.png` });
  });

  it('met no script error and no failed request', () => {
    expect(problems).toEqual([]);
  });
});
