// One shop's search index, in memory: the case fields ranking needs (never the
// body), exact-lookup postings (codes, families, system groups, cylinders,
// tags, recent work, platforms, status) and a text index (text-index.ts).
// A search first collects candidates from the postings and the text index
// with a cheap additive score, keeps the best few dozen, and only those go
// through the full explained ranking (shared/search/rank.ts). The loops that
// touch every candidate read typed arrays only (SlotColumns, CandidatePoints).
import { codeFacts, type CodeFacts, validCodeFacts } from '../../shared/search/code-facts';
import { type Platform, platformSimilarity } from '../../shared/platform';
import { canSeeCase, type Actor } from '../../shared/policy';
import { caseStatuses, type CaseStatus } from '../../shared/roles';
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
import { indexTerm, MATCH_WEIGHTS, TEXT_FIELDS, textFieldsOf } from './text-fields';
import { MAX_GROUPS, TextIndex, type TextGroupQuery, type TextHit } from './text-index';
import { KeyPostings } from './key-postings';
import { CandidatePoints, withRoom } from './slot-list';
import { TopK } from './top-k';

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

/** What the index keeps of a case: the row without its text, plus what searches derive from it. */
type Doc = Omit<CaseRow, 'body' | 'rootCause' | 'fix' | 'confirmedAt'> & {
  fixConfirmed: boolean;
  keys: string[];
  codeFacts: CodeFacts[];
};

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
const FULL_RANK_MIN = 50;
/** Text hits kept (best first): past a couple of hundred they only add noise and time. */
const TEXT_HITS_MAX = 200;
/** Below this many AND hits, and with no exact-key match, the text search falls back to OR. */
const AND_FALLBACK_BELOW = 5;

const W = SEARCH_WEIGHTS;
const DAY_MS = 86_400_000;

function groupKey(code: string): string | null {
  const g = codeFacts(code)?.group;
  return g ? `group:${g}` : null;
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
    if (f.cylinder !== null) keys.add(`cyl:${f.cylinder}`);
    if (f.group) keys.add(`group:${f.group}`);
  }
  for (const t of c.symptoms) keys.add(`tag:${tagKey(t)}`);
  for (const t of c.context) keys.add(`ctx:${tagKey(t)}`);
  if (c.platformId != null) keys.add(`platform:${c.platformId}`);
  keys.add(`status:${c.status}`);
  return [...keys];
}

/** Recency decays from this instant: per-slot factors stay in range for centuries either side. */
const EPOCH_MS = Date.UTC(2020, 0, 1);
const HALF_LIFE_MS = W.recency.halfLifeDays * DAY_MS;
const DRAFT = caseStatuses.indexOf('draft');
/** The most quality x recency can be: fix confirmed, best status, updated now. */
const BEST_QUALITY = W.fixConfirmed * Math.max(...Object.values(W.status));

/**
 * Per-slot columns in typed arrays, for the loops that touch every candidate
 * (tens of thousands for a common code): no object per case is read there.
 */
class SlotColumns {
  status = new Uint8Array(1024);
  author = new Int32Array(1024);
  /** 0 = no platform (platform ids start at 1) */
  platform = new Int32Array(1024);
  /** fix confirmed x status weight */
  quality = new Float64Array(1024);
  /** 2^((updatedAt - EPOCH) / half-life): times 2^(-(now - EPOCH) / half-life) it is the recency decay */
  growth = new Float64Array(1024);

  ensure(n: number) {
    this.status = withRoom(this.status, n);
    this.author = withRoom(this.author, n);
    this.platform = withRoom(this.platform, n);
    this.quality = withRoom(this.quality, n);
    this.growth = withRoom(this.growth, n);
  }

  set(slot: number, d: Doc) {
    this.ensure(slot + 1);
    this.status[slot] = caseStatuses.indexOf(d.status);
    this.author[slot] = d.authorId;
    this.platform[slot] = d.platformId ?? 0;
    this.quality[slot] = (d.fixConfirmed ? W.fixConfirmed : 1) * (W.status[d.status] ?? 1);
    this.growth[slot] = 2 ** ((d.updatedAt.getTime() - EPOCH_MS) / HALF_LIFE_MS);
  }
}

/** A text hit of the current query: its score and the groups (typed words) it matched. */
interface SlotHit {
  score: number;
  groups: number;
}

