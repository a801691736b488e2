/**
 * Which tree cause a case's write-up describes, so a case written in the editor
 * can teach the walk without anyone picking a cause id by hand.
 *
 * Two signals, multiplied so neither alone decides:
 *   text   the words of the root cause, fix and title against each cause's title, id and
 *          `about`, with the search's tokeniser, stop words, stemmer and J1930 terms
 *          (a write-up saying "MAF" meets a cause titled "air-flow sensor"); each shared
 *          word weighs its inverse document frequency over every cause, so "connector"
 *          counts more than "fault";
 *   fit    how well the cause's tree fits the case's codes, symptoms and context
 *          (selectTrees points, relative to the best tree), and the cause's prior in
 *          that tree for this evidence (priorsFor).
 *
 *   raw   = text x (FIT_FLOOR + (1 - FIT_FLOOR) x fit) + PRIOR_WEIGHT x fit x prior
 *   score = raw / (raw + HALF_SCORE)           0..1, 0.5 at raw = HALF_SCORE
 */
import { normaliseTerms, findTerm } from '../terms';
import { STOP_WORDS, stem, tokenize } from '../search/text';
import type { WalkEvidence } from './evidence';
import { priorsFor } from './priors';
import { selectTrees } from './select';
import { listCauses, type System, type Tree, type TreeCause } from './tree-schema';

export interface CauseSuggestion {
  /** Global cause id `<treeId>/<causeId>`. */
  cause: string;
  title: string;
  treeId: string;
  treeTitle: string;
  system: System;
  /** 0..1; see the formula above. */
  score: number;
}

export interface CaseText {
  title?: string | null;
  rootCause?: string | null;
  fix?: string | null;
}

export const SUGGEST_WEIGHTS = { rootCause: 1, fix: 0.6, title: 0.5, causeTitle: 1, causeAbout: 0.35 } as const;
const FIT_FLOOR = 0.25;
const PRIOR_WEIGHT = 0.15;
const HALF_SCORE = 0.5;
/** The best suggestion is linked by itself only at this score and with a raw score this many times the next one's. */
export const AUTO_LINK = { minScore: 0.5, lead: 1.3 } as const;

// Workshop words for what the trees call by another name. Common practice, no source.
const WORKSHOP_WORDS: Record<string, string> = {
  loom: 'harness',
  wiring: 'harness',
  wire: 'harness',
  wires: 'harness',
  terminal: 'connector',
  crossed: 'connector',
  swapped: 'connector',
  tooth: 'timing',
  sprocket: 'timing',
  split: 'leak',
  torn: 'leak',
  perished: 'leak',
};

/** Stemmed content words with the J1930 term names added ("MAF" also gives mass, air, flow). */
export function contentStems(text: string): Set<string> {
  const normal = normaliseTerms(text);
  const words = [...tokenize(text), ...tokenize(normal.text)].map((t) => t.lower);
  for (const term of normal.terms) words.push(...tokenize(findTerm(term.to)?.name ?? '').map((t) => t.lower));
  const out = new Set<string>();
  for (const w of words) {
    if (STOP_WORDS.has(w) || w.length < 2 || /^\d+$/.test(w)) continue;
    out.add(stem(w));
    const alias = WORKSHOP_WORDS[w];
    if (alias) out.add(stem(alias));
  }
  return out;
}

interface CauseDoc {
  cause: TreeCause;
  tree: Tree;
  name: Set<string>;
  about: Set<string>;
}

const DOC_CACHE = new WeakMap<Tree, CauseDoc[]>();

function causeDocs(tree: Tree): CauseDoc[] {
  const hit = DOC_CACHE.get(tree);
  if (hit) return hit;
  const docs = listCauses(tree).map((cause) => ({
    cause,
    tree,
    name: contentStems(`${cause.title} ${cause.id.replace(/-/g, ' ')}`),
    about: contentStems(cause.about ?? ''),
  }));
  DOC_CACHE.set(tree, docs);
  return docs;
}

function inverseFrequency(docs: CauseDoc[]): (word: string) => number {
  const df = new Map<string, number>();
  for (const d of docs) for (const w of new Set([...d.name, ...d.about])) df.set(w, (df.get(w) ?? 0) + 1);
  return (w) => Math.log(1 + docs.length / (df.get(w) ?? docs.length));
}

