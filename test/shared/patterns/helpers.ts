import type { PatternCase } from '../../../shared/patterns';

let nextId = 1;

/** A confirmed, published-looking visit of vehicle 1 on 2026-03-02 at 87,300 km, overridable. */
export function visit(over: Partial<PatternCase> = {}): PatternCase {
  const id = over.id ?? nextId++;
  return {
    id,
    title: `case ${id}`,
    vehicleId: 1,
    vin: '7K9PL5C58JL552151',
    plate: null,
    platformId: 10,
    day: '2026-03-02',
    mileage: 87_300,
    mileageUnit: 'km',
    codes: [],
    symptoms: [],
    cause: null,
    rootCause: null,
    confirmed: true,
    confirmedDay: over.confirmed === false ? null : (over.day ?? '2026-03-02'),
    ...over,
  };
}
