import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { stem, withinOneEdit, wordsMatch } from '../../../shared/search/text';

/** Optimal string alignment distance by the textbook table (Damerau's restricted edit distance). */
function osaDistance(a: string, b: string): number {
  const d = Array.from({ length: a.length + 1 }, (_, i) => Array.from({ length: b.length + 1 }, (_, j) => (i === 0 ? j : j === 0 ? i : 0)));
  for (let i = 1; i <= a.length; i++) {
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      d[i]![j] = Math.min(d[i - 1]![j]! + 1, d[i]![j - 1]! + 1, d[i - 1]![j - 1]! + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) d[i]![j] = Math.min(d[i]![j]!, d[i - 2]![j - 2]! + 1);
    }
  }
  return d[a.length]![b.length]!;
}

describe('withinOneEdit', () => {
  it.each([
    ['idle', 'idle', true],
    ['idle', 'idel', true], // neighbours swapped
    ['hesitation', 'hesitaton', true], // one letter missing
    ['misfire', 'missfire', true], // one letter extra
    ['rattle', 'rettle', true], // one letter wrong
    ['rattle', 'rottla', false],
    ['whine', 'whistle', false],
    ['', 'a', true],
    ['ab', 'ba', true],
    ['abc', 'cab', false],
  ])('%s / %s -> %s', (a, b, expected) => {
    expect(withinOneEdit(a, b)).toBe(expected);
    expect(withinOneEdit(b, a)).toBe(expected);
  });

  it('agrees with the optimal string alignment distance on random words', () => {
    const word = fc.string({ unit: fc.constantFrom('a', 'b', 'c', 'd'), maxLength: 7 });
    fc.assert(fc.property(word, word, (a, b) => withinOneEdit(a, b) === osaDistance(a, b) <= 1), { numRuns: 5000 });
  });
});

describe('wordsMatch', () => {
  it('allows inflection and, from 5 letters, one typo', () => {
    expect(wordsMatch('shaking', 'shakes')).toBe(true);
    expect(stem('whistling')).toBe(stem('whistle'));
    expect(wordsMatch('hesitaton', 'hesitation')).toBe(true);
    expect(wordsMatch('idel', 'idle')).toBe(false); // too short for a typo
    expect(wordsMatch('whine', 'whistle')).toBe(false);
  });
});
