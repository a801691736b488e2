import { describe, expect, it } from 'vitest';
import { computeFigures, median, rate, repeatsFor, rootCauseKey } from '../../../shared/patterns';
import { visit } from './helpers';

const window = { days: 90, km: 3000 }; // shop default, common practice, no source
const A = 10;
const B = 20;

// Hand-built shop history; the period is March 2026.
const history = [
  visit({ id: 8, platformId: A, vehicleId: 6, day: '2026-01-10', codes: ['P0299'], cause: 'low-boost/charge-pipe-leak', mileage: null }),
  visit({ id: 1, platformId: A, vehicleId: 1, day: '2026-02-20', codes: ['P0299'], cause: 'low-boost/charge-pipe-leak', mileage: null, confirmedDay: '2026-02-21' }),
  visit({ id: 2, platformId: A, vehicleId: 1, day: '2026-03-05', codes: ['P0299'], cause: 'low-boost/charge-pipe-leak', mileage: null, confirmedDay: '2026-03-07' }),
  visit({ id: 3, platformId: A, vehicleId: 2, day: '2026-03-10', codes: ['P0171'], cause: 'lean/vacuum-leak', mileage: null, confirmedDay: '2026-03-10' }),
  visit({ id: 4, platformId: A, vehicleId: 3, day: '2026-03-12', codes: ['P0171', 'P0300'], mileage: null, confirmed: false }),
  visit({ id: 5, platformId: B, vehicleId: 4, day: '2026-03-15', codes: ['C0035'], rootCause: 'Sensor air gap full of debris.', mileage: null, confirmedDay: '2026-03-20' }),
  visit({ id: 6, platformId: B, vehicleId: 4, day: '2026-03-25', codes: ['C0035'], mileage: null, confirmed: false }),
  visit({ id: 7, platformId: B, vehicleId: 5, day: '2026-04-02', codes: ['P0171'], mileage: null }),
];
const march = { from: '2026-03-01', to: '2026-03-31' };

