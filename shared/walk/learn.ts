import type { CaseId, CausePrior } from './priors';

const clamp01 = (x: number) => (Number.isFinite(x) ? Math.min(1, Math.max(0, x)) : 0);

export interface ConfirmedCase {
  caseId: CaseId;
  title: string;
  /** Global cause id `<treeId>/<causeId>` of the confirmed fix. */
  cause: string;
  /** How close the case is to this walk's evidence, 0..1. */
  similarity: number;
}

export interface LearnOptions {
  /** How many pseudo-counts the tree's priors are worth (the Dirichlet's total a). */
  strength?: number;
}

export const DEFAULT_STRENGTH = 5;

/**
 * How much one case counts, from its similarity s: PRECEDENT_COUNT x s^SHARPNESS.
 * Sharp on purpose: the shop's own exact precedent (s = 1) is worth 12 counts, more than twice
 * the tree's whole prior (a = 5); s = 0.9 is worth 5.2, s = 0.8 2.0, s = 0.7 0.7, and a
 * same-family case on another engine (s about 0.5-0.6) 0.05-0.2, so it only nudges.
 * Chosen against `npm run bench:walks` (docs/performance.md) and the VT27 precedent test.
 */
export const PRECEDENT_COUNT = 12;
export const SHARPNESS = 8;

export const caseWeight = (similarity: number): number => PRECEDENT_COUNT * clamp01(similarity) ** SHARPNESS;

const plural = (n: number) => (n === 1 ? '1 confirmed fix in this shop' : `${n} confirmed fixes in this shop`);

/**
 * Posterior mean of a Dirichlet whose pseudo-counts are the priors scaled by
 * `strength` (a), after observing similarity-weighted counts n_i:
 *
 *   p_i' = (a * p_i + n_i) / (a + N),   n_i = sum of caseWeight(similarity) over cases confirming i,  N = sum of n_i
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
    const weight = caseWeight(c.similarity);
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
