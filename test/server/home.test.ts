// GET /api/home: each role's lists, capped with totals, and nothing of another shop.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { cases, vehicles } from '../../db/schema';
import { addDays, dayOf } from '../../shared/patterns';
import { HOME_LIST_LIMIT, homeResponseSchema, type HomeResponse } from '../../shared/schemas/home';
import { createTestApp, seedShop, signedIn, type TestApp } from '../support/test-app';

let t: TestApp;
let shop: Awaited<ReturnType<typeof seedShop>>;
let other: Awaited<ReturnType<typeof seedShop>>;
type Signed = Awaited<ReturnType<typeof signedIn>>;
let technician: Signed;
let senior: Signed;
let manager: Signed;
let returnedId: number;

async function home(who: Signed): Promise<HomeResponse> {
  const res = await who.agent.get('/api/home').expect(200);
  return homeResponseSchema.parse(res.body);
}

async function draft(who: Signed, title: string): Promise<number> {
  const res = await who.agent.post('/api/cases').set('X-CSRF-Token', who.csrf).send({ title, body: 'Notes.', codes: ['P0171'] }).expect(201);
  return res.body.id as number;
}

/** A confirmed fix three days ago and the same code back today on the same car: one comeback this week. */
async function insertComeback(shopId: number, authorId: number) {
  const today = dayOf(new Date());
  // VIN of the demo set's form (fictional WMI, valid 49 CFR 565 check digit).
  const [v] = await t.ctx.db.insert(vehicles).values({ shopId, vin: '7K9PL5C58JL552151', plate: 'HM 1' }).$returningId();
  const common = { shopId, body: 'Fixture note.', vehicleId: v!.id, codes: ['P0171'], symptoms: [], context: [], status: 'published' as const, authorId };
  await t.ctx.db.insert(cases).values({ ...common, title: 'Lean at idle, intake boot split', visitDate: addDays(today, -3), confirmedById: authorId, confirmedAt: new Date() });
  await t.ctx.db.insert(cases).values({ ...common, title: 'Lean again', visitDate: today });
}

beforeAll(async () => {
  t = await createTestApp();
  shop = await seedShop(t.ctx, 'Home Test Garage');
  other = await seedShop(t.ctx, 'Other Home Garage');
  technician = await signedIn(t.app, shop.people.technician.email);
  senior = await signedIn(t.app, shop.people.senior.email);
  manager = await signedIn(t.app, shop.people.manager.email);

  for (let i = 1; i <= HOME_LIST_LIMIT + 2; i++) await draft(technician, `Draft ${i}`);
  returnedId = await draft(technician, 'Returned one');
  await technician.agent.post(`/api/cases/${returnedId}/submit`).set('X-CSRF-Token', technician.csrf).expect(200);
  await senior.agent.post(`/api/cases/${returnedId}/return`).set('X-CSRF-Token', senior.csrf).send({ comment: 'Add the fuel trim readings.' }).expect(200);
  const waiting = await draft(technician, 'Waiting for review');
  await technician.agent.post(`/api/cases/${waiting}/submit`).set('X-CSRF-Token', technician.csrf).expect(200);
  await technician.agent.post('/api/walks').set('X-CSRF-Token', technician.csrf).send({ codes: ['P0171'], symptoms: [] }).expect(201);
  await insertComeback(shop.shopId, shop.people.senior.id);

  const outsider = await signedIn(t.app, other.people.technician.email);
  await draft(outsider, 'Another shop draft');
});
afterAll(() => t?.close());

describe('GET /api/home', () => {
  it('answers 401 to someone signed out', async () => {
    await request(t.app).get('/api/home').expect(401);
  });

  it("gives a technician their open walks, drafts and the case returned for changes, capped with totals", async () => {
    const body = await home(technician);
    expect(body.openWalks.total).toBe(1);
    expect(body.openWalks.items[0]).toMatchObject({ codes: ['P0171'] });
    expect(body.drafts.total).toBe(HOME_LIST_LIMIT + 2);
    expect(body.drafts.items).toHaveLength(HOME_LIST_LIMIT);
    expect(body.drafts.items.map((d) => d.title)).not.toContain('Another shop draft');
    expect(body.returned).toEqual({
      total: 1,
      items: [expect.objectContaining({ id: returnedId, title: 'Returned one', comment: 'Add the fuel trim readings.', returnedBy: expect.stringMatching(/^Senior/) })],
    });
    expect(body.review).toBeNull();
    expect(body.comebacks).toBeNull();
    expect(body.digest).toBeNull();
  });

  it('gives a senior what waits for review as well', async () => {
    const body = await home(senior);
    expect(body.review?.total).toBe(1);
    expect(body.review?.items[0]).toMatchObject({ title: 'Waiting for review', author: expect.stringMatching(/^Technician/) });
    expect(body.comebacks).toBeNull();
    expect(body.drafts.total).toBe(0); // the technician's drafts are theirs, not the senior's
  });

  it("gives a manager this week's comebacks and the digest status", async () => {
    const body = await home(manager);
    expect(body.review?.total).toBe(1);
    expect(body.comebacks?.total).toBe(1);
    expect(body.comebacks?.items[0]).toMatchObject({ repeatTitle: 'Lean again', code: 'P0171', days: 3 });
    expect(body.comebacks?.to).toBe(dayOf(new Date()));
    expect(body.digest).toMatchObject({ lastSentAt: null, lastKind: null });
    expect(Date.parse(body.digest!.nextRunAt!)).toBeGreaterThan(Date.now());
  });
});
