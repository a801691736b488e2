// GET /api/search end to end: ranking, visibility, isolation, bad input, live updates, two instances.
import { eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { connect } from '../../db/client';
import { cases, platforms } from '../../db/schema';
import { createApp, type CausewayApp } from '../../server/app';
import { recordChange } from '../../server/changes/change-log';
import type { AppContext } from '../../server/context';
import { searchIndexStatus } from '../../server/search/client';
import { searchResponseSchema, type SearchResponse } from '../../shared/schemas/search';
import { createTestApp, seedShop, signedIn, type TestApp } from '../support/test-app';

let t: TestApp;
let shop: Awaited<ReturnType<typeof seedShop>>;
let other: Awaited<ReturnType<typeof seedShop>>;
const p: Record<string, number> = {};

// Fictional platforms. V6 numbered alternately (odd cylinders on bank 1); no firing order recorded.
const vt27 = { make: 'Orrin', model: 'Selby', engine: 'QV27', yearFrom: 2015, yearTo: 2022, cylinders: 6, layout: 'V' as const, banks: { '1': [1, 3, 5], '2': [2, 4, 6] } };
const sameModel = { make: 'Orrin', model: 'Selby', engine: 'QL20', yearFrom: 2015, yearTo: 2022, cylinders: 4, layout: 'inline' as const };
const otherV6 = { make: 'Brant', model: 'Kell', engine: 'BX30', yearFrom: 2012, yearTo: 2019, cylinders: 6, layout: 'V' as const, banks: { '1': [1, 2, 3], '2': [4, 5, 6] } };
const inline4 = { make: 'Brant', model: 'Pim', engine: 'BP16', yearFrom: 2010, yearTo: 2018, cylinders: 4, layout: 'inline' as const };

interface Fixture {
  title: string;
  codes?: string[];
  symptoms?: string[];
  context?: string[];
  platform?: string;
  status?: 'draft' | 'review' | 'published';
  confirmed?: boolean;
  author?: number;
  body?: string;
  shopId?: number;
  updatedAt?: Date;
}

const FIXED_DATE = new Date('2026-06-01T10:00:00Z');

async function addCase(ctx: AppContext, f: Fixture): Promise<number> {
  const shopId = f.shopId ?? shop.shopId;
  const [row] = await ctx.db
    .insert(cases)
    .values({
      shopId,
      title: f.title,
      body: f.body ?? `${f.title}. Notes from the bay.`,
      platformId: f.platform ? p[f.platform]! : null,
      codes: f.codes ?? [],
      symptoms: f.symptoms ?? [],
      context: f.context ?? [],
      status: f.status ?? 'published',
      authorId: f.author ?? (shopId === shop.shopId ? shop.people.senior.id : other.people.senior.id),
      confirmedAt: f.confirmed ? FIXED_DATE : null,
      updatedAt: f.updatedAt ?? FIXED_DATE,
    })
    .$returningId();
  await recordChange(ctx.db, shopId, 'case', row!.id);
  return row!.id;
}

async function search(agent: Awaited<ReturnType<typeof signedIn>>['agent'], query: Record<string, string>): Promise<SearchResponse> {
  const res = await agent.get('/api/search').query(query).expect(200);
  return searchResponseSchema.parse(res.body);
}

type CaseKey = 'both' | 'single' | 'otherV6' | 'inline4' | 'unrelated' | 'lean' | 'leanConfirmed' | 'draft' | 'deleted' | 'otherShop';
const ids = {} as Record<CaseKey, number>;

beforeAll(async () => {
  t = await createTestApp();
  shop = await seedShop(t.ctx, 'Search Yard');
  other = await seedShop(t.ctx, 'Other Yard');
  for (const [key, def] of Object.entries({ vt27, sameModel, otherV6, inline4 })) {
    const [row] = await t.ctx.db.insert(platforms).values({ ...def, shopId: shop.shopId }).$returningId();
    p[key] = row!.id;
  }
  const [otherPlatform] = await t.ctx.db.insert(platforms).values({ ...vt27, shopId: other.shopId }).$returningId();
  p.otherShopVt27 = otherPlatform!.id;

  ids.both = await addCase(t.ctx, { title: 'Coil connectors crossed', codes: ['P0302', 'P0305'], symptoms: ['misfire'], platform: 'vt27' });
  ids.single = await addCase(t.ctx, { title: 'Coil 2 failed', codes: ['P0302'], symptoms: ['misfire'], platform: 'vt27' });
  ids.otherV6 = await addCase(t.ctx, { title: 'Injectors 2 and 5 clogged', codes: ['P0302', 'P0305'], symptoms: ['misfire'], platform: 'otherV6' });
  ids.inline4 = await addCase(t.ctx, { title: 'Plugs worn', codes: ['P0302', 'P0305'], symptoms: ['misfire'], platform: 'inline4' });
  ids.unrelated = await addCase(t.ctx, { title: 'Brake pads glazed', symptoms: ['squeal'], platform: 'vt27' });
  // equal match, one confirmed
  ids.lean = await addCase(t.ctx, { title: 'Lean at idle, intake leak', codes: ['P0171'], symptoms: ['rough-idle'], platform: 'sameModel' });
  ids.leanConfirmed = await addCase(t.ctx, { title: 'Lean at idle, intake leak', codes: ['P0171'], symptoms: ['rough-idle'], platform: 'sameModel', confirmed: true });
  ids.draft = await addCase(t.ctx, { title: 'Boost leak hiss draft', codes: ['P0299'], status: 'draft', author: shop.people.apprentice.id, platform: 'vt27' });
  ids.deleted = await addCase(t.ctx, { title: 'Boost leak deleted', codes: ['P0299'], platform: 'vt27' });
  await t.ctx.db.update(cases).set({ deletedAt: new Date() }).where(eq(cases.id, ids.deleted));
  await recordChange(t.ctx.db, shop.shopId, 'case', ids.deleted, 'delete');
  ids.otherShop = await addCase(t.ctx, { title: 'Coil connectors crossed elsewhere', codes: ['P0302', 'P0305'], symptoms: ['misfire'], shopId: other.shopId, confirmed: true });
});
afterAll(() => t?.close());

describe('GET /api/search: ranking', () => {
  it('puts both cylinder codes on the same engine above one code, another V6 and an inline 4', async () => {
    const { agent } = await signedIn(t.app, shop.people.technician.email);
    const res = await search(agent, { q: 'misfire cyl 2 and 5 QV27' });
    expect(res.query.codes).toEqual(['P0302', 'P0305']);
    expect(res.query.cylinders).toEqual([2, 5]);
    expect(res.query.platformIds).toEqual([p.vt27]);
    const order = res.results.map((r) => r.id);
    expect(order[0]).toBe(ids.both);
    for (const below of [ids.single, ids.otherV6, ids.inline4]) expect(order.indexOf(below)).toBeGreaterThan(0);
    // another V6 shares layout and cylinder count: above the inline 4
    expect(order.indexOf(ids.otherV6)).toBeLessThan(order.indexOf(ids.inline4));
    expect(res.results[0]!.why).toEqual(expect.arrayContaining(['both misfire codes P0302 P0305', 'same engine QV27']));
    expect(order).not.toContain(ids.unrelated);
  });

  it('ranks a confirmed fix above the same match unconfirmed, and says so', async () => {
    const { agent } = await signedIn(t.app, shop.people.technician.email);
    const res = await search(agent, { q: 'P0171 rough idle' });
    const order = res.results.map((r) => r.id);
    expect(order.slice(0, 2)).toEqual([ids.leanConfirmed, ids.lean]);
    expect(res.results[0]!.fixConfirmed).toBe(true);
    expect(res.results[0]!.why).toContain('fix confirmed');
    expect(res.results[1]!.score).toBeLessThan(res.results[0]!.score);
  });

  it('answers the documented shape with chips that drop one part each', async () => {
    const { agent } = await signedIn(t.app, shop.people.technician.email);
    const res = await search(agent, { q: 'misfire cyl 2 and 5 QV27 after timing work' });
    expect(res.query.context).toEqual(['after-timing-work']);
    const cyl2 = res.query.chips.find((c) => c.kind === 'cylinder' && c.value === '2')!;
    const again = await search(agent, { q: cyl2.without });
    expect(again.query.cylinders).toEqual([5]);
    expect(again.query.codes).toEqual(['P0305']);
    expect(again.query.context).toEqual(['after-timing-work']);
    expect(again.query.platformIds).toEqual([p.vt27]);
    expect(res.results[0]).toMatchObject({ id: ids.both, codes: ['P0302', 'P0305'], status: 'published', platform: { engine: 'QV27' } });
    expect(res.tookMs).toBeGreaterThanOrEqual(0);
  });

  it('filters by platform, code, tag and status', async () => {
    const { agent } = await signedIn(t.app, shop.people.senior.email);
    const byPlatform = await search(agent, { q: 'misfire P0302', platformId: String(p.otherV6) });
    expect(byPlatform.results.map((r) => r.id)).toEqual([ids.otherV6]);
    const byCode = await search(agent, { code: 'p0171' });
    expect(byCode.results.map((r) => r.id).sort()).toEqual([ids.lean, ids.leanConfirmed].sort());
    // a tag filter keeps only cases with the tag; the words still order them
    const byTag = await search(agent, { q: 'coil', tag: 'misfire' });
    expect(byTag.results.every((r) => r.symptoms.includes('misfire'))).toBe(true);
    expect(byTag.results.slice(0, 2).map((r) => r.id).sort()).toEqual([ids.both, ids.single].sort());
    const drafts = await search(agent, { status: 'draft' });
    expect(drafts.results.map((r) => r.id)).toEqual([ids.draft]);
    expect(drafts.results[0]!.why).toEqual(['matches your filters']);
  });
});

describe('GET /api/search: who sees what', () => {
  it('shows a draft to its author and seniors, not to other technicians', async () => {
    const q = { q: 'P0299' };
    const tech = await search((await signedIn(t.app, shop.people.technician.email)).agent, q);
    const author = await search((await signedIn(t.app, shop.people.apprentice.email)).agent, q);
    const senior = await search((await signedIn(t.app, shop.people.senior.email)).agent, q);
    expect(tech.results.map((r) => r.id)).not.toContain(ids.draft);
    expect(author.results.map((r) => r.id)).toContain(ids.draft);
    expect(senior.results.map((r) => r.id)).toContain(ids.draft);
  });

  it('never shows a soft-deleted case', async () => {
    const res = await search((await signedIn(t.app, shop.people.manager.email)).agent, { q: 'boost leak P0299' });
    expect(res.results.map((r) => r.id)).not.toContain(ids.deleted);
  });

  it("never shows another shop's matching case, and another shop's platform id is 404", async () => {
    const { agent } = await signedIn(t.app, shop.people.manager.email);
    const res = await search(agent, { q: 'misfire cyl 2 and 5 coil connectors crossed' });
    expect(res.results.map((r) => r.id)).not.toContain(ids.otherShop);
    const theirs = await search((await signedIn(t.app, other.people.technician.email)).agent, { q: 'misfire cyl 2 and 5' });
    expect(theirs.results.map((r) => r.id)).toEqual([ids.otherShop]);
    const probe = await agent.get('/api/search').query({ q: 'misfire', platformId: String(p.otherShopVt27) }).expect(404);
    expect(probe.body.error.code).toBe('not_found');
  });

  it('asks for sign-in', async () => {
    await request(t.app).get('/api/search?q=P0302').expect(401);
  });
});

describe('GET /api/search: input a client can send', () => {
  it.each([
    ['10 kB of text', { q: 'misfire '.repeat(1300) }],
    ['a zero limit', { q: 'P0302', limit: '0' }],
    ['a huge limit', { q: 'P0302', limit: '100000' }],
    ['a non-number platform', { q: 'P0302', platformId: 'vt27' }],
    ['a code that is not a code', { code: 'X9999' }],
    ['a status that does not exist', { status: 'archived' }],
  ])('refuses %s with a 400 that names the problem', async (_name, query) => {
    const { agent } = await signedIn(t.app, shop.people.technician.email);
    const res = await agent.get('/api/search').query(query).expect(400);
    expect(res.body.error.code).toBeTruthy();
    expect(res.body.error.message).toBeTruthy();
    expect(Object.keys(res.body.error.fields ?? {}).length).toBeGreaterThan(0);
  });

  it('refuses q given twice', async () => {
    const { agent } = await signedIn(t.app, shop.people.technician.email);
    await agent.get('/api/search?q=P0302&q=P0305').expect(400);
  });

  it.each([
    ['nothing', ''],
    ['only punctuation', '?!?!... --- ###'],
    ['control characters', '\u0000\u0007\u001b[31m'],
    ['emoji', '🔧🚗💥'],
  ])('answers %s with an empty result', async (_name, q) => {
    const { agent } = await signedIn(t.app, shop.people.technician.email);
    const res = await search(agent, { q });
    expect(res.results).toEqual([]);
    expect(res.total).toBe(0);
  });
});

describe('live index', () => {
  it('finds a case created, edited, published and confirmed through the case API on the very next search, and loses it when deleted', async () => {
    const tech = await signedIn(t.app, shop.people.technician.email);
    const senior = await signedIn(t.app, shop.people.senior.email);
    const created = await tech.agent
      .post('/api/cases')
      .set('X-CSRF-Token', tech.csrf)
      .send({ title: 'Sprocket rattle on cold start', body: 'Chain guide worn, rattle for two seconds.', fix: 'New chain guide', codes: ['P0016'], symptoms: ['rattle-on-start'], platformId: p.vt27 })
      .expect(201);
    const id = created.body.case?.id ?? created.body.id;
    const find = async (who: typeof tech, q: string) => (await search(who.agent, { q })).results.find((r) => r.id === id);
    expect(await find(tech, 'sprocket rattle')).toMatchObject({ status: 'draft' });

    const detail = await senior.agent.get(`/api/cases/${id}`).expect(200);
    await senior.agent
      .patch(`/api/cases/${id}`)
      .set('X-CSRF-Token', senior.csrf)
      .send({ title: 'Guide rail rattle on cold start', version: detail.body.case.version })
      .expect(200);
    expect(await find(senior, 'guide rail')).toBeTruthy();
    expect(await find(senior, 'sprocket')).toBeUndefined();

    await senior.agent.post(`/api/cases/${id}/publish`).set('X-CSRF-Token', senior.csrf).expect(200);
    expect(await find(tech, 'guide rail')).toMatchObject({ status: 'published', fixConfirmed: false });

    await senior.agent.post(`/api/cases/${id}/confirm`).set('X-CSRF-Token', senior.csrf).send({ note: 'Road test' }).expect(200);
    expect(await find(tech, 'guide rail')).toMatchObject({ fixConfirmed: true });

    await senior.agent.delete(`/api/cases/${id}`).set('X-CSRF-Token', senior.csrf).expect((r) => expect([200, 204]).toContain(r.status));
    expect(await find(senior, 'guide rail')).toBeUndefined();
  });

  it('reports the index state on /api/health', async () => {
    const res = await request(t.app).get('/api/health').expect(200);
    expect(res.body.index).toMatchObject({ state: 'ready' });
    expect((await searchIndexStatus(t.ctx)).cases).toBeGreaterThan(0);
  });
});

describe('two app instances on one database', () => {
  let second: CausewayApp;
  let secondCtx: AppContext;
  let close: () => Promise<void>;

  beforeAll(async () => {
    const database = connect(t.ctx.config.db);
    secondCtx = { ...t.ctx, db: database.db };
    second = createApp({ ctx: secondCtx, pool: database.pool, sessionSecret: t.ctx.config.session.secret! });
    close = async () => {
      await second.shutdown();
      await database.close();
    };
  });
  afterAll(() => close?.());

  it('sees a change made through the other instance: in the same process on its next search, idle within 2 s', async () => {
    // (two instances in one process share its write count; across processes the 500 ms poll brings it in)
    const a = await signedIn(t.app, shop.people.senior.email);
    const b = await signedIn(second, shop.people.senior.email);
    // both instances have built the shop's index
    await search(a.agent, { q: 'P0302' });
    await search(b.agent, { q: 'P0302' });

    const made = await a.agent
      .post('/api/cases')
      .set('X-CSRF-Token', a.csrf)
      .send({ title: 'Wandering idle, throttle body gummed', body: 'Idle hunting 600 to 1100 rpm.', codes: [], symptoms: ['rough-idle'], status: 'published' })
      .expect(201);
    const id = made.body.case?.id ?? made.body.id;
    const inB = await search(b.agent, { q: 'throttle body gummed' });
    expect(inB.results.map((r) => r.id)).toContain(id);

    // an edit through A reaches B's index by the background poll, with no request to B
    const before = (await searchIndexStatus(secondCtx)).lastChangeId;
    const detail = await a.agent.get(`/api/cases/${id}`).expect(200);
    await a.agent.patch(`/api/cases/${id}`).set('X-CSRF-Token', a.csrf).send({ title: 'Wandering idle, idle valve sticking', version: detail.body.case.version }).expect(200);
    const started = Date.now();
    while ((await searchIndexStatus(secondCtx)).lastChangeId <= before && Date.now() - started < 2000) await new Promise((r) => setTimeout(r, 50));
    expect((await searchIndexStatus(secondCtx)).lastChangeId).toBeGreaterThan(before);
    expect(Date.now() - started).toBeLessThan(2000);
    const after = await search(b.agent, { q: 'idle valve sticking' });
    expect(after.results.map((r) => r.id)).toContain(id);
  });
});
