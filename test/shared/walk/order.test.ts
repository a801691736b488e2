import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { expectedCost, expectedMinutes, orderSteps, type Orderable } from '../../../shared/walk';

const step = (id: string, probability: number, costMinutes: number, extra: Partial<Orderable> = {}): Orderable => ({
  id,
  probability,
  costMinutes,
  state: 'open',
  ...extra,
});

// references.md §5 worked check (Kadane & Simon 1977; Heckerman, Breese & Rommelse 1995):
// p = (0.5, 0.3, 0.2), c = (10, 2, 5) minutes.
const worked = [step('1', 0.5, 10), step('2', 0.3, 2), step('3', 0.2, 5)];

function permutations<T>(items: T[]): T[][] {
  if (items.length <= 1) return [items];
  return items.flatMap((item, i) => permutations([...items.slice(0, i), ...items.slice(i + 1)]).map((rest) => [item, ...rest]));
}

describe('orderSteps and expectedCost', () => {
  it('orders the worked example 2, 1, 3 by probability per minute', () => {
    expect(orderSteps(worked).map((s) => s.id)).toEqual(['2', '1', '3']); // references.md §5
  });

  it('gives an expected 10.0 minutes in p/c order, 12.0 by likelihood and 10.5 by cost alone', () => {
    const minutes = expectedMinutes(worked);
    expect(minutes.recommended).toBeCloseTo(10.0, 9); // references.md §5
    expect(minutes.byLikelihood).toBeCloseTo(12.0, 9); // references.md §5
    const byCost = [...worked].sort((a, b) => a.costMinutes - b.costMinutes);
    expect(expectedCost(byCost)).toBeCloseTo(10.5, 9); // references.md §5
  });

  it('breaks a tie in p/c towards the more likely cause, then by id', () => {
    const tied = [step('b', 0.2, 2), step('a', 0.1, 1), step('c', 0.2, 2)];
    expect(orderSteps(tied).map((s) => s.id)).toEqual(['b', 'c', 'a']);
  });

  it('lists done steps after the open ones, in the order they were marked', () => {
    const steps = [
      step('x', 0, 5, { state: 'tested', markOrder: 2 }),
      step('y', 0.6, 10),
      step('z', 0, 1, { state: 'ruled_out', markOrder: 1 }),
      step('w', 0.4, 2),
    ];
    expect(orderSteps(steps).map((s) => s.id)).toEqual(['w', 'y', 'z', 'x']);
  });

  it('counts only open steps in the expected minutes', () => {
    const steps = [step('a', 1, 4), step('b', 0, 30, { state: 'tested', markOrder: 1 })];
    expect(expectedMinutes(steps)).toEqual({ recommended: 4, byLikelihood: 4 });
  });

  it('is never beaten by any other order (brute force over all permutations, n <= 6)', () => {
    // Optimality of the p/c rule for a single fault with conclusive tests (references.md §5).
    const cases = fc
      .array(fc.record({ w: fc.double({ min: 0.01, max: 10, noNaN: true }), c: fc.double({ min: 0.5, max: 60, noNaN: true }) }), {
        minLength: 1,
        maxLength: 6,
      })
      .map((raw) => {
        const total = raw.reduce((sum, r) => sum + r.w, 0);
        return raw.map((r, i) => step(`s${i}`, r.w / total, r.c));
      });
    fc.assert(
      fc.property(cases, (steps) => {
        const best = Math.min(...permutations(steps).map(expectedCost));
        expect(expectedCost(orderSteps(steps))).toBeLessThanOrEqual(best + 1e-9);
      }),
      { numRuns: 300 },
    );
  });
});
