// Search for one app instance: an index per shop, built lazily in the
// background, kept live by following the change log (server/changes/follower.ts,
// which never skips an id that commits late) and checked against the cases table
// every SEARCH_RECONCILE_MS (reconcile.ts).
// Before answering, a search reads the log when this process has written since the
// last read (db/client localWrites), so a change made here is found on the very next
// search; a 500 ms poll brings in changes made through other instances (and keeps idle
// ones current).
import { performance } from 'node:perf_hooks';
import { setImmediate as yieldToLoop } from 'node:timers/promises';
import { parseDtc } from '../../shared/codes';
import type { Actor } from '../../shared/policy';
import { CONTEXT_TAGS, parseQuery, removableChips, structuredKeys } from '../../shared/search';
import type { SearchQuery, SearchResponse, SearchResult } from '../../shared/schemas/search';
import type { AppContext } from '../context';
import { localWrites } from '../../db/client';
import { notFound } from '../http/errors';
import { type Change, ChangeFollower, type FeedCounters } from '../changes/follower';
import { SEARCH_DEFAULTS } from '../config';
import { loadCasePage, loadCases, loadPlatforms } from './loader';
import { type ReconcileCounters, Reconciler, VersionLedger } from './reconcile';
import { type IndexedCandidate, ShopIndex } from './shop-index';
import type { RankedCase } from '../../shared/search';
import { shops } from '../../db/schema';

export const POLL_MS = 500;

/** Timers that never keep the process alive on their own. */
function unref<T>(timer: T): T {
  (timer as { unref?: () => void }).unref?.();
  return timer;
}

type ShopState = {
  index: ShopIndex;
  /** id -> version of every case in the index, for reconciliation */
  versions: VersionLedger;
  ready: Promise<void>;
  building: boolean;
  pending: Change[];
  builtMs: number | null;
  error: string | null;
};

/** What the service needs of the app: the database and a log. */
export type SearchContext = Pick<AppContext, 'db' | 'log'>;

export interface SearchServiceOptions {
  /** build every shop's index at start (default true) */
  warm?: boolean;
  /** follow the change log every POLL_MS (default true) */
  poll?: boolean;
  /** the app's write count (db/client localWrites) this service answers for (default: this thread's) */
  writeCount?: () => number;
  /** how long a change-log id missing below the newest is waited for (SEARCH_GAP_TIMEOUT_MS) */
  gapTimeoutMs?: number;
  /** how often every built index is compared with the cases table; 0: never (SEARCH_RECONCILE_MS) */
  reconcileMs?: number;
}

export interface SearchIndexStatus {
  state: 'starting' | 'building' | 'ready' | 'error' | 'stopped';
  shops: { ready: number; building: number };
  cases: number;
  lastChangeId: number;
  buildMs: number | null;
  /** change-log ids waited for, filled late and given up on (server/changes/follower.ts) */
  gaps: FeedCounters;
  reconcile: ReconcileCounters;
}

export class SearchService {
  private shops = new Map<number, ShopState>();
  private readonly follower: ChangeFollower;
  private readonly reconciler: Reconciler;
  /** the follower and the reconciler's repairs take turns: neither applies a row read before the other's */
  private feedTurn: Promise<unknown> = Promise.resolve();
  /** localWrites() when the last log read started */
  private writesSeen = -1;
  private started: Promise<void>;
  private running: Promise<void> | null = null;
  private next: Promise<void> | null = null;
  private timers: ReturnType<typeof setInterval>[] = [];
  private reconciling = false;
  private stopped = false;
  private failed: string | null = null;

  private readonly writeCount: () => number;

  constructor(
    private readonly ctx: SearchContext,
    options: SearchServiceOptions = {},
  ) {
    this.writeCount = options.writeCount ?? localWrites;
    this.follower = new ChangeFollower(ctx.db, options.gapTimeoutMs ?? SEARCH_DEFAULTS.gapTimeoutMs);
    this.reconciler = new Reconciler({
      db: ctx.db,
      log: ctx.log,
      builtShops: () => [...this.shops.values()].filter((s) => !s.building).map((s) => ({ shopId: s.index.shopId, versions: s.versions })),
      catchUp: () => this.catchUp(),
      withFeedCaughtUp: (work) =>
        this.takeFeedTurn(async () => {
          await this.follower.poll((changes) => this.route(changes));
          return work();
        }),
      refresh: (shopId, ids) => {
        const state = this.shops.get(shopId);
        return state && !state.building ? this.refreshCases(state, ids) : Promise.resolve(0);
      },
    });
    // the log position is read before any shop is built, so no change can fall between
    this.started = this.follower.start();
    this.started.catch((err) => this.fail(err));
    if (options.poll !== false) {
      this.timers.push(unref(setInterval(() => void this.catchUp().catch((err) => this.fail(err)), POLL_MS)));
    }
    const reconcileMs = options.reconcileMs ?? SEARCH_DEFAULTS.reconcileMs;
    if (reconcileMs > 0) this.timers.push(unref(setInterval(() => void this.reconcileInBackground(), reconcileMs)));
    if (options.warm !== false) unref(setTimeout(() => void this.warmUp().catch((err) => this.fail(err)), 0));
  }

