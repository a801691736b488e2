import { describe, expect, it } from 'vitest';
import {
  checkReading,
  convert,
  findMeasurements,
  formatReading,
  parseUnit,
  quantityOf,
  unitSchema,
  UNITS,
  UnitError,
  type Unit,
} from '../../shared/units';

describe('convert', () => {
  it('uses the NIST SP 811 factors for psi, inHg and lbf.ft', () => {
    expect(convert(1, 'psi', 'kPa')).toBeCloseTo(6.894757, 6); // NIST SP 811 App. B.8 (references.md §6)
    expect(convert(1, 'inHg', 'kPa')).toBeCloseTo(3.386389, 6); // NIST SP 811 App. B.8 (references.md §6)
    expect(convert(1, 'lbf.ft', 'N.m')).toBeCloseTo(1.355818, 6); // NIST SP 811 App. B.8 (references.md §6)
    expect(convert(1, 'bar', 'kPa')).toBe(100); // exact by definition (references.md brief)
  });

  it('matches the derived check values', () => {
    expect(convert(15, 'psi', 'kPa')).toBeCloseTo(103.42, 2); // derived, references.md §6
    expect(convert(20, 'inHg', 'kPa')).toBeCloseTo(67.728, 3); // derived, references.md §6
    expect(convert(100, 'kPa', 'psi')).toBeCloseTo(14.5038, 4); // derived, references.md §6
  });

  it('converts temperatures with their offsets', () => {
    expect(convert(100, 'degC', 'degF')).toBeCloseTo(212, 9); // water boils at 100 °C = 212 °F (SI definition)
    expect(convert(-40, 'degF', 'degC')).toBeCloseTo(-40, 9); // the scales cross at -40 (from the definitions)
    expect(convert(0, 'degC', 'K')).toBeCloseTo(273.15, 9); // SI definition
  });

  it('converts the small and large units of a quantity', () => {
    expect(convert(1, 'in', 'mm')).toBe(25.4); // exact, international inch
    expect(convert(450, 'mV', 'V')).toBeCloseTo(0.45, 12);
    expect(convert(2.4, 'kohm', 'ohm')).toBeCloseTo(2400, 9);
    expect(convert(2, 'min', 's')).toBe(120);
    expect(convert(14, 'mA', 'A')).toBeCloseTo(0.014, 12);
  });

  it('round-trips every unit through its quantity', () => {
    for (const a of UNITS) {
      for (const b of UNITS.filter((u) => quantityOf(u) === quantityOf(a))) {
        expect(convert(convert(12.5, a, b), b, a)).toBeCloseTo(12.5, 9);
      }
    }
  });

  it('refuses to convert across quantities', () => {
    expect(() => convert(12, 'V', 'kPa')).toThrow(UnitError);
    expect(() => convert(12, 'deg', 'degC')).toThrow(/cannot be converted/);
  });
});

describe('parseUnit', () => {
  it.each<[string, Unit]>([
    ['PSI', 'psi'], ['kpa', 'kPa'], ['KPa', 'kPa'], ['bar', 'bar'], ['in Hg', 'inHg'], ['"Hg', 'inHg'],
    ['°C', 'degC'], ['deg C', 'degC'], ['°F', 'degF'], ['kelvin', 'K'],
    ['degrees', 'deg'], ['°', 'deg'], ['deg', 'deg'],
    ['Nm', 'N.m'], ['N·m', 'N.m'], ['ft-lb', 'lbf.ft'], ['lb-ft', 'lbf.ft'], ['ft lbs', 'lbf.ft'],
    ['volts', 'V'], ['v', 'V'], ['mV', 'mV'], ['Ω', 'ohm'], ['Ω', 'ohm'], ['ohms', 'ohm'], ['kΩ', 'kohm'], ['k ohm', 'kohm'],
    ['amps', 'A'], ['mA', 'mA'], ['ms', 'ms'], ['sec', 's'], ['minutes', 'min'], ['%', '%'], ['percent', '%'],
    ['RPM', 'rpm'], ['r/min', 'rpm'], ['mm', 'mm'], ['inches', 'in'],
  ])('reads %s as %s', (text, unit) => {
    expect(parseUnit(text)).toBe(unit);
  });

  it('throws a UnitError for something that is not a unit', () => {
    expect(() => parseUnit('furlongs')).toThrow(UnitError);
  });

  it('lets the zod schema accept spellings and store the canonical id', () => {
    expect(unitSchema.parse('PSI')).toBe('psi');
    expect(unitSchema.safeParse('parsecs').success).toBe(false);
  });
});

