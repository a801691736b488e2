// Symptom words -> the shop's own symptom tags (kebab-case, e.g. rough-idle,
// shakes-at-idle, whistle-under-boost). A tag matches when its content words
// appear close together in any order, each word allowing inflection
// (stemming) and, from 5 letters, one typo; a whole phrase of 5+ characters
// may also carry one typo ("rough idel"). Linking words are ignored, so
// "whistling on boost" finds whistle-under-boost.
import { normaliseTerms } from '../terms';
import { editDistance, kebabToWords, LINK_WORDS, type Token, tokenize, wordsMatch } from './text';

// Everyday phrasings rewritten to the words tags usually use. Common practice, no source.
const PHRASES: [RegExp, string][] = [
  [/\b(?:won'?t|wont|will not|doesn'?t|does not|didn'?t|did not|can'?t|cannot) (?:start|fire up|fire)\b/giu, 'no start'],
  [/\bcranks?(?:,| but)? (?:no|won'?t|wont|doesn'?t|does not) start\b/giu, 'no start'],
  [/\bnon[- ]?start(?:er)?\b/giu, 'no start'],
  [/\b(?:won'?t|wont|doesn'?t|does not) crank\b/giu, 'no crank'],
  [/\b(?:dies|cuts out|cutting out|conks out)\b/giu, 'stalls'],
  [/\b(?:bogs|bogging|bog) down\b|\bflat spot\b/giu, 'hesitation'],
  [/\bhesitat(?:es|ing|e)\b/giu, 'hesitation'],
];

export function rewriteSymptomPhrases(text: string): string {
  let out = text;
  for (const [re, to] of PHRASES) out = out.replace(re, to);
  return out;
}

const contentWords = (tokens: Token[]): Token[] => tokens.filter((t) => !LINK_WORDS.has(t.lower));

interface TagForm { tag: string; words: string[] }

const FORM_CACHE = new Map<string, TagForm[]>();
const FORM_CACHE_MAX = 5000;

/** A tag's words, as written and after the J1930 normaliser (so "cel-on" meets "check engine light on"). */
function tagForms(tag: string): TagForm[] {
  const cached = FORM_CACHE.get(tag);
  if (cached) return cached;
  const forms = buildTagForms(tag);
  if (FORM_CACHE.size >= FORM_CACHE_MAX) FORM_CACHE.clear();
  FORM_CACHE.set(tag, forms);
  return forms;
}

function buildTagForms(tag: string): TagForm[] {
  const plain = contentWords(tokenize(kebabToWords(tag))).map((t) => t.lower);
  const normal = contentWords(tokenize(normaliseTerms(kebabToWords(tag)).text)).map((t) => t.lower);
  const forms = [{ tag, words: plain }];
  if (normal.join(' ') !== plain.join(' ')) forms.push({ tag, words: normal });
  return forms.filter((f) => f.words.length > 0);
}

type Matcher = (query: string, tagWord: string) => boolean;

/** wordsMatch with a per-query memo: many tags share words, and typo checks cost. */
function memoMatcher(): Matcher {
  const memo = new Map<string, boolean>();
  return (q, t) => {
    const key = `${q}\u0000${t}`;
    let v = memo.get(key);
    if (v === undefined) {
      v = wordsMatch(q, t);
      memo.set(key, v);
    }
    return v;
  };
}

/** Indexes (into `words`) of a match for every tag word within a short window, any order. */
function findWindow(words: { lower: string; used: boolean }[], tagWords: string[], match: Matcher): number[] | null {
  const span = tagWords.length + 2;
  for (let i = 0; i < words.length; i++) {
    const picked: number[] = [];
    for (const tw of tagWords) {
      let hit = -1;
      for (let j = i; j < Math.min(words.length, i + span); j++) {
        const w = words[j];
        if (w && !w.used && !picked.includes(j) && match(w.lower, tw)) {
          hit = j;
          break;
        }
      }
      if (hit < 0) break;
      picked.push(hit);
    }
    if (picked.length === tagWords.length) return picked;
  }
  return null;
}

/** Consecutive words whose joined text is one typo away from the tag phrase. */
function findFuzzyPhrase(words: { lower: string; used: boolean }[], tagWords: string[]): number[] | null {
  const phrase = tagWords.join(' ');
  if (phrase.length < 5 || tagWords.length < 2) return null;
  const n = tagWords.length;
  for (let i = 0; i + n <= words.length; i++) {
    const win = words.slice(i, i + n);
    if (win.some((w) => w.used)) continue;
    if (editDistance(win.map((w) => w.lower).join(' '), phrase, 1) <= 1) return win.map((_, k) => i + k);
  }
  return null;
}

export interface SymptomMatch { tags: string[]; used: Set<number> }

/**
 * Matches tags against tokens (already term-normalised). Longer tags go first,
 * so "shakes at idle" is not spent on a shorter tag; each token serves one tag.
 * Returns the tags and the token indexes they used.
 */
export function matchSymptomTags(tokens: Token[], symptomTags: readonly string[]): SymptomMatch {
  // content-word view, keeping a map back to token indexes
  const contentIdx = tokens.map((t, i) => (LINK_WORDS.has(t.lower) ? -1 : i)).filter((i) => i >= 0);
  const content = contentIdx.map((i) => ({ lower: tokens[i]?.lower ?? '', used: false }));
  const forms = [...new Set(symptomTags)]
    .flatMap(tagForms)
    .sort((a, b) => b.words.length - a.words.length || b.words.join(' ').length - a.words.join(' ').length);
  const match = memoMatcher();
  const found = new Map<string, number>();
  const used = new Set<number>();
  for (const f of forms) {
    if (found.has(f.tag)) continue;
    const hit = findWindow(content, f.words, match) ?? findFuzzyPhrase(content, f.words);
    if (!hit) continue;
    found.set(f.tag, Math.min(...hit));
    for (const k of hit) {
      const c = content[k];
      if (c) c.used = true;
      const idx = contentIdx[k];
      if (idx !== undefined) used.add(idx);
    }
  }
  // in the order the query mentions them
  const tags = [...found.entries()].sort((a, b) => a[1] - b[1]).map(([t]) => t);
  return { tags, used };
}
