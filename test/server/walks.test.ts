import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { cases, platforms, walks } from '../../db/schema';
import { backfillCauses, createCase } from '../../server/cases/service';
import { markWalkStep } from '../../server/walks/service';
import type { SessionUser } from '../../server/auth/session-user';
import { walkResponseSchema, type WalkResponse } from '../../shared/schemas/walks';
import { DEFAULT_STRENGTH, PRECEDENT_COUNT } from '../../shared/walk';
import { createTestApp, seedShop, signedIn, type TestApp } from '../support/test-app';

let t: TestApp;
let shop: Awaited<ReturnType<typeof seedShop>>;
let other: Awaited<ReturnType<typeof seedShop>>;
let vt27: number;
let kr15t: number;
type Signed = Awaited<ReturnType<typeof signedIn>>;
let apprentice: Signed;
let technician: Signed;
let senior: Signed;
let outsider: Signed;

// Fictional platforms shaped like content/platforms.yaml: a V6 numbered 1-2-3 / 4-5-6 (so 1-4-3-6-2-5 alternates banks), an inline-4 turbo.
async function addPlatforms(shopId: number) {
  const [v6] = await t.ctx.db
    .insert(platforms)
    .values({ shopId, key: 'test-v6', make: 'Vexholm', model: 'Kestrune', engine: 'VT27', yearFrom: 2019, yearTo: 2026, cylinders: 6, layout: 'V', banks: { '1': [1, 2, 3], '2': [4, 5, 6] }, firingOrder: [1, 4, 3, 6, 2, 5], fuel: 'petrol', induction: 'turbo' })
    .$returningId();
  const [i4] = await t.ctx.db
    .insert(platforms)
    .values({ shopId, key: 'test-i4', make: 'Calderane', model: 'Pello', engine: 'KR15T', yearFrom: 2017, yearTo: 2025, cylinders: 4, layout: 'inline', firingOrder: [1, 3, 4, 2], fuel: 'petrol', induction: 'turbo' })
    .$returningId();
  return { v6: v6!.id, i4: i4!.id };
}

beforeAll(async () => {
  t = await createTestApp();
  shop = await seedShop(t.ctx, 'Walk Test Garage');
  other = await seedShop(t.ctx, 'Other Walk Garage');
  ({ v6: vt27, i4: kr15t } = await addPlatforms(shop.shopId));
  apprentice = await signedIn(t.app, shop.people.apprentice.email);
  technician = await signedIn(t.app, shop.people.technician.email);
  senior = await signedIn(t.app, shop.people.senior.email);
  outsider = await signedIn(t.app, other.people.senior.email);
});
afterAll(() => t.close());

const misfireV6 = () => ({ platformId: vt27, codes: ['P0302', 'P0305'], symptoms: ['rough-idle'], context: ['after-timing-work'] });

async function start(who: Signed, body: object): Promise<WalkResponse> {
  const res = await who.agent.post('/api/walks').set('X-CSRF-Token', who.csrf).send(body);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return walkResponseSchema.parse(res.body);
}

const mark = (who: Signed, id: number, stepId: string, body: object) =>
  who.agent.patch(`/api/walks/${id}/steps/${stepId}`).set('X-CSRF-Token', who.csrf).send(body);

const openSum = (w: WalkResponse) => w.steps.filter((s) => s.state === 'open').reduce((sum, s) => sum + s.probability, 0);
const probabilityOf = (w: WalkResponse, id: string) => w.steps.find((s) => s.id === id)?.probability ?? 0;

