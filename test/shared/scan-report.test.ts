import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { mileageIn, parseScanReport, type ScanReport, ScanReportError, statusFromUds } from '../../shared/scan-report';
import { checkVin } from '../../shared/vin';
import { validCode } from './codes/arbitraries';

// Sample printouts below are invented: no shop, tool or layout is taken from a real product.
// VINs are the published check-digit examples of 49 CFR 565 (references.md §3).

const onePerLine = `HARBOURLINE MOTORS - WORKSHOP SCAN
Date: 14/03/2025   Tech: R. Okafor
Vehicle: Corvane Tern 1.6 (KX16)
VIN: 1G4AH59H45G118341
Odometer: 84,210 km

Confirmed codes (2)
  P0302-13  Cylinder 2 Misfire Detected
  P0171     System Too Lean Bank 1
Pending codes (1)
  P0174     System Too Lean Bank 2
Permanent codes (0)
  none
Readiness monitors:
  Misfire ........ complete
  Catalyst ....... not complete
`;

const csvWithHeader = `Module,DTC,FTB,Status,Description,Odometer (mi)
ECM,P0301,00,Confirmed,Cylinder 1 Misfire Detected,52118
ECM,P0300,,Pending,Random/Multiple Cylinder Misfire Detected,52118
ABS,C0035,13,"Active, warning lamp on","Left front wheel speed sensor, circuit",52118
BCM,U0100,87,History,Lost Communication With ECM/PCM "A",52118
`;

const mixedWithFreezeFrame = `== Engine control module ==
Stored DTCs:
P0302 Cylinder 2 Misfire Detected
P0304 Cylinder 4 Misfire Detected
Freeze frame for P0302:
  Engine speed ............. 812 rpm
  Coolant temp ............. 91 C
  Vehicle speed ............ 0 km/h
  Distance since codes cleared .. 1,204 km
  Long term fuel trim B1 ... +12.5 %
Pending DTCs:
P0171 System Too Lean Bank 1
Mileage: 61 507 mi
`;

const blockLayout = `Scan summary - Bay 2 - Tamsin Reyes
DTC: P0420
Description: Catalyst System Efficiency Below Threshold Bank 1
Status: Confirmed

DTC: P0141
Description: O2 Sensor Heater Circuit Bank 1 Sensor 2
Status: Pending
`;

const semicolonWithUdsStatus = `Report;Northgate Auto Electrical
Code;Status byte;Text
P0562;0x08;Supply voltage low
P0A80;2F;Hybrid battery pack
U0121;0x28;No messages from ABS unit
Odometer;120.332 km
`;

describe('parseScanReport: sample printouts', () => {
  it('reads a one-code-per-line printout with section headers', () => {
    const { readiness, ...rest } = parseScanReport(onePerLine);
    // the monitor table at the end is the readiness part (shared/readiness)
    const supported = readiness?.monitors.filter((m) => m.supported).map((m) => [m.key, m.complete]);
    expect(supported).toEqual([
      ['misfire', true],
      ['catalyst', false],
    ]);
    expect(rest).toEqual<ScanReport>({
      codes: [
        { code: 'P0302', ftb: '13', status: 'confirmed' },
        { code: 'P0171', status: 'confirmed' },
        { code: 'P0174', status: 'pending' },
      ],
      vin: '1G4AH59H45G118341',
      mileage: { value: 84210, unit: 'km' },
    });
  });

  it('reads a CSV export with code, FTB, status and odometer columns', () => {
    expect(parseScanReport(csvWithHeader)).toEqual<ScanReport>({
      codes: [
        { code: 'P0301', ftb: '00', status: 'confirmed' },
        { code: 'P0300', status: 'pending' },
        { code: 'C0035', ftb: '13', status: 'active' },
        { code: 'U0100', ftb: '87', status: 'history' },
      ],
      mileage: { value: 52118, unit: 'mi' },
    });
  });

  it('reads a printout mixed with freeze frame lines, without taking trip distances as the odometer', () => {
    expect(parseScanReport(mixedWithFreezeFrame)).toEqual<ScanReport>({
      codes: [
        { code: 'P0302', status: 'confirmed' },
        { code: 'P0304', status: 'confirmed' },
        { code: 'P0171', status: 'pending' },
      ],
      mileage: { value: 61507, unit: 'mi' },
    });
  });

  it('reads a block layout where the status sits on its own line under the code', () => {
    expect(parseScanReport(blockLayout).codes).toEqual([
      { code: 'P0420', status: 'confirmed' },
      { code: 'P0141', status: 'pending' },
    ]);
  });

  it('reads a semicolon CSV whose status column holds UDS status bytes', () => {
    // UDS status bits, references.md §1: 0x08 confirmed only; 0x2F includes testFailed; 0x28 confirmed + failed since clear
    const r = parseScanReport(semicolonWithUdsStatus);
    expect(r.codes).toEqual([
      { code: 'P0562', status: 'confirmed' },
      { code: 'P0A80', status: 'active' },
      { code: 'U0121', status: 'confirmed' },
    ]);
    expect(r.mileage).toEqual({ value: 120332, unit: 'km' });
  });

  it('accepts Windows line endings and a byte order mark', () => {
    const r = parseScanReport(`\uFEFF${onePerLine.replace(/\n/g, '\r\n')}`);
    expect(r.codes.map((c) => c.code)).toEqual(['P0302', 'P0171', 'P0174']);
  });
});

