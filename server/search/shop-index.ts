// One shop's search index, in memory: the case fields ranking needs (never the
// body), exact-lookup postings (codes, families, system groups, cylinders,
// tags, recent work, platforms, status) and a minisearch text index.
// A search first collects candidates from the postings and the text index
// with a cheap additive score, keeps the best few hundred, and only those go
// through the full explained ranking (shared/search/rank.ts).
import MiniSearch, { type Query, type SearchOptions, type SearchResult as TextHit } from 'minisearch';
import { classifyDtc, cylinderForMisfireCode, parseDtc } from '../../shared/codes';
import { type Platform, platformSimilarity } from '../../shared/platform';
import { canSeeCase, type Actor } from '../../shared/policy';
import type { CaseStatus } from '../../shared/roles';
import {
  type CaseCandidate,
  type ParsedQuery,
  rankCases,
  type RankedCase,
  SEARCH_WEIGHTS,
  structuredKeys,
} from '../../shared/search';
import { expandTerm } from '../../shared/terms';
import { kebabToWords, unique } from '../../shared/search/text';
import { indexTerm, textDoc, type TextDoc, textIndexOptions, textSearchDefaults } from './text-fields';

export interface CaseRow {
  id: number;
  title: string;
  body: string;
  rootCause: string | null;
  fix: string | null;
  codes: string[];
  symptoms: string[];
  context: string[];
  platformId: number | null;
  status: CaseStatus;
  authorId: number;
  confirmedAt: Date | null;
  updatedAt: Date;
}

interface Doc {
  id: number;
  title: string;
  codes: string[];
  symptoms: string[];
  context: string[];
  platformId: number | null;
  status: CaseStatus;
  authorId: number;
  fixConfirmed: boolean;
  updatedAt: Date;
  keys: string[];
}

export interface SearchFilters {
  platformId?: number;
  /** 5-character code */
  code?: string;
  tag?: string;
  status?: CaseStatus;
}

export interface IndexSearch {
  parsed: ParsedQuery;
  actor: Actor;
  filters: SearchFilters;
  /** the platform the query is about (filter, else first named) */
  platform: Platform | null;
  limit: number;
  now: Date;
}

export type IndexedCandidate = CaseCandidate & { id: number; platformId: number | null };

export interface IndexResult {
  ranked: RankedCase<IndexedCandidate>[];
  total: number;
}

/** Candidates that go through the full ranking: enough that the cheap score's blind spots (banks, groups) cannot hide a top result. */
const FULL_RANK_MIN = 100;
/** A word in more than this share of a shop's notes is common (see textSearch). */
const RARE_SHARE = 0.03;
const RARE_MIN = 200;
/** Text hits kept (best first): past a few hundred they only add noise and time. */
const TEXT_HITS_MAX = 500;
/** Below this many AND hits, and with no exact-key match, the text search falls back to OR. */
const AND_FALLBACK_BELOW = 5;

const W = SEARCH_WEIGHTS;
const DAY_MS = 86_400_000;

function groupKey(code: string): string | null {
  const g = classifyDtc(code);
  return g.group ? `group:${g.system}:${g.group}` : null;
}

interface CodeFacts { code: string; family: string; cyl: number | null; group: string | null }
const CODE_FACTS = new Map<string, CodeFacts | null>();

/** Parsed once per spelling: the same few hundred codes recur across a shop's cases. */
function codeFacts(raw: string): CodeFacts | null {
  let f = CODE_FACTS.get(raw);
  if (f !== undefined) return f;
  const r = parseDtc(raw);
  f = r.ok ? { code: r.dtc.code, family: r.dtc.code.slice(0, 4), cyl: cylinderForMisfireCode(r.dtc.code), group: groupKey(r.dtc.code) } : null;
  if (CODE_FACTS.size > 50_000) CODE_FACTS.clear();
  CODE_FACTS.set(raw, f);
  return f;
}

const tagKey = (t: string): string => t.trim().toLowerCase().replace(/[\s_]+/g, '-');

