// Leave-one-out replay of a shop's confirmed, linked cases (npm run bench:walks): each case's
// evidence starts a walk with the other cases as the shop's history, and we record where its
// true cause lands and how many minutes of testing it takes to reach it, under three policies.
import {
  evidenceFrom,
  scoreHistory,
  selectTrees,
  startWalk,
  type ConfirmedCase,
  type HistoryCase,
  type Step,
  type Tree,
} from '../../shared/walk';

export const POLICIES = ['tree-priors', 'learned', 'most-likely-first'] as const;
export type Policy = (typeof POLICIES)[number];

export const POLICY_LABELS: Record<Policy, string> = {
  'tree-priors': '(i) tree priors only, p/c order',
  learned: '(ii) learned priors, p/c order',
  'most-likely-first': '(iii) learned priors, most likely first',
};

export interface ReplayResult {
  caseId: HistoryCase['caseId'];
  cause: string;
  treeId: string;
  /** 1-based position of the true cause in the walk's order, or null when the walk's tree lacks it. */
  rank: Record<Policy, number | null>;
  /** Minutes of testing until the true cause's test is done (every step when it is not in the walk). */
  minutes: Record<Policy, number>;
}

function position(steps: Step[], cause: string): { rank: number | null; minutes: number } {
  let minutes = 0;
  for (const [i, s] of steps.entries()) {
    minutes += s.costMinutes;
    if (s.cause === cause) return { rank: i + 1, minutes };
  }
  return { rank: null, minutes };
}

const byLikelihood = (steps: Step[]) => [...steps].sort((a, b) => b.probability - a.probability || a.id.localeCompare(b.id));

export function replayCase(trees: Tree[], target: HistoryCase & { cause: string }, others: HistoryCase[]): ReplayResult | null {
  const ev = evidenceFrom(target, target.platform);
  const best = selectTrees(trees, ev)[0];
  if (!best) return null;
  const tree = best.tree;
  const history: ConfirmedCase[] = scoreHistory(ev, target.platform, others).flatMap((c) =>
    c.cause?.startsWith(`${tree.id}/`) ? [{ caseId: c.caseId, title: c.title, cause: c.cause, similarity: c.similarity }] : [],
  );
  const plain = startWalk(tree, ev).steps;
  const learned = startWalk(tree, ev, { confirmedCases: history }).steps;
  const orders: Record<Policy, Step[]> = { 'tree-priors': plain, learned, 'most-likely-first': byLikelihood(learned) };
  const rank = {} as ReplayResult['rank'];
  const minutes = {} as ReplayResult['minutes'];
  for (const p of POLICIES) ({ rank: rank[p], minutes: minutes[p] } = position(orders[p], target.cause));
  return { caseId: target.caseId, cause: target.cause, treeId: tree.id, rank, minutes };
}

/** Every confirmed case with a cause, replayed against all the others. */
export function replayAll(trees: Tree[], confirmed: HistoryCase[]): ReplayResult[] {
  return confirmed.flatMap((c) => {
    if (!c.cause) return [];
    const result = replayCase(trees, { ...c, cause: c.cause }, confirmed.filter((o) => o.caseId !== c.caseId));
    return result ? [result] : [];
  });
}

export interface PolicySummary {
  policy: Policy;
  inFirstThree: number;
  meanRank: number;
  meanMinutes: number;
  notInWalk: number;
}

export function summarise(results: ReplayResult[]): PolicySummary[] {
  return POLICIES.map((policy) => {
    const ranks = results.map((r) => r.rank[policy]);
    const found = ranks.filter((r): r is number => r !== null);
    return {
      policy,
      inFirstThree: ranks.filter((r) => r !== null && r <= 3).length / results.length,
      meanRank: found.reduce((a, b) => a + b, 0) / found.length,
      meanMinutes: results.reduce((a, r) => a + r.minutes[policy], 0) / results.length,
      notInWalk: ranks.length - found.length,
    };
  });
}
