import { describe, expect, it } from 'vitest';
import { assessReadiness, decodeMonitorStatus, judgeReadiness, readinessModelYear, readinessRule } from '../../../shared/readiness';

// Byte values hand-worked from the SAE J1979 PID $01 layout (from memory).
// C=0x65: catalyst, EVAP, O2 sensor, O2 heater supported. D picks the incomplete ones.
const withIncomplete = (d: number, a = 0x00) => decodeMonitorStatus([a, 0x07, 0x65, d]);
const usCommon = readinessRule('us-common');

describe('us-common rule (common US practice, no source: 2001+ one incomplete, 1996-2000 two)', () => {
  it.each([
    [2005, 0x00, true],
    [2005, 0x04, true], // EVAP only
    [2005, 0x05, false], // EVAP and catalyst
    [1999, 0x05, true],
    [1999, 0x25, false], // EVAP, catalyst, O2 sensor
    [2000, 0x05, true],
    [2001, 0x05, false],
  ])('model year %i, D=0x%s -> ready %s', (year, d, ready) => {
    expect(judgeReadiness(withIncomplete(d), usCommon, year).ready).toBe(ready);
  });

  it('fails a commanded-on MIL even with every monitor complete', () => {
    const v = judgeReadiness(withIncomplete(0, 0x81), usCommon, 2010);
    expect(v.ready).toBe(false);
    expect(v.reasons[0]).toMatch(/MIL is commanded on/);
  });

  it('uses the strictest band when the model year is unknown, and says so', () => {
    const v = judgeReadiness(withIncomplete(0x05), usCommon, null);
    expect(v).toMatchObject({ ready: false, maxIncomplete: 1 });
    expect(v.reasons.join(' ')).toMatch(/model year is not known/);
  });

  it('does not count continuous monitors but mentions them', () => {
    const v = judgeReadiness(decodeMonitorStatus([0, 0x17, 0x65, 0]), usCommon, 2012); // misfire incomplete
    expect(v.ready).toBe(true);
    expect(v.reasons.join(' ')).toMatch(/Continuous monitors not complete \(Misfire\)/);
  });

  it('is not ready when the MIL state is unknown', () => {
    const table = { ...withIncomplete(0), mil: null };
    expect(judgeReadiness(table, usCommon, 2012)).toMatchObject({ ready: false });
  });

  it('names the rule, its source and the regional note', () => {
    const v = judgeReadiness(withIncomplete(0), usCommon, 2012);
    expect(v.rule).toMatchObject({ id: 'us-common', name: 'Common US practice' });
    expect(v.rule.source).toMatch(/common practice, no source/);
    expect(v.note).toMatch(/local inspection rules decide/);
  });
});

describe('other rule sets', () => {
  it('all-complete fails one incomplete monitor whatever the year', () => {
    expect(judgeReadiness(withIncomplete(0x04), readinessRule('all-complete'), 2003).ready).toBe(false);
    expect(judgeReadiness(withIncomplete(0x04), readinessRule('all-complete'), 1998).ready).toBe(false);
  });

  it('mil-only passes any number of incomplete monitors but not the MIL', () => {
    expect(judgeReadiness(withIncomplete(0x65), readinessRule('mil-only'), 2015).ready).toBe(true);
    expect(judgeReadiness(withIncomplete(0x00, 0x80), readinessRule('mil-only'), 2015).ready).toBe(false);
  });

  it('falls back to the default rule for an unknown id', () => {
    expect(readinessRule('nope').id).toBe('us-common');
  });
});

describe('assessReadiness', () => {
  it('lists the incomplete monitors beside the verdict', () => {
    const a = assessReadiness(withIncomplete(0x24), usCommon, 2009);
    expect(a.incomplete).toEqual([
      { key: 'evap', name: 'Evaporative system', kind: 'non-continuous' },
      { key: 'oxygen-sensor', name: 'Oxygen sensor', kind: 'non-continuous' },
    ]);
    expect(a.verdict.ready).toBe(false);
  });
});

describe('readinessModelYear', () => {
  const now = new Date('2026-06-01T00:00:00Z');
  it.each([
    [[2005], 2005],
    [[1995], null],
    [[2000, 2030], 2000],
    [[2015, 2045], 2015],
    [[], null],
  ])('%j -> %s', (candidates, year) => {
    expect(readinessModelYear(candidates, now)).toBe(year);
  });
});
