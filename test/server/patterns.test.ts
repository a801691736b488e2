import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { patternsResponseSchema, vehicleDetailSchema, vehicleListSchema } from '../../shared/schemas/patterns';
import { findRepeats } from '../../server/patterns/service';
import { createTestApp, seedShop, signedIn, type TestApp } from '../support/test-app';
import request from 'supertest';
import { eq } from 'drizzle-orm';
import { cases, platforms, vehicles } from '../../db/schema';
import type { AppContext } from '../../server/context';

// Inserts a small shop history straight into the tables, so the patterns API has known figures.

interface FixtureCase {
  key: string;
  vehicle?: string;
  platform?: 'a' | 'b';
  day: string;
  km?: number;
  unit?: 'km' | 'mi';
  codes?: string[];
  symptoms?: string[];
  cause?: string;
  confirmed?: string;
  status?: 'draft' | 'review' | 'published';
  deleted?: boolean;
}

// VINs of the demo set's form (content/cases/README.md): check digits valid, fictional WMIs.
const VINS = ['7K9PL5C58JL552151', '7K9SR3B40BL552202', '7K9LM8H59NL552817', '7V9DR8B28KH318907'];

async function insertHistory(ctx: AppContext, shopId: number, authorId: number, list: FixtureCase[]) {
  const [pa] = await ctx.db.insert(platforms).values({ shopId, make: 'Pello', model: 'Test', engine: 'KR15T', yearFrom: 2015, yearTo: 2022, cylinders: 4, layout: 'inline' }).$returningId();
  const [pb] = await ctx.db.insert(platforms).values({ shopId, make: 'Ostrel', model: 'Test', engine: 'KV35', yearFrom: 2010, yearTo: 2018, cylinders: 6, layout: 'V' }).$returningId();
  const platformIds = { a: pa!.id, b: pb!.id };
  const vehicleIds = new Map<string, number>();
  const ids: Record<string, number> = {};
  for (const c of list) {
    let vehicleId: number | null = null;
    if (c.vehicle) {
      if (!vehicleIds.has(c.vehicle)) {
        const [v] = await ctx.db.insert(vehicles).values({ shopId, vin: VINS[vehicleIds.size]!, plate: `T${vehicleIds.size} TIA`, platformId: platformIds[c.platform ?? 'a'] }).$returningId();
        vehicleIds.set(c.vehicle, v!.id);
      }
      vehicleId = vehicleIds.get(c.vehicle)!;
    }
    const [row] = await ctx.db
      .insert(cases)
      .values({
        shopId,
        title: `Case ${c.key}`,
        body: 'Fixture note.',
        platformId: platformIds[c.platform ?? 'a'],
        vehicleId,
        mileage: c.km ?? null,
        mileageUnit: c.km === undefined ? null : (c.unit ?? 'km'),
        visitDate: c.day,
        codes: c.codes ?? [],
        symptoms: c.symptoms ?? [],
        context: [],
        cause: c.cause ?? null,
        rootCause: c.cause ? `Root cause of ${c.key}` : null,
        status: c.status ?? 'published',
        authorId,
        confirmedById: c.confirmed ? authorId : null,
        confirmedAt: c.confirmed ? new Date(`${c.confirmed}T12:00:00Z`) : null,
        deletedAt: c.deleted ? new Date() : null,
      })
      .$returningId();
    ids[c.key] = row!.id;
  }
  return { ids, platformIds, vehicleIds };
}

let t: TestApp;
let shop: Awaited<ReturnType<typeof seedShop>>;
let other: Awaited<ReturnType<typeof seedShop>>;
let fx: Awaited<ReturnType<typeof insertHistory>>;
let otherFx: Awaited<ReturnType<typeof insertHistory>>;
const period = 'from=2026-03-01&to=2026-05-31';

