import { describe, expect, it } from 'vitest';
import data from '../../../content/codes/generic-codes.json';
import { classifyDtc, codeReferenceNote, listCodeReference, lookupCodeTitle, parseDtc } from '../../../shared/codes';

// Titles are compared by key words only: J2012 wording varies by edition (references.md header).
function words(title: string | null): string[] {
  return (title ?? '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, ' ')
    .trim()
    .split(' ');
}
function hasWords(title: string | null, expected: string): boolean {
  const have = words(title);
  return words(expected).every((w) => have.includes(w));
}

describe('code reference data file', () => {
  const codes = listCodeReference();

  it('holds at least 400 generic codes', () => {
    expect(codes.length).toBeGreaterThanOrEqual(400);
  });

  it('every row is a valid five-character generic code with a one-line title', () => {
    for (const { code, title } of codes) {
      const r = parseDtc(code);
      expect(r.ok && r.dtc.full === code && !r.dtc.ftb, code).toBe(true);
      expect(classifyDtc(code).scope, code).toBe('generic');
      expect(title.trim(), code).toBe(title);
      expect(title.length, code).toBeGreaterThan(3);
      expect(title, code).not.toMatch(/[\n.]$/);
    }
  });

  it('lists each code once, sorted P, C, B, U then by code', () => {
    const order = 'PCBU';
    const keys = codes.map((c) => `${order.indexOf(c.code.charAt(0))}${c.code}`);
    expect(new Set(keys).size).toBe(keys.length);
    expect([...keys].sort()).toEqual(keys);
  });

  it('covers P0300-P0312, C0035-C0050 and each P0 hundred from P00 to P07', () => {
    for (let n = 0; n <= 12; n++) expect(lookupCodeTitle(`P03${String(n).padStart(2, '0')}`)).not.toBeNull();
    for (let n = 35; n <= 50; n++) expect(lookupCodeTitle(`C00${n}`), `C00${n}`).not.toBeNull();
    for (const h of '01234567') expect(codes.filter((c) => c.code.startsWith(`P0${h}`)).length).toBeGreaterThanOrEqual(20);
    expect(codes.filter((c) => c.code.startsWith('P2')).length).toBeGreaterThanOrEqual(40);
    expect(codes.filter((c) => c.code.startsWith('U0')).length).toBeGreaterThanOrEqual(20);
  });

  it('carries a provenance note that says it is from memory and copies no product', () => {
    expect(data.note).toBe(codeReferenceNote);
    expect(codeReferenceNote).toMatch(/from memory/);
    expect(codeReferenceNote).toMatch(/J2012/);
    expect(codeReferenceNote).toMatch(/not copied|Nothing here is copied/);
  });
});

describe('lookupCodeTitle', () => {
  it.each([
    // Generic titles, references.md §1 [S, secondary transcription]
    ['P0300', 'random multiple cylinder misfire detected'],
    ['P0301', 'cylinder 1 misfire detected'],
    ['P0312', 'cylinder 12 misfire detected'],
    ['P0171', 'system too lean bank 1'],
    ['P0174', 'system too lean bank 2'],
    ['P0172', 'system too rich bank 1'],
    ['P0175', 'system too rich bank 2'],
    ['P0016', 'crankshaft position camshaft position correlation bank 1 sensor a'],
    ['P0011', 'camshaft position timing over advanced bank 1'],
    ['P0012', 'camshaft position timing over retarded bank 1'],
    ['P0101', 'mass air flow circuit range performance'],
    ['P0420', 'catalyst system efficiency below threshold bank 1'],
    ['P0430', 'catalyst system efficiency below threshold bank 2'],
    ['P0128', 'coolant thermostat below regulating temperature'],
  ])('%s: %s', (code, expected) => {
    const title = lookupCodeTitle(code);
    expect(hasWords(title, expected), `${code}: ${title}`).toBe(true);
  });

  it('reads codes in any case and ignores an FTB', () => {
    expect(lookupCodeTitle('p0302-13')).toBe(lookupCodeTitle('P0302'));
  });

  it('returns null for unlisted, manufacturer and malformed codes', () => {
    expect(lookupCodeTitle('P1302')).toBeNull();
    expect(lookupCodeTitle('P0FFF')).toBeNull();
    expect(lookupCodeTitle('nonsense')).toBeNull();
  });

  it('listCodeReference hands out copies', () => {
    const a = listCodeReference();
    const first = a[0];
    if (first) first.title = 'changed';
    expect(listCodeReference()[0]?.title).not.toBe('changed');
  });
});