/** The exact keys of a case, spelled as shared/search/keys.ts spells them, plus system groups and status. */
function keysOf(c: { codes: string[]; symptoms: string[]; context: string[]; platformId: number | null; status: string }): string[] {
  const keys = new Set<string>();
  for (const raw of c.codes) {
    const f = codeFacts(raw);
    if (!f) continue;
    keys.add(`code:${f.code}`);
    keys.add(`family:${f.family}`);
    if (f.cyl !== null) keys.add(`cyl:${f.cyl}`);
    if (f.group) keys.add(f.group);
  }
  for (const t of c.symptoms) keys.add(`tag:${tagKey(t)}`);
  for (const t of c.context) keys.add(`ctx:${tagKey(t)}`);
  if (c.platformId != null) keys.add(`platform:${c.platformId}`);
  keys.add(`status:${c.status}`);
  return [...keys];
}

/** A small binary min-heap on score: the best `size` entries of a stream. */
class TopK {
  private slots: number[] = [];
  private scores: number[] = [];
  constructor(private readonly size: number) {}
  push(slot: number, score: number) {
    if (this.slots.length < this.size) {
      this.slots.push(slot);
      this.scores.push(score);
      this.up(this.slots.length - 1);
    } else if (score > (this.scores[0] ?? -Infinity)) {
      this.slots[0] = slot;
      this.scores[0] = score;
      this.down(0);
    }
  }
  items(): number[] {
    return this.slots;
  }
  private swap(a: number, b: number) {
    [this.slots[a], this.slots[b]] = [this.slots[b]!, this.slots[a]!];
    [this.scores[a], this.scores[b]] = [this.scores[b]!, this.scores[a]!];
  }
  private up(i: number) {
    while (i > 0) {
      const p = (i - 1) >> 1;
      if (this.scores[p]! <= this.scores[i]!) return;
      this.swap(i, p);
      i = p;
    }
  }
  private down(i: number) {
    const n = this.scores.length;
    for (;;) {
      const l = 2 * i + 1;
      const r = l + 1;
      let m = i;
      if (l < n && this.scores[l]! < this.scores[m]!) m = l;
      if (r < n && this.scores[r]! < this.scores[m]!) m = r;
      if (m === i) return;
      this.swap(i, m);
      i = m;
    }
  }
}

export class ShopIndex {
  private docs: (Doc | undefined)[] = [];
  private slotOf = new Map<number, number>();
  private freeSlots: number[] = [];
  private postings = new Map<string, Set<number>>();
  /** how often each index term occurs: known words need no fuzzy search, very common ones narrow nothing */
  private vocab = new Map<string, number>();
  private text = new MiniSearch<TextDoc>({
    ...textIndexOptions,
    processTerm: (word) => {
      const term = indexTerm(word);
      if (term) this.vocab.set(term, (this.vocab.get(term) ?? 0) + 1);
      return term;
    },
  });
  private tagCache: string[] | null = null;
  private acc = new Float64Array(1024);
  platforms: Platform[] = [];

  constructor(readonly shopId: number) {}

  get size(): number {
    return this.slotOf.size;
  }

  /** The shop's symptom tags (what the query parser matches words against). */
  symptomTags(): string[] {
    this.tagCache ??= [...this.postings.keys()].filter((k) => k.startsWith('tag:')).map((k) => k.slice(4));
    return this.tagCache;
  }

  platform(id: number | null | undefined): Platform | null {
    return id == null ? null : (this.platforms.find((p) => p.id === id) ?? null);
  }

  /** Adds many cases at once (the initial build); rows already present are replaced. */
  addMany(rows: CaseRow[]) {
    const fresh: TextDoc[] = [];
    for (const row of rows) {
      if (this.slotOf.has(row.id)) this.remove(row.id);
      this.addDoc(row);
      fresh.push(textDoc(row));
    }
    this.text.addAll(fresh);
  }

  upsert(row: CaseRow) {
    if (this.slotOf.has(row.id)) this.remove(row.id);
    this.addDoc(row);
    this.text.add(textDoc(row));
  }

  remove(caseId: number) {
    const slot = this.slotOf.get(caseId);
    if (slot === undefined) return;
    const doc = this.docs[slot]!;
    for (const k of doc.keys) {
      const set = this.postings.get(k);
      set?.delete(slot);
      if (set && set.size === 0) {
        this.postings.delete(k);
        if (k.startsWith('tag:')) this.tagCache = null;
      }
    }
    this.docs[slot] = undefined;
    this.slotOf.delete(caseId);
    this.freeSlots.push(slot);
    this.text.discard(caseId);
  }

