import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { findDtcMentions, findDtcsInText } from '../../../shared/codes';
import { validCode } from './arbitraries';

const fulls = (text: string) => findDtcsInText(text).map((d) => d.full);

describe('findDtcsInText', () => {
  it('finds every code in order of first mention', () => {
    expect(fulls('Came in with P0302 and P0171; after the plug swap P0305 set.')).toEqual(['P0302', 'P0171', 'P0305']);
  });

  it('deduplicates by full form', () => {
    expect(fulls('P0302, P0302 again, then P0302-13')).toEqual(['P0302', 'P0302-13']);
  });

  it('reads the hyphen FTB form and normalises case', () => {
    expect(findDtcsInText('logged p0420-1a twice')).toEqual([{ code: 'P0420', ftb: '1A', full: 'P0420-1A' }]);
  });

  it('does not read a number after a space as an FTB', () => {
    expect(fulls('P0302 13 times on the road test')).toEqual(['P0302']);
  });

  it('skips codes glued to letters or digits', () => {
    expect(fulls('XP0301Y P03011 1P0301 part AB-P0301Z')).toEqual([]);
  });

  it('skips code-like runs inside a VIN', () => {
    // VIN example from 49 CFR 565 (references.md §3) contains no standalone code
    expect(fulls('VIN 1G4AH59H45G118341 logged')).toEqual([]);
    expect(fulls('VIN1P0301ABC12345678')).toEqual([]);
  });

  it('finds codes next to punctuation and brackets', () => {
    expect(fulls('(P0300),[U0100];"C0035".B0001:')).toEqual(['P0300', 'U0100', 'C0035', 'B0001']);
  });

  it('does not take an invalid second character or non-hex', () => {
    expect(fulls('P4300 P03G0 Q0300')).toEqual([]);
  });

  it('keeps the range end when codes are written as a range', () => {
    expect(fulls('P0300-P0312 cover misfire')).toEqual(['P0300', 'P0312']);
  });

  it('returns nothing for empty text', () => {
    expect(findDtcsInText('')).toEqual([]);
  });

  it('reports positions of each mention', () => {
    const m = findDtcMentions('a P0302-13 b P0171');
    expect(m.map((x) => [x.index, x.length])).toEqual([
      [2, 8],
      [13, 5],
    ]);
  });

  it('finds any valid code placed between words', () => {
    fc.assert(
      fc.property(validCode, (code) => {
        expect(fulls(`noted ${code.toLowerCase()} today`)).toEqual([code]);
      }),
    );
  });
});
