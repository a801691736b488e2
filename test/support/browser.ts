// Debian's Chromium driven by playwright-core (never a downloaded browser).
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { afterAll, beforeAll } from 'vitest';
import { DEMO_PASSWORD, readDemoShop } from '../../server/seed/demo-files';
import type { Role } from '../../shared/roles';

export const VIEWPORTS = { phone: { width: 390, height: 844 }, wide: { width: 1280, height: 800 } } as const;
export type ViewportName = keyof typeof VIEWPORTS;

export const SCREENSHOT_DIR = path.resolve(import.meta.dirname, '../../test-results/screenshots');

export async function launchBrowser(): Promise<Browser> {
  // playwright gives every launch a fresh, empty profile of its own.
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
}

export interface WatchedPage {
  page: Page;
  context: BrowserContext;
  /** Console errors, page errors, dialogs and CSP violations seen so far. */
  problems: string[];
}

/** A fresh page that records anything a user should never see: errors, dialogs, CSP reports. */
export async function openPage(browser: Browser, viewport: ViewportName, baseURL: string): Promise<WatchedPage> {
  const context = await browser.newContext({ viewport: VIEWPORTS[viewport], baseURL, deviceScaleFactor: 1 });
  const page = await context.newPage();
  const problems: string[] = [];
  page.on('console', (msg) => {
    if (msg.type() !== 'error') return;
    // Asking "who am I?" while signed out answers 401 by contract; the browser logs it.
    const expected401 = msg.text().includes('status of 401') && msg.location().url.endsWith('/api/auth/me');
    if (!expected401) problems.push(`console: ${msg.text()} (${msg.location().url})`);
  });
  page.on('pageerror', (err) => problems.push(`pageerror: ${err.message}`));
  page.on('dialog', async (d) => {
    problems.push(`dialog: ${d.message()}`);
    await d.dismiss();
  });
  await page.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (e) => console.error(`CSP violation: ${e.violatedDirective} ${e.blockedURI}`));
  });
  return { page, context, problems };
}

/** `fullPage` captures below the fold too (a phone's home scrolls). */
export async function screenshot(page: Page, name: string, { fullPage = false } = {}) {
  mkdirSync(SCREENSHOT_DIR, { recursive: true });
  const file = path.join(SCREENSHOT_DIR, `${name}.png`);
  await page.screenshot({ path: file, fullPage });
  return file;
}

export async function signInThroughUi(page: Page, email: string, password: string) {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

const demoShop = readDemoShop(path.resolve(import.meta.dirname, '../../content'));

/** The first demo user with this role (content/shop.yaml). */
export function demoPerson(role: Role) {
  const person = demoShop.users.find((u) => u.role === role);
  if (!person) throw new Error(`no demo user with role ${role}`);
  return person;
}

/** Signs in through the UI as the demo user of this role and waits for the signed-in shell. */
export async function signInAs(page: Page, role: Role) {
  await signInThroughUi(page, demoPerson(role).email, DEMO_PASSWORD);
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
}

/** One Chromium for the test file: launched before its tests, closed after. */
export function useBrowser(): () => Browser {
  let browser: Browser | undefined;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(() => browser?.close());
  return () => {
    if (!browser) throw new Error('the browser is not running yet');
    return browser;
  };
}