  private addDoc(row: CaseRow) {
    const slot = this.freeSlots.pop() ?? this.docs.length;
    const keys = keysOf(row);
    this.docs[slot] = {
      id: row.id,
      title: row.title,
      codes: row.codes,
      symptoms: row.symptoms,
      context: row.context,
      platformId: row.platformId,
      status: row.status,
      authorId: row.authorId,
      fixConfirmed: row.confirmedAt !== null,
      updatedAt: row.updatedAt,
      keys,
    };
    this.slotOf.set(row.id, slot);
    for (const k of keys) {
      let set = this.postings.get(k);
      if (!set) {
        set = new Set();
        this.postings.set(k, set);
        if (k.startsWith('tag:')) this.tagCache = null;
      }
      set.add(slot);
    }
    if (this.acc.length < this.docs.length) {
      const grown = new Float64Array(Math.max(this.docs.length, this.acc.length * 2));
      this.acc = grown;
    }
  }

  private posting(key: string): Set<number> | undefined {
    return this.postings.get(key);
  }

  /** The ranked, visible cases for a query. */
  search(q: IndexSearch): IndexResult {
    const touched: number[] = [];
    const acc = this.acc;
    const add = (slot: number, pts: number) => {
      if (acc[slot] === 0) touched.push(slot);
      acc[slot] = (acc[slot] ?? 0) + pts;
    };
    try {
      const text = this.collect(q, add, touched);
      return this.rank(q, touched, text);
    } finally {
      for (const s of touched) acc[s] = 0;
    }
  }

  /** Adds cheap candidate points from postings and text; returns the text hits by case id. */
  private collect(q: IndexSearch, add: (slot: number, pts: number) => void, touched: number[]): Map<number, TextHit> {
    const { parsed } = q;
    const sk = structuredKeys(parsed);
    const addAll = (key: string, pts: number) => {
      const set = this.posting(key);
      if (set) for (const s of set) add(s, pts);
    };
    if (sk.codes.length) {
      const per = W.code.points / sk.codes.length;
      for (const code of sk.codes) {
        addAll(`family:${code.slice(0, 4)}`, per * W.code.family);
        addAll(`code:${code}`, per * (W.code.exact - W.code.family));
      }
    }
    if (!parsed.misfire && sk.cylinders.length) for (const c of sk.cylinders) addAll(`cyl:${c}`, W.cylinder / sk.cylinders.length);
    for (const t of sk.tags) addAll(`tag:${t}`, W.symptom / sk.tags.length);
    for (const t of sk.context) addAll(`ctx:${t}`, W.context / sk.context.length);

    const structured = touched.length > 0;
    const hits = this.textSearch(parsed, false, !structured).slice(0, TEXT_HITS_MAX);
    const best = hits.reduce((m, h) => Math.max(m, h.score), 0);
    const byId = new Map<number, TextHit>();
    for (const h of hits) {
      const slot = this.slotOf.get(h.id as number);
      if (slot === undefined) continue;
      byId.set(h.id as number, h);
      add(slot, (W.text * h.score) / best);
    }

    // Recall nets, only when the precise keys found too little.
    if (touched.length < q.limit && sk.codes.length) {
      const per = W.code.points / sk.codes.length;
      for (const g of unique(sk.codes.map(groupKey).filter((x): x is string => x !== null))) addAll(g, per * W.code.group * 0.5);
    }
    if (touched.length < q.limit && parsed.tags.length) {
      const more = this.textSearch(parsed, true).slice(0, TEXT_HITS_MAX);
      const top = more.reduce((m, h) => Math.max(m, h.score), 0);
      for (const h of more) {
        const slot = this.slotOf.get(h.id as number);
        // only for cases the exact keys missed: a tagged case needs no word match on its own tag
        if (slot === undefined || byId.has(h.id as number) || this.acc[slot] !== 0) continue;
        byId.set(h.id as number, h);
        add(slot, (W.text * h.score) / top / 2);
      }
    }
    const nothingTyped = !parsed.words.length && !sk.codes.length && !sk.tags.length && !sk.context.length && !sk.cylinders.length;
    if (touched.length === 0 && nothingTyped) this.seedFromFilters(q, add);
    return byId;
  }

