import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { changeLog } from '../../db/schema';
import { platformDetailResponseSchema, platformListResponseSchema } from '../../shared/schemas/platforms';
import { createTestApp, seedShop, signedIn, type TestApp } from '../support/test-app';

let t: TestApp;
type Agent = Awaited<ReturnType<typeof signedIn>>;
let shopId: number;
let apprentice: Agent;
let technician: Agent;
let senior: Agent;
let otherSenior: Agent;

// An invented platform; firing order 1-4-3-6-2-5 is a common 90-degree V6 order (references.md §6),
// numbered one bank after the other so the order alternates banks.
const v6 = {
  make: 'Tarnwick',
  model: 'Osprette',
  engine: 'TW30',
  yearFrom: 2016,
  yearTo: 2023,
  cylinders: 6,
  layout: 'V',
  banks: { '1': [1, 2, 3], '2': [4, 5, 6] },
  firingOrder: [1, 4, 3, 6, 2, 5],
  fuel: 'petrol',
  induction: 'turbo',
};

beforeAll(async () => {
  t = await createTestApp();
  const shop = await seedShop(t.ctx, 'Platform Test Garage');
  const other = await seedShop(t.ctx, 'Other Platform Garage', ['senior']);
  shopId = shop.shopId;
  apprentice = await signedIn(t.app, shop.people.apprentice.email);
  technician = await signedIn(t.app, shop.people.technician.email);
  senior = await signedIn(t.app, shop.people.senior.email);
  otherSenior = await signedIn(t.app, other.people.senior.email);
});
afterAll(() => t.close());

const post = (a: Agent, body: unknown) => a.agent.post('/api/platforms').set('X-CSRF-Token', a.csrf).send(body as object);
const patch = (a: Agent, id: number, body: unknown) => a.agent.patch(`/api/platforms/${id}`).set('X-CSRF-Token', a.csrf).send(body as object);

async function changesFor(id: number) {
  return t.ctx.db.select().from(changeLog).where(and(eq(changeLog.entity, 'platform'), eq(changeLog.entityId, id), eq(changeLog.shopId, shopId)));
}

describe('POST /api/platforms', () => {
  it('lets a senior add a platform, 201 with its id, and logs the change', async () => {
    const res = await post(senior, v6).expect(201);
    expect(res.body.id).toEqual(expect.any(Number));
    expect(await changesFor(res.body.id)).toHaveLength(1);
  });

  it('refuses apprentices and technicians with 403', async () => {
    expect((await post(apprentice, v6)).status).toBe(403);
    expect((await post(technician, v6)).status).toBe(403);
  });

  it('names the field when the firing order is not a permutation', async () => {
    const res = await post(senior, { ...v6, firingOrder: [1, 4, 3, 6, 2, 2] }).expect(400);
    expect(res.body.error.fields.firingOrder).toMatch(/more than once/);
  });

  it('names the field when an inline engine is given banks', async () => {
    const res = await post(senior, { ...v6, layout: 'inline', cylinders: 4, firingOrder: [1, 3, 4, 2], banks: { '1': [1, 2], '2': [3, 4] } }).expect(400);
    expect(res.body.error.fields.banks).toMatch(/inline engine has one bank/);
  });

  it('names missing and malformed fields', async () => {
    const res = await post(senior, { make: '', model: 'X', engine: 'E', yearFrom: 2020, yearTo: 2010, cylinders: 4, layout: 'W' }).expect(400);
    expect(res.body.error.fields.make).toMatch(/required/);
    expect(res.body.error.fields.layout).toMatch(/inline, V or flat/);
  });

  it('checks year order and the column limits', async () => {
    expect((await post(senior, { ...v6, yearFrom: 2024, yearTo: 2016 }).expect(400)).body.error.fields.yearTo).toMatch(/before first year/);
    expect((await post(senior, { ...v6, engine: 'E'.repeat(31) }).expect(400)).body.error.fields.engine).toMatch(/at most 30/);
  });

  it('refuses unknown fields', async () => {
    expect((await post(senior, { ...v6, colour: 'red' })).status).toBe(400);
  });
});

