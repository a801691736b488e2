// Issue 12: a burst of saves in one shop, with searches running, must leave every case
// findable. A follower that read the change log by `id > last seen` lost a case whose
// lower id committed after a higher one; this runs the burst three times and allows no miss.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { searchIndexStatus } from '../../server/search/client';
import { createTestApp, seedShop, signedIn, type TestApp } from '../support/test-app';
import { runBurst, type Client } from '../support/search-burst';

let t: TestApp;
let writers: Client[];
let searcher: Client;

beforeAll(async () => {
  // reconciliation off: the feed alone must bring in every save
  t = await createTestApp({ SEARCH_RECONCILE_MS: '0' });
  const shop = await seedShop(t.ctx, 'Burst Bay', ['senior', 'manager']);
  // several sessions save at once, as a busy shop's terminals would
  writers = [
    await signedIn(t.app, shop.people.senior.email),
    await signedIn(t.app, shop.people.manager.email),
    await signedIn(t.app, shop.people.senior.email),
    await signedIn(t.app, shop.people.manager.email),
  ];
  searcher = await signedIn(t.app, shop.people.senior.email);
});
afterAll(() => t?.close());

describe('search under a burst of saves', () => {
  for (const run of [1, 2, 3]) {
    it(`finds every one of 200 new and 100 retitled cases by its title word, none by an old one (run ${run})`, async () => {
      const before = (await searchIndexStatus(t.ctx)).gaps;
      const report = await runBurst({ writers, searchers: [searcher], creates: 200, edits: 100 });
      const gaps = (await searchIndexStatus(t.ctx)).gaps;
      console.log(
        `search burst run ${run}: cases ${report.cases}, edits ${report.edits}, searches meanwhile ${report.searchesDuring}, misses ${report.misses.length}, ` +
          `all checks passed ${report.convergeMs} ms after the last save (passes over the checks: ${report.passes}); change-log ids that committed late ${gaps.filled - before.filled}, given up ${gaps.expired - before.expired}`,
      );
      expect(report).toMatchObject({ cases: 200, edits: 100 });
      expect(report.searchesDuring).toBeGreaterThan(0);
      expect(report.misses).toEqual([]);
      expect(gaps.expired).toBe(0);
    }, 60_000);
  }
});