describe('formatReading', () => {
  it('writes a reading the way it reads in a chip', () => {
    expect(formatReading(13, 'deg')).toBe('13 deg');
    expect(formatReading(14.4, 'V')).toBe('14.4 V');
    expect(formatReading(103.4213, 'kPa')).toBe('103.4 kPa');
    expect(formatReading(90, 'degC')).toBe('90 °C');
    expect(formatReading(1234.6, 'rpm')).toBe('1235 rpm');
  });
});

describe('checkReading', () => {
  it('puts a cam-to-crank deviation of 14 deg out against a 4 deg limit', () => {
    // limit of about 4 deg and 14 deg for one tooth off: common practice, no source
    const result = checkReading({ value: 14, unit: 'deg' }, { min: -4, max: 4, unit: 'deg' });
    expect(result.verdict).toBe('out');
    expect(result.reason).toBe('14 deg is above the spec (±4 deg)');
  });

  it('puts 14.4 V inside a 13.5-14.5 V charging spec', () => {
    // charging voltage about 13.5-14.5 V, rule of thumb (references.md §6)
    const result = checkReading({ value: 14.4, unit: 'V' }, { min: 13.5, max: 14.5, unit: 'V' });
    expect(result.verdict).toBe('in');
    expect(result.valueInSpecUnit).toBe(14.4);
    expect(result.reason).toBe('14.4 V is within the spec (13.5–14.5 V)');
  });

  it('converts a psi reading to a kPa spec before comparing', () => {
    // 15 psi = 103.42 kPa (references.md §6, derived from NIST SP 811)
    const below = checkReading({ value: 15, unit: 'psi' }, { min: 300, max: 420, unit: 'kPa' });
    expect(below.verdict).toBe('out');
    expect(below.valueInSpecUnit).toBeCloseTo(103.42, 2);
    expect(below.reason).toMatch(/15 psi \(103\.4 kPa\) is below/);
    const inside = checkReading({ value: 50, unit: 'psi' }, { min: 300, max: 420, unit: 'kPa' });
    expect(inside.verdict).toBe('in');
  });

  it('does not fail a reading that sits on the limit after conversion round-off', () => {
    // 20 inHg = 67.728 kPa (references.md §6, derived)
    const kPa = convert(20, 'inHg', 'kPa');
    expect(checkReading({ value: kPa, unit: 'kPa' }, { min: 20, unit: 'inHg' }).verdict).toBe('in');
  });

  it('puts a manifold vacuum of 15 inHg below the 17-21 inHg idle range', () => {
    // healthy idle vacuum 17-21 inHg (references.md §6, US Army OD1001)
    expect(checkReading({ value: 15, unit: 'inHg' }, { min: 17, max: 21, unit: 'inHg' }).verdict).toBe('out');
    expect(checkReading({ value: 19, unit: 'inHg' }, { min: 17, max: 21, unit: 'inHg' }).verdict).toBe('in');
  });

  it('refuses to compare a voltage with a pressure spec', () => {
    expect(() => checkReading({ value: 12, unit: 'V' }, { min: 300, unit: 'kPa' })).toThrow(/cannot be compared with/);
  });
});

describe('findMeasurements', () => {
  const units = (text: string) => findMeasurements(text).map((m) => [m.value, m.unit]);

  it('finds readings with units in a case note', () => {
    const text =
      'Cam/crank read 13 degrees on bank 2, fuel pressure 15 psi at idle, battery 11.8 V cranking, ' +
      'LTFT +22 % bank 1 and -8% bank 2, coil primary 0.45 ohm, secondary 2.4 kohm, charging 14.4V at 850 rpm.';
    expect(units(text)).toEqual([
      [13, 'deg'], [15, 'psi'], [11.8, 'V'], [22, '%'], [-8, '%'], [0.45, 'ohm'], [2.4, 'kohm'], [14.4, 'V'], [850, 'rpm'],
    ]);
  });

  it('keeps the text it matched', () => {
    expect(findMeasurements('LTFT +22 % at idle')[0]?.raw).toBe('+22 %');
  });

  it('reads temperatures, vacuum, torque and thousands separators', () => {
    expect(units('ECT 92°C, vacuum 18 inHg, torqued to 25 Nm and 40 ft-lb, idle 1,250 rpm')).toEqual([
      [92, 'degC'], [18, 'inHg'], [25, 'N.m'], [40, 'lbf.ft'], [1250, 'rpm'],
    ]);
  });

  it('does not take trouble codes, engine names or bare numbers for readings', () => {
    expect(findMeasurements('P0302 on the 3.5 V6, cylinder 2, 2 in a row, went in for a check')).toEqual([]);
  });

  it('does not read the dash of a range as a minus sign', () => {
    expect(units('spec is 13.5-14.5 V')).toEqual([[14.5, 'V']]);
  });
});
