// SAE J1979 (ISO 15031-5) service $01 PID $01, "monitor status since DTCs cleared".
// Layout as in the CAN-era editions of the PID $01 table (recalled from memory, not
// checked against the printed standard):
//   A  bit 7 MIL commanded on, bits 6-0 count of confirmed emission codes
//   B  bit 3 0 = spark ignition, 1 = compression ignition
//      bits 0-2 continuous monitors supported (misfire, fuel system, components)
//      bits 4-6 the same three, 1 = not complete; bit 7 reserved
//   C  non-continuous monitors supported (1 = supported), meaning set by B bit 3
//   D  the same bits, 1 = not complete
// Older editions used C/D bit 4 for the A/C refrigerant monitor; later ones reserve it.

export const ignitionTypes = ['spark', 'compression'] as const;
export type Ignition = (typeof ignitionTypes)[number];

export type MonitorKind = 'continuous' | 'non-continuous';

export interface MonitorDef {
  key: string;
  name: string;
  kind: MonitorKind;
  /** bit in byte B (continuous: supported bit; incomplete is bit + 4) or in C/D */
  bit: number;
}

export const continuousMonitors: readonly MonitorDef[] = [
  { key: 'misfire', name: 'Misfire', kind: 'continuous', bit: 0 },
  { key: 'fuel-system', name: 'Fuel system', kind: 'continuous', bit: 1 },
  { key: 'components', name: 'Comprehensive components', kind: 'continuous', bit: 2 },
];

const nonContinuous = (key: string, name: string, bit: number): MonitorDef => ({ key, name, kind: 'non-continuous', bit });

export const sparkMonitors: readonly MonitorDef[] = [
  nonContinuous('catalyst', 'Catalyst', 0),
  nonContinuous('heated-catalyst', 'Heated catalyst', 1),
  nonContinuous('evap', 'Evaporative system', 2),
  nonContinuous('secondary-air', 'Secondary air system', 3),
  nonContinuous('ac-refrigerant', 'A/C refrigerant', 4),
  nonContinuous('oxygen-sensor', 'Oxygen sensor', 5),
  nonContinuous('oxygen-sensor-heater', 'Oxygen sensor heater', 6),
  nonContinuous('egr-vvt', 'EGR / VVT system', 7),
];

// Bits 2 and 4 are reserved for compression ignition.
export const compressionMonitors: readonly MonitorDef[] = [
  nonContinuous('nmhc-catalyst', 'NMHC catalyst', 0),
  nonContinuous('nox-scr', 'NOx / SCR aftertreatment', 1),
  nonContinuous('boost-pressure', 'Boost pressure', 3),
  nonContinuous('exhaust-gas-sensor', 'Exhaust gas sensor', 5),
  nonContinuous('pm-filter', 'PM filter', 6),
  nonContinuous('egr-vvt', 'EGR / VVT system', 7),
];

export function nonContinuousMonitors(ignition: Ignition): readonly MonitorDef[] {
  return ignition === 'spark' ? sparkMonitors : compressionMonitors;
}

/** Every monitor an ignition type can report, continuous first, in bit order. */
export function monitorsFor(ignition: Ignition): readonly MonitorDef[] {
  return [...continuousMonitors, ...nonContinuousMonitors(ignition)];
}

const allDefs = [...continuousMonitors, ...sparkMonitors, ...compressionMonitors];
export const monitorKeys: readonly string[] = [...new Set(allDefs.map((d) => d.key))];

export function monitorDef(key: string): MonitorDef | undefined {
  return allDefs.find((d) => d.key === key);
}

export interface MonitorState {
  key: string;
  name: string;
  kind: MonitorKind;
  supported: boolean;
  /** true when supported and done; false when supported and not done; unsupported monitors report false */
  complete: boolean;
}

/** What PID $01 (or a printed monitor table) says: MIL, code count, ignition, monitors. */
export interface ReadinessReadout {
  /** null when the source did not say (a printed table without a MIL line) */
  mil: boolean | null;
  confirmedCodes: number | null;
  ignition: Ignition;
  monitors: MonitorState[];
}

export class ReadinessDecodeError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ReadinessDecodeError';
  }
}

const bitSet = (byte: number, bit: number) => (byte & (1 << bit)) !== 0;

function state(def: MonitorDef, supported: boolean, incompleteBit: boolean): MonitorState {
  return { key: def.key, name: def.name, kind: def.kind, supported, complete: supported && !incompleteBit };
}

/** The four data bytes A-D of a PID $01 answer to MIL, ignition and monitor states. */
export function decodeMonitorStatus(bytes: readonly number[]): ReadinessReadout {
  if (bytes.length !== 4) throw new ReadinessDecodeError(`PID $01 carries 4 data bytes (A-D), got ${bytes.length}`);
  for (const b of bytes) {
    if (!Number.isInteger(b) || b < 0 || b > 0xff) throw new ReadinessDecodeError(`each byte is 0-255, got ${b}`);
  }
  const [a, b, c, d] = bytes as [number, number, number, number];
  const ignition: Ignition = bitSet(b, 3) ? 'compression' : 'spark';
  return {
    mil: bitSet(a, 7),
    confirmedCodes: a & 0x7f,
    ignition,
    monitors: [
      ...continuousMonitors.map((m) => state(m, bitSet(b, m.bit), bitSet(b, m.bit + 4))),
      ...nonContinuousMonitors(ignition).map((m) => state(m, bitSet(c, m.bit), bitSet(d, m.bit))),
    ],
  };
}

/** Back to bytes A-D; the inverse of decodeMonitorStatus for readouts it produced. */
export function encodeMonitorStatus(r: ReadinessReadout): [number, number, number, number] {
  const a = Math.min(r.confirmedCodes ?? 0, 0x7f) | (r.mil ? 0x80 : 0);
  let b = r.ignition === 'compression' ? 0x08 : 0;
  let c = 0;
  let d = 0;
  for (const m of r.monitors) {
    const def = monitorsFor(r.ignition).find((x) => x.key === m.key);
    if (!def || !m.supported) continue;
    if (def.kind === 'continuous') b |= (1 << def.bit) | (m.complete ? 0 : 1 << (def.bit + 4));
    else {
      c |= 1 << def.bit;
      if (!m.complete) d |= 1 << def.bit;
    }
  }
  return [a, b, c, d];
}

/**
 * Several control units answer PID $01 (engine, transmission...). Common practice
 * (no source): the MIL is on if any unit commands it, codes add up, a monitor is
 * supported if any unit supports it and complete only if every supporting unit says so.
 * The first readout (the engine unit, answering first) sets the ignition type.
 */
export function mergeReadouts(readouts: readonly ReadinessReadout[]): ReadinessReadout {
  const [first, ...rest] = readouts;
  if (!first) throw new ReadinessDecodeError('no monitor status to merge');
  const same = rest.filter((r) => r.ignition === first.ignition);
  const monitors = first.monitors.map((m) => {
    const others = same.map((r) => r.monitors.find((o) => o.key === m.key)).filter((o): o is MonitorState => !!o?.supported);
    const supported = m.supported || others.length > 0;
    const complete = supported && [m, ...others].filter((o) => o.supported).every((o) => o.complete);
    return { ...m, supported, complete };
  });
  const anyMil = readouts.some((r) => r.mil === true);
  const mil = anyMil ? true : readouts.every((r) => r.mil === false) ? false : null;
  const counts = readouts.map((r) => r.confirmedCodes);
  const confirmedCodes = counts.every((n) => n === null) ? null : counts.reduce<number>((s, n) => s + (n ?? 0), 0);
  return { mil, confirmedCodes, ignition: first.ignition, monitors };
}
