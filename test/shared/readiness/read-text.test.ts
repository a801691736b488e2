import { describe, expect, it } from 'vitest';
import { parseMonitorBytes, readMonitorTable, readReadiness, ReadinessDecodeError, readTableLine } from '../../../shared/readiness';

// Printouts below are invented; no tool's layout is copied. Byte values are hand-worked from the
// SAE J1979 service $01 PID $01 layout (recalled from memory).

const state = (text: string) => {
  const r = readReadiness(text);
  return r && Object.fromEntries(r.monitors.filter((m) => m.supported).map((m) => [m.key, m.complete]));
};

describe('PID $01 answers in hex', () => {
  it.each(['41 01 00 07 65 04', '4101 00076504', '41010 0076504', '41010007 6504', '00 07 65 04', '00076504'])('reads %s', (input) => {
    const r = parseMonitorBytes(input);
    expect(r).toMatchObject({ mil: false, confirmedCodes: 0, ignition: 'spark' });
    expect(r.monitors.find((m) => m.key === 'evap')).toMatchObject({ supported: true, complete: false });
  });

  it('reads CAN lines with headers, one per control unit, and merges them', () => {
    const text = `>0101
7E8 06 41 01 82 07 65 04
7E9 06 41 01 00 04 00 00`;
    const r = parseMonitorBytes(text);
    expect(r).toMatchObject({ mil: true, confirmedCodes: 2 });
    expect(state(text)).toMatchObject({ catalyst: true, evap: false, components: true });
  });

  it.each([
    ['', /give the PID \$01 bytes/],
    ['41 01 00 07 65', /4 bytes/],
    ['41 01 0G 07 65 04', /"G" is not a hex digit/],
    ['410100076', /odd number/],
    ['43 01 35 00 00 00', /41 01/],
  ])('rejects %j with the reason', (input, reason) => {
    expect(() => parseMonitorBytes(input)).toThrow(ReadinessDecodeError);
    expect(() => parseMonitorBytes(input)).toThrow(reason);
  });
});

describe('printed monitor tables', () => {
  it.each([
    ['Catalyst: complete', 'catalyst', 'complete'],
    ['EVAP  incomplete', 'evap', 'incomplete'],
    ['Catalyst ....... not complete', 'catalyst', 'incomplete'],
    ['Secondary air       not supported', 'secondary-air', 'unsupported'],
    ['Heated catalyst: N/A', 'heated-catalyst', 'unsupported'],
    ['O2 Sensor Heater  Ready', 'oxygen-sensor-heater', 'complete'],
    ['Oxygen sensor     Not ready', 'oxygen-sensor', 'incomplete'],
    ['EGR/VVT System: INC', 'egr-vvt', 'incomplete'],
    ['Comprehensive components  complete', 'components', 'complete'],
    ['DPF   incomplete', 'pm-filter', 'incomplete'],
    ['NOx/SCR monitor: complete', 'nox-scr', 'complete'],
  ])('%j -> %s %s', (line, key, s) => {
    expect(readTableLine(line)).toEqual({ key, state: s });
  });

  it('ignores code lines and counters that only mention a monitor', () => {
    expect(readMonitorTable('P0420 Catalyst System Efficiency Below Threshold Bank 1 - confirmed')).toBeNull();
    expect(readMonitorTable('Distance with MIL on: 0 km\nCatalyst: complete')?.mil).toBeNull();
  });

  it('reads a whole table with MIL and code count, spark ignition', () => {
    const text = `Monitor status since codes cleared
MIL status: OFF
DTC count: 0
Misfire ............ complete
Fuel system ........ complete
Comp. components ... complete
Catalyst ........... complete
EVAP ............... incomplete
Secondary air ...... not supported
O2 sensor .......... complete
O2 sensor heater ... complete
EGR/VVT ............ not complete`;
    const r = readMonitorTable(text)!;
    expect(r).toMatchObject({ mil: false, confirmedCodes: 0, ignition: 'spark' });
    expect(state(text)).toEqual({
      misfire: true,
      'fuel-system': true,
      components: true,
      catalyst: true,
      evap: false,
      'oxygen-sensor': true,
      'oxygen-sensor-heater': true,
      'egr-vvt': false,
    });
  });

  it('takes a table naming diesel monitors as compression ignition', () => {
    const r = readMonitorTable('MIL: on\nNMHC catalyst: incomplete\nBoost pressure: complete\nPM filter: complete')!;
    expect(r).toMatchObject({ mil: true, ignition: 'compression' });
    expect(r.monitors.find((m) => m.key === 'nmhc-catalyst')).toMatchObject({ supported: true, complete: false });
  });

  it('prefers a PID $01 answer over the table in the same printout', () => {
    expect(readReadiness('Catalyst: incomplete\n41 01 00 07 65 00')?.monitors.find((m) => m.key === 'catalyst')?.complete).toBe(true);
  });

  it('finds nothing in a printout without monitor status', () => {
    expect(readReadiness('P0302 Cylinder 2 Misfire Detected\nOdometer: 84,210 km')).toBeNull();
  });
});
