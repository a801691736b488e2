// Symptom words -> the shop's own symptom tags (kebab-case, e.g. rough-idle,
// shakes-at-idle, whistle-under-boost). A tag matches when its content words
// appear close together in any order, each word allowing inflection
// (stemming) and, from 5 letters, one typo; a whole phrase of 5+ characters
// may also carry one typo ("rough idel"). Linking words are ignored, so
// "whistling on boost" finds whistle-under-boost.
import { normaliseTerms } from '../terms';
import { kebabToWords, LINK_WORDS, type Token, stem, tokenize, withinOneEdit, wordsMatch } from './text';

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

/** A query word and the tag words it matches (wordsMatch), worked out once per query. */
interface Word {
  lower: string;
  matches: Set<string>;
  used: boolean;
}

/** Indexes (into `words`) of a match for every tag word within a short window, any order. */
function findWindow(words: Word[], tagWords: string[]): number[] | null {
  const span = tagWords.length + 2;
  for (let i = 0; i < words.length; i++) {
    const picked: number[] = [];
    for (const tw of tagWords) {
      let hit = -1;
      for (let j = i; j < Math.min(words.length, i + span); j++) {
        const w = words[j];
        if (w && !w.used && !picked.includes(j) && w.matches.has(tw)) {
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
function findFuzzyPhrase(words: Word[], windows: string[][], phrase: string, n: number): number[] | null {
  if (phrase.length < 5 || n < 2) return null;
  const texts = windows[n] ?? [];
  for (let i = 0; i < texts.length; i++) {
    const text = texts[i]!;
    if (Math.abs(text.length - phrase.length) > 1 || !withinOneEdit(text, phrase)) continue;
    if (words.slice(i, i + n).some((w) => w.used)) continue;
    return Array.from({ length: n }, (_, k) => i + k);
  }
  return null;
}

/** A shop's tags, prepared once per tag list (the index keeps one list per shop). */
interface PreparedTags {
  /** longest first, so "shakes at idle" is not spent on a shorter tag */
  forms: (TagForm & { phrase: string })[];
  /** every word of every tag, with its stem */
  words: { word: string; stem: string }[];
  maxWords: number;
}

const PREPARED = new WeakMap<readonly string[], PreparedTags>();

function prepared(symptomTags: readonly string[]): PreparedTags {
  let p = PREPARED.get(symptomTags);
  if (!p) {
    const forms = [...new Set(symptomTags)]
      .flatMap(tagForms)
      .map((f) => ({ ...f, phrase: f.words.join(' ') }))
      .sort((a, b) => b.words.length - a.words.length || b.phrase.length - a.phrase.length);
    const words = [...new Set(forms.flatMap((f) => f.words))].map((word) => ({ word, stem: stem(word) }));
    p = { forms, words, maxWords: Math.max(0, ...forms.map((f) => f.words.length)) };
    PREPARED.set(symptomTags, p);
  }
  return p;
}

/** windows[n][i]: the text of n words from word i, for the one-typo phrase check. */
function wordWindows(words: Word[], maxWords: number): string[][] {
  const windows: string[][] = [];
  for (let n = 2; n <= Math.min(maxWords, words.length); n++) {
    windows[n] = [];
    for (let i = 0; i + n <= words.length; i++) windows[n]!.push(words.slice(i, i + n).map((w) => w.lower).join(' '));
  }
  return windows;
}

export interface SymptomMatch { tags: string[]; used: Set<number> }

/**
 * Matches tags against tokens (already term-normalised). Longer tags go first,
 * so "shakes at idle" is not spent on a shorter tag; each token serves one tag.
 * Returns the tags and the token indexes they used.
 */
export function matchSymptomTags(tokens: Token[], symptomTags: readonly string[]): SymptomMatch {
  const tags = prepared(symptomTags);
  // content-word view, keeping a map back to token indexes
  const contentIdx = tokens.map((t, i) => (LINK_WORDS.has(t.lower) ? -1 : i)).filter((i) => i >= 0);
  const content: Word[] = contentIdx.map((i) => {
    const lower = tokens[i]?.lower ?? '';
    const matches = new Set<string>();
    for (const tw of tags.words) if (wordsMatch(lower, tw.word, tw.stem)) matches.add(tw.word);
    return { lower, matches, used: false };
  });
  const windows = wordWindows(content, tags.maxWords);
  const found = new Map<string, number>();
  const used = new Set<number>();
  for (const f of tags.forms) {
    if (found.has(f.tag)) continue;
    const hit = findWindow(content, f.words) ?? findFuzzyPhrase(content, windows, f.phrase, f.words.length);
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
  return { tags: [...found.entries()].sort((a, b) => a[1] - b[1]).map(([t]) => t), used };
}
