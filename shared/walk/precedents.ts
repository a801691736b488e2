/**
 * Precedents: the shop's confirmed cases that match a walk closely enough to show
 * before the first step ("Seen before on this engine: ..."). The same similarity
 * feeds learnFromCases, so a precedent shown here is also what lifts its cause.
 */
import type { CaseId } from './priors';

export interface PrecedentCandidate {
  caseId: CaseId;
  title: string;
  /** Global cause id, or null when the case was never linked to a tree cause. */
  cause: string | null;
  similarity: number;
}

export interface Precedent extends PrecedentCandidate {
  /** The cause's title in the walk's tree, when the cause is one of its steps. */
  causeTitle: string | null;
  /** Whether the case was on the same engine as the walk. */
  sameEngine: boolean;
}

/** Below this a case is only "related": it still teaches the walk a little, but is not shown as seen before. */
export const PRECEDENT_MIN_SIMILARITY = 0.7;
export const MAX_PRECEDENTS = 3;

/** Closest first (ties by case id so the list is stable), at most MAX_PRECEDENTS. */
export function pickPrecedents<C extends PrecedentCandidate>(cases: readonly C[]): C[] {
  return cases
    .filter((c) => c.similarity >= PRECEDENT_MIN_SIMILARITY)
    .sort((a, b) => b.similarity - a.similarity || String(a.caseId).localeCompare(String(b.caseId)))
    .slice(0, MAX_PRECEDENTS);
}
