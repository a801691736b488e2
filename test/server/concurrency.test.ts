// 200 concurrent edits of one case, all claiming the same version: exactly one wins per
// version, the rest get 409 with the current version, and the revision history has no gaps.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { asc, eq } from 'drizzle-orm';
import { caseRevisions } from '../../db/schema';
import { createTestApp, seedShop, signedIn, type TestApp } from '../support/test-app';

let t: TestApp;
let writers: Awaited<ReturnType<typeof signedIn>>[];

beforeAll(async () => {
  t = await createTestApp();
  const shop = await seedShop(t.ctx, 'Busy Bay', ['senior', 'manager']);
  writers = [await signedIn(t.app, shop.people.senior.email), await signedIn(t.app, shop.people.manager.email)];
});
afterAll(() => t.close());

describe('concurrent edits', () => {
  it('lets exactly one of 200 writers win each version, over several rounds, with every revision kept', async () => {
    const w0 = writers[0]!;
    const created = await w0.agent.post('/api/cases').set('X-CSRF-Token', w0.csrf).send({ title: 'Busy case', body: 'start', codes: [], symptoms: [], status: 'published' }).expect(201);
    const id = created.body.id as number;
    let version = 1;
    let contenders = Array.from({ length: 200 }, (_, i) => i);
    const winners: { writer: number; version: number }[] = [];
    for (let round = 0; round < 4; round++) {
      const results = await Promise.all(
        contenders.map((i) => {
          const w = writers[i % writers.length]!;
          return w.agent.patch(`/api/cases/${id}`).set('X-CSRF-Token', w.csrf).send({ body: `writer ${i} in round ${round}`, version });
        }),
      );
      const won = results.flatMap((r, k) => (r.status === 200 ? [contenders[k]!] : []));
      const lost = results.filter((r) => r.status === 409);
      expect(won).toHaveLength(1);
      expect(lost).toHaveLength(contenders.length - 1);
      expect(new Set(lost.map((r) => r.body.currentVersion))).toEqual(new Set([version + 1]));
      winners.push({ writer: won[0]!, version: version + 1 });
      version += 1;
      contenders = contenders.filter((i) => i !== won[0]);
    }
    const revisions = await t.ctx.db.select().from(caseRevisions).where(eq(caseRevisions.caseId, id)).orderBy(asc(caseRevisions.version));
    expect(revisions.map((r) => r.version)).toEqual([1, 2, 3, 4, 5]);
    for (const [round, w] of winners.entries()) {
      expect(revisions.find((r) => r.version === w.version)!.body).toBe(`writer ${w.writer} in round ${round}`);
    }
  }, 120_000);
});
