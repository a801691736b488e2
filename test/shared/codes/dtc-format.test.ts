import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { dtcFamily, InvalidDtcError, isValidDtc, parseDtc, requireDtc } from '../../../shared/codes';
import { validCode, validFtb } from './arbitraries';

// Syntax: SAE J2012 / ISO 15031-6 (references.md §1): letter P/C/B/U, second character 0-3,
// characters 3-5 hex, optional failure type byte of two hex digits.

describe('parseDtc accepts well-formed codes', () => {
  it.each([
    ['P0302', 'P0302', undefined, 'P0302'],
    ['p0302', 'P0302', undefined, 'P0302'],
    [' P0302-13 ', 'P0302', '13', 'P0302-13'],
    ['P0302-13', 'P0302', '13', 'P0302-13'],
    ['p0302-1a', 'P0302', '1A', 'P0302-1A'],
    ['P0302 13', 'P0302', '13', 'P0302-13'],
    ['P0302 - 13', 'P0302', '13', 'P0302-13'],
    ['P030213', 'P0302', '13', 'P0302-13'],
    ['C0035', 'C0035', undefined, 'C0035'],
    ['b1a2f', 'B1A2F', undefined, 'B1A2F'],
    ['U3FFF', 'U3FFF', undefined, 'U3FFF'],
    ['P0301-00', 'P0301', '00', 'P0301-00'], // FTB example, references.md §1
  ])('%j -> code %s ftb %s', (input, code, ftb, full) => {
    const r = parseDtc(input);
    expect(r).toEqual({ ok: true, dtc: ftb ? { code, ftb, full } : { code, full } });
  });

  it('accepts an en dash as the FTB separator (pasted from word processors)', () => {
    expect(parseDtc('P0302\u201313')).toEqual({ ok: true, dtc: { code: 'P0302', ftb: '13', full: 'P0302-13' } });
  });
});

describe('parseDtc rejects with a human reason', () => {
  it.each([
    ['X0302', 'first letter must be P, C, B or U'],
    ['00302', 'first letter must be P, C, B or U'],
    ['A', 'first letter must be P, C, B or U'],
    ['P4302', 'second character must be 0-3'],
    ['PA302', 'second character must be 0-3'],
    ['P03G2', 'characters 3-5 must be hex 0-9 or A-F'],
    ['P030Z', 'characters 3-5 must be hex 0-9 or A-F'],
    ['P0302-1', 'failure type byte must be two hex digits'],
    ['P0302-123', 'failure type byte must be two hex digits'],
    ['P0302-GG', 'failure type byte must be two hex digits'],
    ['P0302-', 'failure type byte must be two hex digits'],
    ['P0302XY', 'failure type byte must be two hex digits'],
    ['P03', 'a trouble code has 5 characters'],
    ['P', 'a trouble code has 5 characters'],
    ['P03021', 'a trouble code has 5 characters'],
    ['P03021345', 'a trouble code has 5 characters'],
    ['P0302 13 14', 'a trouble code has 5 characters'],
    ['', 'enter a trouble code'],
    ['   ', 'enter a trouble code'],
  ])('%j: %s', (input, reason) => {
    const r = parseDtc(input);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.reason).toContain(reason);
  });

  it('isValidDtc agrees with parseDtc', () => {
    expect(isValidDtc('P0420')).toBe(true);
    expect(isValidDtc('P0420-11')).toBe(true);
    expect(isValidDtc('P0G20')).toBe(false);
    expect(isValidDtc('hello')).toBe(false);
  });

  it('requireDtc throws InvalidDtcError naming the input and reason', () => {
    expect(() => requireDtc('Q1234')).toThrow(InvalidDtcError);
    expect(() => requireDtc('Q1234')).toThrow(/"Q1234".*first letter must be P, C, B or U/);
  });
});

describe('dtcFamily', () => {
  it('is the first four characters', () => {
    expect(dtcFamily('P0302')).toBe('P030');
    expect(dtcFamily('p0171-13')).toBe('P017');
    expect(dtcFamily('U0100')).toBe('U010');
  });

  it('puts cylinder misfire codes in one family and the lean codes in another', () => {
    expect(dtcFamily('P0301')).toBe(dtcFamily('P0306'));
    expect(dtcFamily('P0171')).not.toBe(dtcFamily('P0301'));
  });

  it('throws on a malformed code', () => {
    expect(() => dtcFamily('P9')).toThrow(InvalidDtcError);
  });
});

describe('parseDtc properties', () => {
  it('round-trips every full form it produces', () => {
    fc.assert(
      fc.property(validCode, fc.option(validFtb, { nil: undefined }), (code, ftb) => {
        const full = ftb ? `${code}-${ftb}` : code;
        const r = parseDtc(full);
        expect(r.ok && r.dtc.full).toBe(full);
        expect(r.ok && r.dtc.code).toBe(code);
        expect(r.ok && r.dtc.ftb).toBe(ftb);
      }),
    );
  });

  it('ignores case and surrounding whitespace', () => {
    fc.assert(
      fc.property(validCode, validFtb, fc.constantFrom('', ' ', '\t', '  '), (code, ftb, pad) => {
        const a = parseDtc(`${pad}${code.toLowerCase()}-${ftb.toLowerCase()}${pad}`);
        expect(a).toEqual(parseDtc(`${code}-${ftb}`));
      }),
    );
  });

  it('the compact seven-character form means the same as the hyphen form', () => {
    fc.assert(
      fc.property(validCode, validFtb, (code, ftb) => {
        expect(parseDtc(code + ftb)).toEqual(parseDtc(`${code}-${ftb}`));
      }),
    );
  });

  it('never accepts a code whose second character is 4-9', () => {
    fc.assert(
      fc.property(validCode, fc.integer({ min: 4, max: 9 }), (code, d) => {
        expect(isValidDtc(code.charAt(0) + d + code.slice(2))).toBe(false);
      }),
    );
  });
});