describe('POST /api/walks', () => {
  it('starts a misfire walk with banks from the platform and open steps in p/c order', async () => {
    const w = await start(apprentice, misfireV6());
    expect(w.treeId).toBe('misfire');
    // VT27 numbering: 1-2-3 on bank 1, 4-5-6 on bank 2 (content/platforms.yaml)
    expect(w.evidence.banks).toEqual({ bank1: [2], bank2: [5], bothBanks: true });
    expect(w.evidence.cylinders).toEqual([2, 5]);
    expect(w.evidence.platform).toMatchObject({ fuel: 'petrol', induction: 'turbo', layout: 'V', cylinders: 6 });
    expect(openSum(w)).toBeCloseTo(1, 9);
    const open = w.steps.filter((s) => s.state === 'open');
    for (let i = 1; i < open.length; i++) {
      expect(open[i - 1]!.probability / open[i - 1]!.costMinutes).toBeGreaterThanOrEqual(open[i]!.probability / open[i]!.costMinutes - 1e-12);
    }
    expect(w.expectedMinutes.recommended).toBeLessThanOrEqual(w.expectedMinutes.byLikelihood + 1e-9);
    const step = w.steps[0]!;
    expect(Object.keys(step)).toEqual(expect.arrayContaining(['id', 'cause', 'system', 'test', 'costMinutes', 'probability', 'state', 'evidence', 'why']));
    // after timing work on both banks: cam timing leads with its reasons shown
    expect(w.nextStepId).toBe('cam-timing');
    expect(w.steps.find((s) => s.id === 'cam-timing')?.why.join(' ')).toMatch(/timing work/);
    expect(w.steps.find((s) => s.id === 'cam-timing')?.caution).toMatch(/interference engine.*local regulations and licensed practice\.$/);
  });

  it('reads cylinders, context and the platform from the free text', async () => {
    const w = await start(technician, { codes: [], symptoms: [], query: 'misfire cyl 2 and 5 after timing work vt27' });
    expect(w.treeId).toBe('misfire');
    expect(w.evidence.cylinders).toEqual([2, 5]);
    expect(w.evidence.context).toContain('after-timing-work');
    expect(w.platform?.id).toBe(vt27);
    expect(w.evidence.banks?.bothBanks).toBe(true);
    expect(w.query).toBe('misfire cyl 2 and 5 after timing work vt27');
  });

  it('answers 400 with a clear message when no tree fits the evidence', async () => {
    const res = await apprentice.agent.post('/api/walks').set('X-CSRF-Token', apprentice.csrf).send({ codes: [], symptoms: ['smells-of-roses'] });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('no_tree');
    expect(res.body.error.message).toMatch(/No cause tree fits/);
  });

  it('refuses a malformed code, naming the field, and another shop’s platform', async () => {
    const bad = await apprentice.agent.post('/api/walks').set('X-CSRF-Token', apprentice.csrf).send({ codes: ['P03X2'], symptoms: [] });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toContain('codes.0');
    const [foreign] = await t.ctx.db.insert(platforms).values({ shopId: other.shopId, make: 'Vexholm', model: 'X', engine: 'X1', yearFrom: 2020, yearTo: 2021, cylinders: 4, layout: 'inline' }).$returningId();
    const res = await apprentice.agent.post('/api/walks').set('X-CSRF-Token', apprentice.csrf).send({ platformId: foreign!.id, codes: ['P0302'], symptoms: [] });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.platformId).toBeTruthy();
  });

  it('needs a signed-in user and the CSRF token', async () => {
    const res = await apprentice.agent.post('/api/walks').send(misfireV6());
    expect(res.status).toBe(403);
  });
});

