// Issue 15, finding 7: a firing order of [1..145,000] held the server for 7.6 s before its 400
// (a quadratic duplicate check over a list with no length limit). Every list the API accepts now
// has a limit that fits what the field can mean, and the duplicate checks are linear.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { parse, stringify } from 'yaml';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { duplicates } from '../../shared/platform';
import { TREE_LIST_LIMITS } from '../../shared/walk/tree-schema';
import { createTestApp, seedShop, signedIn, type TestApp } from '../support/test-app';

let t: TestApp;
type Agent = Awaited<ReturnType<typeof signedIn>>;
let senior: Agent;
let apprentice: Agent;

beforeAll(async () => {
  t = await createTestApp();
  const shop = await seedShop(t.ctx, 'Long List Garage', ['apprentice', 'senior']);
  senior = await signedIn(t.app, shop.people.senior.email);
  apprentice = await signedIn(t.app, shop.people.apprentice.email);
});
afterAll(() => t.close());

const send = (a: Agent, method: 'post' | 'put' | 'patch', url: string, body: object) => a.agent[method](url).set('X-CSRF-Token', a.csrf).send(body);
const upTo = (n: number) => Array.from({ length: n }, (_, i) => i + 1);

// An invented platform numbered alternately; 1-2-3-4-5-6 then alternates banks (a common 60-degree V6 order, from memory).
const v6 = { make: 'Tarnwick', model: 'Osprette', engine: 'TW30', yearFrom: 2016, yearTo: 2023, cylinders: 6, layout: 'V', banks: { '1': [1, 3, 5], '2': [2, 4, 6] }, firingOrder: [1, 2, 3, 4, 5, 6] };

describe('platform lists are as long as an engine has cylinders (at most 16)', () => {
  it('answers the reported firing order of [1..145,000] with 400 naming the limit', async () => {
    const res = await send(senior, 'post', '/api/platforms', { ...v6, firingOrder: upTo(145_000) });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.firingOrder).toMatch(/at most 16 cylinders/);
  });

  it('limits each bank the same way, on create and on patch', async () => {
    const created = await send(senior, 'post', '/api/platforms', v6).expect(201);
    const long = { '1': upTo(10_000), '2': [2] };
    const onCreate = await send(senior, 'post', '/api/platforms', { ...v6, banks: long });
    expect(onCreate.status).toBe(400);
    expect(onCreate.body.error.fields['banks.1']).toMatch(/at most 16 cylinders/);
    const onPatch = await send(senior, 'patch', `/api/platforms/${created.body.id}`, { firingOrder: upTo(17) });
    expect(onPatch.status).toBe(400);
    expect(onPatch.body.error.fields.firingOrder).toMatch(/at most 16 cylinders/);
  });

  it('still accepts a 16-cylinder engine and still names a repeated cylinder', async () => {
    const w16 = { ...v6, engine: 'TW80', cylinders: 16, layout: 'V', banks: { '1': upTo(8), '2': upTo(16).slice(8) }, firingOrder: upTo(16) };
    expect((await send(senior, 'post', '/api/platforms', w16)).status).toBe(201);
    const repeated = await send(senior, 'post', '/api/platforms', { ...w16, firingOrder: [...upTo(15), 15] });
    expect(repeated.body.error.fields.firingOrder).toMatch(/cylinder 15 more than once/);
  });

  it('finds duplicates in one pass: each repeated entry once, in a list of 145,000', () => {
    const list = [...upTo(145_000), 7, 7, 144_999];
    expect(duplicates(list)).toEqual([7, 144_999]);
    expect(duplicates([1, 2, 3])).toEqual([]);
  });
});

describe('case and walk lists', () => {
  const codes = (n: number) => upTo(n).map((i) => `P0${String(100 + i).padStart(3, '0')}`);
  const tags = (n: number) => upTo(n).map((i) => `tag-${i}`);

  for (const [field, n, message] of [
    ['codes', 41, /At most 40 codes/],
    ['symptoms', 31, /At most 30 symptom tags/],
    ['context', 11, /10/],
  ] as const) {
    it(`refuses a case with ${n} ${field} with 400`, async () => {
      const res = await send(apprentice, 'post', '/api/cases', { title: 'Long list', body: 'x', [field]: field === 'codes' ? codes(n) : tags(n) });
      expect(res.status).toBe(400);
      expect(res.body.error.fields[field]).toMatch(message);
    });
  }

  for (const [field, n, message] of [
    ['codes', 41, /At most 40 codes/],
    ['symptoms', 41, /At most 40 symptom tags/],
    ['context', 21, /At most 20 context tags/],
  ] as const) {
    it(`refuses a walk started with ${n} ${field} with 400`, async () => {
      const res = await send(apprentice, 'post', '/api/walks', { codes: [], symptoms: ['misfire'], [field]: field === 'codes' ? codes(n) : tags(n) });
      expect(res.status).toBe(400);
      expect(res.body.error.fields[field]).toMatch(message);
    });
  }

  it('refuses a case with 20,000 symptom tags (what fits in the 1 MB body) with 400', async () => {
    const res = await send(apprentice, 'post', '/api/cases', { title: 'Long list', body: 'x', symptoms: tags(20_000) });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.symptoms).toMatch(/At most 30 symptom tags/);
  });
});

describe('cause-tree lists', () => {
  const charging = () => parse(readFileSync(path.resolve(import.meta.dirname, '../../content/trees/charging.yaml'), 'utf8'));
  type TreeDoc = { appliesTo: { symptoms: string[] }; branches: { causes: { id: string; test: { tools: string[] } }[] }[] };

  const cases: [string, (tree: TreeDoc) => void, RegExp][] = [
    ['tools of a test step', (tree) => void (tree.branches[0]!.causes[0]!.test.tools = upTo(1_000).map((i) => `tool ${i}`)), new RegExp(`at most ${TREE_LIST_LIMITS.tools} tools`)],
    ['symptoms the tree applies to', (tree) => void (tree.appliesTo.symptoms = upTo(1_000).map((i) => `symptom-${i}`)), new RegExp(`at most ${TREE_LIST_LIMITS.tags} tags`)],
    ['causes in a branch', (tree) => void (tree.branches[0]!.causes = upTo(TREE_LIST_LIMITS.causes + 1).map((i) => ({ ...structuredClone(tree.branches[0]!.causes[0]!), id: `cause-${i}` }))), new RegExp(`at most ${TREE_LIST_LIMITS.causes} causes`)],
    ['branches', (tree) => void (tree.branches = upTo(TREE_LIST_LIMITS.branches + 1).map((i) => ({ ...structuredClone(tree.branches[0]!), causes: tree.branches[0]!.causes.map((c) => ({ ...structuredClone(c), id: `${c.id}-${i}` })) }))), new RegExp(`at most ${TREE_LIST_LIMITS.branches} branches`)],
  ];
  for (const [what, lengthen, message] of cases) {
    it(`answers a tree with too many ${what} with 400 naming the limit`, async () => {
      const tree = charging() as TreeDoc;
      lengthen(tree);
      const res = await send(senior, 'put', '/api/trees/charging', { yaml: stringify(tree) });
      expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(400);
      expect(res.body.problems.join('\n')).toMatch(message);
    });
  }

  it('still saves the shipped tree unchanged', async () => {
    const res = await send(senior, 'put', '/api/trees/charging', { yaml: stringify(charging()) });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
  });
});
