// What the text index holds per case, and how words become index terms.
// The full body is never indexed: at 100,000 cases it made the index take 51 s
// and 760 MiB (docs/performance.md). A case's title, root cause and fix go in
// whole; from the body only its most frequent content words (a bounded set).
// Tags are exact keys (shop-index.ts), not text.
import type { MatchWeights, TextField } from './text-index';
import { STOP_WORDS, stem } from '../../shared/search/text';

/** Body words kept per case; enough for the words a note keeps coming back to. */
export const BODY_TERMS_PER_CASE = 16;

// Words every note has (its section headings, the caution), which would match everything.
const NOTE_WORDS = new Set([
  'what', 'did', 'tests', 'test', 'readings', 'reading', 'cause', 'fix', 'caution', 'follow', 'manufacturer', 'manufacturer\'s',
  'procedure', 'spec', 'found', 'fault', 'ruled', 'out', 'not', 'no', 'one', 'two', 'both', 'off', 'back', 'then', 'before',
  'first', 'went', 'came', 'done', 'checked', 'check', 'put', 'new', 'old', 'other', 'others', 'same', 'each', 'only',
]);

/** Index term of a word: lower case, stop words dropped, lightly stemmed (misfiring = misfire; stem keeps its own memo). */
export function indexTerm(word: string): string | null {
  const w = word.toLowerCase();
  return w.length < 2 || w.length > 40 || STOP_WORDS.has(w) ? null : stem(w);
}

/** The most frequent content words of a note body, at most `max`, most frequent first. */
export function bodyTerms(body: string, max = BODY_TERMS_PER_CASE): string {
  const counts = new Map<string, number>();
  for (const m of body.toLowerCase().matchAll(/\p{L}[\p{L}\p{N}']*/gu)) {
    const w = m[0];
    if (w.length < 3 || STOP_WORDS.has(w) || NOTE_WORDS.has(w)) continue;
    counts.set(w, (counts.get(w) ?? 0) + 1);
  }
  // stable: equal counts keep their first-seen order
  return [...counts.entries()]
    .sort((a, b) => b[1] - a[1])
    .slice(0, max)
    .map(([w]) => w)
    .join(' ');
}

/** The text fields of a case, in TEXT_FIELDS order. */
export function textFieldsOf(c: { title: string; body: string; rootCause: string | null; fix: string | null }): string[] {
  return [c.title, [c.rootCause ?? '', c.fix ?? '', bodyTerms(c.body)].join(' ')];
}

/** A word in the title counts twice a word in the notes. */
export const TEXT_FIELDS: readonly TextField[] = [
  { name: 'title', boost: 2 },
  { name: 'notes', boost: 1 },
];

/** A prefix or one-typo match counts a little under half an exact one. */
export const MATCH_WEIGHTS: MatchWeights = { fuzzy: 0.45, prefix: 0.4 };
