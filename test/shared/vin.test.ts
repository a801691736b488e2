import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  checkVin,
  MODEL_YEAR_CODES,
  modelYearCandidates,
  modelYearCode,
  vinCharValue,
  vinCheckDigit,
  followsNorthAmericanRules,
  vinSchema,
  vinWeightedSum,
} from '../../shared/vin';

const VIN_CHARS = 'ABCDEFGHJKLMNPRSTUVWXYZ0123456789'.split('');

/** Puts the computed check digit into position 9. */
function withCheckDigit(vin: string): string {
  return vin.slice(0, 8) + vinCheckDigit(vin) + vin.slice(9);
}

describe('vinCheckDigit (49 CFR 565.15(c))', () => {
  it('1M8GDM9AXKP042788 computes X (sum 351)', () => {
    // common textbook example, references.md §3 [S]: 351 mod 11 = 10 -> X
    expect(vinWeightedSum('1M8GDM9AXKP042788')).toBe(351);
    expect(vinCheckDigit('1M8GDM9AXKP042788')).toBe('X');
  });

  it('1G4AH59H45G118341 computes 4 (sum 411)', () => {
    // older CFR Table V example, references.md §3 [S]: 411 mod 11 = 4
    expect(vinWeightedSum('1G4AH59H45G118341')).toBe(411);
    expect(vinCheckDigit('1G4AH59H45G118341')).toBe('4');
  });

  it('11111111111111111 is its own check digit', () => {
    // references.md §3 [C]: the weights sum to 89, and 89 mod 11 = 1
    expect(vinWeightedSum('11111111111111111')).toBe(89);
    expect(vinCheckDigit('11111111111111111')).toBe('1');
  });

  it('ignores whatever is in position 9', () => {
    expect(vinCheckDigit('1M8GDM9A0KP042788')).toBe('X');
  });

  it('transliterates letters as the regulation lists them', () => {
    // 49 CFR 565.15(c) table, references.md §3
    const table: Record<string, number> = {
      A: 1, B: 2, C: 3, D: 4, E: 5, F: 6, G: 7, H: 8, J: 1, K: 2, L: 3, M: 4, N: 5,
      P: 7, R: 9, S: 2, T: 3, U: 4, V: 5, W: 6, X: 7, Y: 8, Z: 9,
    };
    for (const [ch, v] of Object.entries(table)) expect(vinCharValue(ch), ch).toBe(v);
    expect(vinCharValue('7')).toBe(7);
    expect(vinCharValue('I')).toBeNull();
    expect(vinCharValue('O')).toBeNull();
    expect(vinCharValue('Q')).toBeNull();
  });

  it('throws on the wrong length or a forbidden character', () => {
    expect(() => vinCheckDigit('1M8GDM9AXKP04278')).toThrow(RangeError);
    expect(() => vinCheckDigit('1M8GDM9AXKP04278O')).toThrow(/position 17/);
  });
});