  /** Nothing in the text to go on: the platform or the filters alone choose the cases. */
  private seedFromFilters(q: IndexSearch, add: (slot: number, pts: number) => void) {
    const keys: string[] = [];
    if (q.platform) keys.push(`platform:${q.platform.id}`);
    else if (q.filters.code) keys.push(`code:${q.filters.code}`);
    else if (q.filters.tag) keys.push(`tag:${q.filters.tag}`, `ctx:${q.filters.tag}`);
    else if (q.filters.status) keys.push(`status:${q.filters.status}`);
    for (const k of keys) {
      const set = this.posting(k);
      if (set) for (const s of set) add(s, 1);
    }
  }

  /**
   * Text query: each typed word (with its J1930 synonyms) must match; OR when that
   * finds too little. Fuzzy only for words the index does not know (likely typos),
   * prefix only for the last word when it is not a whole known word (still being typed).
   * Common words (in more than 3 % of the notes) cost the most (minisearch scores
   * every note that has them) and narrow little: they are left out when rarer words
   * are there, and only the rarest is used when every word is common.
   */
  private textSearch(parsed: ParsedQuery, withTagWords: boolean, orFallback = true): TextHit[] {
    const all = textGroups(parsed, withTagWords);
    if (all.length === 0) return [];
    const known = (w: string) => {
      const t = indexTerm(w);
      return t !== null && this.vocab.has(t);
    };
    const freq = (g: TextGroup) => g.words.reduce((n, w) => n + (this.vocab.get(indexTerm(w) ?? '') ?? 0), 0);
    const rare = all.filter((g) => freq(g) <= Math.max(RARE_MIN, this.size * RARE_SHARE));
    // every word common: the rarest one alone narrows as well as all of them, at a fraction of the cost
    const rarest = [...all].sort((a, b) => freq(a) - freq(b))[0]!;
    const groups = rare.length ? rare : [rarest];
    const last = all[all.length - 1];
    const options: SearchOptions = {
      ...textSearchDefaults,
      fuzzy: (term) => (term.length >= 5 && !this.vocab.has(term) ? 0.2 : false),
    };
    const build = (combineWith: 'AND' | 'OR'): Query => ({
      combineWith,
      queries: groups.map((g) => ({
        combineWith: 'OR',
        queries: g.words,
        prefix: g === last && !withTagWords && !g.words.some(known) ? (term: string) => term.length >= 3 : false,
      })),
    });
    if (withTagWords) return this.text.search(build('OR'), options);
    const hits = this.text.search(build('AND'), options);
    if (!orFallback || hits.length >= AND_FALLBACK_BELOW || groups.length < 2) return hits;
    return this.text.search(build('OR'), options);
  }

  private quality(doc: Doc, now: number): number {
    const age = Math.max(0, (now - doc.updatedAt.getTime()) / DAY_MS);
    const recency = W.recency.floor + (1 - W.recency.floor) * 0.5 ** (age / W.recency.halfLifeDays);
    return (doc.fixConfirmed ? W.fixConfirmed : 1) * (W.status[doc.status] ?? 1) * recency;
  }

  private passes(doc: Doc, q: IndexSearch): boolean {
    const f = q.filters;
    if (!canSeeCase(q.actor, doc)) return false;
    if (f.status && doc.status !== f.status) return false;
    if (f.platformId && doc.platformId !== f.platformId) return false;
    if (f.code && !doc.keys.includes(`code:${f.code}`)) return false;
    if (f.tag && !doc.symptoms.includes(f.tag) && !doc.context.includes(f.tag)) return false;
    return true;
  }

  private platformPoints(query: Platform | null): Map<number, number> {
    const points = new Map<number, number>();
    if (!query) return points;
    for (const p of this.platforms) {
      const pts = W.platform[platformSimilarity(query, p).level];
      if (pts > 0) points.set(p.id, pts);
    }
    return points;
  }

