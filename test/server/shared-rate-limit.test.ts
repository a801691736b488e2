// The sign-in/sign-up/reset limit lives in MariaDB: two app instances share one count per
// address, so the limit holds however many instances run; windows end by the database clock.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MariaDbRateLimitStore } from '../../server/http/rate-limit-store';
import { createTestApp, secondInstance, type TestApp } from '../support/test-app';

const LIMIT = 6;
let a: TestApp;
let b: TestApp;

beforeAll(async () => {
  a = await createTestApp({ AUTH_LIMIT_PER_ADDRESS: String(LIMIT) });
  b = secondInstance(a);
});
afterAll(async () => {
  await b.close();
  await a.close();
});

async function attemptSignIn(app: TestApp) {
  const csrf = await request(app.app).get('/api/auth/csrf');
  const cookie = ([] as string[]).concat(csrf.headers['set-cookie'] ?? []).map((c) => c.split(';')[0]).join('; ');
  return request(app.app).post('/api/auth/login').set('Cookie', cookie).set('X-CSRF-Token', csrf.body.token).send({ email: 'nobody@limits.test', password: 'wrong password here' });
}

describe('request limits shared across instances', () => {
  it(`allows ${LIMIT} attempts per address in total across two instances, not ${LIMIT} each`, async () => {
    const statuses: number[] = [];
    for (let i = 0; i < LIMIT + 2; i++) statuses.push((await attemptSignIn(i % 2 === 0 ? a : b)).status);
    expect(statuses.slice(0, LIMIT).every((s) => s === 401)).toBe(true);
    expect(statuses.slice(LIMIT)).toEqual([429, 429]);
    const refused = await attemptSignIn(b);
    expect(refused.body.error.code).toBe('too_many_requests');
    expect(refused.headers['ratelimit']).toMatch(/; r=0;/);
  });

  it('counts concurrent hits through both stores exactly once each', async () => {
    const stores = [new MariaDbRateLimitStore(a.ctx.db, 'test:'), new MariaDbRateLimitStore(b.ctx.db, 'test:')];
    for (const s of stores) s.init({ windowMs: 60_000 } as Parameters<MariaDbRateLimitStore['init']>[0]);
    const hits = await Promise.all(Array.from({ length: 40 }, (_, i) => stores[i % 2]!.increment('concurrent')));
    expect(hits.map((h) => h.totalHits).sort((x, y) => x - y)).toEqual(Array.from({ length: 40 }, (_, i) => i + 1));
    await stores[0]!.decrement('concurrent');
    expect((await stores[1]!.get('concurrent'))?.totalHits).toBe(39);
    await stores[1]!.resetKey('concurrent');
    expect(await stores[0]!.get('concurrent')).toBeUndefined();
  });

  it('starts a new window once the old one has ended', async () => {
    const store = new MariaDbRateLimitStore(a.ctx.db, 'window:');
    store.init({ windowMs: 300 } as Parameters<MariaDbRateLimitStore['init']>[0]);
    await store.increment('k');
    const second = await store.increment('k');
    expect(second.totalHits).toBe(2);
    expect(second.resetTime!.getTime() - Date.now()).toBeLessThanOrEqual(300 + 50); // clocks of one machine
    await new Promise((r) => setTimeout(r, 400));
    expect(await store.get('k')).toBeUndefined();
    expect((await store.increment('k')).totalHits).toBe(1);
  });
});