export class ShopIndex {
  private docs: (Doc | undefined)[] = [];
  private slotOf = new Map<number, number>();
  private freeSlots: number[] = [];
  private postings = new KeyPostings();
  private columns = new SlotColumns();
  /** the current query's cheap points per case (reused: see slot-list.ts) */
  private candidates = new CandidatePoints();
  private text = new TextIndex(TEXT_FIELDS, indexTerm, MATCH_WEIGHTS);
  private tagCache: string[] | null = null;
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
    for (const row of rows) this.upsert(row);
  }

  upsert(row: CaseRow) {
    if (this.slotOf.has(row.id)) this.remove(row.id);
    const slot = this.addDoc(row);
    this.text.add(slot, textFieldsOf(row));
  }

  remove(caseId: number) {
    const slot = this.slotOf.get(caseId);
    if (slot === undefined) return;
    const doc = this.docs[slot]!;
    for (const k of doc.keys) {
      if (this.postings.delete(k, slot) && k.startsWith('tag:')) this.tagCache = null;
    }
    this.text.remove(slot);
    this.docs[slot] = undefined;
    this.slotOf.delete(caseId);
    this.freeSlots.push(slot);
  }

  private addDoc(row: CaseRow): number {
    const slot = this.freeSlots.pop() ?? this.docs.length;
    const keys = keysOf(row);
    const doc: Doc = {
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
      codeFacts: validCodeFacts(row.codes),
    };
    this.docs[slot] = doc;
    this.columns.set(slot, doc);
    this.slotOf.set(row.id, slot);
    for (const k of keys) {
      if (this.postings.add(k, slot) && k.startsWith('tag:')) this.tagCache = null;
    }
    this.candidates.ensure(this.docs.length);
    return slot;
  }

  /** The ranked, visible cases for a query. */
  search(q: IndexSearch): IndexResult {
    const candidates = this.candidates;
    candidates.clear();
    try {
      const { hits, groups } = this.collect(q, candidates);
      return this.rank(q, candidates, hits, groups);
    } finally {
      candidates.clear();
    }
  }

  /** Adds cheap candidate points from postings and text; returns the text hits by slot. */
  private collect(q: IndexSearch, candidates: CandidatePoints) {
    const { parsed } = q;
    const sk = structuredKeys(parsed);
    const addAll = (key: string, pts: number) => candidates.addAll(this.postings.slots(key), pts);
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

    const hits = new Map<number, SlotHit>();
    const addText = (found: TextHit[], share: number, onlyNew: boolean) => {
      const best = found[0]?.score ?? 0;
      for (const h of found) {
        // the recall net adds only cases the exact keys missed: a tagged case needs no word match on its own tag
        if (onlyNew && (hits.has(h.slot) || candidates.has(h.slot))) continue;
        hits.set(h.slot, { score: (h.score / best) * share, groups: h.groups });
        candidates.add(h.slot, W.text * (h.score / best) * share);
      }
    };
    const groups = textGroups(parsed, false);
    addText(this.textSearch(groups, candidates.size === 0), 1, false);

    // Recall nets, only when the precise keys found too little.
    if (candidates.size < q.limit && sk.codes.length) {
      const per = W.code.points / sk.codes.length;
      for (const g of unique(sk.codes.map(groupKey).filter((x): x is string => x !== null))) addAll(g, per * W.code.group * 0.5);
    }
    const withTags = textGroups(parsed, true);
    if (candidates.size < q.limit && parsed.tags.length) {
      addText(this.text.search(this.groupQueries(withTags, false), 'OR', TEXT_HITS_MAX), 0.5, true);
    }
    const nothingTyped = !parsed.words.length && !sk.codes.length && !sk.tags.length && !sk.context.length && !sk.cylinders.length;
    if (candidates.size === 0 && nothingTyped) this.seedFromFilters(q, candidates);
    return { hits, groups: withTags };
  }

  /** Nothing in the text to go on: the platform or the filters alone choose the cases. */
  private seedFromFilters(q: IndexSearch, candidates: CandidatePoints) {
    const keys: string[] = [];
    if (q.platform) keys.push(`platform:${q.platform.id}`);
    else if (q.filters.code) keys.push(`code:${q.filters.code}`);
    else if (q.filters.tag) keys.push(`tag:${q.filters.tag}`, `ctx:${q.filters.tag}`);
    else if (q.filters.status) keys.push(`status:${q.filters.status}`);
    for (const k of keys) candidates.addAll(this.postings.slots(k), 1);
  }

  /**
   * Text query: each typed word (with its J1930 synonyms) must match; OR when that
   * finds too little and no exact key matched. Fuzzy only for words the index does
   * not know (likely typos), prefix only for the last word when it is not a whole
   * known word (still being typed).
   */
  private textSearch(groups: TextGroup[], orFallback: boolean): TextHit[] {
    if (groups.length === 0) return [];
    const queries = this.groupQueries(groups, true);
    const hits = this.text.search(queries, 'AND', TEXT_HITS_MAX);
    if (!orFallback || hits.length >= AND_FALLBACK_BELOW || groups.length < 2) return hits;
    return this.text.search(queries, 'OR', TEXT_HITS_MAX);
  }

  private groupQueries(groups: TextGroup[], prefixLast: boolean): TextGroupQuery[] {
    const known = (w: string) => {
      const t = indexTerm(w);
      return t !== null && this.text.knows(t);
    };
    const fuzzy = (term: string) => (term.length >= 5 && !this.text.knows(term) ? 0.2 : false);
    const typing = (term: string) => term.length >= 3;
    return groups.map((g, i) => ({
      words: g.words,
      fuzzy,
      prefix: prefixLast && i === groups.length - 1 && !g.words.some(known) ? typing : undefined,
    }));
  }

  /** Points for each platform id against the platform the query is about (index = platform id). */
  private platformPoints(query: Platform | null): Float64Array {
    // sized for every platform id, so the candidate loop never reads past the end
    const points = new Float64Array(Math.max(0, ...this.platforms.map((p) => p.id)) + 1);
    if (!query) return points;
    for (const p of this.platforms) points[p.id] = Math.max(0, W.platform[platformSimilarity(query, p).level]);
    return points;
  }

  /** Filters a caller chose (status, platform, code, tag): only these need the case's record. */
  private passesFilters(doc: Doc, f: SearchFilters): boolean {
    if (f.status && doc.status !== f.status) return false;
    if (f.platformId && doc.platformId !== f.platformId) return false;
    if (f.code && !doc.keys.includes(`code:${f.code}`)) return false;
    if (f.tag && !doc.symptoms.includes(f.tag) && !doc.context.includes(f.tag)) return false;
    return true;
  }

  /** The best candidates by cheap score x quality, among those the caller may see. */
  private shortlist(q: IndexSearch, candidates: CandidatePoints): { slots: number[]; total: number } {
    const { status, platform, quality, growth } = this.columns;
    const { points, touched } = candidates;
    const platformPts = this.platformPoints(q.platform);
    const decayNow = 2 ** (-(q.now.getTime() - EPOCH_MS) / HALF_LIFE_MS);
    const floor = W.recency.floor;
    const filtered = Boolean(q.filters.status || q.filters.platformId || q.filters.code || q.filters.tag);
    // the policy's answer for someone else's draft holds for every draft but the caller's own
    const seesAllDrafts = canSeeCase(q.actor, { status: 'draft', authorId: -1 });
    const top = new TopK(Math.max(FULL_RANK_MIN, q.limit * 3));
    let bar = -Infinity; // a case whose points x BEST_QUALITY cannot beat it is skipped unread
    let total = 0;
    for (let i = 0; i < touched.length; i++) {
      const slot = touched.items[i]!;
      if (status[slot] === DRAFT && !seesAllDrafts && !canSeeCase(q.actor, this.docs[slot]!)) continue;
      if (filtered && !this.passesFilters(this.docs[slot]!, q.filters)) continue;
      total++;
      const pts = points[slot]! + (platformPts[platform[slot]!] ?? 0);
      if (pts * BEST_QUALITY <= bar) continue;
      const score = pts * quality[slot]! * (floor + (1 - floor) * Math.min(1, decayNow * growth[slot]!));
      if (score > bar) {
        top.push(slot, score);
        bar = top.bar();
      }
    }
    return { slots: top.items(), total };
  }

  private rank(q: IndexSearch, points: CandidatePoints, text: Map<number, SlotHit>, groups: TextGroup[]): IndexResult {
    const { slots, total } = this.shortlist(q, points);
    const candidates: IndexedCandidate[] = slots.map((slot) => {
      const d = this.docs[slot]!;
      const hit = text.get(slot);
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
        textScore: hit ? hit.score : 0,
        matchedWords: hit ? matchedWords(hit.groups, groups) : undefined,
        codeFacts: d.codeFacts,
      };
    });
    const ranked = rankCases(q.parsed, candidates, { platform: q.platform, now: q.now });
    const relevant = ranked.some((r) => r.score > 0);
    // filters alone (no words): every case that passes is a result, newest first
    const kept = relevant ? ranked.filter((r) => r.score > 0) : ranked.map((r) => ({ ...r, why: ['matches your filters'] }));
    return { ranked: kept.slice(0, q.limit), total: relevant ? Math.max(total, kept.length) : total };
  }
}

/** The words a text hit matched, as the tech typed them (group i is bit i). */
function matchedWords(mask: number, groups: TextGroup[]): string[] {
  return groups.filter((_, i) => mask & (1 << i)).map((g) => g.shown).slice(0, 5);
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
  // a query of many words: the first few carry the meaning, the rest only cost time
  return groups.slice(0, MAX_GROUPS);
}
