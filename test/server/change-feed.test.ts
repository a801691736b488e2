// Issue 12: the change feed cannot skip. A change-log id is taken at insert and becomes
// visible at commit, so a lower id can commit after a higher one. These tests hold the
// lower one open on a connection of their own while a higher one commits, and drive the
// search service's follower by hand, so the order of events is fixed, not raced.
import { eq, sql } from 'drizzle-orm';
import { drizzle } from 'drizzle-orm/mysql2';
import mysql from 'mysql2/promise';
import pino from 'pino';
import request from 'supertest';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { Db } from '../../db/client';
import * as schema from '../../db/schema';
import { cases } from '../../db/schema';
import { MissingIds } from '../../server/changes/missing-ids';
import { recordChange } from '../../server/changes/change-log';
import { createCase } from '../../server/cases/service';
import { differing, VersionLedger } from '../../server/search/reconcile';
import { SearchService } from '../../server/search/service';
import type { Actor } from '../../shared/policy';
import { searchQuerySchema } from '../../shared/schemas/search';
import { createTestApp, seedShop, type TestApp } from '../support/test-app';
import { uniqueWord } from '../support/search-burst';

const GAP_TIMEOUT_MS = 1500;

let t: TestApp;
let senior: Actor;
const services: SearchService[] = [];
const connections: mysql.Connection[] = [];
const warnings: string[] = [];
const log = pino({ level: 'warn' }, { write: (line: string) => void warnings.push(JSON.parse(line).msg) });

beforeAll(async () => {
  t = await createTestApp({ SEARCH_GAP_TIMEOUT_MS: String(GAP_TIMEOUT_MS), SEARCH_RECONCILE_MS: '0' });
  const shop = await seedShop(t.ctx, 'Feed Lane', ['senior']);
  senior = { id: shop.people.senior.id, role: 'senior', shopId: shop.shopId };
});
afterEach(async () => {
  for (const s of services.splice(0)) s.stop();
  for (const c of connections.splice(0)) await c.end().catch(() => undefined);
});
afterAll(() => t?.close());

/** A search service following by hand only (no poll, no reconciliation timer), timed by the test app's config. */
function followerByHand(): SearchService {
  const s = new SearchService({ db: t.ctx.db, log }, { poll: false, warm: false, gapTimeoutMs: t.ctx.config.searchGapTimeoutMs, reconcileMs: 0 });
  services.push(s);
  return s;
}

const titleWith = (word: string) => `Charging fault ${word} at idle`;

/**
 * Saves a case on a connection of its own and leaves the transaction open: its case row
 * and change-log row exist, with their ids taken, but nobody else can see them yet.
 */
async function saveHeldOpen(word: string) {
  const connection = await mysql.createConnection({ ...t.ctx.config.db, timezone: 'Z' });
  connections.push(connection);
  const db = drizzle(connection, { schema, mode: 'default' }) as unknown as Db;
  await connection.beginTransaction();
  const [row] = await db
    .insert(cases)
    .values({ shopId: senior.shopId, title: titleWith(word), body: 'Held open by the test.', codes: [], symptoms: [], context: [], status: 'published', authorId: senior.id })
    .$returningId();
  await recordChange(db, senior.shopId, 'case', row!.id);
  const [[logged]] = (await connection.query('SELECT LAST_INSERT_ID() AS id')) as unknown as [[{ id: number }]];
  return { caseId: row!.id, changeId: Number(logged.id), commit: () => connection.commit(), rollback: () => connection.rollback() };
}

/** Saves a case through the case service (its own transaction, committed on return). */
async function saveCommitted(word: string) {
  const { id } = await createCase(t.ctx, senior, { title: titleWith(word), body: 'Committed at once.', codes: [], symptoms: [], status: 'published' });
  const [row] = await t.ctx.db.select({ id: sql<number>`MAX(${schema.changeLog.id})` }).from(schema.changeLog);
  return { caseId: id, changeId: Number(row!.id) };
}

