// What a code's characters say about it (SAE J2012, references.md §1):
// letter = system, second character (+ third for P3) = who owns the
// definition, third character of P0/P2 = subsystem group.
import { requireDtc } from './dtc-format';

export type DtcSystem = 'powertrain' | 'chassis' | 'body' | 'network';
export type DtcScope = 'generic' | 'manufacturer' | 'reserved';
export type DtcGroup =
  | 'fuel-air-metering'
  | 'fuel-air-metering-injector'
  | 'ignition-misfire'
  | 'auxiliary-emission'
  | 'speed-idle-control'
  | 'computer-output'
  | 'transmission'
  | 'hybrid-propulsion'
  | null;

export interface DtcClassification {
  system: DtcSystem;
  scope: DtcScope;
  group: DtcGroup;
  groupLabel: string | null;
}

const systems: Record<string, DtcSystem> = { P: 'powertrain', C: 'chassis', B: 'body', U: 'network' };

export const dtcSystemLabels: Record<DtcSystem, string> = {
  powertrain: 'Powertrain',
  chassis: 'Chassis',
  body: 'Body',
  network: 'Network and vehicle integration',
};

export const dtcScopeLabels: Record<DtcScope, string> = {
  generic: 'Generic (ISO/SAE defined)',
  manufacturer: 'Manufacturer specific',
  reserved: 'Reserved',
};

type GroupEntry = readonly [Exclude<DtcGroup, null>, string];

const FUEL_AIR: GroupEntry = ['fuel-air-metering', 'Fuel and air metering'];
const TRANSMISSION: GroupEntry = ['transmission', 'Transmission'];
const HYBRID: GroupEntry = ['hybrid-propulsion', 'Hybrid propulsion'];

// P0 third character, references.md §1 ([S] except P00 [M]). D-F are not assigned.
const p0Groups: Record<string, GroupEntry> = {
  '0': ['fuel-air-metering', 'Fuel and air metering and auxiliary emission controls'],
  '1': FUEL_AIR,
  '2': ['fuel-air-metering-injector', 'Fuel and air metering (injector circuit)'],
  '3': ['ignition-misfire', 'Ignition system or misfire'],
  '4': ['auxiliary-emission', 'Auxiliary emission controls'],
  '5': ['speed-idle-control', 'Vehicle speed control, idle control and auxiliary inputs'],
  '6': ['computer-output', 'Computer output circuit'],
  '7': TRANSMISSION,
  '8': TRANSMISSION,
  '9': TRANSMISSION,
  A: HYBRID,
  B: HYBRID,
  C: HYBRID,
};

// P2 follows the same scheme for 3-8, but 0-2 and A are all fuel and air
// metering (P22xx is not injector circuits, P2Axx is not hybrid). From memory
// of J2012; P29 and P2B-P2F are left unassigned rather than guessed.
const p2Groups: Record<string, GroupEntry> = {
  '0': ['fuel-air-metering', 'Fuel and air metering and auxiliary emission controls'],
  '1': FUEL_AIR,
  '2': ['fuel-air-metering', 'Fuel and air metering and auxiliary emission controls'],
  '3': ['ignition-misfire', 'Ignition system or misfire'],
  '4': ['auxiliary-emission', 'Auxiliary emission controls'],
  '5': ['speed-idle-control', 'Auxiliary inputs'],
  '6': ['computer-output', 'Computer and auxiliary output circuits'],
  '7': TRANSMISSION,
  '8': TRANSMISSION,
  A: FUEL_AIR,
};

/** Ownership by character position (references.md §1, [M]). */
function scopeOf(letter: string, second: string, third: string): DtcScope {
  if (letter === 'P') {
    if (second === '1') return 'manufacturer';
    // P30-P33 manufacturer, P34-P39 generic; P3A-P3F assumed to follow P34-P39.
    if (second === '3') return /[0-3]/.test(third) ? 'manufacturer' : 'generic';
    return 'generic';
  }
  if (second === '0') return 'generic';
  if (second === '3') return 'reserved';
  return 'manufacturer';
}

/** Classifies a code (an FTB, if given, is ignored). Throws InvalidDtcError on a malformed code. */
export function classifyDtc(code: string): DtcClassification {
  const { code: c } = requireDtc(code);
  const letter = c.charAt(0);
  const second = c.charAt(1);
  const third = c.charAt(2);
  const system = systems[letter] ?? 'powertrain';
  const table = letter === 'P' && second === '0' ? p0Groups : letter === 'P' && second === '2' ? p2Groups : {};
  const entry = table[third];
  return {
    system,
    scope: scopeOf(letter, second, third),
    group: entry ? entry[0] : null,
    groupLabel: entry ? entry[1] : null,
  };
}
