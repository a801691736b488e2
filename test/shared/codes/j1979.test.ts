import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  decodeDtcPair,
  decodeDtcPairs,
  decodeDtcTriple,
  decodeMilStatus,
  decodeService03Response,
  DtcDecodeError,
  encodeDtcPair,
  encodeDtcTriple,
} from '../../../shared/codes';
import { validCode, validFtb } from './arbitraries';

describe('service $03 two-byte codes (SAE J1979)', () => {
  it('decodes the worked example 43 01 35 -> P0135', () => {
    // SAE J1979 service $03 worked example (references.md §2 [S])
    expect(decodeDtcPair('0135')).toBe('P0135');
    expect(decodeService03Response('43 01 35')).toEqual(['P0135']);
  });

  it.each([
    // SAE J1979 bit layout, check values computed (references.md §2 [C])
    ['0133', 'P0133'],
    ['4123', 'C0123'],
    ['C100', 'U0100'],
    ['0300', 'P0300'],
    ['0420', 'P0420'],
    ['2135', 'P2135'],
    ['4035', 'C0035'],
  ])('%s <-> %s', (hex, code) => {
    expect(decodeDtcPair(hex)).toBe(code);
    expect(encodeDtcPair(code)).toBe(hex);
  });

  it('encodes C0035 as 40 35', () => {
    // references.md §2 reverse check [C]
    expect(encodeDtcPair('C0035')).toBe('4035');
  });

  it('treats 0000 as padding, not a code', () => {
    // references.md §2 [M]
    expect(decodeDtcPair('0000')).toBeNull();
    expect(decodeDtcPairs('013300000420')).toEqual(['P0133', 'P0420']);
  });

  it('decodes each letter from bits 15-14', () => {
    // 00 P, 01 C, 10 B, 11 U (references.md §2 [S])
    expect(decodeDtcPair('8001')).toBe('B0001');
    expect(decodeDtcPair('9234')).toBe('B1234');
    expect(decodeDtcPair('F234')).toBe('U3234');
    expect(decodeDtcPair('1302')).toBe('P1302');
  });

  it('decodes a run of pairs and ignores spaces and case', () => {
    expect(decodeDtcPairs('0133C100')).toEqual(['P0133', 'U0100']);
    expect(decodeDtcPairs('01 33 c1 00')).toEqual(['P0133', 'U0100']);
    expect(decodeDtcPairs('')).toEqual([]);
  });

  it.each([
    ['013', /odd number of hex digits/],
    ['0133C1', /3 bytes do not split/],
    ['01G3', /"G" is not a hex digit/],
    ['0x0133', /"X" is not a hex digit/],
  ])('decodeDtcPairs(%j) throws DtcDecodeError %s', (hex, message) => {
    expect(() => decodeDtcPairs(hex)).toThrow(DtcDecodeError);
    expect(() => decodeDtcPairs(hex)).toThrow(message);
  });

  it('decodeDtcPair wants exactly two bytes', () => {
    expect(() => decodeDtcPair('013')).toThrow(DtcDecodeError);
    expect(() => decodeDtcPair('013300')).toThrow(/4 hex digits/);
  });

  it('encodeDtcPair drops an FTB and rejects malformed codes', () => {
    expect(encodeDtcPair('P0302-13')).toBe('0302');
    expect(() => encodeDtcPair('P9302')).toThrow(/second character must be 0-3/);
  });

  it('reads CAN responses that carry a code count', () => {
    expect(decodeService03Response('43 02 01 33 04 20')).toEqual(['P0133', 'P0420']);
    expect(decodeService03Response('43 00')).toEqual([]);
    expect(decodeService03Response('47 01 03 00')).toEqual(['P0300']);
    expect(() => decodeService03Response('43 03 01 33 04 20')).toThrow(/says 3 codes but carries 2/);
    expect(() => decodeService03Response('41 01 33')).toThrow(/starts with 43, 47 or 4A/);
  });

  it('encode then decode returns every valid code', () => {
    fc.assert(
      fc.property(validCode, (code) => {
        // P0000 encodes to 0000, which J1979 reserves as padding
        fc.pre(code !== 'P0000');
        expect(decodeDtcPair(encodeDtcPair(code))).toBe(code);
      }),
    );
  });

  it('decode then encode returns every non-padding pair', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 0xffff }), (n) => {
        const hex = n.toString(16).toUpperCase().padStart(4, '0');
        expect(encodeDtcPair(decodeDtcPair(hex) ?? '')).toBe(hex);
      }),
    );
  });
});

describe('three-byte codes with FTB', () => {
  it('encodes and decodes P0302-13', () => {
    expect(encodeDtcTriple('P0302-13')).toBe('030213');
    expect(decodeDtcTriple('030213')).toBe('P0302-13');
    expect(encodeDtcTriple('P0302')).toBe('030200');
    expect(decodeDtcTriple('000000')).toBeNull();
  });

  it('round-trips every code and FTB', () => {
    fc.assert(
      fc.property(validCode, validFtb, (code, ftb) => {
        fc.pre(code !== 'P0000');
        expect(decodeDtcTriple(encodeDtcTriple(`${code}-${ftb}`))).toBe(`${code}-${ftb}`);
      }),
    );
  });
});

describe('service $01 PID $01 byte A', () => {
  it.each([
    // bit 7 MIL, bits 6-0 confirmed code count (references.md §2 [S]; values [C])
    [0x81, true, 1],
    [0x03, false, 3],
    [0xff, true, 127],
    [0x00, false, 0],
    [0x80, true, 0],
  ])('0x%s -> MIL %s, %i codes', (byte, milOn, storedCodes) => {
    expect(decodeMilStatus(byte)).toEqual({ milOn, storedCodes });
  });

  it.each([256, -1, 1.5])('rejects %s', (bad) => {
    expect(() => decodeMilStatus(bad)).toThrow(RangeError);
  });
});
