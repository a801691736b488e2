import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { createCase } from '../../server/cases/service';
import { treeDetailSchema, treeListSchema } from '../../shared/schemas/walks';
import { createTestApp, seedShop, signedIn, type TestApp } from '../support/test-app';

let t: TestApp;
let shop: Awaited<ReturnType<typeof seedShop>>;
let other: Awaited<ReturnType<typeof seedShop>>;
type Signed = Awaited<ReturnType<typeof signedIn>>;
let senior: Signed;
let technician: Signed;
let outsider: Signed;

const authored = (id: string) => readFileSync(path.resolve(import.meta.dirname, '../../content/trees', `${id}.yaml`), 'utf8');

beforeAll(async () => {
  t = await createTestApp();
  shop = await seedShop(t.ctx, 'Tree Test Garage');
  other = await seedShop(t.ctx, 'Other Tree Garage');
  senior = await signedIn(t.app, shop.people.senior.email);
  technician = await signedIn(t.app, shop.people.technician.email);
  outsider = await signedIn(t.app, other.people.manager.email);
});
afterAll(() => t.close());

const put = (who: Signed, id: string, yaml: unknown) => who.agent.put(`/api/trees/${id}`).set('X-CSRF-Token', who.csrf).send({ yaml });

describe('GET /api/trees', () => {
  it('lists every authored tree for a senior', async () => {
    const res = await senior.agent.get('/api/trees');
    expect(res.status).toBe(200);
    const { trees } = treeListSchema.parse(res.body);
    expect(trees.length).toBeGreaterThanOrEqual(12);
    expect(trees.map((x) => x.id)).toEqual(expect.arrayContaining(['misfire', 'lean', 'low-boost', 'no-comm', 'cam-crank']));
    expect(trees.every((x) => x.source === 'content')).toBe(true);
  });

  it('is for seniors and managers only', async () => {
    expect((await technician.agent.get('/api/trees')).status).toBe(403);
    expect((await technician.agent.get('/api/trees/misfire')).status).toBe(403);
    expect((await put(technician, 'misfire', authored('misfire'))).status).toBe(403);
  });
});

describe('GET /api/trees/:treeId', () => {
  it('returns the tree and its YAML text', async () => {
    const res = await senior.agent.get('/api/trees/misfire');
    expect(res.status).toBe(200);
    const tree = treeDetailSchema.parse(res.body.tree);
    expect(tree.tree.id).toBe('misfire');
    expect(tree.yaml).toBe(authored('misfire'));
  });

  it('answers 404 for an unknown tree and 400 for a bad id', async () => {
    expect((await senior.agent.get('/api/trees/no-such-tree')).status).toBe(404);
    expect((await senior.agent.get('/api/trees/Bad_Id')).status).toBe(400);
  });
});

describe('PUT /api/trees/:treeId', () => {
  it('saves a senior’s edit for this shop only, and walks use it', async () => {
    const edited = authored('charging').replace(/^title: .*$/m, 'title: Charging system (shop edit)');
    const res = await put(senior, 'charging', edited);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.tree.title).toBe('Charging system (shop edit)');
    expect(res.body.tree.source).toBe('shop');
    expect(res.body.tree.yaml).toBe(edited);
    expect(res.body.tree.updatedBy.id).toBe(shop.people.senior.id);
    const mine = await senior.agent.get('/api/trees/charging');
    expect(mine.body.tree.title).toBe('Charging system (shop edit)');
    const theirs = await outsider.agent.get('/api/trees/charging');
    expect(theirs.body.tree.source).toBe('content');
    expect(theirs.body.tree.title).not.toBe('Charging system (shop edit)');
  });

  it('answers 400 listing every problem of an invalid tree', async () => {
    const broken = authored('brakes').replace(/weight: \d+/, 'wieght: 3').replace(/minutes: \d+/, 'minutes: -5');
    const res = await put(senior, 'brakes', broken);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_tree');
    expect(res.body.problems.length).toBeGreaterThanOrEqual(2);
    expect(res.body.problems.join('\n')).toMatch(/wieght/);
    expect(res.body.problems.join('\n')).toMatch(/minutes/);
  });

  it('refuses YAML that does not parse, a changed id, and an empty body', async () => {
    const bad = await put(senior, 'brakes', 'id: brakes\ntitle: [unclosed');
    expect(bad.status).toBe(400);
    expect(bad.body.problems[0]).toMatch(/^\(yaml\)/);
    const renamed = await put(senior, 'brakes', authored('brakes').replace(/^id: brakes$/m, 'id: brakes-two'));
    expect(renamed.status).toBe(400);
    expect(renamed.body.problems[0]).toMatch(/must stay "brakes"/);
    expect((await put(senior, 'brakes', '')).status).toBe(400);
    expect((await put(senior, 'brakes', 42)).status).toBe(400);
    expect((await put(senior, 'no-such-tree', authored('brakes'))).status).toBe(404);
  });

  it('refuses to drop a cause id that a case in this shop points at', async () => {
    const seniorUser = { id: shop.people.senior.id, role: 'senior' as const, shopId: shop.shopId };
    await createCase(t.ctx, seniorUser, { title: 'Pump whine, pump worn', body: '-', codes: [], symptoms: ['whine'], cause: 'power-steering/pump-worn', status: 'published' });
    const yaml = authored('power-steering').replace(/id: pump-worn\b/, 'id: pump-tired');
    const res = await put(senior, 'power-steering', yaml);
    expect(res.status).toBe(400);
    expect(res.body.problems.join('\n')).toMatch(/power-steering\/pump-worn/);
  });
});
