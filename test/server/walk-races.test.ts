// Walks under parallel requests: write-ups are idempotent per walk (outside test, finding 9) and
// marks on different steps merge instead of refusing each other (finding 12).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { cases, walks } from '../../db/schema';
import { walkResponseSchema, type WalkResponse } from '../../shared/schemas/walks';
import { createTestApp, seedShop, signedIn, type TestApp } from '../support/test-app';

let t: TestApp;
let shop: Awaited<ReturnType<typeof seedShop>>;
let tech: Awaited<ReturnType<typeof signedIn>>;

beforeAll(async () => {
  t = await createTestApp();
  shop = await seedShop(t.ctx, 'Walk Race Garage', ['technician']);
  tech = await signedIn(t.app, shop.people.technician.email);
});
afterAll(() => t.close());

async function startMisfireWalk(): Promise<WalkResponse> {
  const res = await tech.agent.post('/api/walks').set('X-CSRF-Token', tech.csrf).send({ codes: ['P0301'], symptoms: ['misfire'] });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return walkResponseSchema.parse(res.body);
}

const mark = (id: number, stepId: string, body: object) => tech.agent.patch(`/api/walks/${id}/steps/${stepId}`).set('X-CSRF-Token', tech.csrf).send(body);
const writeUp = (id: number) => tech.agent.post(`/api/walks/${id}/write-up`).set('X-CSRF-Token', tech.csrf);

describe('parallel requests on one walk', () => {
  it('writes one draft case when a finished walk is written up ten times at once, and every answer points to it (outside test, finding 9)', async () => {
    const w = await startMisfireWalk();
    const found = await mark(w.id, w.steps[0]!.id, { state: 'tested', outcome: 'fault_found', note: 'found it' });
    expect(found.status, JSON.stringify(found.body)).toBe(200);
    const before = await t.ctx.db.select({ id: cases.id }).from(cases).where(eq(cases.shopId, shop.shopId));
    const answers = await Promise.all(Array.from({ length: 10 }, () => writeUp(w.id)));
    expect(answers.map((a) => a.status).sort()).toEqual([200, 200, 200, 200, 200, 200, 200, 200, 200, 201]);
    const caseIds = new Set(answers.map((a) => a.body.caseId));
    expect(caseIds.size).toBe(1);
    const after = await t.ctx.db.select({ id: cases.id }).from(cases).where(eq(cases.shopId, shop.shopId));
    expect(after.length - before.length).toBe(1);
    const [row] = await t.ctx.db.select({ caseId: walks.caseId }).from(walks).where(eq(walks.id, w.id));
    expect(row!.caseId).toBe([...caseIds][0]);
  });

  it('keeps all 30 marks sent at once on different steps of one walk, none refused (outside test, finding 12)', async () => {
    const w = await startMisfireWalk();
    const steps = w.steps.map((s) => s.id);
    expect(steps.length).toBeGreaterThanOrEqual(6);
    // 30 requests: every step ruled out, each sent several times as a flaky connection would replay it
    const requests = Array.from({ length: 30 }, (_, i) => steps[i % steps.length]!);
    const answers = await Promise.all(requests.map((stepId) => mark(w.id, stepId, { state: 'ruled_out', note: `ruled out ${stepId}` })));
    expect(answers.filter((a) => a.status !== 200).map((a) => `${a.status} ${JSON.stringify(a.body)}`)).toEqual([]);
    const after = walkResponseSchema.parse((await tech.agent.get(`/api/walks/${w.id}`)).body);
    expect(after.steps.every((s) => s.state === 'ruled_out')).toBe(true);
    expect(after.revision).toBe(w.revision + steps.length);
  });
});
