// A status change (submit, publish, return, confirm) writes the case, its revision, its
// change-log entry and its comment in one transaction: when the comment insert fails, none of
// them is left behind, and the same request succeeds once the insert works again.
import { and, count, eq } from 'drizzle-orm';
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { caseComments, caseRevisions, cases, changeLog } from '../../db/schema';
import { createTestApp, seedShop, signedIn, type TestApp } from '../support/test-app';

let t: TestApp;
let shop: Awaited<ReturnType<typeof seedShop>>;
let tech: Awaited<ReturnType<typeof signedIn>>;
let senior: Awaited<ReturnType<typeof signedIn>>;

beforeAll(async () => {
  t = await createTestApp();
  shop = await seedShop(t.ctx, 'Atomic Lane', ['technician', 'senior']);
  tech = await signedIn(t.app, shop.people.technician.email);
  senior = await signedIn(t.app, shop.people.senior.email);
});
afterAll(() => t.close());

/** A real database failure: a trigger that refuses every comment insert while it exists. */
async function whileCommentsFail<T>(work: () => Promise<T>): Promise<T> {
  await t.ctx.db.execute(sql.raw(`CREATE TRIGGER refuse_comments BEFORE INSERT ON case_comments FOR EACH ROW SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'comment insert refused by the test'`));
  try {
    return await work();
  } finally {
    await t.ctx.db.execute(sql.raw('DROP TRIGGER refuse_comments'));
  }
}

/** Everything a status change writes about one case. */
async function recordOf(caseId: number) {
  const [row] = await t.ctx.db.select({ status: cases.status, version: cases.version, confirmedAt: cases.confirmedAt }).from(cases).where(eq(cases.id, caseId));
  const tally = async (table: typeof caseRevisions | typeof caseComments) => (await t.ctx.db.select({ n: count() }).from(table).where(eq(table.caseId, caseId)))[0]!.n;
  const [changes] = await t.ctx.db.select({ n: count() }).from(changeLog).where(and(eq(changeLog.entity, 'case'), eq(changeLog.entityId, caseId)));
  return { ...row!, revisions: await tally(caseRevisions), comments: await tally(caseComments), changes: changes!.n };
}

async function newCase(status: 'draft' | 'review', fix?: string) {
  const res = await tech.agent.post('/api/cases').set('X-CSRF-Token', tech.csrf).send({ title: `Atomic ${status}`, body: 'Idle hunts when warm.', codes: ['P0505'], symptoms: [], status, ...(fix ? { fix } : {}) }).expect(201);
  return res.body.id as number;
}

const steps = [
  { name: 'submit', start: 'draft', as: () => tech, path: 'submit', body: {}, after: { status: 'review' } },
  { name: 'publish', start: 'review', as: () => senior, path: 'publish', body: {}, after: { status: 'published' } },
  { name: 'return', start: 'review', as: () => senior, path: 'return', body: { comment: 'Add the idle air readings.' }, after: { status: 'draft' } },
  { name: 'confirm', start: 'review', as: () => senior, path: 'confirm', body: { note: 'Held for a week.' }, after: { status: 'review' }, fix: 'Cleaned the idle air passage.' },
] as const;

describe('one transaction per status change', () => {
  for (const step of steps) {
    it(`${step.name}: a failed comment insert leaves no status change, revision or change-log entry; the retry writes all of them`, async () => {
      const id = await newCase(step.start, 'fix' in step ? step.fix : undefined);
      const before = await recordOf(id);
      const actor = step.as();
      const failed = await whileCommentsFail(() => actor.agent.post(`/api/cases/${id}/${step.path}`).set('X-CSRF-Token', actor.csrf).send(step.body));
      expect(failed.status).toBe(500);
      expect(await recordOf(id)).toEqual(before);

      await actor.agent.post(`/api/cases/${id}/${step.path}`).set('X-CSRF-Token', actor.csrf).send(step.body).expect(200);
      const after = await recordOf(id);
      expect(after).toMatchObject({ ...step.after, version: before.version + 1, revisions: before.revisions + 1, comments: before.comments + 1, changes: before.changes + 1 });
      if (step.name === 'confirm') expect(after.confirmedAt).not.toBeNull();
    });
  }
});
