// Search quality over the demo content: every query in content/search-eval.yaml
// runs through the real search service; prints top-1 accuracy and mean reciprocal rank.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { eq } from 'drizzle-orm';
import { parse } from 'yaml';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { z } from 'zod';
import { cases, users } from '../../db/schema';
import { searchQuerySchema } from '../../shared/schemas/search';
import { readDemoShop } from '../../server/seed/demo-files';
import { seedDemoShop } from '../../server/seed/seed';
import { SearchService } from '../../server/search/service';
import { createTestApp, type TestApp } from '../support/test-app';

const root = path.resolve(import.meta.dirname, '../..');
const evalSchema = z.object({
  user: z.enum(['apprentice', 'technician', 'senior', 'manager']),
  queries: z.array(z.object({ q: z.string(), expect: z.string() })).min(25),
});
const evalSet = evalSchema.parse(parse(readFileSync(path.join(root, 'content/search-eval.yaml'), 'utf8')));

// Thresholds set by the issue (search quality targets).
const MIN_TOP1 = 0.9;
const MIN_MRR = 0.95;

let t: TestApp;
let service: SearchService;
let actor: { id: number; role: 'senior' | 'manager' | 'technician' | 'apprentice'; shopId: number };
const slugOf = new Map<number, string>();

beforeAll(async () => {
  t = await createTestApp();
  await seedDemoShop(t.ctx.db, root);
  const person = readDemoShop(path.join(root, 'content')).users.find((u) => u.role === evalSet.user)!;
  const [u] = await t.ctx.db.select().from(users).where(eq(users.email, person.email.toLowerCase()));
  actor = { id: u!.id, role: u!.role, shopId: u!.shopId };
  for (const c of await t.ctx.db.select({ id: cases.id, slug: cases.slug }).from(cases)) slugOf.set(c.id, c.slug ?? '');
  service = new SearchService(t.ctx, { warm: false, poll: false });
});
afterAll(() => t?.close());

describe('search evaluation set (content/search-eval.yaml)', () => {
  it('names only cases that exist in the demo content', () => {
    const slugs = new Set(slugOf.values());
    expect(evalSet.queries.filter((e) => !slugs.has(e.expect)).map((e) => e.expect)).toEqual([]);
  });

  it(`ranks the expected case first often enough: top-1 >= ${MIN_TOP1}, MRR >= ${MIN_MRR}`, async () => {
    const misses: string[] = [];
    let top1 = 0;
    let rr = 0;
    for (const e of evalSet.queries) {
      const res = await service.search(actor, searchQuerySchema.parse({ q: e.q, limit: 50 }));
      const rank = res.results.findIndex((r) => slugOf.get(r.id) === e.expect) + 1;
      if (rank === 1) top1++;
      if (rank > 0) rr += 1 / rank;
      if (rank !== 1) {
        const first = res.results[0];
        misses.push(`  "${e.q}": expected at ${rank || 'none'}; first ${first ? slugOf.get(first.id) : 'nothing'} (${first?.why.join('; ')})`);
      }
    }
    const n = evalSet.queries.length;
    const accuracy = top1 / n;
    const mrr = rr / n;
    console.log(`search eval: ${n} queries, top-1 ${accuracy.toFixed(3)} (${top1}/${n}), MRR ${mrr.toFixed(3)}`);
    if (misses.length) console.log(`not first:\n${misses.join('\n')}`);
    expect(accuracy).toBeGreaterThanOrEqual(MIN_TOP1);
    expect(mrr).toBeGreaterThanOrEqual(MIN_MRR);
  });
});