beforeAll(async () => {
  t = await createTestApp();
  shop = await seedShop(t.ctx, 'Harrowgate Motors');
  other = await seedShop(t.ctx, 'Other Yard');
  fx = await insertHistory(t.ctx, shop.shopId, shop.people.senior.id, [
    // vehicle v1: day-90 comeback with the same code (counts)
    { key: 'v1a', vehicle: 'v1', day: '2026-03-02', km: 87_300, codes: ['P0171'], confirmed: '2026-03-02' },
    { key: 'v1b', vehicle: 'v1', day: '2026-05-31', km: 89_950, codes: ['P0171'], confirmed: '2026-05-31' },
    // vehicle v2: day 91 (does not count)
    { key: 'v2a', vehicle: 'v2', platform: 'b', day: '2026-03-01', km: 100_000, cause: 'clutch-hydraulics/slave-leak', confirmed: '2026-03-01' },
    { key: 'v2b', vehicle: 'v2', platform: 'b', day: '2026-05-31', km: 101_000, cause: 'clutch-hydraulics/master-bypass' },
    // vehicle v3: first fix never confirmed, then a review case and a draft (drafts never count)
    { key: 'v3a', vehicle: 'v3', day: '2026-04-01', codes: ['P0102'] },
    { key: 'v3b', vehicle: 'v3', day: '2026-04-20', codes: ['P0102'], status: 'review' },
    { key: 'v3c', vehicle: 'v3', day: '2026-04-25', codes: ['P0102'], status: 'draft' },
    // a deleted case counts nowhere
    { key: 'gone', day: '2026-04-02', codes: ['P0420'], confirmed: '2026-04-02', deleted: true },
  ]);
  otherFx = await insertHistory(t.ctx, other.shopId, other.people.senior.id, [{ key: 'x', vehicle: 'x1', day: '2026-04-01', codes: ['P0300'] }]);
});
afterAll(() => t?.close());

describe('GET /api/patterns', () => {
  it('answers 401 to someone signed out', async () => {
    await request(t.app).get('/api/patterns').expect(401);
  });

  it.each(['apprentice', 'technician'] as const)('refuses a %s with 403', async (role) => {
    const { agent } = await signedIn(t.app, shop.people[role].email);
    const res = await agent.get('/api/patterns').expect(403);
    expect(res.body.error.code).toBe('forbidden');
  });

  it.each(['senior', 'manager'] as const)('gives a %s the figures of their shop', async (role) => {
    const { agent } = await signedIn(t.app, shop.people[role].email);
    const res = await agent.get(`/api/patterns?${period}`).expect(200);
    const body = patternsResponseSchema.parse(res.body);
    // non-draft, non-deleted cases in March-May: v1a, v1b, v2a, v2b, v3a, v3b = 6; confirmed v1a, v1b, v2a = 3
    expect(body.totals).toEqual({ cases: 6, confirmed: 3, comebacks: 1 });
    expect(body.confirmedRate).toBe(0.5); // 3 / 6
    expect(body.comebackRate).toBeCloseTo(1 / 6); // v1b / 6 cases
    expect(body.comebacks).toEqual([
      expect.objectContaining({ firstCaseId: fx.ids.v1a, repeatCaseId: fx.ids.v1b, days: 90, km: 2650, code: 'P0171', vehicle: expect.objectContaining({ id: fx.vehicleIds.get('v1') }) }),
    ]);
    expect(body.medianDaysToConfirm).toBe(0);
    expect(body.waitingForReview.map((w) => w.id)).toEqual([fx.ids.v3b]);
    expect(body.topCodes[0]).toMatchObject({ code: 'P0102', count: 2 });
    expect(body.period).toEqual({ from: '2026-03-01', to: '2026-05-31', platformId: null, defaulted: false });
  });

  it('defaults to the 90 days ending today', async () => {
    const { agent } = await signedIn(t.app, shop.people.senior.email);
    const res = await agent.get('/api/patterns').expect(200);
    const today = new Date().toISOString().slice(0, 10);
    expect(res.body.period.to).toBe(today);
    expect(res.body.period.defaulted).toBe(true);
    expect(Math.round((Date.parse(res.body.period.to) - Date.parse(res.body.period.from)) / 86_400_000)).toBe(89);
  });

  it('filters by platform', async () => {
    const { agent } = await signedIn(t.app, shop.people.senior.email);
    const res = await agent.get(`/api/patterns?${period}&platformId=${fx.platformIds.b}`).expect(200);
    expect(res.body.totals).toEqual({ cases: 2, confirmed: 1, comebacks: 0 });
  });

  it('shows nothing of another shop, even given its platform id', async () => {
    const { agent } = await signedIn(t.app, shop.people.senior.email);
    const res = await agent.get(`/api/patterns?${period}&platformId=${otherFx.platformIds.a}`).expect(200);
    expect(res.body.totals.cases).toBe(0);
    expect(res.body.topCodes).toEqual([]);
  });

  it.each([
    ['a date that is not a date', 'from=yesterday'],
    ['an impossible date', 'from=2026-02-30'],
    ['from after to', 'from=2026-06-01&to=2026-05-01'],
    ['a platform id that is not a number', 'platformId=abc'],
    ['a negative platform id', 'platformId=-1'],
    ['a period far too long', 'from=1900-01-01&to=2026-01-01'],
    ['a repeated parameter', 'from=2026-01-01&from=2026-02-01'],
  ])('answers 400 to %s', async (_what, query) => {
    const { agent } = await signedIn(t.app, shop.people.senior.email);
    const res = await agent.get(`/api/patterns?${query}`).expect(400);
    expect(res.body.error.code).toBe('bad_request');
  });
});