function weightedWords(text: CaseText): Map<string, number> {
  const out = new Map<string, number>();
  const add = (s: string | null | undefined, weight: number) => {
    for (const w of contentStems(s ?? '')) out.set(w, Math.max(out.get(w) ?? 0, weight));
  };
  add(text.rootCause, SUGGEST_WEIGHTS.rootCause);
  add(text.fix, SUGGEST_WEIGHTS.fix);
  add(text.title, SUGGEST_WEIGHTS.title);
  return out;
}

/**
 * How much of the cause's name (and, less, its about text) the write-up says, times the square
 * root of how much of the write-up's tree vocabulary the cause explains: "coil connector not
 * clipped, terminal backed out" names a coil, but the harness cause explains the rest as well.
 */
function textScore(doc: CauseDoc, words: Map<string, number>, idf: (w: string) => number, vocabulary: Set<string>): number {
  const nameMass = [...doc.name].reduce((s, w) => s + idf(w), 0);
  if (nameMass === 0) return 0;
  let hit = 0;
  let explained = 0;
  let said = 0;
  for (const [w, weight] of words) {
    if (!vocabulary.has(w)) continue;
    said += weight * idf(w);
    if (doc.name.has(w)) hit += SUGGEST_WEIGHTS.causeTitle * weight * idf(w);
    else if (doc.about.has(w)) hit += SUGGEST_WEIGHTS.causeAbout * weight * idf(w);
    if (doc.name.has(w) || doc.about.has(w)) explained += weight * idf(w);
  }
  return said > 0 ? (hit / nameMass) * Math.sqrt(explained / said) : 0;
}

/** Tree causes a case most likely describes, best first; causes that cannot apply to the platform are left out. */
export function suggestCauses(trees: Tree[], text: CaseText, ev: WalkEvidence, limit = 5): CauseSuggestion[] {
  const docs = trees.flatMap(causeDocs);
  const idf = inverseFrequency(docs);
  const vocabulary = new Set(docs.flatMap((d) => [...d.name, ...d.about]));
  const words = weightedWords(text);
  const matches = selectTrees(trees, ev);
  const best = matches[0]?.score ?? 0;
  const fit = new Map(matches.map((m) => [m.tree.id, best > 0 ? m.score / best : 0]));
  // priorsFor leaves out the causes that cannot apply to this platform, so the map also filters
  const priors = new Map(trees.flatMap((tree) => priorsFor(tree, ev).map((p) => [p.cause, p.probability] as const)));
  return docs
    .filter((d) => priors.has(d.cause.globalId))
    .map((d) => {
      const treeFit = fit.get(d.tree.id) ?? 0;
      const raw = textScore(d, words, idf, vocabulary) * (FIT_FLOOR + (1 - FIT_FLOOR) * treeFit) + PRIOR_WEIGHT * treeFit * priors.get(d.cause.globalId)!;
      return { doc: d, raw };
    })
    .filter((s) => s.raw > 0)
    .sort((a, b) => b.raw - a.raw || a.doc.cause.globalId.localeCompare(b.doc.cause.globalId))
    .slice(0, limit)
    .map(({ doc, raw }) => ({
      cause: doc.cause.globalId,
      title: doc.cause.title,
      treeId: doc.tree.id,
      treeTitle: doc.tree.title,
      system: doc.cause.system,
      score: Math.round((raw / (raw + HALF_SCORE)) * 1000) / 1000,
    }));
}

const rawOf = (score: number) => (score >= 1 ? Infinity : (HALF_SCORE * score) / (1 - score));

/** The suggestion to link without asking: good enough on its own and clearly ahead of the next. */
export function clearSuggestion(suggestions: readonly CauseSuggestion[]): CauseSuggestion | null {
  const [first, second] = suggestions;
  if (!first || first.score < AUTO_LINK.minScore) return null;
  // compare the raw scores: the 0..1 score flattens the lead between two good matches
  if (second && rawOf(first.score) < AUTO_LINK.lead * rawOf(second.score)) return null;
  return first;
}
