import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { cases, digestRuns, vehicles } from '../../db/schema';
import { runScheduledDigests, startDigestScheduler } from '../../server/patterns/scheduler';
import { mailTo } from '../support/mail';
import { createTestApp, seedShop, signedIn, type TestApp } from '../support/test-app';

let t: TestApp;
let shop: Awaited<ReturnType<typeof seedShop>>;
const ids: Record<string, number> = {};
// A Monday 07:00 run; its week of new comebacks is Monday 2026-11-30 to Sunday 2026-12-06.
const monday = new Date('2026-12-07T07:00:00Z');

async function insertCase(key: string, values: Partial<typeof cases.$inferInsert>) {
  const [row] = await t.ctx.db
    .insert(cases)
    .values({ shopId: shop.shopId, title: `Case ${key}`, body: 'Fixture.', codes: [], symptoms: [], context: [], authorId: shop.people.technician.id, status: 'published', ...values })
    .$returningId();
  ids[key] = row!.id;
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** The number of digests the manager holds once it reaches `want` (or after 5 s). */
async function digestsOnceAt(want: number): Promise<number> {
  const until = Date.now() + 5000;
  for (;;) {
    const n = (await mailTo(shop.people.manager.email, { subject: /weekly digest/, timeoutMs: 0 })).length;
    if (n >= want || Date.now() > until) return n;
    await sleep(100);
  }
}

beforeAll(async () => {
  t = await createTestApp();
  shop = await seedShop(t.ctx, 'Digest Lane Garage');
  const [v] = await t.ctx.db.insert(vehicles).values({ shopId: shop.shopId, vin: '7K9LM8H59NL552817', plate: 'DG1 TIA' }).$returningId();
  await insertCase('first', { vehicleId: v!.id, visitDate: '2026-11-20', codes: ['U0100'], confirmedAt: new Date('2026-11-20T15:00:00Z'), confirmedById: shop.people.senior.id });
  await insertCase('back', { vehicleId: v!.id, visitDate: '2026-12-02', codes: ['U0100'], title: 'ECM lost again <check>' });
  await insertCase('waiting', { visitDate: '2026-12-01', codes: ['P0299'], status: 'review' });
});
afterAll(() => t?.close());

describe('weekly digest', () => {
  it('sends managers the new comebacks, cases waiting for review and top codes, as text and HTML', async () => {
    const [result] = await runScheduledDigests(t.ctx, monday);
    expect(result).toEqual({ shopId: shop.shopId, sent: 1, skipped: false });
    const [mail, ...more] = await mailTo(shop.people.manager.email, { subject: /weekly digest/ });
    expect(more).toEqual([]);
    expect(mail!.subject).toBe('Causeway weekly digest for Digest Lane Garage: 1 new comeback, 1 waiting for review');
    expect(mail!.text).toContain('New comebacks (2026-11-30 to 2026-12-06)');
    expect(mail!.text).toContain('DG1 TIA: "ECM lost again <check>" came back 12 days after "Case first" (same code U0100).');
    expect(mail!.text).toContain(`/cases/${ids.back}`);
    expect(mail!.text).toContain('Waiting for review (1)');
    expect(mail!.text).toContain('"Case waiting" by ');
    expect(mail!.text).toMatch(/U0100 .*: 2 cases/);
    expect(mail!.html).toContain(`href="${t.ctx.config.publicUrl}/cases/${ids.back}"`);
    // user text is escaped in the HTML part
    expect(mail!.html).toContain('ECM lost again &lt;check&gt;');
    expect(mail!.html).not.toContain('<check>');
    // only managers get it
    expect(await mailTo(shop.people.senior.email, { subject: /weekly digest/, timeoutMs: 300 })).toEqual([]);
  });

  it('does not send twice for the same week, even when two instances fire at once', async () => {
    const later = new Date(monday.getTime() + 60_000);
    const rounds = await Promise.all([runScheduledDigests(t.ctx, later), runScheduledDigests(t.ctx, later)]);
    expect(rounds.flat().map((r) => r.skipped)).toEqual([true, true]);
    await sleep(500);
    expect(await mailTo(shop.people.manager.email, { subject: /weekly digest/ })).toHaveLength(1);
    const runs = await t.ctx.db.select().from(digestRuns).where(and(eq(digestRuns.shopId, shop.shopId), eq(digestRuns.kind, 'scheduled')));
    expect(runs.map((r) => [r.periodKey, r.recipients])).toEqual([['2026-W50', 1]]);
  });

  it('sends again in the next week', async () => {
    const next = await runScheduledDigests(t.ctx, new Date('2026-12-14T07:00:00Z'));
    expect(next[0]).toMatchObject({ sent: 1, skipped: false });
    expect(await digestsOnceAt(2)).toBe(2);
  });
});

describe('the scheduler', () => {
  it('starts on the configured cron and stops with the function it returns', () => {
    const stop = startDigestScheduler(t.ctx);
    expect(t.ctx.config.digestCron).toBe('0 7 * * 1'); // Mondays 07:00, the default
    expect(typeof stop).toBe('function');
    stop();
  });
});

describe('POST /api/digest/send', () => {
  it.each(['senior', 'technician'] as const)('refuses a %s with 403', async (role) => {
    const { agent, csrf } = await signedIn(t.app, shop.people[role].email);
    await agent.post('/api/digest/send').set('X-CSRF-Token', csrf).expect(403);
  });

  it('lets a manager send the digest now: 202 with the number sent', async () => {
    const before = await digestsOnceAt(2);
    const { agent, csrf } = await signedIn(t.app, shop.people.manager.email);
    const res = await agent.post('/api/digest/send').set('X-CSRF-Token', csrf).expect(202);
    expect(res.body).toEqual({ sent: 1 });
    expect(await digestsOnceAt(before + 1)).toBe(before + 1);
  });

  it('needs the CSRF token', async () => {
    const { agent } = await signedIn(t.app, shop.people.manager.email);
    await agent.post('/api/digest/send').expect(403);
  });
});