describe('GET /api/patterns.csv', () => {
  it('downloads a table as a quoted CSV file', async () => {
    const { agent } = await signedIn(t.app, shop.people.manager.email);
    const res = await agent.get(`/api/patterns.csv?table=comebacks&${period}`).expect(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toBe('attachment; filename="causeway-comebacks-2026-03-01-to-2026-05-31.csv"');
    const lines = res.text.replace(/^\uFEFF/, '').trimEnd().split('\r\n');
    expect(lines[0]).toBe('vin,plate,code,first case id,first case,repeat case id,repeat case,repeat visit,days,km,reason');
    expect(lines).toHaveLength(2);
    expect(lines[1]).toContain(`,P0171,${fx.ids.v1a},Case v1a,${fx.ids.v1b},Case v1b,2026-05-31,90,2650,same code P0171`);
  });

  it('answers 400 to an unknown table and 403 to a technician', async () => {
    const senior = await signedIn(t.app, shop.people.senior.email);
    await senior.agent.get('/api/patterns.csv?table=secrets').expect(400);
    const tech = await signedIn(t.app, shop.people.technician.email);
    await tech.agent.get('/api/patterns.csv?table=topCodes').expect(403);
  });
});

describe('vehicles', () => {
  it('lists the shop vehicles with visit counts and last visit', async () => {
    const { agent } = await signedIn(t.app, shop.people.technician.email);
    const body = vehicleListSchema.parse((await agent.get('/api/vehicles').expect(200)).body);
    expect(body.vehicles.map((v) => v.id).sort()).toEqual([...fx.vehicleIds.values()].sort());
    const v1 = body.vehicles.find((v) => v.id === fx.vehicleIds.get('v1'))!;
    expect(v1).toMatchObject({ visits: 2, lastVisit: '2026-05-31', comebacks: 1 });
  });

  it('hides another author’s draft from a technician but not from a senior', async () => {
    const v3 = fx.vehicleIds.get('v3')!;
    const tech = await signedIn(t.app, shop.people.technician.email);
    expect((await tech.agent.get(`/api/vehicles/${v3}`).expect(200)).body.visits).toHaveLength(2);
    const senior = await signedIn(t.app, shop.people.senior.email);
    expect((await senior.agent.get(`/api/vehicles/${v3}`).expect(200)).body.visits).toHaveLength(3);
  });

  it('gives the visits in order with confirmed and comeback flags', async () => {
    const { agent } = await signedIn(t.app, shop.people.apprentice.email);
    const body = vehicleDetailSchema.parse((await agent.get(`/api/vehicles/${fx.vehicleIds.get('v1')}`).expect(200)).body);
    expect(body.visits.map((v) => [v.caseId, v.confirmed, v.comebackOf?.caseId ?? null, v.cameBackAs.map((c) => c.caseId)])).toEqual([
      [fx.ids.v1a, true, null, [fx.ids.v1b]],
      [fx.ids.v1b, true, fx.ids.v1a, []],
    ]);
    expect(body.visits[0]).toMatchObject({ day: '2026-03-02', mileage: 87_300, mileageUnit: 'km', codes: ['P0171'], status: 'published' });
  });

  it('answers 404 for another shop’s vehicle and 400 for a bad id', async () => {
    const { agent } = await signedIn(t.app, shop.people.manager.email);
    const res = await agent.get(`/api/vehicles/${otherFx.vehicleIds.get('x1')}`).expect(404);
    expect(res.body.error.code).toBe('not_found');
    await agent.get('/api/vehicles/not-a-number').expect(400);
    await request(t.app).get('/api/vehicles').expect(401);
  });
});

describe('findRepeats for the case view', () => {
  it('links both cases of a comeback', async () => {
    expect(await findRepeats(t.ctx, shop.shopId, fx.ids.v1b!)).toEqual([
      { caseId: fx.ids.v1a, title: 'Case v1a', relation: 'comeback-of', days: 90, reason: 'same code P0171' },
    ]);
    expect(await findRepeats(t.ctx, shop.shopId, fx.ids.v1a!)).toEqual([
      { caseId: fx.ids.v1b, title: 'Case v1b', relation: 'came-back-as', days: 90, reason: 'same code P0171' },
    ]);
  });

  it('finds nothing for the day-91 pair or across shops', async () => {
    expect(await findRepeats(t.ctx, shop.shopId, fx.ids.v2b!)).toEqual([]);
    expect(await findRepeats(t.ctx, other.shopId, fx.ids.v1b!)).toEqual([]);
  });
});

describe('the demo shop', () => {
  let demoShopId: number;
  beforeAll(async () => {
    const { seedDemoShop } = await import('../../server/seed/seed');
    demoShopId = (await seedDemoShop(t.ctx.db, t.ctx.config.root)).shopId;
  }, 120_000);

  const slugs = async () => {
    const rows = await t.ctx.db.select({ id: cases.id, slug: cases.slug }).from(cases).where(eq(cases.shopId, demoShopId));
    return new Map(rows.map((r) => [r.id, (r.slug ?? '').slice(0, 4)]));
  };

  it('finds exactly the four comebacks content/cases/README.md lists', async () => {
    const { getPatterns } = await import('../../server/patterns/service');
    const all = await getPatterns(t.ctx, demoShopId, { from: '2026-01-01', to: '2026-12-01' });
    const bySlug = await slugs();
    // README "Comebacks and repeat visits": 0003->0008 (34 d), 0009->0023 (day 90), 0024->0034 (45 d), 0040->0044 (21 d)
    expect(all.comebacks.map((c) => [bySlug.get(c.firstCaseId), bySlug.get(c.repeatCaseId), c.days]).sort()).toEqual([
      ['0003', '0008', 34],
      ['0009', '0023', 90],
      ['0024', '0034', 45],
      ['0040', '0044', 21],
    ]);
    // README "Repeat fault across vehicles": the VT27 charge-pipe coupler on three VINs
    const coupler = all.repeatPatterns.find((p) => p.causeKey === 'low-boost/charge-pipe-leak');
    expect(coupler?.cases.map((c) => bySlug.get(c.id))).toEqual(['0003', '0008', '0020', '0043']);
    expect(coupler?.vehicles).toBe(3);
    if (process.env.PRINT_DEMO_FIGURES) {
      const q = await getPatterns(t.ctx, demoShopId, {}, '2026-12-01');
      console.log(JSON.stringify({ year: { ...all, trend: undefined, byRootCause: all.byRootCause.slice(0, 5) }, default: { ...q, trend: undefined, byRootCause: q.byRootCause.slice(0, 5) } }, null, 1));
    }
  });
});
