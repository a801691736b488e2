/**
 * The safety caution a code page shows, chosen from an explicit table of code
 * ranges (not from the code's third character, which groups boost codes with
 * the fuel rail and crank sensors with the coils).
 *
 * Each row names where its range comes from and where its advice comes from.
 * The ranges follow the SAE J2012 allocation as remembered ("from memory"); the
 * advice is workshop practice ("common practice, no source"). The first row that
 * holds the code wins, so narrower rows sit above wider ones.
 */
import { parseDtc } from './dtc-format';

export type CautionTopic =
  | 'restraints' | 'hybrid-high-voltage' | 'fuel-pressure' | 'ignition' | 'rotating-engine' | 'glow-plugs'
  | 'boost' | 'over-temperature' | 'hot-exhaust' | 'fuel-vapour' | 'battery-charging' | 'vehicle-raised';

export interface CodeCautionRow {
  /** Inclusive range of base codes, e.g. ['P0335', 'P0349']. */
  from: string;
  to: string;
  topic: CautionTopic;
  /** What the range is, in words. */
  covers: string;
  caution: string;
  /** Where the range and the advice come from. */
  source: string;
}

const RANGES_FROM_MEMORY = 'ranges: SAE J2012 allocation, from memory; advice: common practice, no source';

const RESTRAINTS = 'Airbags and belt pretensioners can fire during work. Switch the ignition off, disconnect the battery and wait the time the maker gives before touching restraint wiring; never probe restraint circuits with a test light or an ordinary meter lead.';
const HIGH_VOLTAGE = 'Hybrid drive systems carry dangerous high voltage, and in ready mode the engine can start by itself. Only staff trained for high-voltage work may work on them, with the system isolated and proved dead.';
const FUEL = 'The fuel system stays under pressure after the engine stops, and a direct-injection rail runs at very high pressure. Relieve pressure as the maker describes before opening any fuel line, wear eye protection, keep sparks and heat away and have an extinguisher at hand.';
const IGNITION = 'The ignition secondary delivers well over 20,000 volts. Switch the ignition off before unplugging coils or leads and keep clear of them while the engine runs.';
const ROTATING = 'Crank, cam and knock sensors sit beside the belt, chain and pulleys. Keep hands clear while the engine cranks or runs; turn the engine by hand only in its direction of rotation and stop at any resistance.';
const GLOW = 'Glow plugs run red hot and draw high current. Let them cool before removing them, and do not power a plug out of the head.';
const BOOST = 'The turbo, its pipes and the charge air are hot and under pressure. Let them cool before opening the system, and never run the engine with an intake or charge pipe off.';
const HOT = 'Coolant above its boiling point is held under pressure and the fan can start with the ignition off. Never open the cooling system hot; let the engine cool and open the cap slowly with a cloth over it.';
const EXHAUST = 'The exhaust and catalyst reach several hundred degrees and the gas contains carbon monoxide. Let them cool before touching, and run the engine only with exhaust extraction.';
const VAPOUR = 'Fuel vapour catches fire easily. Keep sparks and flames away from the tank, lines and canister, and use a smoke machine made for evaporative testing.';
const CHARGING = 'A battery can give off explosive gas and a short across it burns. Wear eye protection, keep sparks away, and disconnect the negative lead first.';
const RAISED = 'Wheel, brake and hub work means the car is raised. Support it on stands or a lift at the maker’s lifting points, never on a jack alone, and keep clear of rotating wheels.';