describe('marking steps', () => {
  it('rules a cause out, renormalises the rest and recomputes the order', async () => {
    const w = await start(apprentice, misfireV6());
    const first = w.steps[0]!;
    const res = await mark(apprentice, w.id, first.id, { state: 'tested', outcome: 'no_fault', measurement: { value: 1, unit: 'deg' } });
    expect(res.status).toBe(200);
    const after = walkResponseSchema.parse(res.body);
    const done = after.steps.find((s) => s.id === first.id)!;
    expect(done.state).toBe('tested');
    expect(done.probability).toBe(0);
    expect(done.verdict?.verdict).toBe('in');
    expect(openSum(after)).toBeCloseTo(1, 9);
    // p_j / (1 - p_i) for every open cause (references.md §5)
    for (const s of after.steps.filter((x) => x.state === 'open')) {
      const before = w.steps.find((x) => x.id === s.id)!;
      expect(s.probability).toBeCloseTo(before.probability / (1 - first.probability), 9);
    }
    expect(after.steps.at(-1)?.id).toBe(first.id);
    expect(after.revision).toBe(w.revision + 1);
  });

  it('converts a reading in another unit of the same quantity and refuses one of another quantity', async () => {
    const w = await start(apprentice, misfireV6());
    const ok = await mark(apprentice, w.id, 'fuel-pressure-low', { state: 'tested', outcome: 'no_fault', measurement: { value: 50, unit: 'psi' } });
    expect(ok.status).toBe(200);
    expect(ok.body.steps.find((s: { id: string }) => s.id === 'fuel-pressure-low').verdict.valueInSpecUnit).toBeCloseTo(50 * 6.894757, 6); // NIST SP 811 B.8
    const wrong = await mark(apprentice, w.id, 'cam-timing', { state: 'tested', outcome: 'no_fault', measurement: { value: 14.4, unit: 'V' } });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.code).toBe('wrong_unit');
    expect(wrong.body.error.message).toMatch(/angle/);
    expect(wrong.body.error.fields['measurement.unit']).toBeTruthy();
    const unknownUnit = await mark(apprentice, w.id, 'cam-timing', { state: 'tested', outcome: 'no_fault', measurement: { value: 3, unit: 'furlong' } });
    expect(unknownUnit.status).toBe(400);
  });

  it('answers 404 for an unknown step and 400 for a mark that makes no sense', async () => {
    const w = await start(apprentice, misfireV6());
    const unknown = await mark(apprentice, w.id, 'flux-capacitor', { state: 'tested', outcome: 'no_fault' });
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.message).toMatch(/flux-capacitor/);
    const noOutcome = await mark(apprentice, w.id, 'coil', { state: 'tested' });
    expect(noOutcome.status).toBe(400);
    expect(noOutcome.body.error.fields.outcome).toBeTruthy();
    const noReason = await mark(apprentice, w.id, 'coil', { state: 'ruled_out' });
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.fields.note).toBeTruthy();
    const badState = await mark(apprentice, w.id, 'coil', { state: 'maybe' });
    expect(badState.status).toBe(400);
  });

  it('finishes on fault found, refuses further marks with 409, and reopens', async () => {
    const w = await start(apprentice, misfireV6());
    const found = await mark(apprentice, w.id, 'ignition-harness', { state: 'tested', outcome: 'fault_found', note: 'coil connectors 2 and 5 crossed' });
    expect(found.status).toBe(200);
    expect(found.body.status).toBe('finished');
    expect(found.body.confirmedStepId).toBe('ignition-harness');
    const late = await mark(apprentice, w.id, 'coil', { state: 'tested', outcome: 'no_fault' });
    expect(late.status).toBe(409);
    expect(late.body.error.code).toBe('walk_finished');
    const again = await mark(apprentice, w.id, 'ignition-harness', { state: 'tested', outcome: 'fault_found', note: 'coil connectors 2 and 5 crossed' });
    expect(again.status).toBe(200); // the same mark sent twice (an offline replay) changes nothing
    expect(again.body.revision).toBe(found.body.revision);
    const reopened = await mark(apprentice, w.id, 'ignition-harness', { state: 'open' });
    expect(reopened.status).toBe(200);
    expect(reopened.body.status).toBe('open');
  });

  it('keeps both marks when two devices mark at the same moment', async () => {
    const w = await start(apprentice, misfireV6());
    const actor: SessionUser = { id: shop.people.apprentice.id, name: 'A', email: shop.people.apprentice.email, role: 'apprentice', shopId: shop.shopId, shopName: 'x', shopCountry: null, shopTimeZone: 'UTC' };
    const ids = w.steps.slice(0, 4).map((s) => s.id);
    await Promise.all(ids.map((id) => markWalkStep(t.ctx, actor, w.id, id, { state: 'tested', outcome: 'no_fault' })));
    const res = await apprentice.agent.get(`/api/walks/${w.id}`);
    const after = walkResponseSchema.parse(res.body);
    expect(after.marks).toBe(4);
    expect(after.steps.filter((s) => ids.includes(s.id)).every((s) => s.state === 'tested')).toBe(true);
    expect(after.revision).toBe(w.revision + 4);
  });
});