async function found(service: SearchService, word: string, caseId: number): Promise<boolean> {
  const res = await service.search(senior, searchQuerySchema.parse({ q: word }));
  return res.results.some((r) => r.id === caseId);
}

describe('a lower change-log id that commits after a higher one', () => {
  it('is applied once it commits, though the follower had already read past it', async () => {
    const service = followerByHand();
    await service.shop(senior.shopId).ready;
    const [lowWord, highWord] = [uniqueWord(), uniqueWord()];

    const lower = await saveHeldOpen(lowWord);
    const higher = await saveCommitted(highWord);
    expect(lower.changeId).toBeLessThan(higher.changeId);

    await service.catchUp();
    // the follower is past the lower id: reading `id > last seen` from here on would never return it
    expect(service.status().lastChangeId).toBeGreaterThanOrEqual(higher.changeId);
    expect(service.status().gaps).toMatchObject({ open: 1, filled: 0, expired: 0 });
    expect(await found(service, highWord, higher.caseId)).toBe(true);
    expect(await found(service, lowWord, lower.caseId)).toBe(false);

    await lower.commit();
    await service.catchUp();
    expect(await found(service, lowWord, lower.caseId)).toBe(true);
    expect(await found(service, highWord, higher.caseId)).toBe(true);
    expect(service.status().gaps).toMatchObject({ open: 0, filled: 1, expired: 0 });
  });

  it('is waited for after a restart: a follower started while it was open still applies it', async () => {
    const [lowWord, highWord] = [uniqueWord(), uniqueWord()];
    const lower = await saveHeldOpen(lowWord);
    const higher = await saveCommitted(highWord);

    // started with the higher id already the newest in the log
    const service = followerByHand();
    await service.shop(senior.shopId).ready;
    expect(await found(service, highWord, higher.caseId)).toBe(true);
    expect(service.status().lastChangeId).toBeGreaterThanOrEqual(higher.changeId);

    await lower.commit();
    await service.catchUp();
    expect(await found(service, lowWord, lower.caseId)).toBe(true);
    expect(service.status().gaps.open).toBe(0);
  });

  it('is given up on after the gap timeout when its transaction rolled back, and nothing else is lost', async () => {
    const service = followerByHand();
    await service.shop(senior.shopId).ready;
    const [goneWord, keptWord] = [uniqueWord(), uniqueWord()];
    const rolledBack = await saveHeldOpen(goneWord);
    const kept = await saveCommitted(keptWord);
    await service.catchUp();
    expect(service.status().gaps).toMatchObject({ open: 1, expired: 0 });

    await rolledBack.rollback();
    await service.catchUp();
    // not yet: before the timeout a missing id may still commit
    expect(service.status().gaps).toMatchObject({ open: 1, expired: 0 });

    await new Promise((r) => setTimeout(r, GAP_TIMEOUT_MS + 100));
    await service.catchUp();
    expect(service.status().gaps).toMatchObject({ open: 0, filled: 0, expired: 1 });
    expect(await found(service, goneWord, rolledBack.caseId)).toBe(false);
    expect(await found(service, keptWord, kept.caseId)).toBe(true);
  });
});

