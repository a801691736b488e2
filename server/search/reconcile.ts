// Periodic reconciliation: the safety net under the change feed. Every SEARCH_RECONCILE_MS
// it compares each built shop index with the cases table by a summary of the live cases
// (count, max version, sum of versions and an XOR of CRC32(id.version)) and, where they
// differ, re-reads the cases that differ. The feed is gap-proof by itself
// (server/changes/follower.ts); this repairs what no feed can see: a transaction that
// outlived the gap timeout, rows written without a change-log row (a manual fix in SQL,
// a restored backup), or a bug. Every repair is logged.
import { crc32 } from 'node:zlib';
import { and, eq, isNull, sql } from 'drizzle-orm';
import type { Logger } from 'pino';
import type { Db } from '../../db/client';
import { cases } from '../../db/schema';

/** id -> version of the cases a shop index holds, or of a shop's live rows. */
export type Versions = Map<number, number>;

export interface ShopSummary {
  count: number;
  maxVersion: number;
  /** a missed edit to any case raises it; max version alone only sees the newest */
  versionSum: number;
  /** XOR of CRC32("id.version"): tells apart a missed create and a missed delete that balance the count */
  fingerprint: number;
}

export interface ReconcileCounters {
  runs: number;
  /** shop checks whose index differed from the table after catching up */
  drifted: number;
  /** cases the repairs put in, took out or refreshed */
  repaired: number;
  lastAt: string | null;
  lastMs: number | null;
}

const EMPTY: ShopSummary = { count: 0, maxVersion: 0, versionSum: 0, fingerprint: 0 };

const entryPrint = (id: number, version: number) => crc32(`${id}.${version}`);

export function summarise(versions: Versions): ShopSummary {
  const s = { ...EMPTY };
  for (const [id, version] of versions) {
    s.count++;
    s.maxVersion = Math.max(s.maxVersion, version);
    s.versionSum += version;
    s.fingerprint = (s.fingerprint ^ entryPrint(id, version)) >>> 0;
  }
  return s;
}

export const sameSummary = (a: ShopSummary, b: ShopSummary) =>
  a.count === b.count && a.maxVersion === b.maxVersion && a.versionSum === b.versionSum && a.fingerprint === b.fingerprint;

const summaryColumns = {
  shopId: cases.shopId,
  count: sql<number>`COUNT(*)`,
  maxVersion: sql<number>`COALESCE(MAX(${cases.version}), 0)`,
  versionSum: sql<number>`COALESCE(SUM(${cases.version}), 0)`,
  fingerprint: sql<number>`BIT_XOR(CRC32(CONCAT(${cases.id}, '.', ${cases.version})))`,
};

const toSummary = (r: { count: unknown; maxVersion: unknown; versionSum: unknown; fingerprint: unknown }): ShopSummary => ({
  count: Number(r.count),
  maxVersion: Number(r.maxVersion),
  versionSum: Number(r.versionSum),
  fingerprint: Number(r.fingerprint),
});

/** Every shop's summary of live cases in one pass over the (shop, deleted, version) index. */
export async function tableSummaries(db: Db): Promise<Map<number, ShopSummary>> {
  const rows = await db.select(summaryColumns).from(cases).where(isNull(cases.deletedAt)).groupBy(cases.shopId);
  return new Map(rows.map((r) => [Number(r.shopId), toSummary(r)]));
}

export async function tableSummary(db: Db, shopId: number): Promise<ShopSummary> {
  const [row] = await db
    .select(summaryColumns)
    .from(cases)
    .where(and(eq(cases.shopId, shopId), isNull(cases.deletedAt)))
    .groupBy(cases.shopId);
  return row ? toSummary(row) : EMPTY;
}

export async function tableVersions(db: Db, shopId: number): Promise<Versions> {
  const rows = await db
    .select({ id: cases.id, version: cases.version })
    .from(cases)
    .where(and(eq(cases.shopId, shopId), isNull(cases.deletedAt)));
  return new Map(rows.map((r) => [Number(r.id), Number(r.version)]));
}

/** Cases whose index entry differs from the table: absent, extra or at another version. */
export function differing(index: Versions, table: Versions): number[] {
  const ids: number[] = [];
  for (const [id, version] of table) if (index.get(id) !== version) ids.push(id);
  for (const id of index.keys()) if (!table.has(id)) ids.push(id);
  return ids;
}

/** What the reconciler needs of the search service. */
export interface ReconcileHost {
  db: Db;
  log: Logger;
  /** the built (not building) shop indexes and the versions they hold */
  builtShops(): Iterable<{ shopId: number; versions: Versions }>;
  /** reads the change feed once */
  catchUp(): Promise<void>;
  /**
   * Runs `work` with the feed held still, after one more read of it: no change is
   * applied meanwhile, so what `work` compares and re-reads is not overtaken.
   */
  withFeedCaughtUp<T>(work: () => Promise<T>): Promise<T>;
  /** re-reads these cases of the shop (live ones go in, the rest come out); returns how many entries changed */
  refresh(shopId: number, caseIds: number[]): Promise<number>;
}

export class Reconciler {
  private counters: ReconcileCounters = { runs: 0, drifted: 0, repaired: 0, lastAt: null, lastMs: null };

  constructor(private readonly host: ReconcileHost) {}

  status(): ReconcileCounters {
    return { ...this.counters };
  }

  /** One pass over every built shop. */
  async run() {
    const t0 = Date.now();
    const summaries = await tableSummaries(this.host.db);
    const suspects = [...this.host.builtShops()].filter((s) => !sameSummary(summarise(s.versions), summaries.get(s.shopId) ?? EMPTY));
    // most differences are saves the feed has not been read for yet
    if (suspects.length > 0) await this.host.catchUp();
    for (const shop of suspects) await this.repair(shop);
    this.counters.runs++;
    this.counters.lastAt = new Date(t0).toISOString();
    this.counters.lastMs = Date.now() - t0;
  }

  private async repair(shop: { shopId: number; versions: Versions }) {
    const { host } = this;
    if (sameSummary(summarise(shop.versions), await tableSummary(host.db, shop.shopId))) return;
    const changed = await host.withFeedCaughtUp(async () => {
      const ids = differing(shop.versions, await tableVersions(host.db, shop.shopId));
      return ids.length === 0 ? 0 : host.refresh(shop.shopId, ids);
    });
    if (changed === 0) return;
    this.counters.drifted++;
    this.counters.repaired += changed;
    host.log.warn({ shopId: shop.shopId, repaired: changed }, 'search reconcile: shop %d index differed from the cases table; %d cases re-read', shop.shopId, changed);
  }
}