describe('GET /api/platforms', () => {
  it('lists the shop’s platforms to every role, and none of another shop', async () => {
    await post(senior, { ...v6, model: 'Listed' }).expect(201);
    const mine = platformListResponseSchema.parse((await apprentice.agent.get('/api/platforms').expect(200)).body);
    expect(mine.platforms.map((p) => p.model)).toContain('Listed');
    const theirs = platformListResponseSchema.parse((await otherSenior.agent.get('/api/platforms').expect(200)).body);
    expect(theirs.platforms).toEqual([]);
  });

  it('shows banks and firing companion pairs on the detail', async () => {
    const { id } = (await post(senior, v6).expect(201)).body;
    const res = platformDetailResponseSchema.parse((await technician.agent.get(`/api/platforms/${id}`).expect(200)).body);
    expect(res.platform).toMatchObject({ id, make: 'Tarnwick', layout: 'V', firingOrder: [1, 4, 3, 6, 2, 5] });
    // positions i and i + n/2 of 1-4-3-6-2-5: 1 & 6, 4 & 2, 3 & 5 (references.md §6)
    expect(res.facts.companionPairs).toEqual([[1, 6], [4, 2], [3, 5]]);
    expect(res.facts.banks).toEqual({ '1': [1, 2, 3], '2': [4, 5, 6] });
    expect(res.facts.companionWords[0]).toMatch(/one on each bank, firing companions/);
  });

  it('puts every cylinder of an inline engine on bank 1', async () => {
    // inline-4 firing order 1-3-4-2 (references.md §6)
    const { id } = (await post(senior, { ...v6, layout: 'inline', cylinders: 4, banks: undefined, firingOrder: [1, 3, 4, 2] }).expect(201)).body;
    const res = (await apprentice.agent.get(`/api/platforms/${id}`).expect(200)).body;
    expect(res.facts.banks).toEqual({ '1': [1, 2, 3, 4], '2': [] });
    expect(res.facts.companionPairs).toEqual([[1, 4], [3, 2]]);
    expect(res.platform.banks).toBeUndefined();
  });

  it('answers 404 for another shop’s platform and for no such id', async () => {
    const { id } = (await post(senior, v6).expect(201)).body;
    expect((await otherSenior.agent.get(`/api/platforms/${id}`)).status).toBe(404);
    expect((await senior.agent.get('/api/platforms/999999')).status).toBe(404);
    expect((await senior.agent.get('/api/platforms/abc')).status).toBe(400);
  });
});

describe('PATCH /api/platforms/:id', () => {
  it('lets a senior change fields and logs the change', async () => {
    const { id } = (await post(senior, v6).expect(201)).body;
    const res = await patch(senior, id, { yearTo: 2025, induction: null }).expect(200);
    expect(res.body.platform.yearTo).toBe(2025);
    expect(res.body.platform.induction).toBeUndefined();
    expect(await changesFor(id)).toHaveLength(2);
  });

  it('checks the merged record with the cross-field rules', async () => {
    const { id } = (await post(senior, v6).expect(201)).body;
    // 6 cylinders in the record, firing order of 4 in the patch
    const res = await patch(senior, id, { firingOrder: [1, 3, 4, 2] }).expect(400);
    expect(res.body.error.fields.firingOrder).toMatch(/lists 4 cylinders but the engine has 6/);
    // turning a V6 inline while its banks are stored must clear them too
    expect((await patch(senior, id, { layout: 'inline' }).expect(400)).body.error.fields.banks).toMatch(/inline/);
    await patch(senior, id, { layout: 'inline', banks: null }).expect(200);
  });

  it('refuses an empty patch, a technician, and another shop', async () => {
    const { id } = (await post(senior, v6).expect(201)).body;
    expect((await patch(senior, id, {})).status).toBe(400);
    expect((await patch(technician, id, { yearTo: 2024 })).status).toBe(403);
    expect((await patch(otherSenior, id, { yearTo: 2024 })).status).toBe(404);
    expect(await changesFor(id)).toHaveLength(1);
  });
});