describe('who sees a walk', () => {
  it('lists my walks open first; an apprentice cannot open another tech’s walk, a senior can', async () => {
    const mine = await start(technician, misfireV6());
    const a = await apprentice.agent.get(`/api/walks/${mine.id}`);
    expect(a.status).toBe(404);
    const s = await senior.agent.get(`/api/walks/${mine.id}`);
    expect(s.status).toBe(200);
    expect(s.body.owner.id).toBe(shop.people.technician.id);
    const seniorMark = await mark(senior, mine.id, 'coil', { state: 'tested', outcome: 'no_fault' });
    expect(seniorMark.status).toBe(403);
    const list = await technician.agent.get('/api/walks?mine=1');
    expect(list.status).toBe(200);
    expect(list.body.walks.every((x: { owner: { id: number } }) => x.owner.id === shop.people.technician.id)).toBe(true);
    expect(list.body.walks.map((x: { id: number }) => x.id)).toContain(mine.id);
    // without mine=1 a technician still sees only their own; a senior sees the shop's
    const techAll = await technician.agent.get('/api/walks');
    expect(techAll.body.walks.every((x: { owner: { id: number } }) => x.owner.id === shop.people.technician.id)).toBe(true);
    const shopAll = await senior.agent.get('/api/walks');
    const owners = new Set(shopAll.body.walks.map((x: { owner: { id: number } }) => x.owner.id));
    expect(owners.has(shop.people.apprentice.id) && owners.has(shop.people.technician.id)).toBe(true);
    const statuses = shopAll.body.walks.map((x: { status: string }) => x.status);
    expect(statuses.indexOf('open')).toBeLessThan(Math.max(0, statuses.indexOf('finished')) || Infinity);
  });

  it('answers 404 for another shop’s walk, for reading and marking', async () => {
    const w = await start(apprentice, misfireV6());
    expect((await outsider.agent.get(`/api/walks/${w.id}`)).status).toBe(404);
    expect((await mark(outsider, w.id, 'coil', { state: 'tested', outcome: 'no_fault' })).status).toBe(404);
    expect((await outsider.agent.post(`/api/walks/${w.id}/write-up`).set('X-CSRF-Token', outsider.csrf)).status).toBe(404);
    expect((await outsider.agent.get('/api/walks')).body.walks.some((x: { id: number }) => x.id === w.id)).toBe(false);
  });

  it('answers 400 for a walk id that is not a number', async () => {
    expect((await apprentice.agent.get('/api/walks/abc')).status).toBe(400);
  });
});

