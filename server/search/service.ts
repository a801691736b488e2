// Search for one app instance: an index per shop, built lazily in the
// background, kept live by following the change log (server/changes).
// Before answering, a search reads the log (id > last seen, a primary-key range)
// when this process has written since the last read (db/client localWrites), so a change
// made here is found on the very next search; a 500 ms poll brings in changes
// made through other instances (and keeps idle ones current).
import { performance } from 'node:perf_hooks';
import { setImmediate as yieldToLoop } from 'node:timers/promises';
import { parseDtc } from '../../shared/codes';
import type { Actor } from '../../shared/policy';
import { CONTEXT_TAGS, parseQuery, removableChips, structuredKeys } from '../../shared/search';
import type { SearchQuery, SearchResponse, SearchResult } from '../../shared/schemas/search';
import type { AppContext } from '../context';
import { localWrites } from '../../db/client';
import { notFound } from '../http/errors';
import { type Change, lastChangeId, loadCasePage, loadCases, loadChanges, loadPlatforms } from './loader';
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
}

export interface SearchIndexStatus {
  state: 'starting' | 'building' | 'ready' | 'error' | 'stopped';
  shops: { ready: number; building: number };
  cases: number;
  lastChangeId: number;
  buildMs: number | null;
}

export class SearchService {
  private shops = new Map<number, ShopState>();
  private lastSeen = 0;
  /** localWrites() when the last log read started */
  private writesSeen = -1;
  private started: Promise<void>;
  private running: Promise<void> | null = null;
  private next: Promise<void> | null = null;
  private timer: ReturnType<typeof setInterval> | null = null;
  private stopped = false;
  private failed: string | null = null;

  private readonly writeCount: () => number;

  constructor(
    private readonly ctx: SearchContext,
    options: SearchServiceOptions = {},
  ) {
    this.writeCount = options.writeCount ?? localWrites;
    // the log position is read before any shop is built, so no change can fall between
    this.started = lastChangeId(ctx.db).then((id) => {
      this.lastSeen = id;
    });
    this.started.catch((err) => this.fail(err));
    if (options.poll !== false) {
      this.timer = unref(setInterval(() => void this.catchUp().catch((err) => this.fail(err)), POLL_MS));
    }
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
    if (this.timer) clearInterval(this.timer);
    this.timer = null;
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
    return { state, shops: { ready: states.length - building, building }, cases, lastChangeId: this.lastSeen, buildMs };
  }

  /** The shop's index state; starts building it on first use. */
  shop(shopId: number): ShopState {
    let s = this.shops.get(shopId);
    if (s) return s;
    const state: ShopState = { index: new ShopIndex(shopId), ready: Promise.resolve(), building: true, pending: [], builtMs: null, error: null };
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
        after = page[page.length - 1]!.id;
        // let sign-ins and other requests run between pages
        await yieldToLoop();
      }
      state.building = false;
      const pending = state.pending.splice(0);
      await this.apply(state, pending);
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

  private async followOnce() {
    await this.started;
    this.writesSeen = this.writeCount();
    for (;;) {
      const changes = await loadChanges(this.ctx.db, this.lastSeen);
      if (changes.length === 0) return;
      const byShop = new Map<number, Change[]>();
      for (const c of changes) {
        const state = this.shops.get(c.shopId);
        if (!state) continue; // not built yet: its build will read the current rows
        if (state.building) state.pending.push(c);
        else byShop.set(c.shopId, [...(byShop.get(c.shopId) ?? []), c]);
      }
      for (const [shopId, list] of byShop) await this.apply(this.shops.get(shopId)!, list);
      this.lastSeen = changes[changes.length - 1]!.id;
      if (changes.length < 5000) return;
    }
  }

  /** Re-reads the changed records: whatever is live now goes in, the rest comes out. */
  private async apply(state: ShopState, changes: Change[]) {
    if (changes.length === 0) return;
    const index = state.index;
    if (changes.some((c) => c.entity === 'platform')) index.platforms = await loadPlatforms(this.ctx.db, index.shopId);
    const ids = [...new Set(changes.filter((c) => c.entity === 'case').map((c) => c.entityId))];
    for (let i = 0; i < ids.length; i += 500) {
      const chunk = ids.slice(i, i + 500);
      const rows = await loadCases(this.ctx.db, index.shopId, chunk);
      const live = new Set(rows.map((r) => r.id));
      for (const id of chunk) if (!live.has(id)) index.remove(id);
      for (const r of rows) index.upsert(r);
    }
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

