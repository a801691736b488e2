import path from 'node:path';
import { beforeAll, describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import type { Role } from '../../shared/roles';
import { demoPerson, openPage, signInAs, useBrowser, SCREENSHOT_DIR, screenshot, VIEWPORTS, type ViewportName } from '../support/browser';

const baseUrl = inject('baseUrl');
const person = demoPerson;

const getBrowser = useBrowser();
beforeAll(async () => {
  // The first load after a fresh web build can be slow on a busy machine; warm it up once.
  const { page, context } = await openPage(getBrowser(), 'phone', baseUrl);
  await page.goto('/');
  await page.getByRole('button', { name: 'Sign in' }).waitFor({ timeout: 90_000 });
  await context.close();
});

/** Elements that stick out past the right edge of the window (clipped labels, sideways scroll). */
async function overflowing(page: Page): Promise<string[]> {
  return page.evaluate(() => {
    const width = window.innerWidth;
    const out: string[] = [];
    for (const el of Array.from(document.querySelectorAll('body *'))) {
      const r = el.getBoundingClientRect();
      if (r.width === 0 || r.right <= width + 1 || (el instanceof SVGElement && el.closest('svg') !== el)) continue;
      // inside a clipping frame it cannot stick out on screen
      if (el.parentElement?.closest('[role="img"]') && getComputedStyle(el.parentElement.closest('[role="img"]')!).overflow === 'hidden') continue;
      out.push(`${el.tagName} ${(el.textContent ?? '').slice(0, 40)} right=${Math.round(r.right)}`);
    }
    return out.slice(0, 10);
  });
}

/** Charts whose drawing is wider than their frame (the frame clips, so the right end would be cut). */
async function clippedCharts(page: Page): Promise<string[]> {
  return page.evaluate(() =>
    Array.from(document.querySelectorAll('[role="img"]')).flatMap((frame) => {
      const right = frame.getBoundingClientRect().right;
      const widest = Math.max(0, ...Array.from(frame.querySelectorAll('svg')).map((svg) => svg.getBoundingClientRect().right));
      return widest > right + 1 ? [`${(frame.getAttribute('aria-label') ?? '').slice(0, 40)}: ${Math.round(widest - right)} px cut`] : [];
    }),
  );
}

async function openDashboard(viewport: ViewportName, role: Role = 'manager') {
  const watched = await openPage(getBrowser(), viewport, baseUrl);
  await signInAs(watched.page, role);
  await watched.page.goto('/patterns');
  await watched.page.getByText('Confirmed-fix rate').waitFor();
  return watched;
}

describe.each(Object.keys(VIEWPORTS) as ViewportName[])('patterns dashboard at %s size', (viewport) => {
  it('shows the figures, charts and tables of the demo shop without clipping or CSP problems', async () => {
    const { page, problems, context } = await openDashboard(viewport);
    await page.getByRole('heading', { name: 'Top trouble codes' }).waitFor();
    await page.getByRole('img', { name: /Bar chart of top codes/ }).locator('svg').first().waitFor();
    await page.getByRole('img', { name: /Line chart per week/ }).locator('svg').first().waitFor();
    // the default period is the last 90 days; the demo has one comeback in it (0040 -> 0044, U0100)
    await page.getByText('Came back as:').first().waitFor();
    await screenshot(page, `patterns-${viewport}`);
    // the answer comes first: the first figure sits inside the first screen, filters do not push it down
    const figure = await page.getByText('Confirmed-fix rate').boundingBox();
    expect(figure!.y + figure!.height).toBeLessThan(VIEWPORTS[viewport].height);
    expect(await overflowing(page)).toEqual([]);
    expect(await clippedCharts(page)).toEqual([]);
    // The page scrolls inside the app's scroll view; a tall window shows all of it at the same width.
    await page.setViewportSize({ width: VIEWPORTS[viewport].width, height: 5200 });
    await page.getByText('Waiting for review', { exact: true }).last().waitFor();
    const { width } = VIEWPORTS[viewport];
    const height = await page.evaluate(() => Math.max(...Array.from(document.querySelectorAll('[role="heading"]')).map((h) => h.getBoundingClientRect().bottom)) + 600);
    for (let part = 0, y = 0; y < Math.min(height, 5200); part += 1, y += 900)
      await page.screenshot({ path: path.join(SCREENSHOT_DIR, `patterns-${viewport}-part-${part}.png`), clip: { x: 0, y, width, height: Math.min(900, 5200 - y) } });
    expect(problems).toEqual([]);
    await context.close();
  });

  it('switches to the last 365 days and shows all four demo comebacks', async () => {
    const { page, problems, context } = await openDashboard(viewport);
    // on a phone the period and platform sit in a sheet behind one button
    if (viewport === 'phone') await page.getByRole('button', { name: 'Change' }).click();
    await page.getByRole('radio', { name: /Last 365 days/ }).click();
    if (viewport === 'phone') {
      await screenshot(page, 'patterns-sheet-phone');
      await page.getByRole('button', { name: 'Show figures' }).click();
    }
    await page.getByText('Last 365 days · All platforms').or(page.getByRole('radio', { name: /Last 365 days/ })).first().waitFor();
    await page.waitForFunction(() => document.querySelectorAll('body').length > 0 && (document.body.innerText.match(/Came back as:/g) ?? []).length === 4);
    await page.getByRole('heading', { name: 'Comebacks', exact: true }).scrollIntoViewIfNeeded();
    await screenshot(page, `patterns-comebacks-${viewport}`);
    expect(await overflowing(page)).toEqual([]);
    expect(await clippedCharts(page)).toEqual([]);
    expect(problems).toEqual([]);
    await context.close();
  });
});

describe('patterns actions', () => {
  it('downloads a table as a CSV file', async () => {
    const { page, context } = await openDashboard('wide');
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Download CSV: Top trouble codes' }).click()]);
    expect(download.suggestedFilename()).toMatch(/^causeway-topCodes-\d{4}-\d{2}-\d{2}-to-\d{4}-\d{2}-\d{2}\.csv$/);
    await context.close();
  });

  it('lets the manager send the digest now', async () => {
    const { page, problems, context } = await openDashboard('phone');
    await page.getByRole('button', { name: 'Send digest now' }).click();
    await page.getByText(/Digest sent to 1 manager/).waitFor();
    expect(problems).toEqual([]);
    await context.close();
  });

  it('shows a senior the dashboard but no digest button', async () => {
    const { page, context } = await openDashboard('wide', 'senior');
    expect(await page.getByRole('button', { name: 'Send digest now' }).count()).toBe(0);
    await context.close();
  });

  it('opens a vehicle from a comeback with its visits in order', async () => {
    const { page, problems, context } = await openDashboard('phone');
    await page.getByRole('link', { name: /7K9LM8H59NL552817/ }).first().click();
    await page.getByText('Visit 2').waitFor();
    await page.getByText(/Came back 21 days after/).waitFor();
    await screenshot(page, 'vehicle-phone');
    expect(await overflowing(page)).toEqual([]);
    await page.goto('/vehicles');
    await page.getByText('Every vehicle the shop has written a case for').waitFor();
    await screenshot(page, 'vehicles-phone');
    expect(problems).toEqual([]);
    await context.close();
  });
});