describe('learning from the shop’s confirmed fixes', () => {
  it('raises cam timing for a matching walk once a confirmed cam-timing case exists, and lowers the others', async () => {
    const before = await start(technician, { platformId: vt27, codes: ['P0302', 'P0305'], symptoms: ['rough-idle'] });
    const seniorUser = { id: shop.people.senior.id, role: 'senior' as const, shopId: shop.shopId };
    const created = await createCase(
      t.ctx,
      seniorUser,
      { title: 'VT27 misfire 2 and 5, bank 2 cam a tooth out', body: 'Cam a tooth out.', platformId: vt27, codes: ['P0302', 'P0305'], symptoms: ['rough-idle'], rootCause: 'Cam one tooth out', cause: 'misfire/cam-timing', status: 'published' },
      { confirmation: { byId: seniorUser.id, at: new Date(), note: 'deviation back to 1 degree' } },
    );
    const after = await start(technician, { platformId: vt27, codes: ['P0302', 'P0305'], symptoms: ['rough-idle'] });
    expect(probabilityOf(after, 'cam-timing')).toBeGreaterThan(probabilityOf(before, 'cam-timing'));
    for (const s of after.steps.filter((x) => x.id !== 'cam-timing')) expect(s.probability).toBeLessThan(probabilityOf(before, s.id));
    const cam = after.steps.find((s) => s.id === 'cam-timing')!;
    expect(cam.evidence).toContainEqual({ caseId: created.id, title: 'VT27 misfire 2 and 5, bank 2 cam a tooth out' });
    expect(cam.why).toContain('1 confirmed fix in this shop');
    // the same engine, codes and tags: similarity 1, so the case counts PRECEDENT_COUNT against the tree's a (docs/cause-walk.md §4)
    const a = DEFAULT_STRENGTH;
    expect(probabilityOf(after, 'cam-timing')).toBeCloseTo((a * probabilityOf(before, 'cam-timing') + PRECEDENT_COUNT) / (a + PRECEDENT_COUNT), 6);
    expect(after.precedents).toEqual([
      { caseId: created.id, title: 'VT27 misfire 2 and 5, bank 2 cam a tooth out', cause: 'misfire/cam-timing', causeTitle: cam.title, similarity: 1, sameEngine: true },
    ]);
    expect(before.precedents).toEqual([]);
  });

  it('ignores an unconfirmed case and another shop’s confirmed case', async () => {
    const before = await start(technician, { platformId: kr15t, codes: ['P0301'], symptoms: ['misfire'] });
    const seniorUser = { id: shop.people.senior.id, role: 'senior' as const, shopId: shop.shopId };
    await createCase(t.ctx, seniorUser, { title: 'KR15T P0301 coil, not confirmed', body: '-', platformId: kr15t, codes: ['P0301'], symptoms: ['misfire'], cause: 'misfire/coil', status: 'published' });
    const otherSenior = { id: other.people.senior.id, role: 'senior' as const, shopId: other.shopId };
    await createCase(t.ctx, otherSenior, { title: 'P0301 coil elsewhere', body: '-', codes: ['P0301'], symptoms: ['misfire'], cause: 'misfire/coil', status: 'published' }, { confirmation: { byId: otherSenior.id, at: new Date(), note: null } });
    const after = await start(technician, { platformId: kr15t, codes: ['P0301'], symptoms: ['misfire'] });
    expect(probabilityOf(after, 'coil')).toBeCloseTo(probabilityOf(before, 'coil'), 12);
  });
});