describe('parseScanReport: codes and status on one line', () => {
  it('gives each code the status word that follows it', () => {
    expect(parseScanReport('P0301 pending  P0302 confirmed').codes).toEqual([
      { code: 'P0301', status: 'pending' },
      { code: 'P0302', status: 'confirmed' },
    ]);
  });

  it('applies a leading status word to every code on the line', () => {
    expect(parseScanReport('Permanent: P0420, P0430').codes).toEqual([
      { code: 'P0420', status: 'permanent' },
      { code: 'P0430', status: 'permanent' },
    ]);
  });

  it.each([
    ['stored', 'confirmed'],
    ['Historic', 'history'],
    ['inactive', 'history'],
    ['ACTIVE', 'active'],
  ] as const)('reads "%s" as %s', (word, status) => {
    expect(parseScanReport(`P0128 ${word}`).codes[0]?.status).toBe(status);
  });

  it('does not read "current" in a code title as a status', () => {
    expect(parseScanReport('P0685-19 power relay circuit current above threshold').codes).toEqual([{ code: 'P0685', ftb: '19' }]);
  });

  it('does not read a number after a space as an FTB', () => {
    expect(parseScanReport('P0302 13 events').codes).toEqual([{ code: 'P0302' }]);
  });

  it('lists a repeated code once and keeps the first status', () => {
    expect(parseScanReport('P0171 pending\nP0171 confirmed\np0171').codes).toEqual([{ code: 'P0171', status: 'pending' }]);
  });

  it('keeps two FTBs of one code apart, and adds an FTB to an earlier bare mention', () => {
    expect(parseScanReport('P0302-13\nP0302-11').codes).toEqual([
      { code: 'P0302', ftb: '13' },
      { code: 'P0302', ftb: '11' },
    ]);
    expect(parseScanReport('Codes: P0302\nP0302-13 confirmed').codes).toEqual([{ code: 'P0302', ftb: '13', status: 'confirmed' }]);
  });

  it('reads a compact code-plus-FTB cell in a CSV code column', () => {
    expect(parseScanReport('dtc,status\nP030213,pending').codes).toEqual([{ code: 'P0302', ftb: '13', status: 'pending' }]);
  });

  it('finds every code listed one per line', () => {
    fc.assert(
      fc.property(fc.array(validCode, { minLength: 1, maxLength: 12 }), fc.boolean(), (codes, lower) => {
        const text = codes.map((c) => (lower ? c.toLowerCase() : c)).join('\n');
        expect(parseScanReport(text).codes.map((c) => c.code)).toEqual([...new Set(codes)]);
      }),
    );
  });
});

