import type { CaseId, CausePrior } from './priors';

export interface ConfirmedCase {
  caseId: CaseId;
  title: string;
  /** Global cause id `<treeId>/<causeId>` of the confirmed fix. */
  cause: string;
  /** How close the case is to this walk's evidence, 0..1. */
  similarity: number;
}

export interface LearnOptions {
  /**
   * How many fully similar cases the tree's priors are worth. With the default 5,
   * one case can move a cause by at most 1/6 of the probability mass.
   */
  strength?: number;
}

export const DEFAULT_STRENGTH = 5;

const clamp01 = (x: number) => (Number.isFinite(x) ? Math.min(1, Math.max(0, x)) : 0);

const plural = (n: number) => (n === 1 ? '1 confirmed fix in this shop' : `${n} confirmed fixes in this shop`);

/**
 * Posterior mean of a Dirichlet whose pseudo-counts are the priors scaled by
 * `strength` (a), after observing similarity-weighted counts n_i:
 *
 *   p_i' = (a * p_i + n_i) / (a + N),   n_i = sum of similarity over cases confirming i,  N = sum of n_i
 *
 * Cases whose cause is not among the priors (another tree, or a cause that does
 * not apply to this platform) are ignored; each case counts once.
 */
export function learnFromCases(priors: CausePrior[], cases: ConfirmedCase[], options: LearnOptions = {}): CausePrior[] {
  const strength = options.strength ?? DEFAULT_STRENGTH;
  if (!(strength > 0)) throw new RangeError('strength must be positive');
  const known = new Set(priors.map((p) => p.cause));
  const seen = new Set<string>();
  const counts = new Map<string, number>();
  const refs = new Map<string, ConfirmedCase[]>();
  for (const c of cases) {
    const key = `${typeof c.caseId}:${c.caseId}`;
    const weight = clamp01(c.similarity);
    if (!known.has(c.cause) || seen.has(key) || weight === 0) continue;
    seen.add(key);
    counts.set(c.cause, (counts.get(c.cause) ?? 0) + weight);
    refs.set(c.cause, [...(refs.get(c.cause) ?? []), c]);
  }
  const total = [...counts.values()].reduce((a, b) => a + b, 0);
  if (total === 0) return priors;
  return priors.map((p) => {
    const supporting = (refs.get(p.cause) ?? []).sort((a, b) => b.similarity - a.similarity);
    const probability = (strength * p.probability + (counts.get(p.cause) ?? 0)) / (strength + total);
    return {
      ...p,
      probability,
      why: supporting.length > 0 ? [...p.why, plural(supporting.length)] : p.why,
      evidence: [...p.evidence, ...supporting.map(({ caseId, title }) => ({ caseId, title }))],
    };
  });
}
