import { describe, expect, it } from 'vitest';
import { addDays, comebackBetween, distanceKm, faultLink, findComebacks, KM_PER_MILE } from '../../../shared/patterns';
import { visit } from './helpers';

// The shop default window: 90 days and 3,000 km (content/shop.yaml; common practice, no source).
const window = { days: 90, km: 3000 };

describe('comeback window in days', () => {
  const first = visit({ id: 1, day: '2026-03-02', mileage: null, codes: ['P0171'] });
  const backOn = (days: number) => visit({ id: 2, day: addDays('2026-03-02', days), mileage: null, codes: ['P0171'], confirmed: false });

  it('counts a return on day N as a comeback', () => {
    const pair = comebackBetween(first, backOn(90), window);
    expect(pair?.days).toBe(90);
  });

  it('does not count a return on day N + 1', () => {
    expect(comebackBetween(first, backOn(91), window)).toBeNull();
  });

  it('counts a return on the same day (day 0) when it is the later visit', () => {
    expect(comebackBetween(first, backOn(0), window)?.days).toBe(0);
  });

  it('follows the shop setting for N', () => {
    expect(comebackBetween(first, backOn(30), { days: 30, km: 3000 })).not.toBeNull();
    expect(comebackBetween(first, backOn(31), { days: 30, km: 3000 })).toBeNull();
  });

  it('counts the demo day-90 pair (0009 on 2026-03-02, 0023 on 2026-05-31) and not the day-91 pair', () => {
    // content/cases/README.md, "Comebacks and repeat visits"
    const pcv = visit({ id: 9, day: '2026-03-02', mileage: 87_300, codes: ['P0171'] });
    const gasket = visit({ id: 23, day: '2026-05-31', mileage: 89_950, codes: ['P0171'] });
    expect(comebackBetween(pcv, gasket, window)?.days).toBe(90);
    const slave = visit({ id: 15, vehicleId: 2, day: '2026-04-10', mileage: 143_200, cause: 'clutch-hydraulics/slave-leak' });
    const master = visit({ id: 32, vehicleId: 2, day: '2026-07-10', mileage: 145_350, cause: 'clutch-hydraulics/master-bypass' });
    expect(comebackBetween(slave, master, window)).toBeNull();
  });
});

describe('comeback window in distance', () => {
  const first = visit({ id: 1, mileage: 50_000, codes: ['P0299'] });
  const at = (mileage: number, unit: 'km' | 'mi' = 'km') => visit({ id: 2, day: '2026-03-20', mileage, mileageUnit: unit, codes: ['P0299'] });

  it('counts exactly M km', () => {
    expect(comebackBetween(first, at(53_000), window)?.km).toBe(3000);
  });

  it('does not count M + 1 km', () => {
    expect(comebackBetween(first, at(53_001), window)).toBeNull();
  });

  it('converts miles to km before comparing (1 mi = 1.609344 km, exact by definition)', () => {
    const firstMi = visit({ id: 1, mileage: 30_000, mileageUnit: 'mi', codes: ['P0299'] });
    // 1,864 mi = 2,999.817 km (inside); 1,865 mi = 3,001.427 km (outside)
    expect(comebackBetween(firstMi, at(31_864, 'mi'), window)?.km).toBeCloseTo(1864 * KM_PER_MILE, 3);
    expect(comebackBetween(firstMi, at(31_865, 'mi'), window)).toBeNull();
  });

  it('compares a km reading with a miles reading in km', () => {
    const firstMi = visit({ id: 1, mileage: 10_000, mileageUnit: 'mi', codes: ['P0299'] });
    // 10,000 mi = 16,093.44 km; a later 19,093 km reading is 2,999.56 km on, 19,094 km is 3,000.56 km on
    expect(comebackBetween(firstMi, at(19_093), window)).not.toBeNull();
    expect(comebackBetween(firstMi, at(19_094), window)).toBeNull();
  });

  it('ignores distance when either mileage is unknown, so the days decide', () => {
    expect(comebackBetween(first, visit({ id: 2, day: '2026-03-20', mileage: null, codes: ['P0299'] }), window)).not.toBeNull();
  });

  it('ignores a later reading lower than the earlier one (a typo tells nothing)', () => {
    expect(distanceKm(first, at(49_000))).toBeNull();
    expect(comebackBetween(first, at(49_000), window)).not.toBeNull();
  });

  it('needs both windows: day 40 after 3,400 km is not a comeback (demo 0039 and 0046)', () => {
    const rotor = visit({ id: 39, day: '2026-08-11', mileage: 72_150, cause: 'brakes/rotor-runout', symptoms: ['brake-judder'] });
    const pins = visit({ id: 46, day: '2026-09-20', mileage: 75_550, cause: 'brakes/slide-pins-seized', symptoms: ['brake-judder'] });
    expect(comebackBetween(rotor, pins, window)).toBeNull();
  });
});

