import { describe, expect, it } from 'vitest';
import { csvField, daysBetween, defaultPeriod, isoWeekKey, toCsv, weekStart } from '../../../shared/patterns';

describe('CSV', () => {
  it('quotes fields with commas, quotes and line breaks (RFC 4180)', () => {
    expect(csvField('plain')).toBe('plain');
    expect(csvField('a, b')).toBe('"a, b"');
    expect(csvField('say "hi"')).toBe('"say ""hi"""');
    expect(csvField('two\nlines')).toBe('"two\nlines"');
  });

  it('defuses text a spreadsheet would run as a formula', () => {
    expect(csvField('=HYPERLINK("x")')).toBe(`"'=HYPERLINK(""x"")"`);
    expect(csvField('-3')).toBe("'-3");
    expect(csvField(-3)).toBe('-3');
  });

  it('writes a header and rows with CRLF line ends and empty cells for null', () => {
    expect(toCsv(['code', 'count'], [['P0299', 4], [null, 0]])).toBe('code,count\r\nP0299,4\r\n,0\r\n');
  });
});

describe('calendar days', () => {
  it('counts whole days across a month end and a leap day', () => {
    expect(daysBetween('2026-03-02', '2026-05-31')).toBe(90); // 29 + 30 + 31
    expect(daysBetween('2028-02-28', '2028-03-01')).toBe(2); // 2028 is a leap year
  });

  it('defaults to the 90 days ending today, both ends included', () => {
    expect(defaultPeriod('2026-12-01')).toEqual({ from: '2026-09-03', to: '2026-12-01' });
    expect(daysBetween('2026-09-03', '2026-12-01') + 1).toBe(90);
  });

  it('starts weeks on Monday and names them by ISO 8601 week', () => {
    expect(weekStart('2026-12-01')).toBe('2026-11-30');
    // ISO 8601: the week with the year's first Thursday is week 1; 2026-01-01 is a Thursday
    expect(isoWeekKey('2026-01-01')).toBe('2026-W01');
    expect(isoWeekKey('2026-12-01')).toBe('2026-W49');
    // 2027-01-01 is a Friday, so it belongs to the last week of 2026 (W53)
    expect(isoWeekKey('2027-01-01')).toBe('2026-W53');
  });
});