describe('the learning loop: a case written and confirmed in the app teaches the next walk', () => {
  it('links a case confirmed with only root-cause text to its suggested cause, and the next walk opens with it', async () => {
    // a KR15T misfire on cylinder 3 with the shop's own words for it: no cause id anywhere
    const evidence = { platformId: kr15t, codes: ['P0303'], symptoms: ['misfire', 'misfire-when-wet'], context: ['after-plug-change'] };
    const before = await start(technician, evidence);
    const write = await senior.agent
      .post('/api/cases')
      .set('X-CSRF-Token', senior.csrf)
      .send({
        title: 'KR15T P0303 after plugs, misfire in the wet',
        body: 'Misfire on 3 after the plug change, worse in rain.',
        platformId: kr15t,
        codes: ['P0303'],
        symptoms: ['misfire', 'misfire-when-wet'],
        context: ['after-plug-change'],
        rootCause: 'Coil connector on cylinder 3 not clipped home after the plug change, terminal backed out',
        fix: 'Re-pinned the terminal and clipped the connector',
        status: 'published',
      });
    expect(write.status, JSON.stringify(write.body)).toBe(201);
    const caseId = write.body.id as number;
    const draft = (await senior.agent.get(`/api/cases/${caseId}`)).body.case;
    expect(draft.cause).toBeNull();
    expect(draft.causeSuggestions[0]).toMatchObject({ cause: 'misfire/ignition-harness', title: 'Coil connector or ignition harness fault' });

    const confirmed = await senior.agent.post(`/api/cases/${caseId}/confirm`).set('X-CSRF-Token', senior.csrf).send({ note: 'no misfire after 30 km in the wet' });
    expect(confirmed.status, JSON.stringify(confirmed.body)).toBe(200);
    expect(confirmed.body.case).toMatchObject({ cause: 'misfire/ignition-harness', causeLinkedBy: 'suggestion', causeTitle: 'Coil connector or ignition harness fault' });

    const after = await start(technician, evidence);
    expect(probabilityOf(after, 'ignition-harness')).toBeGreaterThan(probabilityOf(before, 'ignition-harness') + 0.3);
    expect(after.steps.find((s) => s.id === 'ignition-harness')?.evidence).toContainEqual({ caseId, title: 'KR15T P0303 after plugs, misfire in the wet' });
    expect(after.precedents[0]).toMatchObject({ caseId, cause: 'misfire/ignition-harness', causeTitle: 'Coil connector or ignition harness fault', sameEngine: true });
    expect(after.precedents[0]!.similarity).toBe(1);
    const again = await technician.agent.get(`/api/walks/${after.id}`);
    expect(walkResponseSchema.parse(again.body).precedents).toEqual(after.precedents);

    // the link can be changed in the editor, and is then the author's
    const edited = await senior.agent.patch(`/api/cases/${caseId}`).set('X-CSRF-Token', senior.csrf).send({ cause: 'misfire/coil', version: confirmed.body.case.version });
    expect(edited.status, JSON.stringify(edited.body)).toBe(200);
    expect((await senior.agent.get(`/api/cases/${caseId}`)).body.case).toMatchObject({ cause: 'misfire/coil', causeLinkedBy: 'author' });
    const bad = await senior.agent.patch(`/api/cases/${caseId}`).set('X-CSRF-Token', senior.csrf).send({ cause: 'misfire/no-such-cause', version: edited.body.version });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.cause).toMatch(/Pick a cause/);
  });

  it('lists the shop’s causes for the picker and suggests from an unsaved write-up; malformed input is a 400', async () => {
    const list = await apprentice.agent.get('/api/cases/causes');
    expect(list.status).toBe(200);
    expect(list.body.causes).toContainEqual({ cause: 'misfire/ignition-harness', title: 'Coil connector or ignition harness fault', treeId: 'misfire', treeTitle: 'Engine misfire', system: 'ignition' });
    const post = (body: object) => apprentice.agent.post('/api/cases/cause-suggestions').set('X-CSRF-Token', apprentice.csrf).send(body);
    const res = await post({ rootCause: 'Charge pipe coupler split at the intercooler end', codes: ['P0299'], symptoms: [] });
    expect(res.status).toBe(200);
    expect(res.body.suggestions[0]).toMatchObject({ cause: 'low-boost/charge-pipe-leak' });
    expect((await post({ codes: ['not a code'] })).status).toBe(400);
    expect((await post({ rootCause: 5 })).status).toBe(400);
  });

  it('backfills cases confirmed before suggestions existed, once, and leaves unclear ones for a person', async () => {
    const seniorUser = { id: shop.people.senior.id, role: 'senior' as const, shopId: shop.shopId };
    const old = { confirmation: { byId: seniorUser.id, at: new Date('2026-01-05T10:00:00Z'), note: null } };
    const clear = await createCase(t.ctx, seniorUser, { title: 'KR15T lean at idle', body: '-', platformId: kr15t, codes: ['P0171'], symptoms: ['rough-idle'], rootCause: 'PCV valve diaphragm split, unmetered air at idle', fix: 'New PCV valve', status: 'published' }, old);
    const vague = await createCase(t.ctx, seniorUser, { title: 'Came in, went out', body: '-', codes: [], symptoms: [], rootCause: 'Nothing found', fix: 'Road tested', status: 'published' }, old);
    const first = await backfillCauses(t.ctx);
    expect(first.linked).toContainEqual({ caseId: clear.id, cause: 'lean/pcv-failed' });
    expect(first.linked.map((l) => l.caseId)).not.toContain(vague.id);
    const [row] = await t.ctx.db.select().from(cases).where(eq(cases.id, clear.id));
    expect(row).toMatchObject({ cause: 'lean/pcv-failed', causeLinkedBy: 'suggestion', version: 2 });
    const second = await backfillCauses(t.ctx);
    expect(second.linked.map((l) => l.caseId)).not.toContain(clear.id);
  });

  it('links nothing when no suggestion is clearly ahead, and takes a cause given with the confirmation as the author’s', async () => {
    const create = (rootCause: string) =>
      senior.agent
        .post('/api/cases')
        .set('X-CSRF-Token', senior.csrf)
        .send({ title: 'Odd one', body: '-', codes: [], symptoms: [], rootCause, fix: 'Sorted it', status: 'published' });
    const vague = await create('Customer fault, nothing found');
    const res = await senior.agent.post(`/api/cases/${vague.body.id}/confirm`).set('X-CSRF-Token', senior.csrf).send({});
    expect(res.status).toBe(200);
    expect(res.body.case).toMatchObject({ cause: null, causeLinkedBy: null });

    const given = await create('Something vague again');
    const withCause = await senior.agent.post(`/api/cases/${given.body.id}/confirm`).set('X-CSRF-Token', senior.csrf).send({ cause: 'misfire/spark-plug' });
    expect(withCause.body.case).toMatchObject({ cause: 'misfire/spark-plug', causeLinkedBy: 'author' });
    const malformed = await senior.agent.post(`/api/cases/${vague.body.id}/confirm`).set('X-CSRF-Token', senior.csrf).send({ cause: 'not a cause' });
    expect(malformed.status).toBe(400);
  });
});

