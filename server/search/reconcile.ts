// Periodic reconciliation: the safety net under the change feed. Every SEARCH_RECONCILE_MS
// it compares each built shop index with the cases table by a summary of the live cases
// (count, max version, sum of versions, sum of ids) and, where they
// differ, re-reads the cases that differ. The feed is gap-proof by itself
// (server/changes/follower.ts); this repairs what no feed can see: a transaction that
// outlived the gap timeout, rows written without a change-log row (a manual fix in SQL,
// a restored backup), or a bug. Every repair is logged.
import { and, eq, isNull, sql } from 'drizzle-orm';
import type { Logger } from 'pino';
import type { Db } from '../../db/client';
import { cases } from '../../db/schema';

/** id -> version of a shop's live rows. */
export type Versions = Map<number, number>;

export interface ShopSummary {
  count: number;
  maxVersion: number;
  /** a missed edit to any case raises it; the max only moves with the highest version */
  versionSum: number;
  /** tells apart a missed create and a missed delete that leave count and versions as they were */
  idSum: number;
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

const EMPTY: ShopSummary = { count: 0, maxVersion: 0, versionSum: 0, idSum: 0 };

/**
 * The versions of the cases one shop index holds, with their summary kept up to date as
 * they change, so a reconciliation pass costs the index side nothing (the max is found
 * again only after the case holding it went down or out).
 */
export class VersionLedger {
  private readonly versions: Versions = new Map();
  private sums = { versionSum: 0, idSum: 0 };
  private max: number | null = 0;

  get(id: number): number | undefined {
    return this.versions.get(id);
  }

  ids(): IterableIterator<number> {
    return this.versions.keys();
  }

  set(id: number, version: number) {
    const old = this.versions.get(id);
    if (old !== undefined) this.forget(id, old);
    this.versions.set(id, version);
    this.sums.versionSum += version;
    this.sums.idSum += id;
    if (this.max !== null) this.max = Math.max(this.max, version);
  }

  /** Whether the id was held. */
  delete(id: number): boolean {
    const old = this.versions.get(id);
    if (old === undefined) return false;
    this.forget(id, old);
    this.versions.delete(id);
    return true;
  }

  summary(): ShopSummary {
    if (this.max === null) {
      this.max = 0;
      for (const version of this.versions.values()) this.max = Math.max(this.max, version);
    }
    return { count: this.versions.size, maxVersion: this.max, ...this.sums };
  }

  private forget(id: number, version: number) {
    this.sums.versionSum -= version;
    this.sums.idSum -= id;
    if (version === this.max) this.max = null;
  }
}

export const sameSummary = (a: ShopSummary, b: ShopSummary) =>
  a.count === b.count && a.maxVersion === b.maxVersion && a.versionSum === b.versionSum && a.idSum === b.idSum;

const summaryColumns = {
  shopId: cases.shopId,
  count: sql<number>`COUNT(*)`,
  maxVersion: sql<number>`COALESCE(MAX(${cases.version}), 0)`,
  versionSum: sql<number>`COALESCE(SUM(${cases.version}), 0)`,
  idSum: sql<number>`COALESCE(SUM(${cases.id}), 0)`,
};

const toSummary = (r: { count: unknown; maxVersion: unknown; versionSum: unknown; idSum: unknown }): ShopSummary => ({
  count: Number(r.count),
  maxVersion: Number(r.maxVersion),
  versionSum: Number(r.versionSum),
  idSum: Number(r.idSum),
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
export function differing(index: VersionLedger, table: Versions): number[] {
  const ids: number[] = [];
  for (const [id, version] of table) if (index.get(id) !== version) ids.push(id);
  for (const id of index.ids()) if (!table.has(id)) ids.push(id);
  return ids;
}

/** What the reconciler needs of the search service. */
export interface ReconcileHost {
  db: Db;
  log: Logger;
  /** the built (not building) shop indexes and the versions they hold */
  builtShops(): Iterable<{ shopId: number; versions: VersionLedger }>;
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
    const suspects = [...this.host.builtShops()].filter((s) => !sameSummary(s.versions.summary(), summaries.get(s.shopId) ?? EMPTY));
    // most differences are saves the feed has not been read for yet
    if (suspects.length > 0) await this.host.catchUp();
    for (const shop of suspects) await this.repair(shop);
    this.counters.runs++;
    this.counters.lastAt = new Date(t0).toISOString();
    this.counters.lastMs = Date.now() - t0;
  }

  private async repair(shop: { shopId: number; versions: VersionLedger }) {
    const { host } = this;
    if (sameSummary(shop.versions.summary(), await tableSummary(host.db, shop.shopId))) return;
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