  private rank(q: IndexSearch, touched: number[], text: Map<number, TextHit>): IndexResult {
    const now = q.now.getTime();
    const platformPts = this.platformPoints(q.platform);
    const top = new TopK(Math.max(FULL_RANK_MIN, q.limit * 5));
    let total = 0;
    for (const slot of touched) {
      const doc = this.docs[slot];
      if (!doc || !this.passes(doc, q)) continue;
      total++;
      const pts = (this.acc[slot] ?? 0) + (doc.platformId !== null ? (platformPts.get(doc.platformId) ?? 0) : 0);
      top.push(slot, pts * this.quality(doc, now));
    }
    const best = text.size ? Math.max(...[...text.values()].map((h) => h.score)) : 1;
    const typed = typedWordOf(q.parsed);
    const candidates: IndexedCandidate[] = top.items().map((slot) => {
      const d = this.docs[slot]!;
      const hit = text.get(d.id);
      return {
        id: d.id,
        title: d.title,
        codes: d.codes,
        symptoms: d.symptoms,
        context: d.context,
        platform: this.platform(d.platformId),
        platformId: d.platformId,
        status: d.status,
        fixConfirmed: d.fixConfirmed,
        updatedAt: d.updatedAt,
        textScore: hit ? hit.score / best : 0,
        matchedWords: hit ? matchedWords(hit, typed) : undefined,
      };
    });
    const ranked = rankCases(q.parsed, candidates, { platform: q.platform, now: q.now });
    const relevant = ranked.some((r) => r.score > 0);
    // filters alone (no words): every case that passes is a result, newest first
    const kept = relevant ? ranked.filter((r) => r.score > 0) : ranked.map((r) => ({ ...r, why: ['matches your filters'] }));
    return { ranked: kept.slice(0, q.limit), total: relevant ? Math.max(total, kept.length) : total };
  }
}

/** Index term -> the word the tech typed (synonyms and tag words map back to it). */
function typedWordOf(parsed: ParsedQuery): Map<string, string> {
  const out = new Map<string, string>();
  for (const g of textGroups(parsed, true)) {
    for (const w of g.words) {
      const term = indexTerm(w);
      if (term && !out.has(term)) out.set(term, g.shown);
    }
  }
  return out;
}

/** The words a text hit matched, as the tech typed them. */
function matchedWords(hit: TextHit, typed: Map<string, string>): string[] {
  return unique(hit.queryTerms.map((t) => typed.get(t) ?? t)).slice(0, 5);
}

export interface TextGroup {
  /** the word as the tech typed it, for "matches words: ..." */
  shown: string;
  /** any of these matches */
  words: string[];
}

const oneWord = (s: string): boolean => /^[\p{L}\p{N}]+$/u.test(s);

/**
 * One OR-group per thing the tech typed: a free word, or a J1930 term with its
 * one-word synonyms (notes say "cat" as often as "TWC"). Multi-word synonyms
 * are left out: their single words ("coil on plug" -> "plug") would match far
 * too loosely. Tag words are added only for the recall net.
 */
export function textGroups(parsed: ParsedQuery, withTagWords: boolean): TextGroup[] {
  const groups: TextGroup[] = [];
  const seen = new Set<string>();
  const termWords = new Set<string>();
  const push = (shown: string, words: string[]) => {
    const kept = unique(words.map((w) => w.toLowerCase()).filter((w) => oneWord(w) && indexTerm(w) !== null));
    const fresh = kept.filter((w) => !seen.has(indexTerm(w)!));
    if (fresh.length === 0) return;
    for (const w of fresh) seen.add(indexTerm(w)!);
    groups.push({ shown, words: fresh });
  };
  const wordPos = (w: string) => parsed.words.indexOf(w.toLowerCase());
  const terms = [...parsed.terms].sort((a, b) => wordPos(a.to.split(/\s+/)[0] ?? '') - wordPos(b.to.split(/\s+/)[0] ?? ''));
  const termGroups: { at: number; shown: string; words: string[] }[] = [];
  for (const t of terms) {
    const toWords = t.to.toLowerCase().split(/\s+/);
    for (const w of toWords) termWords.add(w);
    const words = [t.from, ...(toWords.length === 1 ? toWords : []), ...expandTerm(t.to)];
    termGroups.push({ at: wordPos(toWords[0] ?? ''), shown: t.from.toLowerCase(), words });
  }
  // free words and terms in the order typed, so "the last word" is the one being typed
  const items = [
    ...parsed.words.filter((w) => !termWords.has(w)).map((w) => ({ at: wordPos(w), shown: w, words: [w] })),
    ...termGroups,
  ].sort((a, b) => a.at - b.at);
  for (const it of items) push(it.shown, it.words);
  if (withTagWords) for (const tag of parsed.tags) push(kebabToWords(tag), kebabToWords(tag).split(' '));
  // a query of many words: the first 8 carry the meaning, the rest only cost time
  return groups.slice(0, 8);
}
