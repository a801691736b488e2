import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { classifyDtc, InvalidDtcError } from '../../../shared/codes';
import { validCode } from './arbitraries';

describe('classifyDtc: system from the first letter', () => {
  // SAE J2012 (references.md §1 [S]): P powertrain, C chassis, B body, U network.
  it.each([
    ['P0302', 'powertrain'],
    ['C0035', 'chassis'],
    ['B0001', 'body'],
    ['U0100', 'network'],
  ] as const)('%s is %s', (code, system) => {
    expect(classifyDtc(code).system).toBe(system);
  });
});

describe('classifyDtc: scope from the second (and for P3, third) character', () => {
  // Ownership by position, references.md §1 [M].
  it.each([
    ['P0302', 'generic'],
    ['P1302', 'manufacturer'],
    ['P2135', 'generic'],
    ['P3000', 'manufacturer'], // P30-P33 manufacturer
    ['P3100', 'manufacturer'],
    ['P3200', 'manufacturer'],
    ['P33FF', 'manufacturer'],
    ['P3400', 'generic'], // P34-P39 ISO/SAE controlled
    ['P3500', 'generic'],
    ['P3999', 'generic'],
    ['B0001', 'generic'],
    ['B1000', 'manufacturer'],
    ['B2000', 'manufacturer'],
    ['B3000', 'reserved'],
    ['C0035', 'generic'],
    ['C1234', 'manufacturer'],
    ['C2234', 'manufacturer'],
    ['C3000', 'reserved'],
    ['U0100', 'generic'],
    ['U1000', 'manufacturer'],
    ['U2000', 'manufacturer'],
    ['U3000', 'reserved'],
  ] as const)('%s is %s', (code, scope) => {
    expect(classifyDtc(code).scope).toBe(scope);
  });
});

describe('classifyDtc: group from the third character of P0 codes', () => {
  // references.md §1 [S] (P00 [M]).
  it.each([
    ['P0016', 'fuel-air-metering', /auxiliary emission/i],
    ['P0171', 'fuel-air-metering', /fuel and air metering/i],
    ['P0201', 'fuel-air-metering-injector', /injector/i],
    ['P0302', 'ignition-misfire', /misfire/i],
    ['P0420', 'auxiliary-emission', /auxiliary emission/i],
    ['P0505', 'speed-idle-control', /idle/i],
    ['P0606', 'computer-output', /computer output/i],
    ['P0700', 'transmission', /transmission/i],
    ['P0800', 'transmission', /transmission/i],
    ['P0900', 'transmission', /transmission/i],
    ['P0A80', 'hybrid-propulsion', /hybrid/i],
    ['P0B00', 'hybrid-propulsion', /hybrid/i],
    ['P0C00', 'hybrid-propulsion', /hybrid/i],
  ] as const)('%s is %s', (code, group, label) => {
    const c = classifyDtc(code);
    expect(c.group).toBe(group);
    expect(c.groupLabel).toMatch(label);
  });

  it('P0D-P0F and manufacturer or non-powertrain codes have no group', () => {
    expect(classifyDtc('P0D00').group).toBeNull();
    expect(classifyDtc('P1302')).toMatchObject({ group: null, groupLabel: null });
    expect(classifyDtc('P3400').group).toBeNull();
    expect(classifyDtc('C0035').group).toBeNull();
    expect(classifyDtc('U0100').groupLabel).toBeNull();
  });

  it('P2 codes are grouped too: P2135 throttle correlation is fuel and air metering, P2300 ignition', () => {
    // from memory of J2012 P2 ranges
    expect(classifyDtc('P2135').group).toBe('fuel-air-metering');
    expect(classifyDtc('P2300').group).toBe('ignition-misfire');
    expect(classifyDtc('P2A00').group).toBe('fuel-air-metering');
  });

  it('ignores an FTB and accepts lower case', () => {
    expect(classifyDtc('p0302-13')).toEqual(classifyDtc('P0302'));
  });

  it('throws InvalidDtcError for a malformed code', () => {
    expect(() => classifyDtc('P9302')).toThrow(InvalidDtcError);
  });

  it('every valid code classifies, and only P0/P2 codes ever get a group', () => {
    fc.assert(
      fc.property(validCode, (code) => {
        const c = classifyDtc(code);
        expect(['powertrain', 'chassis', 'body', 'network']).toContain(c.system);
        expect(['generic', 'manufacturer', 'reserved']).toContain(c.scope);
        if (c.group !== null) expect(code).toMatch(/^P[02]/);
        expect(c.group === null).toBe(c.groupLabel === null);
      }),
    );
  });
});
