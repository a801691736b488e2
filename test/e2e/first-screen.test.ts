// The first screen on a phone network: Chromium at 390x844 throttled to a common mobile audit
// profile (1.6 Mbit/s down, 750 kbit/s up, 150 ms round trip: the "slow 4G" profile of
// Chrome's own audits, common practice, no published standard). Prints the figures it measures.
import type { CDPSession, Page } from 'playwright-core';
import { describe, expect, inject, it } from 'vitest';
import { demoPerson, openPage, screenshot, useBrowser } from '../support/browser';
import { DEMO_PASSWORD } from '../../server/seed/demo-files';

const baseUrl = inject('baseUrl');
const getBrowser = useBrowser();

const MOBILE = { latency: 150, downloadThroughput: (1.6 * 1024 * 1024) / 8, uploadThroughput: (750 * 1024) / 8 };
const KIB = 1024;

/** Counts the bytes that cross the wire (compressed sizes, headers included) on a throttled page. */
async function throttle(page: Page): Promise<{ cdp: CDPSession; bytes: () => number }> {
  const cdp = await page.context().newCDPSession(page);
  let total = 0;
  await cdp.send('Network.enable');
  await cdp.send('Network.emulateNetworkConditions', { offline: false, ...MOBILE });
  cdp.on('Network.loadingFinished', (e: { encodedDataLength: number }) => {
    total += e.encodedDataLength;
  });
  return { cdp, bytes: () => total };
}

describe('first screen on a throttled phone network', () => {
  it('shows the sign-in form within 5 s and 900 KiB, then the search screen within 3 s more', async () => {
    const { page, context, problems } = await openPage(getBrowser(), 'phone', baseUrl);
    const wire = await throttle(page);

    const started = Date.now();
    await page.goto('/sign-in');
    await page.getByRole('button', { name: 'Sign in' }).waitFor();
    const signInMs = Date.now() - started;
    const signInBytes = wire.bytes();
    await screenshot(page, 'first-screen-sign-in-throttled-phone');

    await page.getByLabel('E-mail').fill(demoPerson('technician').email);
    await page.getByLabel('Password').fill(DEMO_PASSWORD);
    const clicked = Date.now();
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('searchbox').first().waitFor();
    const searchMs = Date.now() - clicked;

    console.log(
      `throttled first screen: sign-in form after ${signInMs} ms, ${(signInBytes / KIB).toFixed(0)} KiB over the wire; ` +
        `search screen ${searchMs} ms after signing in, ${(wire.bytes() / KIB).toFixed(0)} KiB in all`,
    );
    expect(signInBytes).toBeLessThanOrEqual(900 * KIB);
    expect(signInMs).toBeLessThanOrEqual(5_000);
    expect(searchMs).toBeLessThanOrEqual(3_000);
    expect(problems).toEqual([]);
    await context.close();
  });

  it('serves the bundle brotli-compressed with a year of caching', async () => {
    const { page, context } = await openPage(getBrowser(), 'phone', baseUrl);
    const scripts: { url: string; encoding?: string; cache?: string }[] = [];
    page.on('response', (r) => {
      if (r.url().endsWith('.js')) scripts.push({ url: r.url(), encoding: r.headers()['content-encoding'], cache: r.headers()['cache-control'] });
    });
    await page.goto('/sign-in');
    await page.getByRole('button', { name: 'Sign in' }).waitFor();
    expect(scripts.length).toBeGreaterThan(1); // split by route: the entry plus at least one route chunk
    for (const s of scripts) {
      expect(s.encoding, s.url).toBe('br');
      expect(s.cache, s.url).toContain('immutable');
    }
    await context.close();
  });
});
