import { describe, expect, it } from 'vitest';
import { countryName, dayIn, formatDateTime, isTimeZone, usesNorthAmericanVinRules } from '../../shared/shop-time';

describe('shop time zones', () => {
  it('knows IANA zone names and refuses what is not one', () => {
    expect(isTimeZone('Pacific/Auckland')).toBe(true);
    expect(isTimeZone('UTC')).toBe(true);
    expect(isTimeZone('Mars/Olympus')).toBe(false);
    expect(isTimeZone('')).toBe(false);
  });

  // One instant, three calendar days: 2026-12-01 23:30 UTC is already 2 Dec in Auckland
  // (UTC+13 in December, NZ daylight time) and still 1 Dec in Honolulu (UTC-10, no DST). From memory.
  it('gives the day the shop is living in, not the server’s', () => {
    const at = new Date('2026-12-01T23:30:00Z');
    expect(dayIn('UTC', at)).toBe('2026-12-01');
    expect(dayIn('Pacific/Auckland', at)).toBe('2026-12-02');
    expect(dayIn('Pacific/Honolulu', at)).toBe('2026-12-01');
    expect(dayIn('Pacific/Honolulu', new Date('2026-12-02T09:59:00Z'))).toBe('2026-12-01');
  });

  it('shows times in the shop’s zone', () => {
    const iso = '2026-12-01T23:30:00Z';
    expect(formatDateTime(iso, 'Pacific/Auckland')).toMatch(/12:30/);
    expect(formatDateTime(iso, 'UTC')).toMatch(/11:30|23:30/);
  });
});

describe('shop countries', () => {
  // ISO 3166-1 alpha-2 codes.
  it('names ISO 3166-1 codes and refuses others', () => {
    expect(countryName('NZ')).toBe('New Zealand');
    expect(countryName('PT')).toBe('Portugal');
    expect(countryName('ZZ')).toBeNull();
    expect(countryName('QQ')).toBeNull();
    expect(countryName('nz')).toBeNull();
  });

  it('applies the North American VIN rules only where they hold (49 CFR 565; ISO 3779 elsewhere)', () => {
    expect(usesNorthAmericanVinRules('US')).toBe(true);
    expect(usesNorthAmericanVinRules('CA')).toBe(true);
    expect(usesNorthAmericanVinRules('DE')).toBe(false);
    expect(usesNorthAmericanVinRules(null)).toBe(true); // unknown: check, and only warn
  });
});