  private fail(err: unknown) {
    const message = err instanceof Error ? err.message : String(err);
    // the database went away (shutdown, a test dropping its database): stop following
    if (/closed|ECONNREFUSED|Unknown database|ER_BAD_DB_ERROR/i.test(message)) this.stop();
    else this.ctx.log.warn({ err }, 'search index: %s', message);
    this.failed = message;
  }

  stop() {
    this.stopped = true;
    for (const timer of this.timers) clearInterval(timer);
    this.timers = [];
  }

  /** Compares every built shop index with the cases table and repairs what differs (reconcile.ts). */
  async reconcile() {
    await this.started;
    await this.reconciler.run();
  }

  private async reconcileInBackground() {
    if (this.reconciling || this.stopped) return; // a slow pass is never overlapped
    this.reconciling = true;
    await this.reconcile()
      .catch((err) => this.fail(err))
      .finally(() => (this.reconciling = false));
  }

  /** Runs `work` after every earlier follower read or repair has finished. */
  private takeFeedTurn<T>(work: () => Promise<T>): Promise<T> {
    const turn = this.feedTurn.then(work, work);
    this.feedTurn = turn.catch(() => undefined);
    return turn;
  }

  /** Builds every shop's index, one after another, without holding up requests. */
  async warmUp() {
    await this.started;
    const rows = await this.ctx.db.select({ id: shops.id }).from(shops);
    for (const r of rows) {
      if (this.stopped) return;
      await this.shop(Number(r.id)).ready;
    }
  }

  status(): SearchIndexStatus {
    const states = [...this.shops.values()];
    const building = states.filter((s) => s.building).length;
    const cases = states.reduce((n, s) => n + s.index.size, 0);
    const buildMs = states.reduce<number | null>((m, s) => (s.builtMs === null ? m : Math.max(m ?? 0, s.builtMs)), null);
    const state = this.stopped ? 'stopped' : states.some((s) => s.error) ? 'error' : building ? 'building' : states.length ? 'ready' : 'starting';
    return {
      state,
      shops: { ready: states.length - building, building },
      cases,
      lastChangeId: this.follower.highWater,
      buildMs,
      gaps: this.follower.counters(),
      reconcile: this.reconciler.status(),
    };
  }

  /** The shop's index state; starts building it on first use. */
  shop(shopId: number): ShopState {
    let s = this.shops.get(shopId);
    if (s) return s;
    const state: ShopState = { index: new ShopIndex(shopId), versions: new VersionLedger(), ready: Promise.resolve(), building: true, pending: [], builtMs: null, error: null };
    state.ready = this.build(state);
    // a failed build is reported to whoever waits on it; nobody waiting is not a crash
    state.ready.catch((err) => this.fail(err));
    this.shops.set(shopId, state);
    return state;
  }

  private async build(state: ShopState) {
    const t0 = performance.now();
    try {
      await this.started;
      state.index.platforms = await loadPlatforms(this.ctx.db, state.index.shopId);
      let after = 0;
      for (;;) {
        const page = await loadCasePage(this.ctx.db, state.index.shopId, after);
        if (page.length === 0) break;
        state.index.addMany(page);
        for (const row of page) state.versions.set(row.id, row.version);
        after = page[page.length - 1]!.id;
        // let sign-ins and other requests run between pages
        await yieldToLoop();
      }
      // in the follower's turn, so no change it reads is applied before these older ones
      await this.takeFeedTurn(async () => {
        state.building = false;
        await this.apply(state, state.pending.splice(0));
      });
      state.builtMs = Math.round(performance.now() - t0);
      state.error = null;
    } catch (err) {
      state.building = false;
      state.error = err instanceof Error ? err.message : String(err);
      // next use rebuilds
      this.shops.delete(state.index.shopId);
      throw err;
    }
  }

  /**
   * Reads the change log once. A call made while a read is in flight waits for
   * the next read (which starts after the current one), so it always sees
   * writes committed before it was called; at most one read waits.
   */
  catchUp(): Promise<void> {
    if (this.stopped) return Promise.resolve();
    if (!this.running) {
      this.running = this.followOnce().finally(() => {
        this.running = null;
      });
      return this.running;
    }
    this.next ??= this.running.then(
      () => {
        this.next = null;
        return this.catchUp();
      },
      () => {
        this.next = null;
        return this.catchUp();
      },
    );
    return this.next;
  }

  private followOnce() {
    return this.takeFeedTurn(async () => {
      await this.started;
      this.writesSeen = this.writeCount();
      await this.follower.poll((changes) => this.route(changes));
    });
  }