describe('figures on a hand-computed fixture', () => {
  const f = computeFigures(history, window, march);

  it('counts the cases and confirmed fixes whose visit day is in the period', () => {
    // in March: 2, 3, 4, 5, 6 (1 and 8 are before, 7 after); confirmed: 2, 3, 5
    expect(f.totals).toEqual({ cases: 5, confirmed: 3, comebacks: 2 });
    // confirmed-fix rate = confirmed / cases = 3 / 5
    expect(f.confirmedRate).toBe(0.6);
  });

  it('puts a comeback in the period of the return visit, even when the first fix was before it', () => {
    // 2 came back 13 days after 1 (February); 6 came back 10 days after 5
    expect(f.comebacks.map((c) => [c.firstCaseId, c.repeatCaseId, c.days])).toEqual([
      [5, 6, 10],
      [1, 2, 13],
    ]);
    // comeback rate = return visits in the period / cases in the period = 2 / 5
    expect(f.comebackRate).toBe(0.4);
  });

  it('takes the median of days from visit to confirmed fix', () => {
    // case 2: 03-05 -> 03-07 = 2; case 3: 0; case 5: 03-15 -> 03-20 = 5; sorted 0, 2, 5 -> 2
    expect(f.medianDaysToConfirm).toBe(2);
  });

  it('ranks codes by the number of cases that carry them', () => {
    // C0035: 5, 6; P0171: 3, 4; P0299: 2; P0300: 4 (ties by code)
    expect(f.topCodes.map((c) => [c.code, c.count])).toEqual([
      ['C0035', 2],
      ['P0171', 2],
      ['P0299', 1],
      ['P0300', 1],
    ]);
  });

  it('splits cases, comebacks and rates by platform', () => {
    // A: cases 2, 3, 4; comeback 2; confirmed 2, 3 -> 1/3 and 2/3. B: cases 5, 6; comeback 6; confirmed 5 -> 1/2 and 1/2
    expect(f.byPlatform).toEqual([
      { platformId: A, cases: 3, comebacks: 1, comebackRate: 1 / 3, confirmedRate: 2 / 3 },
      { platformId: B, cases: 2, comebacks: 1, comebackRate: 0.5, confirmedRate: 0.5 },
    ]);
  });

  it('rates root causes by how many of their confirmed fixes came back', () => {
    // confirmed in March: 2 (charge pipe, did not come back), 3 (vacuum leak, no), 5 (debris, came back as 6)
    expect(f.byRootCause.map((r) => [r.key, r.fixes, r.cameBack, r.comebackRate])).toEqual([
      ['text:sensor air gap full of debris', 1, 1, 1],
      ['lean/vacuum-leak', 1, 0, 0],
      ['low-boost/charge-pipe-leak', 1, 0, 0],
    ]);
  });

  it('counts cases and comebacks per ISO week from the Monday before the period', () => {
    // 2026-03-01 is a Sunday, so the first week starts Monday 2026-02-23
    expect(f.trend).toEqual([
      { week: '2026-02-23', cases: 0, comebacks: 0 },
      { week: '2026-03-02', cases: 1, comebacks: 1 },
      { week: '2026-03-09', cases: 3, comebacks: 0 },
      { week: '2026-03-16', cases: 0, comebacks: 0 },
      { week: '2026-03-23', cases: 1, comebacks: 1 },
      { week: '2026-03-30', cases: 0, comebacks: 0 },
    ]);
  });

  it('finds the same root cause on the same platform on different vehicles', () => {
    // charge pipe on platform A: 8 (vehicle 6), 1 and 2 (vehicle 1) -> 2 vehicles, one case in March
    expect(f.repeatPatterns).toHaveLength(1);
    expect(f.repeatPatterns[0]).toMatchObject({ platformId: A, causeKey: 'low-boost/charge-pipe-leak', vehicles: 2 });
    expect(f.repeatPatterns[0]!.cases.map((c) => c.id)).toEqual([8, 1, 2]);
  });

  it('narrows every figure to one platform when asked', () => {
    const b = computeFigures(history, window, { ...march, platformId: B });
    // B in March: 5, 6; confirmed 5; comeback 6
    expect(b.totals).toEqual({ cases: 2, confirmed: 1, comebacks: 1 });
    expect(b.comebackRate).toBe(0.5);
    expect(b.repeatPatterns).toEqual([]);
  });

  it('answers null rates for an empty period rather than 0', () => {
    const empty = computeFigures(history, window, { from: '2025-01-01', to: '2025-01-31' });
    expect([empty.confirmedRate, empty.comebackRate, empty.medianDaysToConfirm]).toEqual([null, null, null]);
  });
});

describe('small helpers', () => {
  it('takes the median of an even count as the mean of the middle two', () => {
    expect(median([4, 1, 3, 2])).toBe(2.5);
    expect(median([])).toBeNull();
  });

  it('divides only when there is a denominator', () => {
    expect(rate(1, 4)).toBe(0.25);
    expect(rate(0, 0)).toBeNull();
  });

  it('keys a root cause by its tree id, else by its normalised text', () => {
    expect(rootCauseKey({ cause: 'lean/pcv-failed', rootCause: 'PCV split' })).toBe('lean/pcv-failed');
    expect(rootCauseKey({ cause: null, rootCause: '  Loose MAF terminal! ' })).toBe('text:loose maf terminal');
    expect(rootCauseKey({ cause: null, rootCause: null })).toBeNull();
  });

  it('lists both directions of a repeat for the case view', () => {
    expect(repeatsFor(5, history, window)).toEqual([{ caseId: 6, title: 'case 6', relation: 'came-back-as', days: 10, reason: 'same code C0035' }]);
    expect(repeatsFor(6, history, window)).toEqual([{ caseId: 5, title: 'case 5', relation: 'comeback-of', days: 10, reason: 'same code C0035' }]);
  });
});
