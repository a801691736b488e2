// Small text tools shared by the query parser: input clean-up, masking of
// consumed spans, tokens, stop words, a light stemmer and a one-typo check.

export const MAX_QUERY_CHARS = 500;

/** Cuts to MAX_QUERY_CHARS, drops control/format characters, folds dashes and spaces. */
export function sanitiseQuery(input: unknown): string {
  if (typeof input !== 'string') return '';
  return input
    .slice(0, MAX_QUERY_CHARS)
    .normalize('NFKC')
    .replace(/[\p{Cc}\p{Cf}\p{Co}\p{Cn}]/gu, ' ')
    .replace(/[\u2010-\u2015\u2212]/g, '-')
    .replace(/[\u2018\u2019\u02bc]/g, "'")
    .replace(/\s+/gu, ' ')
    .trim()
    .slice(0, MAX_QUERY_CHARS);
}

export const hasWordCharacters = (s: string): boolean => /[\p{L}\p{N}]/u.test(s);

/** Blanks a span with spaces so later stages skip it and offsets stay valid. */
export function mask(s: string, start: number, end: number): string {
  return s.slice(0, start) + ' '.repeat(Math.max(0, end - start)) + s.slice(end);
}

/** Runs a global regex over `s`, calls `onMatch` per hit, masks every hit. */
export function consume(s: string, re: RegExp, onMatch: (m: RegExpExecArray) => boolean | void): string {
  if (!re.global) throw new Error('consume needs a global regex');
  let out = s;
  // exec on the regex itself: matchAll would copy the regex on every call
  re.lastIndex = 0;
  for (let m = re.exec(s); m !== null; m = re.exec(s)) {
    if (m[0] === '') re.lastIndex++; // an empty match would never move on
    else if (onMatch(m) !== false) out = mask(out, m.index, m.index + m[0].length);
  }
  return out;
}

export interface Token { text: string; lower: string; start: number; end: number }

export function tokenize(s: string): Token[] {
  const out: Token[] = [];
  for (const m of s.matchAll(/[\p{L}\p{N}]+(?:'[\p{L}]+)?/gu)) {
    if (m.index === undefined) continue;
    out.push({ text: m[0], lower: m[0].toLowerCase(), start: m.index, end: m.index + m[0].length });
  }
  return out;
}

// Words that carry no search meaning. "no" and "not" are kept: "no start".
export const STOP_WORDS = new Set([
  'a', 'an', 'the', 'and', 'or', 'but', 'of', 'to', 'in', 'on', 'at', 'by', 'for', 'with', 'from', 'into',
  'is', 'are', 'was', 'were', 'be', 'been', 'being', 'it', 'its', "it's", 'this', 'that', 'these', 'those',
  'has', 'have', 'had', 'do', 'does', 'did', 'so', 'as', 'if', 'then', 'than', 'there', 'very', 'just',
  'i', 'we', 'you', 'he', 'she', 'they', 'my', 'our', 'your', 'his', 'her', 'their', 'me', 'us', 'them',
  'after', 'since', 'when', 'while', 'during', 'under', 'over', 'about', 'also', 'some', 'any', 'all',
  'what', 'which', 'who', 'how', 'why', 'can', 'could', 'would', 'should', 'will', 'get', 'got', 'gets',
  'car', 'vehicle', 'customer', 'says', 'said', 'please', 'help', 'like', 'still', 'now', 'again',
]);

// Linking words ignored inside symptom phrases ("whistle under boost" = "whistling on boost").
export const LINK_WORDS = new Set([
  'a', 'an', 'the', 'at', 'on', 'in', 'under', 'over', 'when', 'while', 'with', 'during', 'of', 'from',
  'to', 'for', 'and', 'is', 'it', 'its', 'by', 'into', 'upon',
]);

const STEMS = new Map<string, string>();

/** Light suffix stripping: shakes/shaking/shake -> shak, whistling/whistle -> whistl. */
export function stem(word: string): string {
  let s = STEMS.get(word);
  if (s === undefined) {
    s = stemOnce(word);
    // words repeat across queries and tags; the bound only guards against odd input
    if (STEMS.size >= 50_000) STEMS.clear();
    STEMS.set(word, s);
  }
  return s;
}

function stemOnce(word: string): string {
  let w = word.toLowerCase();
  if (w.length <= 3) return w;
  if (w.endsWith('ations')) w = `${w.slice(0, -6)}ate`;
  else if (w.endsWith('ation')) w = `${w.slice(0, -5)}ate`;
  if (w.endsWith('ies') && w.length > 4) w = `${w.slice(0, -3)}y`;
  else if (w.endsWith('ing') && w.length > 5) w = w.slice(0, -3);
  else if (w.endsWith('ed') && w.length > 4) w = w.slice(0, -2);
  else if (w.endsWith('es') && w.length > 4) w = w.slice(0, -2);
  else if (w.endsWith('ly') && w.length > 4) w = w.slice(0, -2);
  else if (w.endsWith('s') && !w.endsWith('ss') && w.length > 3) w = w.slice(0, -1);
  if (w.endsWith('e') && w.length > 3) w = w.slice(0, -1);
  // stopping -> stopp -> stop
  if (/([b-df-hj-np-tv-z])\1$/.test(w) && !/(ll|ss|zz)$/.test(w)) w = w.slice(0, -1);
  return w;
}

/**
 * Whether two strings are at most one edit apart (a substitution, an insertion or
 * deletion, or a swap of neighbours): optimal string alignment distance <= 1, in one pass.
 */
export function withinOneEdit(a: string, b: string): boolean {
  if (a === b) return true;
  const [s, l] = a.length <= b.length ? [a, b] : [b, a];
  if (l.length - s.length > 1) return false;
  let i = 0;
  while (i < s.length && s[i] === l[i]) i++;
  if (s.length === l.length) {
    // one substitution, or neighbours swapped
    if (s.slice(i + 1) === l.slice(i + 1)) return true;
    return s[i] === l[i + 1] && s[i + 1] === l[i] && s.slice(i + 2) === l.slice(i + 2);
  }
  // one character more in the longer string
  return s.slice(i) === l.slice(i + 1);
}

/** Same word allowing for inflection, or one typo in words of 5+ characters. `targetStem`: stem(target), if known. */
export function wordsMatch(query: string, target: string, targetStem?: string): boolean {
  const q = query.toLowerCase();
  const t = target.toLowerCase();
  if (q === t || stem(q) === (targetStem ?? stem(t))) return true;
  return q.length >= 5 && t.length >= 5 && withinOneEdit(q, t);
}

export const unique = <T>(xs: Iterable<T>): T[] => [...new Set(xs)];

/** 'shakes-at-idle' -> 'shakes at idle' */
export const kebabToWords = (tag: string): string => tag.replace(/[-_]+/g, ' ').trim();
