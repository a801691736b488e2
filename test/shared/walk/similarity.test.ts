import { describe, expect, it } from 'vitest';
import { caseSimilarity, codeSimilarity, FAMILY_CREDIT } from '../../../shared/walk';

const walk = { codes: ['P0302', 'P0305'], symptoms: ['rough-idle'], context: ['after-timing-work'] };

describe('codeSimilarity', () => {
  it('is 1 for the same codes and ignores the failure-type suffix', () => {
    expect(codeSimilarity(['P0302', 'P0305'], ['P0305-00', 'P0302'])).toBe(1);
  });

  it('gives family credit when the codes differ but the family is shared', () => {
    // P0302/P0305 vs P0304: no code in common, family P030 shared
    expect(codeSimilarity(['P0302', 'P0305'], ['P0304'])).toBeCloseTo(FAMILY_CREDIT, 12);
  });

  it('is 0 for codes of another family', () => {
    expect(codeSimilarity(['P0302'], ['U0100'])).toBe(0);
  });
});

describe('caseSimilarity', () => {
  it('is 1 for the same codes, platform and tags', () => {
    expect(caseSimilarity(walk, walk, 1)).toBe(1);
  });

  it('leaves the platform out when the walk has none, instead of counting it as a mismatch', () => {
    expect(caseSimilarity(walk, walk, null)).toBe(1);
    expect(caseSimilarity(walk, walk, 0)).toBeLessThan(1);
  });

  it('is 0 for a case that shares nothing, so learning ignores it', () => {
    expect(caseSimilarity(walk, { codes: ['C0035'], symptoms: ['pulls-left'], context: [] }, 0)).toBe(0);
  });

  it('ranks a same-platform case with the same codes above one on another engine with a related code', () => {
    const close = caseSimilarity(walk, { codes: ['P0302', 'P0305'], symptoms: ['rough-idle'], context: [] }, 1);
    const far = caseSimilarity(walk, { codes: ['P0304'], symptoms: ['misfire'], context: [] }, 0.3);
    expect(close).toBeGreaterThan(far);
    expect(far).toBeGreaterThan(0);
  });
});