describe('checkVin', () => {
  it('accepts the published examples and splits WMI, VDS, VIS', () => {
    // references.md §3: WMI 1-3, VDS 4-8, check digit 9, VIS 10-17
    const r = checkVin('1M8GDM9AXKP042788');
    expect(r).toMatchObject({
      vin: '1M8GDM9AXKP042788',
      valid: true,
      checkDigit: 'X',
      expectedCheckDigit: 'X',
      wmi: '1M8',
      vds: 'GDM9A',
      vis: 'KP042788',
      errors: [],
    });
    expect(checkVin('1G4AH59H45G118341').valid).toBe(true);
    expect(checkVin('11111111111111111').valid).toBe(true);
  });

  it('normalises case and whitespace', () => {
    const r = checkVin('  1g4ah59h45 g118341\n');
    expect(r.vin).toBe('1G4AH59H45G118341');
    expect(r.valid).toBe(true);
  });

  it('accepts a check digit mismatch with a warning naming both digits (ISO 3779 needs no check digit)', () => {
    // 49 CFR 565.15(c) requires the check digit for North American vehicles only; ISO 3779 has none.
    const r = checkVin('1G4AH59H55G118341');
    expect(r.valid).toBe(true);
    expect(followsNorthAmericanRules(r)).toBe(false);
    expect(r.checkDigit).toBe('5');
    expect(r.expectedCheckDigit).toBe('4');
    expect(r.errors).toEqual([]);
    expect(r.warnings).toEqual([
      'Check digit does not match (position 9 is 5, the VIN computes 4): only required for North American vehicles.',
    ]);
  });

  it('warns about a letter other than X in position 9 as a mismatch', () => {
    expect(checkVin('1M8GDM9AAKP042788').warnings[0]).toContain('position 9 is A, the VIN computes X');
  });

  it('a VIN that follows every rule has no warnings', () => {
    const r = checkVin('1M8GDM9AXKP042788'); // textbook example, check X (49 CFR 565.15(c) method)
    expect(r.warnings).toEqual([]);
    expect(followsNorthAmericanRules(r)).toBe(true);
  });

  it('refuses only what no VIN can be: length and I, O, Q', () => {
    expect(checkVin('1G4AH59H55G11834').valid).toBe(false); // 16 characters
    expect(checkVin('1G4AH59H55G11834Q').valid).toBe(false); // Q (ISO 3779 and 49 CFR 565.13)
    expect(checkVin('Y9XRM4C81P0001930').valid).toBe(true); // invented VIN of a non-North-American maker, no check digit
  });

  it('reports the length', () => {
    expect(checkVin('1G4AH59H45G11834').errors).toEqual(['A VIN has 17 characters; this one has 16.']);
    expect(checkVin('1G4AH59H45G1183411').errors[0]).toMatch(/17 characters; this one has 18/);
    expect(checkVin('').errors).toEqual(['Enter a VIN: 17 letters and digits.']);
  });

  it('names the position of each I, O or Q', () => {
    const r = checkVin('1G4AH59H45G11834O');
    expect(r.valid).toBe(false);
    expect(r.errors).toEqual(['Position 17 is "O": the letters I, O and Q are never used in a VIN.']);
    expect(r.expectedCheckDigit).toBeNull();
    expect(checkVin('IG4AH59H45G118341').errors[0]).toMatch(/^Position 1 is "I"/);
    expect(checkVin('1G4AH59H45Q118341').errors[0]).toMatch(/^Position 11 is "Q"/);
  });

  it('names characters that are not letters or digits', () => {
    const r = checkVin('1G4AH-9H45G118341');
    expect(r.errors).toEqual(['Position 6 is "-": a VIN has only letters and digits.']);
  });

  it.each(['U', 'Z', '0'])('warns about %s as a model year character and reads no year', (ch) => {
    // 49 CFR 565.15(d): never U, Z or 0 in position 10; outside North America position 10 need not be a year.
    const vin = withCheckDigit(`1G4AH59H4${ch}G118341`);
    const r = checkVin(vin);
    expect(r.valid).toBe(true);
    expect(r.warnings).toEqual([
      `Position 10 is "${ch}", which is not a North American model-year code: the year is not read from it (only required for North American vehicles).`,
    ]);
    expect(r.modelYears).toEqual([]);
  });

  it('returns nulls for the parts of a VIN of the wrong length', () => {
    expect(checkVin('ABC')).toMatchObject({ checkDigit: null, expectedCheckDigit: null, wmi: null, vds: null, vis: null, modelYears: [] });
  });

  it('every error is one sentence', () => {
    for (const e of checkVin('1O-Q').errors) expect(e).toMatch(/^[A-Z][^.]*\.$/);
  });
});

