import { describe, expect, it } from 'vitest';
import { cylinderForMisfireCode, isMisfireCode, misfireCodeForCylinder } from '../../../shared/codes';

// P0300 random/multiple, P0301..P0312 cylinder N (references.md §1).
describe('misfire codes', () => {
  it.each([
    [1, 'P0301'],
    [5, 'P0305'],
    [10, 'P0310'],
    [12, 'P0312'],
  ])('cylinder %i -> %s and back', (cyl, code) => {
    expect(misfireCodeForCylinder(cyl)).toBe(code);
    expect(cylinderForMisfireCode(code)).toBe(cyl);
  });

  it.each([0, 13, -1, 2.5, Number.NaN])('cylinder %s has no generic misfire code', (cyl) => {
    expect(misfireCodeForCylinder(cyl)).toBeNull();
  });

  it('P0300 is a misfire code but names no cylinder', () => {
    expect(isMisfireCode('P0300')).toBe(true);
    expect(cylinderForMisfireCode('P0300')).toBeNull();
  });

  it.each(['P0313', 'P030A', 'P0171', 'P1301', 'C0301', 'junk'])('%s is not a cylinder misfire code', (code) => {
    expect(isMisfireCode(code)).toBe(false);
    expect(cylinderForMisfireCode(code)).toBeNull();
  });

  it('reads codes with an FTB or in lower case', () => {
    expect(cylinderForMisfireCode('p0306-00')).toBe(6);
    expect(isMisfireCode(' P0311 ')).toBe(true);
  });

  it('every cylinder 1-12 maps to a distinct code that maps back', () => {
    const codes = Array.from({ length: 12 }, (_, i) => misfireCodeForCylinder(i + 1));
    expect(new Set(codes).size).toBe(12);
    codes.forEach((c, i) => expect(cylinderForMisfireCode(c ?? '')).toBe(i + 1));
  });
});
