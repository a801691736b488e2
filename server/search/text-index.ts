// The full-text part of a shop's search index: minisearch's radix-tree term
// dictionary (SearchableMap: exact, prefix and fuzzy lookups) over postings in
// typed arrays, scored with minisearch's own BM25+ and match weights.
//
// Why not a MiniSearch instance: it scores every note that holds a query term
// through Maps of objects. In the 100,000-case benchmark a word held by 15 % of
// the notes cost about 4 ms, and search spent most of its time there
// (docs/performance.md). Here the same scores come from a scan of two flat
// arrays per term. test/server/text-index.test.ts checks them against MiniSearch.
import SearchableMap from 'minisearch/SearchableMap';
import { SlotList, withRoom } from './slot-list';
import { TopK } from './top-k';

/** minisearch's BM25+ defaults (k1, length normalisation b, BM25+ delta d). */
const BM25 = { k: 1.2, b: 0.7, d: 0.5 } as const;
/** Weights of a prefix or fuzzy match against an exact one (1); these are minisearch's defaults. */
export interface MatchWeights {
  fuzzy: number;
  prefix: number;
}
const MINISEARCH_WEIGHTS: MatchWeights = { fuzzy: 0.45, prefix: 0.375 };
/** minisearch's cap on the edit distance of a fuzzy match. */
const MAX_FUZZY = 6;
/** At most this many groups per query: the matched groups of a note are a bit mask. */
export const MAX_GROUPS = 8;

/** minisearch's default tokenizer: split on white space and punctuation. */
const SPACE_OR_PUNCTUATION = /[\n\r\p{Z}\p{P}]+/u;

export interface TextField {
  name: string;
  boost: number;
}

/** One thing the tech typed: any of its words matches (a word and its synonyms). */
export interface TextGroupQuery {
  words: string[];
  /** also match index terms that start with a word (the word still being typed) */
  prefix?: (term: string) => boolean;
  /** edit distance allowed for a word, as a share of its length (minisearch's fuzzy), or false */
  fuzzy?: (term: string) => number | false;
}

export interface TextHit {
  slot: number;
  score: number;
  /** bit i set: the note matched group i */
  groups: number;
}

/** The notes (slots) holding one term in one field, with the term's frequency in each. */
class Posting {
  slots = new Int32Array(4);
  tfs = new Uint8Array(4);
  size = 0;

  add(slot: number, tf: number) {
    this.slots = withRoom(this.slots, this.size + 1);
    this.tfs = withRoom(this.tfs, this.size + 1);
    this.slots[this.size] = slot;
    this.tfs[this.size] = Math.min(tf, 255);
    this.size++;
  }

  /** Order does not matter to scoring: the last entry fills the gap. */
  remove(slot: number) {
    const at = this.slots.subarray(0, this.size).indexOf(slot);
    if (at < 0) return;
    this.size--;
    this.slots[at] = this.slots[this.size]!;
    this.tfs[at] = this.tfs[this.size]!;
  }
}

export class TextIndex {
  private dict = new SearchableMap<number>();
  private postings: (Posting | undefined)[] = [];
  private freeTermIds: number[] = [];
  private termNames: (string | undefined)[] = [];
  private termCount = 0;
  /** per field: the number of distinct tokens of each slot's text (minisearch's field length) */
  private fieldLength: Uint16Array[];
  private totalLength: number[];
  /** per slot: the posting ids (term id x fields + field) it is in, for removal */
  private slotPostings: (Int32Array | undefined)[] = [];
  private docCount = 0;
  // per-query scratch, kept between queries (zeroed after use)
  private scores = new Float64Array(1024);
  private masks = new Uint8Array(1024);
  private touched = new SlotList();

  constructor(
    private readonly fields: readonly TextField[],
    private readonly processTerm: (token: string) => string | null,
    private readonly weights: MatchWeights = MINISEARCH_WEIGHTS,
  ) {
    this.fieldLength = fields.map(() => new Uint16Array(1024));
    this.totalLength = fields.map(() => 0);
  }

  get size(): number {
    return this.docCount;
  }

  /** Whether the word is an index term as typed (no prefix or fuzzy needed). */
  knows(term: string): boolean {
    return this.dict.has(term);
  }

  add(slot: number, texts: readonly string[]) {
    if (this.slotPostings[slot]) this.remove(slot);
    const ids: number[] = [];
    this.ensureSlot(slot);
    this.fields.forEach((_, f) => {
      const tokens = (texts[f] ?? '').split(SPACE_OR_PUNCTUATION).filter((t) => t !== '');
      const length = Math.min(new Set(tokens).size, 65_535);
      this.fieldLength[f]![slot] = length;
      this.totalLength[f]! += length;
      const tf = new Map<string, number>();
      for (const token of tokens) {
        const term = this.processTerm(token);
        if (term) tf.set(term, (tf.get(term) ?? 0) + 1);
      }
      for (const [term, n] of tf) {
        const pid = this.termId(term) * this.fields.length + f;
        (this.postings[pid] ??= new Posting()).add(slot, n);
        ids.push(pid);
      }
    });
    this.slotPostings[slot] = Int32Array.from(ids);
    this.docCount++;
  }

  remove(slot: number) {
    const ids = this.slotPostings[slot];
    if (!ids) return;
    for (const pid of ids) this.postings[pid]!.remove(slot);
    for (const pid of ids) this.dropTermIfUnused(Math.floor(pid / this.fields.length));
    this.fields.forEach((_, f) => {
      this.totalLength[f]! -= this.fieldLength[f]![slot]!;
      this.fieldLength[f]![slot] = 0;
    });
    this.slotPostings[slot] = undefined;
    this.docCount--;
  }

