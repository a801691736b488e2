// The search's text index must score exactly as MiniSearch does (same BM25+,
// boosts, prefix and fuzzy weights), only faster. Reference: a MiniSearch
// instance over the same documents with the same options.
import MiniSearch from 'minisearch';
import { describe, expect, it } from 'vitest';
import { readDemoPlatforms } from '../../server/seed/demo-files';
import { generateCase, mulberry32 } from '../../server/search/bench-corpus';
import { indexTerm, MATCH_WEIGHTS, TEXT_FIELDS, textFieldsOf } from '../../server/search/text-fields';
import { TextIndex, type TextGroupQuery } from '../../server/search/text-index';

interface Doc { id: number; title: string; notes: string }

const platforms = readDemoPlatforms('content');

function corpus(n: number, seed: number): Doc[] {
  const rand = mulberry32(seed);
  return Array.from({ length: n }, (_, i) => {
    const [title, notes] = textFieldsOf(generateCase(rand, platforms));
    return { id: i + 1, title: title!, notes: notes! };
  });
}

function reference(docs: Doc[]): MiniSearch<Doc> {
  const mini = new MiniSearch<Doc>({ fields: ['title', 'notes'], storeFields: [], processTerm: (t) => indexTerm(t) });
  mini.addAll(docs);
  return mini;
}

function ours(docs: Doc[]): TextIndex {
  const index = new TextIndex(TEXT_FIELDS, indexTerm, MATCH_WEIGHTS);
  // slots are the ids here, so hits compare directly
  for (const d of docs) index.add(d.id, [d.title, d.notes]);
  return index;
}

type Case = { words: string[]; combine: 'AND' | 'OR'; prefix?: boolean; fuzzy?: boolean };

function miniScores(mini: MiniSearch<Doc>, c: Case): Map<number, number> {
  const results = mini.search(
    {
      combineWith: c.combine,
      queries: c.words.map((w, i) => ({
        combineWith: 'OR' as const,
        queries: [w],
        prefix: c.prefix && i === c.words.length - 1,
        fuzzy: c.fuzzy ? 0.2 : false,
      })),
    },
    { boost: { title: 2, notes: 1 }, weights: MATCH_WEIGHTS },
  );
  return new Map(results.map((r) => [r.id as number, r.score]));
}

function ourScores(index: TextIndex, c: Case): Map<number, number> {
  const groups: TextGroupQuery[] = c.words.map((w, i) => ({
    words: [w],
    prefix: c.prefix && i === c.words.length - 1 ? () => true : undefined,
    fuzzy: c.fuzzy ? () => 0.2 : undefined,
  }));
  return new Map(index.search(groups, c.combine, 1_000_000).map((h) => [h.slot, h.score]));
}

function expectSameScores(actual: Map<number, number>, expected: Map<number, number>) {
  expect([...actual.keys()].sort((a, b) => a - b)).toEqual([...expected.keys()].sort((a, b) => a - b));
  for (const [id, score] of expected) expect(actual.get(id)).toBeCloseTo(score, 9);
}

const CASES: Case[] = [
  { words: ['coil'], combine: 'AND' },
  { words: ['coil', 'cracked'], combine: 'AND' },
  { words: ['coil', 'cracked'], combine: 'OR' },
  { words: ['charge', 'pipe', 'coupler', 'split'], combine: 'AND' },
  { words: ['wastegate', 'rattle', 'stuck', 'open'], combine: 'OR' },
  { words: ['hesitaton'], combine: 'AND', fuzzy: true }, // one typo
  { words: ['injektor', 'leaking'], combine: 'AND', fuzzy: true },
  { words: ['intake', 'mani'], combine: 'AND', prefix: true }, // still typing
  { words: ['vacuum', 'le'], combine: 'OR', prefix: true, fuzzy: true },
  { words: ['nothingmatchesthis'], combine: 'OR', fuzzy: true },
];

describe('text index against MiniSearch (same documents, same options)', () => {
  const docs = corpus(1500, 20261202);
  const mini = reference(docs);
  const index = ours(docs);

  it.each(CASES)('scores $words ($combine) as MiniSearch does', (c) => {
    const expected = miniScores(mini, c);
    if (c.words[0] !== 'nothingmatchesthis') expect(expected.size).toBeGreaterThan(0);
    expectSameScores(ourScores(index, c), expected);
  });

  it('after removals and re-adds, scores as a MiniSearch built on what is left', () => {
    const live = new Map(docs.map((d) => [d.id, d]));
    const edited = ours(docs);
    const rand = mulberry32(7);
    for (let i = 0; i < 400; i++) {
      const id = 1 + Math.floor(rand() * docs.length);
      if (rand() < 0.5) {
        edited.remove(id);
        live.delete(id);
      } else {
        // an edit: the same slot gets another case's text
        const other = docs[Math.floor(rand() * docs.length)]!;
        const doc = { ...other, id };
        edited.add(id, [doc.title, doc.notes]);
        live.set(id, doc);
      }
    }
    expect(edited.size).toBe(live.size);
    const fresh = reference([...live.values()]);
    for (const c of CASES) expectSameScores(ourScores(edited, c), miniScores(fresh, c));
  });

  it('keeps the best hits first and reports which groups each matched', () => {
    const groups: TextGroupQuery[] = [{ words: ['coil'] }, { words: ['cracked'] }];
    const hits = index.search(groups, 'OR', 50);
    expect(hits).toHaveLength(50);
    for (let i = 1; i < hits.length; i++) expect(hits[i - 1]!.score).toBeGreaterThanOrEqual(hits[i]!.score);
    const all = [...miniScores(mini, { words: ['coil', 'cracked'], combine: 'OR' }).values()].sort((a, b) => b - a);
    expect(hits[0]!.score).toBeCloseTo(all[0]!, 9);
    // both words matched: bits 0 and 1
    expect(hits[0]!.groups).toBe(0b11);
  });

  it('drops a term from the dictionary when its last note goes', () => {
    const small = new TextIndex(TEXT_FIELDS, indexTerm, MATCH_WEIGHTS);
    small.add(0, ['Glowplug relay stuck', 'relay replaced']);
    small.add(1, ['Coolant leak', 'hose clip']);
    expect(small.knows('glowplug')).toBe(true);
    small.remove(0);
    expect(small.knows('glowplug')).toBe(false);
    expect(small.search([{ words: ['glowplug'] }], 'OR', 10)).toEqual([]);
    expect(small.search([{ words: ['coolant'] }], 'OR', 10).map((h) => h.slot)).toEqual([1]);
  });
});

describe('text index, words no note holds', () => {
  it('leaves them out of an AND instead of failing every note', () => {
    const index = new TextIndex(TEXT_FIELDS, indexTerm, MATCH_WEIGHTS);
    index.add(0, ['Weak lift pump, lean on both banks', 'pump replaced']);
    index.add(1, ['Lean at idle', 'intake gasket']);
    const groups = ['weak', 'pump', 'lean', 'zzyzx'].map((w) => ({ words: [w] }));
    expect(index.search(groups, 'AND', 10).map((h) => h.slot)).toEqual([0]);
    // a word the index does know still has to match
    expect(index.search([{ words: ['gasket'] }, { words: ['pump'] }], 'AND', 10)).toEqual([]);
  });
});
