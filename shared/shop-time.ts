// A shop's place in the world: its country (ISO 3166-1 alpha-2) and IANA time zone.
// "Today", the digest week and every date on screen are read in the shop's zone, so a
// shop in Auckland and one in Lisbon both see the day they are living in.

/** True for an IANA zone name this runtime knows ("Europe/Lisbon", "UTC"). */
export function isTimeZone(zone: string): boolean {
  if (!zone || zone.length > 64) return false;
  try {
    new Intl.DateTimeFormat('en', { timeZone: zone });
    return true;
  } catch {
    return false;
  }
}

/** Every zone name the runtime lists, for pickers (falls back to a few when the list is unavailable). */
export function knownTimeZones(): string[] {
  const withList = Intl as typeof Intl & { supportedValuesOf?: (key: 'timeZone') => string[] };
  return withList.supportedValuesOf?.('timeZone') ?? ['UTC', 'Europe/London', 'America/New_York', 'Asia/Tokyo'];
}

const regionNames = (() => {
  try {
    return new Intl.DisplayNames(['en'], { type: 'region' });
  } catch {
    return null;
  }
})();

/** The English name of an ISO 3166-1 alpha-2 code, or null when it names no region. */
export function countryName(code: string): string | null {
  if (!/^[A-Z]{2}$/.test(code) || !regionNames) return null;
  const name = regionNames.of(code);
  // ICU answers the code itself for an unassigned code, and "Unknown Region" for ZZ.
  return name && name !== code && code !== 'ZZ' ? name : null;
}

/** The calendar day 'YYYY-MM-DD' it is in `zone` at `at`. */
export function dayIn(zone: string, at: Date = new Date()): string {
  const parts = new Intl.DateTimeFormat('en-CA', { timeZone: zone, year: 'numeric', month: '2-digit', day: '2-digit' }).formatToParts(at);
  const part = (type: string) => parts.find((p) => p.type === type)?.value ?? '';
  return `${part('year')}-${part('month')}-${part('day')}`;
}

/**
 * Countries that follow the North American VIN rules (49 CFR 565: check digit in position 9,
 * model year in position 10). Elsewhere (ISO 3779) those positions are free, so a mismatch
 * there is only worth a note. Common practice, no source for the exact list.
 */
const NORTH_AMERICAN_VIN = new Set(['US', 'CA', 'MX', 'PR']);

export function usesNorthAmericanVinRules(country: string | null): boolean {
  return country === null || NORTH_AMERICAN_VIN.has(country);
}

const dateOptions: Intl.DateTimeFormatOptions = { day: 'numeric', month: 'short', year: 'numeric' };
const timeOptions: Intl.DateTimeFormatOptions = { ...dateOptions, hour: '2-digit', minute: '2-digit' };

/** "2 Dec 2026" (in the reader's language) for an instant, as the day it was in `zone`. */
export function formatDate(iso: string, zone?: string): string {
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? iso : d.toLocaleDateString(undefined, { ...dateOptions, timeZone: zone });
}

export function formatDateTime(iso: string, zone?: string): string {
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? iso : d.toLocaleString(undefined, { ...timeOptions, timeZone: zone });
}
