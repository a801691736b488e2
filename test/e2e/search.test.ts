// The search home screen at phone and wide sizes over the demo shop.
import { describe, expect, inject, it } from 'vitest';
import { DEMO_PASSWORD } from '../../server/seed/demo-files';
import { demoPerson, openPage, useBrowser, screenshot, signInThroughUi, VIEWPORTS, type ViewportName } from '../support/browser';

const baseUrl = inject('baseUrl');
const senior = demoPerson('senior');

const getBrowser = useBrowser();

describe.each(Object.keys(VIEWPORTS) as ViewportName[])('search home at %s size', (viewport) => {
  it('reads the query back as chips, ranks the case with its reasons, and drops a chip', async () => {
    const { page, problems, context } = await openPage(getBrowser(), viewport, baseUrl);
    await signInThroughUi(page, senior.email, DEMO_PASSWORD);
    await page.getByRole('heading', { name: 'Waiting for your review' }).waitFor();
    await page.getByText("Try a code like P0302, or 'misfire cyl 2 and 5 after timing work'.").waitFor();
    await screenshot(page, `search-empty-${viewport}`);

    const field = page.getByLabel('What is the car doing?');
    await field.fill('misfire cyl 2 and 5 after timing work');
    await field.press('Enter');
    const first = page.getByText('VT27 misfire cyl 2 and 5 after timing belt job').first();
    await first.waitFor();
    await page.getByText('both misfire codes P0302 P0305').first().waitFor();
    await page.getByRole('button', { name: 'Remove code P0302 (cylinder 2 misfire)' }).waitFor();
    await page.getByRole('button', { name: 'Remove recent work after timing work' }).waitFor();
    if (viewport === 'wide') {
      // the first result is open beside the list
      await page.getByText('Root cause').waitFor();
      await page.getByText('Coil connectors for cylinders 2 and 5 swapped', { exact: false }).first().waitFor();
    }
    await screenshot(page, `search-results-${viewport}`);
    const noHorizontalScroll = await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth);
    expect(noHorizontalScroll).toBe(true);

    // dropping the cylinder 2 code searches again without cylinder 2, keeping the rest
    await page.getByRole('button', { name: 'Remove code P0302 (cylinder 2 misfire)' }).click();
    await expect.poll(() => page.getByRole('button', { name: 'Remove code P0302 (cylinder 2 misfire)' }).count()).toBe(0);
    await page.getByRole('button', { name: 'Remove code P0305 (cylinder 5 misfire)' }).waitFor();
    await page.getByRole('button', { name: 'Remove recent work after timing work' }).waitFor();
    expect(await field.inputValue()).not.toMatch(/\b2\b/);
    await screenshot(page, `search-chip-removed-${viewport}`);
    expect(problems).toEqual([]);

    // a cause walk starts from the same evidence
    await page.getByRole('button', { name: 'Start cause walk' }).first().click();
    await expect.poll(() => page.url()).toMatch(/\/walks\/new\?/);
    const url = decodeURIComponent(page.url());
    expect(url).toContain('codes=P0305');
    expect(url).toContain('context=after-timing-work');
    await context.close();
  });

  it('filters by status from the sheet and keeps recent searches', async () => {
    const { page, problems, context } = await openPage(getBrowser(), viewport, baseUrl);
    await signInThroughUi(page, senior.email, DEMO_PASSWORD);
    const field = page.getByLabel('What is the car doing?');
    await field.fill('p0299');
    await field.press('Enter');
    await page.getByText('cases match', { exact: false }).first().waitFor();
    await page.getByRole('button', { name: 'Filters' }).click();
    await page.getByRole('dialog', { name: 'Filters' }).waitFor();
    await screenshot(page, `search-filters-${viewport}`);
    await page.getByRole('radio', { name: 'Draft' }).click();
    await page.getByRole('button', { name: 'Show results' }).click();
    await page.getByRole('button', { name: 'Remove filter Draft' }).waitFor();
    await expect.poll(() => page.getByText('Published', { exact: true }).count()).toBe(0);
    await page.getByText('VT27 P0299 with a hiss at part throttle, bypass valve diaphragm torn').first().waitFor();
    await screenshot(page, `search-draft-filter-${viewport}`);
    await page.getByRole('button', { name: 'Remove filter Draft' }).click();
    await page.getByRole('button', { name: 'Clear', exact: true }).first().click();
    await page.getByText('Recent searches').waitFor();
    await page.getByRole('button', { name: 'p0299' }).waitFor();
    expect(problems).toEqual([]);
    await context.close();
  });
});
