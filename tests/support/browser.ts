import { execFileSync } from 'node:child_process';
import { chromium, type Browser, type Page } from 'playwright-core';
import { DEMO_USERS } from '../../oidc-fake/src/users';
import { testEnv } from './env';

/** Debian's chromium, headless, with no traffic beyond this machine. */
export function chromiumPath(): string {
  if (process.env['CHROMIUM_PATH']) return process.env['CHROMIUM_PATH'];
  try {
    return execFileSync('sh', ['-c', 'command -v chromium || command -v chromium-browser'], { encoding: 'utf8' }).trim();
  } catch {
    throw new Error("chromium is not installed: apt-get install chromium (the browser tests use Debian's chromium)");
  }
}

/**
 * Chromium 156 starts its address-bar popup as a page of its own (chrome://omnibox-popup, a WebUI
 * renderer) for every new window, that is every new browser context here: about 2.0 s of CPU each on the
 * 2-core test machine, against 0.5 s with these features off (a new context and page on about:blank,
 * the browser's processes' CPU time over the next 5 s). Features a Chromium does not know are ignored.
 */
const NO_ADDRESS_BAR_POPUP = '--disable-features=WebUIOmniboxPopup,WebUIOmniboxFullPopup,WebUIOmniboxAimPopup';

export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: chromiumPath(),
    headless: true,
    args: ['--no-sandbox', '--disable-background-networking', '--disable-gpu', '--no-first-run', '--disable-component-update', '--disable-sync', '--disable-quic', NO_ADDRESS_BAR_POPUP],
  });
}

/**
 * Signs a demo person in the way a person does: the app's sign-in button, then their button on the
 * identity provider's page. Leaves the page on the app.
 */
export async function signInThroughProvider(page: Page, role: 'lead' | 'engineer' | 'reviewer' | 'viewer' | 'admin'): Promise<void> {
  const person = role === 'admin' ? DEMO_USERS.find((u) => u.siteAdmin)! : DEMO_USERS.find((u) => u.role === role)!;
  await page.goto(testEnv.appUrl);
  await page.getByRole('button', { name: /sign in/i }).first().click();
  await page.waitForURL((url) => url.href.startsWith(testEnv.oidcIssuer));
  await page.getByRole('button', { name: new RegExp(`Sign in as ${person.name}`) }).click();
  await page.waitForURL((url) => url.href.startsWith(testEnv.appUrl));
}

/**
 * Collects what a person would meet as a defect: script errors, content-security-policy violations and
 * failed requests (the signed-out /api/me probe excepted), each tagged with `label` when given. A failed
 * request is reported once, with its address, by the response handler.
 */
export function collectPageProblems(page: Page, problems: string[], label = ''): void {
  const tag = label ? `${label}: ` : '';
  page.on('console', (m) => m.type() === 'error' && !m.text().startsWith('Failed to load resource') && problems.push(`${tag}${m.text()}`));
  page.on('pageerror', (e) => problems.push(`${tag}${e.message}`));
  page.on('response', (r) => r.status() >= 400 && !r.url().endsWith('/api/me') && problems.push(`${tag}${r.status()} ${r.url()}`));
}

/**
 * Waits until every cell body of the open notebook is drawn: the page draws the bodies below the first
 * screen in idle batches, and each one drawn above a control moves it down the page, so a menu opened
 * from a control meanwhile can be left where the control was. A person waits for the page to settle too.
 */
export async function bodiesDrawn(page: Page): Promise<void> {
  await page.waitForFunction(() => document.querySelectorAll('lam-cell-frame').length > 0 && document.querySelectorAll('.body-pending').length === 0, undefined, { timeout: 30_000 });
}
