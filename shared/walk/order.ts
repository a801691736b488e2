/**
 * Test order for a single fault among independent causes with conclusive tests:
 * descending probability per minute (p/c) minimises the expected cost
 * (Kadane & Simon 1977; Heckerman, Breese & Rommelse 1995; references.md §5).
 */
export type StepState = 'open' | 'tested' | 'ruled_out';

export interface Orderable {
  id: string;
  probability: number;
  costMinutes: number;
  state: StepState;
  /** Sequence of the mark that closed the step; done steps are listed in this order. */
  markOrder?: number;
}

const ratio = (s: { probability: number; costMinutes: number }) => s.probability / s.costMinutes;

/** p/c descending; ties to the more likely cause, then by id so the order is stable. */
export function compareByRatio(a: Orderable, b: Orderable): number {
  return ratio(b) - ratio(a) || b.probability - a.probability || a.id.localeCompare(b.id);
}

export function orderSteps<T extends Orderable>(steps: readonly T[]): T[] {
  const open = steps.filter((s) => s.state === 'open').sort(compareByRatio);
  const done = steps
    .filter((s) => s.state !== 'open')
    .sort((a, b) => (a.markOrder ?? 0) - (b.markOrder ?? 0) || a.id.localeCompare(b.id));
  return [...open, ...done];
}

/** ECR = sum_k c_k x (1 - sum_{j<k} p_j): each test is paid for if the fault was not found earlier. */
export function expectedCost(order: readonly { probability: number; costMinutes: number }[]): number {
  let found = 0;
  let cost = 0;
  for (const step of order) {
    cost += step.costMinutes * Math.max(0, 1 - found);
    found += step.probability;
  }
  return cost;
}

export interface ExpectedMinutes {
  /** Open steps in p/c order. */
  recommended: number;
  /** Open steps most likely first, ignoring how long each test takes. */
  byLikelihood: number;
}

export function expectedMinutes(steps: readonly Orderable[]): ExpectedMinutes {
  const open = steps.filter((s) => s.state === 'open');
  const byLikelihood = [...open].sort((a, b) => b.probability - a.probability || a.id.localeCompare(b.id));
  return { recommended: expectedCost([...open].sort(compareByRatio)), byLikelihood: expectedCost(byLikelihood) };
}