export const CODE_CAUTIONS: readonly CodeCautionRow[] = [
  { from: 'B0000', to: 'B0099', topic: 'restraints', covers: 'restraint system (airbags, pretensioners)', caution: RESTRAINTS, source: RANGES_FROM_MEMORY },
  { from: 'U0151', to: 'U0153', topic: 'restraints', covers: 'lost communication with the restraint control module', caution: RESTRAINTS, source: RANGES_FROM_MEMORY },
  { from: 'P0A00', to: 'P0AFF', topic: 'hybrid-high-voltage', covers: 'hybrid propulsion', caution: HIGH_VOLTAGE, source: RANGES_FROM_MEMORY },
  { from: 'P0033', to: 'P0035', topic: 'boost', covers: 'turbo bypass valve', caution: BOOST, source: RANGES_FROM_MEMORY },
  { from: 'P0045', to: 'P0049', topic: 'boost', covers: 'boost control solenoid, turbine speed', caution: BOOST, source: RANGES_FROM_MEMORY },
  { from: 'P0010', to: 'P0025', topic: 'rotating-engine', covers: 'camshaft actuators and cam/crank correlation', caution: ROTATING, source: RANGES_FROM_MEMORY },
  { from: 'P0087', to: 'P0095', topic: 'fuel-pressure', covers: 'fuel rail and system pressure, regulator', caution: FUEL, source: RANGES_FROM_MEMORY },
  { from: 'P0115', to: 'P0119', topic: 'over-temperature', covers: 'engine coolant temperature sensor', caution: HOT, source: RANGES_FROM_MEMORY },
  { from: 'P0125', to: 'P0128', topic: 'over-temperature', covers: 'coolant temperature, thermostat', caution: HOT, source: RANGES_FROM_MEMORY },
  { from: 'P0170', to: 'P0175', topic: 'fuel-pressure', covers: 'fuel trim (tests often open the fuel supply)', caution: FUEL, source: RANGES_FROM_MEMORY },
  { from: 'P0190', to: 'P0194', topic: 'fuel-pressure', covers: 'fuel rail pressure sensor', caution: FUEL, source: RANGES_FROM_MEMORY },
  { from: 'P0200', to: 'P0212', topic: 'fuel-pressure', covers: 'injector circuits', caution: FUEL, source: RANGES_FROM_MEMORY },
  { from: 'P0217', to: 'P0217', topic: 'over-temperature', covers: 'engine over-temperature', caution: HOT, source: RANGES_FROM_MEMORY },
  { from: 'P0230', to: 'P0232', topic: 'fuel-pressure', covers: 'fuel pump circuit', caution: FUEL, source: RANGES_FROM_MEMORY },
  { from: 'P0234', to: 'P0236', topic: 'boost', covers: 'overboost, boost sensor', caution: BOOST, source: RANGES_FROM_MEMORY },
  { from: 'P0243', to: 'P0250', topic: 'boost', covers: 'wastegate solenoid', caution: BOOST, source: RANGES_FROM_MEMORY },
  { from: 'P0261', to: 'P0296', topic: 'fuel-pressure', covers: 'injector circuits and cylinder contribution', caution: FUEL, source: RANGES_FROM_MEMORY },
  { from: 'P0299', to: 'P0299', topic: 'boost', covers: 'turbo/supercharger underboost', caution: BOOST, source: RANGES_FROM_MEMORY },
  { from: 'P0300', to: 'P0312', topic: 'ignition', covers: 'misfire detected', caution: IGNITION, source: RANGES_FROM_MEMORY },
  { from: 'P0325', to: 'P0349', topic: 'rotating-engine', covers: 'knock, crankshaft and camshaft position sensors', caution: ROTATING, source: RANGES_FROM_MEMORY },
  { from: 'P0350', to: 'P0362', topic: 'ignition', covers: 'ignition coil circuits', caution: IGNITION, source: RANGES_FROM_MEMORY },
  { from: 'P0365', to: 'P0369', topic: 'rotating-engine', covers: 'camshaft position sensor B', caution: ROTATING, source: RANGES_FROM_MEMORY },
  { from: 'P0380', to: 'P0384', topic: 'glow-plugs', covers: 'glow plug circuits', caution: GLOW, source: RANGES_FROM_MEMORY },
  { from: 'P0420', to: 'P0439', topic: 'hot-exhaust', covers: 'catalyst efficiency and temperature', caution: EXHAUST, source: RANGES_FROM_MEMORY },
  { from: 'P0440', to: 'P0457', topic: 'fuel-vapour', covers: 'evaporative emission system', caution: VAPOUR, source: RANGES_FROM_MEMORY },
  { from: 'P0480', to: 'P0485', topic: 'over-temperature', covers: 'cooling fan circuits', caution: HOT, source: RANGES_FROM_MEMORY },
  { from: 'P0544', to: 'P0549', topic: 'hot-exhaust', covers: 'exhaust gas temperature sensors', caution: EXHAUST, source: RANGES_FROM_MEMORY },
  { from: 'P0560', to: 'P0563', topic: 'battery-charging', covers: 'system voltage', caution: CHARGING, source: RANGES_FROM_MEMORY },
  { from: 'P0620', to: 'P0625', topic: 'battery-charging', covers: 'generator control and field', caution: CHARGING, source: RANGES_FROM_MEMORY },
  { from: 'P0670', to: 'P0684', topic: 'glow-plugs', covers: 'glow plug module and circuits', caution: GLOW, source: RANGES_FROM_MEMORY },
  { from: 'C0000', to: 'C0099', topic: 'vehicle-raised', covers: 'wheel speed sensors and brake control', caution: RAISED, source: RANGES_FROM_MEMORY },
];

/** Letter plus the four characters as a number, so P0A00 sorts after P0999 as in the allocation. */
function codeKey(code: string): [string, number] {
  return [code.charAt(0), parseInt(code.slice(1, 5), 16)];
}

export function codeInCautionRange(code: string, row: Pick<CodeCautionRow, 'from' | 'to'>): boolean {
  const [letter, n] = codeKey(code);
  const [fromLetter, from] = codeKey(row.from);
  const [, to] = codeKey(row.to);
  return letter === fromLetter && n >= from && n <= to;
}

/** The row for a code (an FTB is ignored), or null when the table has none. */
export function codeCaution(code: string): CodeCautionRow | null {
  const parsed = parseDtc(code);
  if (!parsed.ok) return null;
  return CODE_CAUTIONS.find((row) => codeInCautionRange(parsed.dtc.code, row)) ?? null;
}
