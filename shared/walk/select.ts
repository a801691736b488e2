import { codeMatches, normaliseCode, normaliseTag, platformIs, type WalkEvidence } from './evidence';
import type { Tree } from './tree-schema';

export interface TreeMatch {
  tree: Tree;
  score: number;
  reasons: string[];
}

/** A code named outright in a tree counts more than one caught by a family pattern. */
export const SELECT_POINTS = { exactCode: 3, familyCode: 2, symptom: 1, context: 1 } as const;

function codePoints(tree: Tree, code: string): number {
  const patterns = tree.appliesTo.codes.filter((p) => codeMatches(p, code));
  if (patterns.length === 0) return 0;
  return patterns.some((p) => !p.includes('*') && !p.includes('?')) ? SELECT_POINTS.exactCode : SELECT_POINTS.familyCode;
}

function excludedByPlatform(tree: Tree, ev: WalkEvidence): boolean {
  const { fuel, induction, layout } = tree.appliesTo;
  return (
    (fuel !== undefined && platformIs(ev, 'fuel', fuel) === false) ||
    (induction !== undefined && platformIs(ev, 'induction', induction) === false) ||
    (layout !== undefined && platformIs(ev, 'layout', layout) === false)
  );
}

function scoreTree(tree: Tree, ev: WalkEvidence): TreeMatch {
  let score = 0;
  const reasons: string[] = [];
  for (const code of new Set(ev.codes.map(normaliseCode))) {
    const points = codePoints(tree, code);
    if (points > 0) reasons.push(`code ${code}`);
    score += points;
  }
  const symptoms = new Set(tree.appliesTo.symptoms);
  for (const s of new Set(ev.symptoms.map(normaliseTag))) {
    if (symptoms.has(s)) {
      score += SELECT_POINTS.symptom;
      reasons.push(`symptom ${s}`);
    }
  }
  const context = new Set(tree.appliesTo.context);
  for (const c of new Set(ev.context.map(normaliseTag))) {
    if (context.has(c)) {
      score += SELECT_POINTS.context;
      reasons.push(`context ${c}`);
    }
  }
  return { tree, score, reasons };
}

/** Trees whose codes, symptoms or context match the evidence, best match first (ties by id). */
export function selectTrees(trees: Tree[], ev: WalkEvidence): TreeMatch[] {
  return trees
    .filter((tree) => !excludedByPlatform(tree, ev))
    .map((tree) => scoreTree(tree, ev))
    .filter((m) => m.score > 0)
    .sort((a, b) => b.score - a.score || a.tree.id.localeCompare(b.tree.id));
}