  /**
   * Notes matching every group the index has words for (AND) or any group (OR), best
   * first, at most `limit`.
   * Scores are minisearch's: BM25+ per field times the field boost, times the
   * match weight (1 exact, less for prefix and fuzzy), summed, then multiplied
   * by the number of groups the note matched.
   */
  search(groups: readonly TextGroupQuery[], combineWith: 'AND' | 'OR', limit: number): TextHit[] {
    // A word no note holds, even with a typo allowed ("both", "restart" in a shop that never
    // wrote it), narrows nothing: it is left out rather than failing every note.
    const used = groups
      .slice(0, MAX_GROUPS)
      .map((g, i) => ({ bit: 1 << i, terms: this.expand(g) }))
      .filter((g) => g.terms.size > 0);
    // AND: the rarest group first; later groups only score notes still in the running
    if (combineWith === 'AND') used.sort((a, b) => this.postingsSize(a.terms) - this.postingsSize(b.terms));
    const touched = this.touched;
    touched.clear();
    try {
      let required = 0;
      for (const g of used) {
        for (const [termId, weight] of g.terms) this.score(termId, weight, g.bit, required, touched);
        if (combineWith === 'AND') required |= g.bit;
      }
      const all = used.reduce((m, g) => m | g.bit, 0);
      const top = new TopK(limit);
      for (let i = 0; i < touched.length; i++) {
        const slot = touched.items[i]!;
        const mask = this.masks[slot]!;
        if (combineWith === 'AND' && mask !== all) continue;
        const score = this.scores[slot]! * bitCount(mask);
        if (top.accepts(score)) top.push(slot, score);
      }
      return top.sorted().map(({ slot, score }) => ({ slot, score, groups: this.masks[slot]! }));
    } finally {
      for (let i = 0; i < touched.length; i++) {
        this.scores[touched.items[i]!] = 0;
        this.masks[touched.items[i]!] = 0;
      }
    }
  }

  private postingsSize(terms: Map<number, number>): number {
    let n = 0;
    for (const id of terms.keys()) for (let f = 0; f < this.fields.length; f++) n += this.postings[id * this.fields.length + f]?.size ?? 0;
    return n;
  }

  /** Index terms for a group with their match weights, as minisearch derives them. */
  private expand(g: TextGroupQuery): Map<number, number> {
    const out = new Map<number, number>();
    const put = (id: number, w: number) => out.set(id, Math.max(out.get(id) ?? 0, w));
    for (const word of g.words) {
      const term = this.processTerm(word);
      if (!term) continue;
      const exact = this.dict.get(term);
      if (exact !== undefined) put(exact, 1);
      const prefixed = new Set<string>();
      if (g.prefix?.(term)) {
        for (const [t, id] of this.dict.atPrefix(term)) {
          const distance = t.length - term.length;
          if (distance === 0) continue;
          prefixed.add(t);
          put(id, (this.weights.prefix * t.length) / (t.length + 0.3 * distance));
        }
      }
      const share = g.fuzzy?.(term) ?? false;
      const maxDistance = share === false ? 0 : share < 1 ? Math.min(MAX_FUZZY, Math.round(term.length * share)) : share;
      if (maxDistance > 0) {
        for (const [t, [id, distance]] of this.dict.fuzzyGet(term, maxDistance)) {
          if (distance === 0 || prefixed.has(t)) continue;
          put(id, (this.weights.fuzzy * t.length) / (t.length + distance));
        }
      }
    }
    return out;
  }

  /**
   * Adds one term's BM25+ score, in every field, to each note holding it that has
   * matched every `required` group so far (0: any note, which then joins `touched`).
   */
  private score(termId: number, weight: number, bit: number, required: number, touched: SlotList) {
    const { k, b, d } = BM25;
    const scores = this.scores;
    const masks = this.masks;
    for (let f = 0; f < this.fields.length; f++) {
      const p = this.postings[termId * this.fields.length + f];
      if (!p || p.size === 0) continue;
      const idf = Math.log(1 + (this.docCount - p.size + 0.5) / (p.size + 0.5));
      const avg = this.totalLength[f]! / this.docCount || 1;
      const lengths = this.fieldLength[f]!;
      const factor = weight * this.fields[f]!.boost * idf;
      const { slots, tfs } = p;
      for (let i = 0; i < p.size; i++) {
        const slot = slots[i]!;
        const mask = masks[slot]!;
        if ((mask & required) !== required) continue;
        if (mask === 0) touched.push(slot);
        const tf = tfs[i]!;
        masks[slot] = mask | bit;
        scores[slot]! += factor * (d + (tf * (k + 1)) / (tf + k * (1 - b + (b * lengths[slot]!) / avg)));
      }
    }
  }

  private termId(term: string): number {
    let id = this.dict.get(term);
    if (id === undefined) {
      id = this.freeTermIds.pop() ?? this.termCount++;
      this.dict.set(term, id);
      this.termNames[id] = term;
    }
    return id;
  }

  private dropTermIfUnused(id: number) {
    for (let f = 0; f < this.fields.length; f++) if ((this.postings[id * this.fields.length + f]?.size ?? 0) > 0) return;
    const term = this.termNames[id];
    if (term === undefined) return;
    this.dict.delete(term);
    this.termNames[id] = undefined;
    for (let f = 0; f < this.fields.length; f++) this.postings[id * this.fields.length + f] = undefined;
    this.freeTermIds.push(id);
  }

  private ensureSlot(slot: number) {
    const n = slot + 1;
    for (let f = 0; f < this.fieldLength.length; f++) this.fieldLength[f] = withRoom(this.fieldLength[f]!, n);
    this.scores = withRoom(this.scores, n);
    this.masks = withRoom(this.masks, n);
  }
}

function bitCount(x: number): number {
  let n = 0;
  for (let v = x; v; v &= v - 1) n++;
  return n;
}
