import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  decodeMonitorStatus,
  encodeMonitorStatus,
  mergeReadouts,
  type MonitorState,
  ReadinessDecodeError,
} from '../../../shared/readiness';

// Bit layout: SAE J1979 service $01 PID $01 table, CAN-era editions, recalled from memory
// (not checked against the printed standard). Byte values below are hand-worked from that layout.

const byKey = (ms: MonitorState[]) => Object.fromEntries(ms.map((m) => [m.key, { supported: m.supported, complete: m.complete }]));

describe('PID $01 byte A', () => {
  it('reads MIL bit 7 and the confirmed-code count in bits 0-6', () => {
    // SAE J1979 PID $01 byte A (from memory); 0x82 = MIL on, 2 codes (hand-worked)
    expect(decodeMonitorStatus([0x82, 0, 0, 0])).toMatchObject({ mil: true, confirmedCodes: 2 });
    expect(decodeMonitorStatus([0x00, 0, 0, 0])).toMatchObject({ mil: false, confirmedCodes: 0 });
    expect(decodeMonitorStatus([0x7f, 0, 0, 0])).toMatchObject({ mil: false, confirmedCodes: 127 });
  });
});

describe('PID $01 spark ignition (byte B bit 3 clear)', () => {
  it('decodes 00 07 65 00: all continuous complete; catalyst, EVAP, O2 sensor, O2 heater supported and complete', () => {
    // hand-worked: B=07 (bits 0-2 supported, 4-6 clear), C=0x65 = bits 0, 2, 5, 6, D=00
    const r = decodeMonitorStatus([0x00, 0x07, 0x65, 0x00]);
    expect(r.ignition).toBe('spark');
    expect(byKey(r.monitors)).toEqual({
      misfire: { supported: true, complete: true },
      'fuel-system': { supported: true, complete: true },
      components: { supported: true, complete: true },
      catalyst: { supported: true, complete: true },
      'heated-catalyst': { supported: false, complete: false },
      evap: { supported: true, complete: true },
      'secondary-air': { supported: false, complete: false },
      'ac-refrigerant': { supported: false, complete: false },
      'oxygen-sensor': { supported: true, complete: true },
      'oxygen-sensor-heater': { supported: true, complete: true },
      'egr-vvt': { supported: false, complete: false },
    });
  });

  it('reads D bit 2 as EVAP incomplete and B bit 4 as misfire incomplete', () => {
    // hand-worked: B=0x17 (misfire incomplete flag bit 4), C=0xE5 (adds EGR/VVT bit 7), D=0x84 (EVAP, EGR/VVT)
    const m = byKey(decodeMonitorStatus([0x00, 0x17, 0xe5, 0x84]).monitors);
    expect(m.misfire).toEqual({ supported: true, complete: false });
    expect(m.evap).toEqual({ supported: true, complete: false });
    expect(m['egr-vvt']).toEqual({ supported: true, complete: false });
    expect(m.catalyst).toEqual({ supported: true, complete: true });
  });

  it('treats an incomplete flag on an unsupported monitor as not supported', () => {
    // D bit 3 (secondary air) set while C bit 3 is clear: not supported wins (common practice, no source)
    expect(byKey(decodeMonitorStatus([0, 0x07, 0x01, 0x08]).monitors)['secondary-air']).toEqual({ supported: false, complete: false });
  });
});

describe('PID $01 compression ignition (byte B bit 3 set)', () => {
  it('decodes 00 0F 83 81 with the diesel meanings of C and D', () => {
    // hand-worked: B=0x0F (bit 3 compression), C=0x83 = NMHC (0), NOx/SCR (1), EGR/VVT (7); D=0x81
    const r = decodeMonitorStatus([0x00, 0x0f, 0x83, 0x81]);
    expect(r.ignition).toBe('compression');
    const m = byKey(r.monitors);
    expect(m['nmhc-catalyst']).toEqual({ supported: true, complete: false });
    expect(m['nox-scr']).toEqual({ supported: true, complete: true });
    expect(m['egr-vvt']).toEqual({ supported: true, complete: false });
    expect(m['pm-filter']).toEqual({ supported: false, complete: false });
    expect(m.catalyst).toBeUndefined();
    expect(r.monitors.map((x) => x.key)).not.toContain('evap');
  });
});

describe('errors and round trip', () => {
  it.each([[[0, 0, 0]], [[0, 0, 0, 256]], [[0, 0, 0, 1.5]]])('rejects %j', (bytes) => {
    expect(() => decodeMonitorStatus(bytes)).toThrow(ReadinessDecodeError);
  });

  it('encodes back to the same bytes once reserved and contradicting bits are cleared', () => {
    const byte = fc.integer({ min: 0, max: 255 });
    fc.assert(
      fc.property(byte, byte, byte, byte, (a, b, c, d) => {
        const r = decodeMonitorStatus([a, b, c, d]);
        const compression = (b & 0x08) !== 0;
        const cMask = compression ? 0xeb : 0xff; // bits 2 and 4 reserved for compression ignition
        const supportedC = c & cMask;
        const expected = [a, (b & 0x0f) | (b & (b << 4) & 0x70), supportedC, d & supportedC];
        expect(encodeMonitorStatus(r)).toEqual(expected);
      }),
    );
  });
});

describe('several control units', () => {
  it('MIL on if any unit says so; a monitor is complete only when every supporting unit says so', () => {
    // engine 00 07 65 00 and a second unit 81 07 61 01 (catalyst incomplete there), hand-worked
    const merged = mergeReadouts([decodeMonitorStatus([0x00, 0x07, 0x65, 0x00]), decodeMonitorStatus([0x81, 0x07, 0x61, 0x01])]);
    expect(merged.mil).toBe(true);
    expect(merged.confirmedCodes).toBe(1);
    const m = byKey(merged.monitors);
    expect(m.catalyst).toEqual({ supported: true, complete: false });
    expect(m.evap).toEqual({ supported: true, complete: true });
  });
});
