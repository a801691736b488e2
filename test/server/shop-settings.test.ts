// GET/PATCH /api/shop: a shop anywhere in the world, its day and its regional notes.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { shopResponseSchema } from '../../shared/schemas/shop';
import { dayIn } from '../../shared/shop-time';
import { createTestApp, seedShop, signedIn, type TestApp } from '../support/test-app';

let t: TestApp;
let shop: Awaited<ReturnType<typeof seedShop>>;
let manager: Awaited<ReturnType<typeof signedIn>>;
let technician: Awaited<ReturnType<typeof signedIn>>;

beforeAll(async () => {
  t = await createTestApp();
  shop = await seedShop(t.ctx, 'Tide Lane Motors');
  manager = await signedIn(t.app, shop.people.manager.email);
  technician = await signedIn(t.app, shop.people.technician.email);
});
afterAll(() => t?.close());

const patch = (who: typeof manager, body: unknown) => who.agent.patch('/api/shop').set('X-CSRF-Token', who.csrf).send(body as object);

describe('shop settings', () => {
  it('answers 401 signed out, and shows every member the settings with UTC as the start', async () => {
    await request(t.app).get('/api/shop').expect(401);
    const { shop: s } = shopResponseSchema.parse((await technician.agent.get('/api/shop').expect(200)).body);
    expect(s).toMatchObject({ name: 'Tide Lane Motors', country: null, timeZone: 'UTC', comebackDays: 90, comebackKm: 3000 });
  });

  it('lets only a manager change them', async () => {
    const res = await patch(technician, { timeZone: 'Pacific/Auckland' }).expect(403);
    expect(res.body.error.code).toBe('forbidden');
  });

  it('keeps a shop outside North America, with its day and the regional notes', async () => {
    const res = await patch(manager, { country: 'nz', timeZone: 'Pacific/Auckland', comebackDays: 60 }).expect(200);
    const { shop: s } = shopResponseSchema.parse(res.body);
    expect(s).toMatchObject({ country: 'NZ', countryName: 'New Zealand', timeZone: 'Pacific/Auckland', comebackDays: 60 });
    expect(s.today).toBe(dayIn('Pacific/Auckland'));
    expect(s.regionalNotes.join(' ')).toMatch(/49 CFR 565/);
    expect(s.regionalNotes.join(' ')).toMatch(/readiness/);
    // the session carries the zone, so screens format dates in it
    const me = await manager.agent.get('/api/auth/me').expect(200);
    expect(me.body.user).toMatchObject({ shopCountry: 'NZ', shopTimeZone: 'Pacific/Auckland' });
  });

  it.each([
    [{ timeZone: 'Mars/Olympus' }, 'timeZone', /time zone name/],
    [{ country: 'ZZ' }, 'country', /ISO 3166/],
    [{ comebackDays: 0 }, 'comebackDays', /At least 1 day/],
    [{ comebackKm: 'far' }, 'comebackKm', /number/],
    [{ owner: 'me' }, null, /owner/],
    [{}, null, /at least one setting/],
  ])('refuses %j with a 400 that says why, and changes nothing', async (body, field, message) => {
    const res = await patch(manager, body).expect(400);
    expect(JSON.stringify(res.body.error)).toMatch(message);
    if (field) expect(res.body.error.fields?.[field]).toBeTruthy();
    const { shop: s } = shopResponseSchema.parse((await manager.agent.get('/api/shop').expect(200)).body);
    expect(s).toMatchObject({ country: 'NZ', timeZone: 'Pacific/Auckland', comebackDays: 60 });
  });
});
