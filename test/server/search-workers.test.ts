// Search with more than one worker thread (SEARCH_WORKERS=2): each holds its own
// index, so every one of them must see a change on the very next search.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { searchIndexStatus } from '../../server/search/client';
import { searchResponseSchema } from '../../shared/schemas/search';
import { createTestApp, seedShop, signedIn, type TestApp } from '../support/test-app';

let t: TestApp;
let shop: Awaited<ReturnType<typeof seedShop>>;

beforeAll(async () => {
  t = await createTestApp({ SEARCH_WORKERS: '2' });
  shop = await seedShop(t.ctx, 'Two Worker Garage');
});
afterAll(() => t?.close());

async function titlesFor(agent: Awaited<ReturnType<typeof signedIn>>['agent'], q: string): Promise<string[]> {
  const res = await agent.get('/api/search').query({ q }).expect(200);
  return searchResponseSchema.parse(res.body).results.map((r) => r.title);
}

describe('two search workers', () => {
  it('finds a new case on the next search whichever worker answers, and reports both indexes', async () => {
    const senior = await signedIn(t.app, shop.people.senior.email);
    // both workers build the shop's index (searches alternate between idle workers)
    expect(await titlesFor(senior.agent, 'glow plug relay')).toEqual([]);
    expect(await titlesFor(senior.agent, 'glow plug relay')).toEqual([]);

    await senior.agent
      .post('/api/cases')
      .set('X-CSRF-Token', senior.csrf)
      .send({ title: 'Long crank cold, glow plug relay sticking', body: 'Relay clicks late.', codes: ['P0380'], symptoms: ['long-crank'], status: 'published' })
      .expect(201);
    // the next two searches go to different workers; neither may miss the case
    for (let i = 0; i < 2; i++) expect(await titlesFor(senior.agent, 'glow plug relay')).toEqual(['Long crank cold, glow plug relay sticking']);

    const status = await searchIndexStatus(t.ctx);
    expect(status).toMatchObject({ state: 'ready', cases: 1 });
  });
});