describe('reconciliation', () => {
  it('repairs cases written past the change log (added, retitled, deleted in SQL), logs it, and then finds nothing to repair', async () => {
    const service = followerByHand();
    const [editedWord, deletedWord, newWord, addedWord] = [uniqueWord(), uniqueWord(), uniqueWord(), uniqueWord()];
    const edited = await saveCommitted(editedWord);
    const deleted = await saveCommitted(deletedWord);
    await service.shop(senior.shopId).ready;
    expect(await found(service, editedWord, edited.caseId)).toBe(true);

    // as a manual fix in SQL would: no change-log row
    const [added] = await t.ctx.db
      .insert(cases)
      .values({ shopId: senior.shopId, title: titleWith(addedWord), body: 'Typed in by hand.', codes: [], symptoms: [], context: [], status: 'published', authorId: senior.id })
      .$returningId();
    await t.ctx.db.update(cases).set({ title: titleWith(newWord), version: sql`${cases.version} + 1` }).where(eq(cases.id, edited.caseId));
    await t.ctx.db.update(cases).set({ deletedAt: new Date(), version: sql`${cases.version} + 1` }).where(eq(cases.id, deleted.caseId));
    await service.catchUp();
    expect(await found(service, addedWord, added!.id)).toBe(false);

    await service.reconcile();
    expect(service.status().reconcile).toMatchObject({ runs: 1, drifted: 1, repaired: 3 });
    expect(warnings.some((w) => /index differed from the cases table; 3 cases re-read/.test(w))).toBe(true);
    expect(await found(service, addedWord, added!.id)).toBe(true);
    expect(await found(service, newWord, edited.caseId)).toBe(true);
    expect(await found(service, editedWord, edited.caseId)).toBe(false);
    expect(await found(service, deletedWord, deleted.caseId)).toBe(false);

    await service.reconcile();
    expect(service.status().reconcile).toMatchObject({ runs: 2, drifted: 1, repaired: 3 });
  });

  it('does not count a save the feed has not been read for yet as drift', async () => {
    const service = followerByHand();
    await service.shop(senior.shopId).ready;
    const word = uniqueWord();
    const saved = await saveCommitted(word); // no catchUp: the index does not have it yet
    await service.reconcile();
    expect(service.status().reconcile).toMatchObject({ runs: 1, drifted: 0, repaired: 0 });
    expect(await found(service, word, saved.caseId)).toBe(true);
  });
});

describe('GET /api/health', () => {
  it('adds the feed and reconciliation counters to the index state, keeping the fields it had', async () => {
    const res = await request(t.app).get('/api/health').expect(200);
    expect(res.body).toMatchObject({ ok: true, db: 'up' });
    expect(Object.keys(res.body.index)).toEqual(expect.arrayContaining(['state', 'shops', 'cases', 'lastChangeId', 'buildMs', 'gaps', 'reconcile']));
    expect(res.body.index.gaps).toEqual({ open: expect.any(Number), filled: expect.any(Number), expired: expect.any(Number) });
    expect(res.body.index.reconcile).toMatchObject({ runs: expect.any(Number), drifted: expect.any(Number), repaired: expect.any(Number) });
  });
});

describe('MissingIds', () => {
  it('splits a range when an id inside it turns up, and expires each range by when it was first missed', () => {
    const m = new MissingIds();
    m.add(3, 7, 1000);
    m.add(10, 10, 2000);
    expect(m.size).toBe(6);
    expect(m.take(5)).toBe(true);
    expect(m.take(5)).toBe(false);
    expect(m.take(8)).toBe(false);
    expect(m.list()).toEqual([
      { from: 3, to: 4, since: 1000 },
      { from: 6, to: 7, since: 1000 },
      { from: 10, to: 10, since: 2000 },
    ]);
    expect(m.expire(2500, 1000)).toBe(4);
    expect(m.list()).toEqual([{ from: 10, to: 10, since: 2000 }]);
    expect(() => m.add(9, 12, 3000)).toThrow(/overlap/);
  });
});

describe('VersionLedger', () => {
  it('keeps the summary the table would give as cases are added, re-versioned and removed', () => {
    const ledger = new VersionLedger();
    const table = new Map<number, number>();
    const both = (id: number, version: number | null) => {
      if (version === null) {
        ledger.delete(id);
        table.delete(id);
      } else {
        ledger.set(id, version);
        table.set(id, version);
      }
    };
    both(1, 1);
    both(2, 4);
    both(3, 2);
    both(2, 5);
    both(2, null); // the case holding the highest version goes
    both(4, 1);
    const versions = [...table.values()];
    expect(ledger.summary()).toEqual({
      count: table.size,
      maxVersion: Math.max(...versions),
      versionSum: versions.reduce((a, b) => a + b, 0),
      idSum: [...table.keys()].reduce((a, b) => a + b, 0),
    });
    expect(ledger.summary()).toMatchObject({ count: 3, maxVersion: 2 });
    expect(differing(ledger, new Map([[1, 1], [3, 3], [5, 1]]))).toEqual([3, 5, 4]);
  });
});