describe('POST /api/walks/:id/write-up', () => {
  it('refuses an open walk with 409, then writes a draft case from the finished walk', async () => {
    const w = await start(apprentice, misfireV6());
    const early = await apprentice.agent.post(`/api/walks/${w.id}/write-up`).set('X-CSRF-Token', apprentice.csrf);
    expect(early.status).toBe(409);
    await mark(apprentice, w.id, 'cam-timing', { state: 'tested', outcome: 'no_fault', measurement: { value: 1, unit: 'deg' } });
    await mark(apprentice, w.id, 'coil', { state: 'ruled_out', note: 'swapped coils 2 and 3, misfire stayed' });
    await mark(apprentice, w.id, 'ignition-harness', { state: 'tested', outcome: 'fault_found', note: 'connectors 2 and 5 crossed' });
    const res = await apprentice.agent.post(`/api/walks/${w.id}/write-up`).set('X-CSRF-Token', apprentice.csrf);
    expect(res.status).toBe(201);
    const caseId = res.body.caseId as number;
    const [draft] = await t.ctx.db.select().from(cases).where(eq(cases.id, caseId));
    expect(draft).toMatchObject({ status: 'draft', codes: ['P0302', 'P0305'], cause: 'misfire/ignition-harness', platformId: vt27, authorId: shop.people.apprentice.id, shopId: shop.shopId });
    expect(draft?.rootCause).toBe(w.steps.find((s) => s.id === 'ignition-harness')?.title);
    expect(draft?.body).toMatch(/## Steps done/);
    expect(draft?.body).toMatch(/swapped coils 2 and 3/);
    expect(draft?.body).toMatch(/Reading `1 deg`/);
    const [row] = await t.ctx.db.select().from(walks).where(eq(walks.id, w.id));
    expect(row?.caseId).toBe(caseId);
    const again = await apprentice.agent.post(`/api/walks/${w.id}/write-up`).set('X-CSRF-Token', apprentice.csrf);
    expect(again.status).toBe(200);
    expect(again.body.caseId).toBe(caseId);
  });
});