  /** Hands each change to its shop: applied now, kept for after the build, or skipped if never built. */
  private async route(changes: Change[]) {
    const byShop = new Map<number, Change[]>();
    for (const c of changes) {
      const state = this.shops.get(c.shopId);
      if (!state) continue; // not built yet: its build will read the current rows
      if (state.building) state.pending.push(c);
      else byShop.set(c.shopId, [...(byShop.get(c.shopId) ?? []), c]);
    }
    for (const [shopId, list] of byShop) await this.apply(this.shops.get(shopId)!, list);
  }

  private async apply(state: ShopState, changes: Change[]) {
    if (changes.length === 0) return;
    if (changes.some((c) => c.entity === 'platform')) state.index.platforms = await loadPlatforms(this.ctx.db, state.index.shopId);
    await this.refreshCases(state, [...new Set(changes.filter((c) => c.entity === 'case').map((c) => c.entityId))]);
  }

  /** Re-reads these cases: whatever is live now goes in, the rest comes out. Returns how many entries changed version or presence. */
  private async refreshCases(state: ShopState, ids: number[]): Promise<number> {
    const { index, versions } = state;
    let changed = 0;
    for (let i = 0; i < ids.length; i += 500) {
      const chunk = ids.slice(i, i + 500);
      const rows = await loadCases(this.ctx.db, index.shopId, chunk);
      const live = new Set(rows.map((r) => r.id));
      for (const id of chunk) {
        if (live.has(id)) continue;
        if (versions.delete(id)) changed++;
        index.remove(id);
      }
      for (const r of rows) {
        if (versions.get(r.id) !== r.version) changed++;
        versions.set(r.id, r.version);
        index.upsert(r);
      }
    }
    return changed;
  }

  /** One search, as GET /api/search answers it. */
  async search(actor: Actor, query: SearchQuery): Promise<SearchResponse> {
    const t0 = performance.now();
    if (this.writeCount() !== this.writesSeen) await this.catchUp();
    const state = this.shop(actor.shopId);
    const building = state.building;
    await state.ready;
    const index = state.index;
    const fixed = query.platformId ? index.platform(query.platformId) : null;
    if (query.platformId && !fixed) throw notFound('That platform is not one of your shop’s.');

    const platforms = index.platforms;
    const parsed = parseQuery(query.q, { platforms, symptomTags: index.symptomTags(), platform: fixed });
    const chips = removableChips(parsed, platforms, fixed?.id ?? null);
    const code = query.code ? codeOf(query.code) : undefined;
    // a filter is evidence too: it joins the ranking as if typed
    const evidence = {
      ...parsed,
      codes: code && !parsed.codes.includes(code) && !parsed.impliedCodes.includes(code) ? [...parsed.codes, code] : parsed.codes,
      tags: query.tag && !isContextTag(query.tag) && !parsed.tags.includes(query.tag) ? [...parsed.tags, query.tag] : parsed.tags,
      context: query.tag && isContextTag(query.tag) && !parsed.context.includes(query.tag) ? [...parsed.context, query.tag] : parsed.context,
    };
    const platform = fixed ?? index.platform(parsed.platformIds[0]);
    const hasFilters = Boolean(query.platformId || code || query.tag || query.status);
    const { ranked, total } =
      query.q.trim() === '' && !hasFilters
        ? { ranked: [], total: 0 }
        : index.search({
            parsed: evidence,
            actor,
            filters: { platformId: query.platformId, code, tag: query.tag, status: query.status },
            platform,
            limit: query.limit,
            now: new Date(),
          });
    const keys = structuredKeys(parsed);
    return {
      query: {
        codes: keys.codes,
        impliedCodes: parsed.impliedCodes,
        cylinders: parsed.cylinders,
        tags: parsed.tags,
        context: parsed.context,
        terms: parsed.terms,
        platformIds: parsed.platformIds,
        text: parsed.text,
        chips,
      },
      results: ranked.map((r) => toResult(r, index)),
      total,
      tookMs: Math.round((performance.now() - t0) * 10) / 10,
      index: building ? 'building' : 'ready',
    };
  }
}

const codeOf = (full: string): string => {
  const r = parseDtc(full);
  return r.ok ? r.dtc.code : full.slice(0, 5);
};

const isContextTag = (tag: string): boolean => (CONTEXT_TAGS as readonly string[]).includes(tag);

function toResult(r: RankedCase<IndexedCandidate>, index: ShopIndex): SearchResult {
  const c = r.candidate;
  const p = index.platform(c.platformId);
  return {
    id: c.id,
    title: c.title,
    score: r.score,
    why: r.why,
    codes: c.codes,
    symptoms: c.symptoms,
    context: c.context,
    platform: p ? { id: p.id, make: p.make, model: p.model, engine: p.engine } : null,
    status: c.status as SearchResult['status'],
    fixConfirmed: c.fixConfirmed,
    updatedAt: (c.updatedAt instanceof Date ? c.updatedAt : new Date(c.updatedAt)).toISOString(),
  };
}

