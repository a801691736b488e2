import { describe, expect, it } from 'vitest';
import { describeFtb } from '../../../shared/codes';

describe('describeFtb', () => {
  // FTB examples and high-nibble groups: SAE J2012-DA, references.md §1 [S, secondary].
  it.each([
    ['11', 'general electrical', /short to ground/],
    ['12', 'general electrical', /short to battery/],
    ['13', 'general electrical', /^circuit open$/],
    ['15', 'general electrical', /short to battery or open/],
    ['1F', 'general electrical', /intermittent/],
    ['31', 'FM/PWM', /no signal/],
    ['64', 'algorithm based', /plausibility/],
    ['71', 'mechanical', /actuator stuck/],
    ['87', 'bus signal', /missing message/],
    ['96', 'component', /component internal failure/],
  ])('0x%s: %s, %s', (ftb, category, meaning) => {
    const d = describeFtb(ftb);
    expect(d.value).toBe(ftb);
    expect(d.category).toContain(category);
    expect(d.meaning).toMatch(meaning);
  });

  it('0x15 is "short to battery or open", not plain "open"', () => {
    // references.md §1 warns about this one
    expect(describeFtb('15').meaning).not.toBe(describeFtb('13').meaning);
  });

  it.each([
    ['00', 'general failure information'],
    ['2F', 'general signal'],
    ['42', 'system internal'],
    ['51', 'system programming'],
    ['F3', 'manufacturer specific'],
    ['A0', 'reserved'],
  ])('high nibble of %s is %s', (ftb, category) => {
    expect(describeFtb(ftb).category).toContain(category);
  });

  it('accepts numbers, lower case and a 0x prefix', () => {
    expect(describeFtb(0x13)).toEqual(describeFtb('13'));
    expect(describeFtb(0x1f).value).toBe('1F');
    expect(describeFtb('1f')).toEqual(describeFtb('1F'));
    expect(describeFtb('0x64')).toEqual(describeFtb('64'));
    expect(describeFtb(0).value).toBe('00');
  });

  it('gives a category but no meaning for unlisted bytes', () => {
    expect(describeFtb('F7')).toEqual({ value: 'F7', category: 'manufacturer specific', meaning: null });
  });

  it.each(['1', '123', 'GG', '', 256, -1, 1.5])('rejects %j', (bad) => {
    expect(() => describeFtb(bad)).toThrow(RangeError);
  });
});