describe('parseScanReport: VIN', () => {
  it('takes an unlabelled 17-character token when its check digit is valid', () => {
    // 1M8GDM9AXKP042788: check digit X, references.md §3
    const r = parseScanReport('Vehicle 1M8GDM9AXKP042788 in for a no-start');
    expect(r).toEqual({ codes: [], vin: '1M8GDM9AXKP042788' });
  });

  it('ignores an unlabelled token whose check digit fails', () => {
    expect(parseScanReport('Ref 1M8GDM9A1KP042788\nP0300').vin).toBeUndefined();
  });

  it('ignores an unlabelled all-digit token even if its check digit works out', () => {
    // 11111111111111111 passes the check digit (references.md §3) but reads as a number here
    expect(parseScanReport('Cal id 11111111111111111\nP0300').vin).toBeUndefined();
  });

  it('takes a labelled VIN even without a valid check digit', () => {
    const vin = 'Y9XKT2B73M0004172';
    expect(checkVin(vin).warnings.length).toBeGreaterThan(0);
    expect(parseScanReport(`Chassis no: ${vin}\nP0101`).vin).toBe(vin);
    expect(parseScanReport(`vin ${vin.toLowerCase()}\nP0101`).vin).toBe(vin);
  });

  it('prefers a labelled VIN over an unlabelled one', () => {
    const r = parseScanReport('Previous car 1M8GDM9AXKP042788\nVIN: 1G4AH59H45G118341\nP0300');
    expect(r.vin).toBe('1G4AH59H45G118341');
  });

  it('reads a VIN column in a CSV', () => {
    expect(parseScanReport('VIN,Code\nY9XKT2B73M0004172,P0420').vin).toBe('Y9XKT2B73M0004172');
  });

  it('does not find codes inside the VIN', () => {
    expect(parseScanReport('VIN: 1G4AH59H45G118341').codes).toEqual([]);
  });
});

describe('mileageIn', () => {
  it.each([
    ['Odometer: 84,210 km', 84210, 'km'],
    ['ODO 120 332 km', 120332, 'km'],
    ['Mileage: 52,118 miles', 52118, 'mi'],
    ['Odometer (mi): 61507', 61507, 'mi'],
    ['Odometer 12.345 km', 12345, 'km'],
    ['Odometer 1204.5 km', 1204.5, 'km'],
    ['odometer 9 kilometres', 9, 'km'],
  ] as const)('%j -> %d %s', (line, value, unit) => {
    expect(mileageIn(line)).toEqual({ value, unit });
  });

  it.each([
    'Mileage since codes cleared: 1,204 km',
    'Distance with MIL on: 388 km',
    'Odometer: 84210',
    'Vehicle speed 0 km/h',
    'Mileage: unknown',
  ])('ignores %j', (line) => {
    expect(mileageIn(line)).toBeUndefined();
  });
});

describe('parseScanReport: unreadable input', () => {
  function reasonOf(text: string): string | undefined {
    try {
      parseScanReport(text);
      return undefined;
    } catch (e) {
      expect(e).toBeInstanceOf(ScanReportError);
      return (e as ScanReportError).reason;
    }
  }

  it('rejects empty or blank text', () => {
    expect(reasonOf('')).toBe('empty');
    expect(reasonOf(' \n\t\r\n ')).toBe('empty');
    expect(() => parseScanReport('')).toThrow(/empty/);
  });

  it('rejects text with NUL bytes as binary', () => {
    expect(reasonOf('P0302\u0000\u0000')).toBe('binary');
    expect(() => parseScanReport('PK\u0003\u0004\u0000')).toThrow(/binary/);
  });

  it('rejects mostly non-printable text as binary', () => {
    expect(reasonOf('P0302 ' + '\u0001\u0002\u0003\u0007\uFFFD'.repeat(10))).toBe('binary');
  });

  it('rejects reports over 1 MB, counting UTF-8 bytes', () => {
    expect(reasonOf('P0302 ' + 'x'.repeat(1024 * 1024))).toBe('too-large');
    expect(reasonOf('P0302 ' + '\u00e9'.repeat(600_000))).toBe('too-large'); // 600k characters, 1.2 MB
    expect(reasonOf('P0302 ' + 'x'.repeat(1000 * 1000))).toBeUndefined();
  });

  it('rejects text with no codes and no VIN', () => {
    expect(reasonOf('Battery 12.4 V at rest, charging 14.1 V')).toBe('nothing-found');
    expect(() => parseScanReport('Odometer: 84,210 km')).toThrow(/No trouble codes or VIN found/);
  });
});

describe('statusFromUds', () => {
  it.each([
    [0x08, 'confirmed'], // references.md §1: confirmed only
    [0x04, 'pending'],
    [0x09, 'active'],
    [0x20, 'history'],
    [0x00, undefined],
  ] as const)('0x%s -> %s', (byte, status) => {
    expect(statusFromUds(byte)).toBe(status);
  });
});