describe('what makes the same fault', () => {
  it('links the same code, ignoring the failure type byte', () => {
    expect(faultLink({ codes: ['P0302-13'], symptoms: [], cause: null }, { codes: ['P0302'], symptoms: [], cause: null })).toMatchObject({ kind: 'same-code', on: 'P0302' });
  });

  it('links a different code in the same J2012 group as the same system', () => {
    // P0301 and P0304 are both P03xx, ignition system or misfire (SAE J2012, references.md §1)
    const link = faultLink({ codes: ['P0301'], symptoms: [], cause: null }, { codes: ['P0304'], symptoms: [], cause: null });
    expect(link).toMatchObject({ kind: 'same-code-group', on: 'ignition-misfire' });
  });

  it('links the same cause-tree system when there are no codes (demo 0024 and 0034, power steering)', () => {
    const link = faultLink({ codes: [], symptoms: ['power-steering-leak'], cause: 'power-steering/fluid-low-leak' }, { codes: [], symptoms: ['steering-groan'], cause: 'power-steering/air-in-system' });
    expect(link).toMatchObject({ kind: 'same-cause-system', on: 'power-steering' });
  });

  it('links a shared symptom tag, but not a generic one such as mil-on', () => {
    expect(faultLink({ codes: [], symptoms: ['mil-on', 'squeal'], cause: null }, { codes: [], symptoms: ['squeal'], cause: null })).toMatchObject({ kind: 'same-symptom', on: 'squeal' });
    expect(faultLink({ codes: [], symptoms: ['mil-on'], cause: null }, { codes: [], symptoms: ['mil-on'], cause: null })).toBeNull();
  });

  it('does not link different systems', () => {
    // P0171 is fuel and air metering (P01), P0302 ignition or misfire (P03), references.md §1
    expect(faultLink({ codes: ['P0171'], symptoms: ['hiss'], cause: 'lean/pcv-failed' }, { codes: ['P0302'], symptoms: ['misfire'], cause: 'misfire/coil' })).toBeNull();
  });

  it('does not call a different system a comeback even inside the window', () => {
    const a = visit({ id: 1, codes: ['P0171'] });
    const b = visit({ id: 2, day: '2026-03-10', codes: ['C0035'] });
    expect(comebackBetween(a, b, window)).toBeNull();
  });
});

describe('findComebacks', () => {
  it('never counts a return after an unconfirmed first fix (demo 0012 and 0017)', () => {
    const loose = visit({ id: 12, day: '2026-03-23', mileage: 70_140, codes: ['P0102'], confirmed: false });
    const chafed = visit({ id: 17, day: '2026-04-22', mileage: 71_260, codes: ['P0102'] });
    expect(findComebacks([loose, chafed], window)).toEqual([]);
  });

  it('only pairs visits of the same vehicle', () => {
    const a = visit({ id: 1, vehicleId: 1, codes: ['P0299'] });
    const b = visit({ id: 2, vehicleId: 2, day: '2026-03-10', codes: ['P0299'] });
    const c = visit({ id: 3, vehicleId: null, day: '2026-03-11', codes: ['P0299'] });
    expect(findComebacks([a, b, c], window)).toEqual([]);
  });

  it('links a return to the latest confirmed visit before it, once', () => {
    const a = visit({ id: 1, day: '2026-01-01', codes: ['P0299'], mileage: null });
    const b = visit({ id: 2, day: '2026-02-01', codes: ['P0299'], mileage: null });
    const c = visit({ id: 3, day: '2026-03-01', codes: ['P0299'], mileage: null });
    const pairs = findComebacks([c, a, b], window);
    expect(pairs.map((p) => [p.firstId, p.repeatId])).toEqual([
      [1, 2],
      [2, 3],
    ]);
  });

  it('skips an unconfirmed visit in between and links to the confirmed one before it', () => {
    const a = visit({ id: 1, day: '2026-01-01', codes: ['P0299'], mileage: null });
    const b = visit({ id: 2, day: '2026-01-20', codes: ['P0299'], mileage: null, confirmed: false });
    const c = visit({ id: 3, day: '2026-02-01', codes: ['P0299'], mileage: null });
    expect(findComebacks([a, b, c], window).map((p) => [p.firstId, p.repeatId, p.days])).toEqual([
      [1, 2, 19],
      [1, 3, 31],
    ]);
  });
});