describe('model year (position 10)', () => {
  it.each([
    // references.md §3 [C]
    [1990, 'L'],
    [2000, 'Y'],
    [2001, '1'],
    [2009, '9'],
    [2010, 'A'],
    [2024, 'R'],
    [2027, 'V'],
    [1980, 'A'],
  ])('%i is %s', (year, code) => {
    expect(modelYearCode(year)).toBe(code);
  });

  it('the cycle is 30 characters without I, O, Q, U, Z or 0', () => {
    // references.md §3 [S]
    expect(MODEL_YEAR_CODES).toHaveLength(30);
    expect(MODEL_YEAR_CODES).not.toMatch(/[IOQUZ0]/);
  });

  it('position 7 numeric means 1980-2009, alphabetic 2010-2039 for light vehicles', () => {
    // references.md §3 [M]
    expect(modelYearCandidates('1M8GDM9AXKP042788')).toEqual([1989]); // 7th '9', 10th 'K'
    expect(modelYearCandidates('1G4AH59H45G118341')).toEqual([2005]); // 7th '9', 10th '5'
    expect(modelYearCandidates('11111111111111111')).toEqual([2001]);
    expect(modelYearCandidates('1G4AH5AH4RG118341')).toEqual([2024]); // 7th 'A', 10th 'R'
  });

  it('keeps both cycles, ascending, when the light-vehicle rule does not apply', () => {
    expect(modelYearCandidates('1M8GDM9AXKP042788', { lightVehicle: false })).toEqual([1989, 2019]);
    expect(modelYearCandidates('1G4AH5AH4VG118341', { lightVehicle: false })).toEqual([1997, 2027]);
  });

  it('returns no years for an unreadable position 10 or length', () => {
    expect(modelYearCandidates('1G4AH59H4UG118341')).toEqual([]);
    expect(modelYearCandidates('1G4AH')).toEqual([]);
  });

  it('modelYearCode is the inverse of the candidates', () => {
    for (let year = 1980; year <= 2039; year++) {
      const seventh = year < 2010 ? '9' : 'A';
      const code = modelYearCode(year) ?? '?';
      expect(modelYearCandidates(`1G4AH5${seventh}H4${code}G118341`)).toEqual([year]);
    }
    expect(modelYearCode(1979)).toBeNull();
    expect(modelYearCode(2040)).toBeNull();
  });
});

describe('vinSchema', () => {
  it('passes a valid VIN through, normalised', () => {
    expect(vinSchema.parse(' 1m8gdm9axkp042788 ')).toBe('1M8GDM9AXKP042788');
  });

  it('fails with the first error as its message', () => {
    const r = vinSchema.safeParse('1G4AH59H55G11834');
    expect(r.success).toBe(false);
    expect(r.error?.issues[0]?.message).toBe('A VIN has 17 characters; this one has 16.');
  });

  it('passes a VIN whose check digit does not match (a warning, never a refusal)', () => {
    expect(vinSchema.safeParse('1G4AH59H55G118341').success).toBe(true);
  });

  it('rejects non-strings', () => {
    expect(vinSchema.safeParse(42).success).toBe(false);
  });
});

describe('VIN properties', () => {
  const body = fc.array(fc.constantFrom(...VIN_CHARS), { minLength: 17, maxLength: 17 });
  const yearChar = fc.constantFrom(...MODEL_YEAR_CODES.split(''));
  const validVin = fc.tuple(body, yearChar).map(([chars, y]) => {
    chars[9] = y;
    return withCheckDigit(chars.join(''));
  });

  it('every VIN made by inserting the computed check digit passes', () => {
    fc.assert(
      fc.property(validVin, (vin) => {
        const r = checkVin(vin);
        expect(r.errors).toEqual([]);
        expect(r.valid).toBe(true);
        expect(r.modelYears).toHaveLength(1);
      }),
    );
  });

  it('changing one character is detected, or the two characters share a transliterated value', () => {
    fc.assert(
      fc.property(validVin, fc.integer({ min: 0, max: 16 }), fc.constantFrom(...VIN_CHARS), (vin, pos, ch) => {
        const old = vin.charAt(pos);
        fc.pre(ch !== old);
        const corrupted = vin.slice(0, pos) + ch + vin.slice(pos + 1);
        const r = checkVin(corrupted);
        if (followsNorthAmericanRules(r)) {
          // Only a same-value swap (e.g. A/J/1, B/K/S/2) outside position 9 slips through mod 11.
          expect(pos).not.toBe(8);
          expect(vinCharValue(ch)).toBe(vinCharValue(old));
        } else {
          expect(r.errors.length + r.warnings.length).toBeGreaterThan(0);
        }
      }),
      { numRuns: 500 },
    );
  });

  it('changing the check digit itself is always detected', () => {
    fc.assert(
      fc.property(validVin, fc.constantFrom(...'0123456789X'.split('')), (vin, d) => {
        fc.pre(d !== vin.charAt(8));
        expect(checkVin(vin.slice(0, 8) + d + vin.slice(9)).warnings[0]).toMatch(/Check digit does not match/);
      }),
    );
  });
});
