import { describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import type { Role } from '../../shared/roles';
import { openPage, signInAs, useBrowser, screenshot, VIEWPORTS, type ViewportName } from '../support/browser';

const baseUrl = inject('baseUrl');

const getBrowser = useBrowser();

const signIn = (page: Page, role: Role) => signInAs(page, role);

/** The browser logs the 400 that a deliberately bad input earns; anything else is a problem. */
const unexpected = (problems: string[], path: string) => problems.filter((p) => !(p.includes('status of 400') && p.includes(path)));

async function noHorizontalScroll(page: Page) {
  const { scroll, width } = await page.evaluate(() => ({ scroll: document.documentElement.scrollWidth, width: window.innerWidth }));
  expect(scroll).toBeLessThanOrEqual(width);
}

describe.each(Object.keys(VIEWPORTS) as ViewportName[])('trouble codes at %s size', (viewport) => {
  it('explains P0302 and decodes pasted bytes', async () => {
    const { page, problems, context } = await openPage(getBrowser(), viewport, baseUrl);
    await signIn(page, 'technician');
    await page.goto('/codes/P0302');
    await page.getByRole('heading', { name: 'What the code says' }).waitFor();
    await page.getByText('cylinder 2 is the one misfiring', { exact: false }).waitFor();
    await page.getByText(/written from memory of the public code list/i).first().waitFor();
    await page.getByText('Caution:', { exact: true }).waitFor();
    await page.getByRole('heading', { name: 'Cases with P0302' }).waitFor();
    await page.waitForLoadState('networkidle');
    await screenshot(page, `code-p0302-${viewport}`);
    await noHorizontalScroll(page);

    await page.getByLabel('Hex bytes').fill('0133C100');
    await page.getByRole('button', { name: 'Decode' }).click();
    const decoded = page.getByLabel('Decoded codes');
    await decoded.getByText('P0133').waitFor();
    await decoded.getByText('U0100').waitFor();
    await page.getByLabel('Hex bytes').fill('013');
    await page.getByRole('button', { name: 'Decode' }).click();
    await page.getByText(/odd number of hex digits/i).waitFor();
    expect(unexpected(problems, '/api/codes/decode?pairs=013')).toEqual([]);
    await context.close();
  });

  it('shows the failure type byte of P0302-13', async () => {
    const { page, problems, context } = await openPage(getBrowser(), viewport, baseUrl);
    await signIn(page, 'apprentice');
    await page.goto('/codes/P0302-13');
    await page.getByText(/Failure type byte 13: circuit open/).waitFor();
    await page.goto('/codes/X123');
    await page.getByText('That is not a trouble code').waitFor();
    expect(unexpected(problems, '/api/codes/X123')).toEqual([]);
    await context.close();
  });

  it('looks codes up by words and browses by system', async () => {
    const { page, problems, context } = await openPage(getBrowser(), viewport, baseUrl);
    await signIn(page, 'technician');
    await page.goto('/codes');
    await page.getByLabel('Look up a code or words').fill('lean bank 2');
    await page.getByText('P0174').waitFor();
    await screenshot(page, `codes-lookup-${viewport}`);
    await page.getByLabel('Look up a code or words').fill('');
    await page.getByRole('radio', { name: /Network/ }).click();
    await page.getByText('U0100').first().waitFor();
    await noHorizontalScroll(page);
    expect(problems).toEqual([]);
    await context.close();
  });

  it('reads a pasted scan report and links to a new case', async () => {
    const { page, problems, context } = await openPage(getBrowser(), viewport, baseUrl);
    await signIn(page, 'technician');
    await page.goto('/scan');
    const report = ['Quick scan, bay 2', 'VIN: 1M8GDM9AXKP042788', 'Odometer: 84,210 km', 'Stored: P0302-13', 'Pending: P0171'].join('\n');
    await page.getByLabel('Scan tool printout').fill(report);
    await page.getByRole('button', { name: 'Read report' }).click();
    await page.getByText('2 codes found').waitFor();
    await page.getByText('Check digit OK').waitFor();
    await page.getByText('Pending', { exact: true }).waitFor();
    await screenshot(page, `scan-report-${viewport}`);
    await noHorizontalScroll(page);
    await page.getByRole('button', { name: 'Start a case' }).click();
    await page.waitForURL(/\/cases\/new\?/);
    const url = new URL(page.url());
    expect(url.searchParams.get('codes')).toBe('P0302-13,P0171');
    expect(url.searchParams.get('vin')).toBe('1M8GDM9AXKP042788');
    expect(url.searchParams.get('mileage')).toBe('84210');
    expect(problems.filter((p) => !p.includes('/cases'))).toEqual([]);
    await context.close();
  });

  it('shows a platform with banks and firing companions', async () => {
    const { page, problems, context } = await openPage(getBrowser(), viewport, baseUrl);
    await signIn(page, 'senior');
    await page.goto('/platforms');
    await page.getByText('Vexholm Kestrune').first().click();
    await page.getByRole('heading', { name: 'Banks and firing order' }).waitFor();
    await page.getByText(/Cylinders 1 and 6: one on each bank, firing companions/).waitFor();
    await page.getByLabel('Cylinders').fill('2 and 5');
    await page.getByText(/cylinders 2 and 5:/).waitFor();
    await screenshot(page, `platform-${viewport}`);
    await page.getByRole('button', { name: 'Edit' }).click();
    await page.getByLabel('Firing order').fill('1-4-3-6-2-2');
    await page.getByRole('button', { name: 'Save changes' }).click();
    await page.getByText('Firing order lists cylinder 2 more than once').waitFor();
    await screenshot(page, `platform-edit-${viewport}`);
    await noHorizontalScroll(page);
    expect(problems).toEqual([]);
    await context.close();
  });
});
