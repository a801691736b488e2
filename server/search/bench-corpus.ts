// Synthetic case notes for the search benchmark (npm run bench:search): about
// 150 words of body in the four sections the demo notes use, real-looking codes,
// symptom and recent-work tags, platforms, statuses and dates over five years.
// Deterministic for a given seed. All invented, like the demo content.
import type { CaseStatus } from '../../shared/roles';

export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

type Rand = () => number;
const pick = <T>(r: Rand, xs: readonly T[]): T => xs[Math.floor(r() * xs.length)]!;
const some = <T>(r: Rand, xs: readonly T[], n: number): T[] => [...new Set(Array.from({ length: n }, () => pick(r, xs)))];
const num = (r: Rand, lo: number, hi: number, dp = 0) => (lo + r() * (hi - lo)).toFixed(dp);

interface Family {
  codes: (r: Rand, cyl: number) => string[];
  symptoms: string[];
  parts: string[];
  faults: string[];
  tests: string[];
  title: (r: Rand, part: string, fault: string, codes: string[]) => string;
}

const misfireCode = (c: number) => `P03${String(c).padStart(2, '0')}`;

const FAMILIES: Family[] = [
  {
    codes: (r, cyl) => {
      const cs = some(r, Array.from({ length: cyl }, (_, i) => i + 1), 1 + Math.floor(r() * 2)).map(misfireCode);
      return r() < 0.3 ? ['P0300', ...cs] : cs;
    },
    symptoms: ['misfire', 'rough-idle', 'shakes-at-idle', 'flashing-mil', 'misfire-under-load', 'misfire-at-idle', 'hesitation', 'low-power'],
    parts: ['ignition coil', 'spark plug', 'coil connector', 'injector', 'valve spring', 'plug lead', 'coil boot', 'injector connector'],
    faults: ['cracked', 'tracking to the head', 'swapped', 'sticking', 'worn out', 'burnt', 'loose', 'carbon fouled'],
    tests: ['swapped the coil to another cylinder and the misfire followed', 'compression on all cylinders within spec', 'scoped the coil primary', 'misfire counters on the live data', 'injector balance test', 'relative compression test'],
    title: (_r, part, fault, codes) => `${codes.join(' ')} misfire, ${part} ${fault}`,
  },
  {
    codes: (r) => (r() < 0.7 ? ['P0299'] : ['P0299', pick(r, ['P0234', 'P0236', 'P0243'])]),
    symptoms: ['low-power', 'whistle-under-boost', 'limp-mode', 'mil-on', 'flutter-on-lift-off', 'black-smoke'],
    parts: ['charge pipe coupler', 'intercooler end tank', 'wastegate actuator', 'boost control solenoid', 'bypass valve', 'boost hose clamp'],
    faults: ['split', 'cracked', 'stuck open', 'seized', 'torn', 'blown off'],
    tests: ['smoke tested the intake side', 'boost pressure logged on a road test', 'pressure tested the charge side', 'checked the wastegate rod travel', 'commanded the boost solenoid'],
    title: (_r, part, fault, codes) => `${codes.join(' ')} underboost, ${part} ${fault}`,
  },
  {
    codes: (r) => (r() < 0.5 ? ['P0171'] : ['P0171', 'P0174']),
    symptoms: ['lean-at-idle', 'rough-idle', 'hiss', 'hesitation', 'mil-on', 'stalling'],
    parts: ['intake manifold gasket', 'pcv diaphragm', 'brake booster hose', 'vacuum hose', 'lift pump', 'injectors'],
    faults: ['leaking', 'split', 'perished', 'weak', 'restricted', 'cracked'],
    tests: ['fuel trims at idle and at 2500 rpm', 'smoke test of the intake', 'fuel pressure under load', 'propane enrichment around the intake', 'checked the MAF reading against the calculated load'],
    title: (_r, part, fault, codes) => `${codes.join(' ')} lean, ${part} ${fault}`,
  },
  {
    codes: (r) => (r() < 0.5 ? ['P0172'] : ['P0172', 'P0175']),
    symptoms: ['black-smoke', 'poor-economy', 'fuel-smell', 'rough-idle', 'hard-hot-start', 'negative-fuel-trim'],
    parts: ['purge valve', 'injector', 'coolant temperature sensor', 'fuel pressure regulator', 'MAF sensor'],
    faults: ['stuck open', 'leaking', 'reading cold', 'failed', 'scaled wrong'],
    tests: ['fuel trims hot and cold', 'injector leak down test', 'coolant sensor against an infrared thermometer', 'purge flow test', 'fuel pressure hold test'],
    title: (_r, part, fault, codes) => `${codes.join(' ')} rich, ${part} ${fault}`,
  },
  {
    codes: (r) => [pick(r, ['P0101', 'P0102', 'P0103'])],
    symptoms: ['hesitation', 'stalling', 'mil-on', 'intermittent', 'limp-mode'],
    parts: ['MAF sensor', 'MAF connector', 'MAF signal wire', 'air filter', 'MAF terminal'],
    faults: ['contaminated', 'corroded', 'chafed through', 'oiled', 'loose'],
    tests: ['wiggle test on the harness with the live data', 'MAF grams per second at idle', 'voltage drop on the MAF ground', 'back-probed the MAF signal'],
    title: (_r, part, fault, codes) => `${codes.join(' ')} MAF fault, ${part} ${fault}`,
  },
  {
    codes: (r) => [pick(r, ['P0011', 'P0016', 'P0017', 'P0019', 'P0335', 'P0340'])],
    symptoms: ['long-crank', 'hard-start', 'rattle-on-start', 'crank-no-start', 'rough-idle', 'stall-when-hot'],
    parts: ['cam sensor', 'crank sensor', 'timing chain', 'cam phaser', 'timing belt', 'tone wheel'],
    faults: ['cracked', 'failed', 'stretched', 'stuck', 'one tooth out', 'damaged'],
    tests: ['cam crank correlation on the scope', 'checked the timing marks', 'sensor air gap', 'cam deviation in the live data', 'oil pressure to the phaser'],
    title: (_r, part, fault, codes) => `${codes.join(' ')} cam crank fault, ${part} ${fault}`,
  },
  {
    codes: (r) => some(r, ['U0100', 'U0101', 'U0121', 'U0140', 'U0155'], 1 + Math.floor(r() * 2)),
    symptoms: ['warning-lights-all-on', 'module-not-responding', 'dead-cluster', 'intermittent', 'hybrid-warning'],
    parts: ['CAN wire', 'ECM ground', 'module connector', 'terminating resistor', 'fuse box', 'gateway module'],
    faults: ['pierced', 'loose', 'corroded', 'missing', 'not seated', 'failed'],
    tests: ['CAN resistance across the bus', 'scoped CAN high and CAN low', 'voltage drop on the module grounds', 'network scan with modules unplugged one by one'],
    title: (_r, part, fault, codes) => `${codes.join(' ')} lost communication, ${part} ${fault}`,
  },
  {
    codes: (r) => [pick(r, ['C0035', 'C0040', 'C0045', 'C0050'])],
    symptoms: ['abs-light', 'traction-light', 'intermittent', 'fault-on-bumps', 'hum-at-speed'],
    parts: ['wheel speed sensor', 'tone ring', 'sensor lead', 'hub bearing', 'sensor connector'],
    faults: ['packed with debris', 'cracked', 'chafed', 'worn', 'corroded'],
    tests: ['wheel speeds compared on a road test', 'sensor signal on the scope', 'checked the air gap', 'wiggle test over bumps'],
    title: (_r, part, fault, codes) => `${codes.join(' ')} wheel speed fault, ${part} ${fault}`,
  },
  {
    codes: () => [],
    symptoms: ['battery-light', 'low-voltage', 'flat-battery', 'lights-flare', 'squeal'],
    parts: ['alternator regulator', 'battery cable', 'alternator belt', 'battery', 'charge wire'],
    faults: ['failed', 'corroded', 'misrouted', 'sulphated', 'high resistance'],
    tests: ['charging voltage at the battery and the alternator', 'voltage drop on the charge circuit', 'parasitic drain test', 'battery load test'],
    title: (_r, part, fault) => `Charging fault, ${part} ${fault}`,
  },
  {
    codes: () => [],
    symptoms: ['brake-judder', 'pull-when-braking', 'brake-drag', 'poor-braking', 'squeal', 'pedal-pulsation', 'hot-wheel'],
    parts: ['front rotor', 'slide pins', 'brake hose', 'caliper piston', 'brake pads'],
    faults: ['out of true', 'seized', 'collapsed inside', 'sticking', 'glazed'],
    tests: ['rotor runout with a dial gauge', 'wheel temperatures after a road test', 'checked the slide pins', 'pedal feel and stopping distance'],
    title: (_r, part, fault) => `Brakes, ${part} ${fault}`,
  },
  {
    codes: () => [],
    symptoms: ['clutch-not-disengaging', 'grinding-into-gear', 'clutch-pedal-sinks', 'spongy-clutch-pedal', 'steering-whine', 'heavy-steering', 'steering-groan'],
    parts: ['clutch slave cylinder', 'clutch master cylinder', 'hydraulic line', 'power steering pump', 'high pressure hose'],
    faults: ['leaking', 'bypassing', 'air in the line', 'worn', 'weeping at the crimp'],
    tests: ['pedal travel and release point', 'pressure test of the hydraulics', 'fluid level and condition', 'power steering pressure test'],
    title: (_r, part, fault) => `Hydraulics, ${part} ${fault}`,
  },
];

const CONTEXTS = ['after-timing-work', 'after-belt-job', 'after-engine-swap', 'after-tune', 'after-clutch-job', 'after-brake-job', 'after-battery-change', 'after-programming', 'after-accident-repair'];
const OPENERS = [
  'Customer says the car', 'Came in on the recovery truck because it', 'Owner reports it', 'Fleet driver says it', 'Booked in because it',
];
const WHEN = ['from cold', 'when hot', 'under load', 'at idle', 'on the motorway', 'after a long drive', 'in the wet', 'at part throttle', 'on a cold start'];
const FILLER = [
  'Road tested with the owner to confirm the complaint.',
  'Pulled the codes and the freeze frame before clearing anything.',
  'Checked for service bulletins and earlier visits on the same car.',
  'Visual inspection of the engine bay and the wiring first.',
  'Battery and grounds checked before any module work.',
  'Live data recorded on a road test for comparison.',
  'Nothing else stored in the other modules.',
  'Mileage and service history look normal for the age.',
];

// The long tail every real note has (names, places, part numbers, one-off words):
// invented words from syllables, picked with a skew so a few are common and most rare.
const SYLLABLES = ['ka', 'ro', 'vel', 'min', 'tas', 'or', 'bren', 'lu', 'sti', 'dar', 'ne', 'quo', 'fal', 'wim', 'ter', 'os', 'gri', 'ham', 'pel', 'ux'];
const TAIL = Array.from({ length: 6000 }, (_, i) => {
  let n = i + 7;
  let w = '';
  do {
    w += SYLLABLES[n % SYLLABLES.length];
    n = Math.floor(n / SYLLABLES.length);
  } while (n > 0);
  return w;
});
const tailWord = (r: Rand) => TAIL[Math.floor(r() ** 3 * TAIL.length)]!;

export interface BenchCase {
  title: string;
  body: string;
  codes: string[];
  symptoms: string[];
  context: string[];
  rootCause: string;
  fix: string;
  platformIndex: number;
  status: CaseStatus;
  confirmed: boolean;
  updatedAt: Date;
}

export function generateCase(r: Rand, platforms: readonly { engine: string; cylinders: number; model: string }[]): BenchCase {
  const fam = pick(r, FAMILIES);
  const platformIndex = Math.floor(r() * platforms.length);
  const plat = platforms[platformIndex]!;
  const codes = fam.codes(r, Math.max(1, plat.cylinders));
  const symptoms = some(r, fam.symptoms, 2 + Math.floor(r() * 3));
  const context = r() < 0.12 ? [pick(r, CONTEXTS)] : [];
  const part = pick(r, fam.parts);
  const fault = pick(r, fam.faults);
  const tests = some(r, fam.tests, 3);
  const reading = () => `\`${num(r, 0.2, 15, 1)} ${pick(r, ['V', 'ohm', 'psi', 'ms', '%', 'degrees'])}\``;
  const body = [
    '## What the car did',
    `${pick(r, OPENERS)} ${symptoms.map((s) => s.replace(/-/g, ' ')).join(', ')} ${pick(r, WHEN)}. ${codes.length ? `Stored ${codes.join(' and ')}.` : 'No codes stored.'} ${pick(r, FILLER)} ${plat.model} ${plat.engine} at ${num(r, 20_000, 220_000)} km.`,
    '## Tests and readings',
    ...tests.map((t) => `- ${t[0]!.toUpperCase()}${t.slice(1)}: ${reading()} against ${reading()} spec. ${pick(r, ['Ruled out.', 'Fault found.', 'Within spec.', 'Borderline, noted.'])}`),
    `${pick(r, FILLER)} Remarks: ${Array.from({ length: 8 + Math.floor(r() * 8) }, () => tailWord(r)).join(' ')}, part ${Math.floor(r() * 900_000 + 100_000)}-${Math.floor(r() * 90 + 10)}.`,
    '## Cause',
    `Fault found: the ${part} was ${fault}. ${pick(r, FILLER)} That explains the ${symptoms[0]!.replace(/-/g, ' ')} ${pick(r, WHEN)}.`,
    '## Fix',
    `Replaced the ${part}, cleared the codes and relearned the adaptations. Road test of ${num(r, 5, 60)} km with no fault returned. ${pick(r, FILLER)}`,
  ].join('\n');
  const roll = r();
  const status: CaseStatus = roll < 0.8 ? 'published' : roll < 0.92 ? 'review' : 'draft';
  const ageDays = Math.floor(r() * 5 * 365);
  return {
    title: `${plat.engine} ${fam.title(r, part, fault, codes)}`.slice(0, 200),
    body,
    codes,
    symptoms,
    context,
    rootCause: `${part} ${fault}`,
    fix: `Replaced the ${part}`,
    platformIndex,
    status,
    confirmed: status !== 'draft' && r() < 0.65,
    updatedAt: new Date(Date.UTC(2026, 10, 30) - ageDays * 86_400_000),
  };
}

/** Queries typed the way techs type: codes, cylinder lists, shorthand, typos, symptoms, context. */
export const BENCH_QUERIES = [
  'misfire cyl 2 and 5 after timing work',
  'p0299 whistle under boost vt27',
  'P0171 lean at idle',
  'rough idle hesitaton',
  'coil pack cracked',
  'charge pipe coupler split',
  'u0100 lost comms ecm ground',
  'abs light c0035 debris',
  'battery light alternator',
  'clutch wont disengage slave leaking',
  'p0302',
  'kr15t p0011 phaser',
  'injector leaking hot restart',
  'vacuum leak hiss',
  'misfire under load',
  'boost leak',
  'crank sensor no start',
  'p0340 long crank after timing chain',
  'brake judder rotor runout',
  'power steering whine',
  'wheel speed sensor chafed',
  'maf contaminated oiled filter',
  'p0101 p0171',
  'intake manifold gasket leak',
  'timing belt one tooth out',
  'misfire 3 kv35',
  'cyl 4 low compression',
  'stalling when hot',
  'weak lift pump lean both banks',
  'wastegate rattle stuck open',
  'ignition coil',
  'terminating resistor missing can bus',
  'purge valve stuck open rich',
  'P0300 random misfire',
  'coolant sensor reads cold',
  'slide pins seized',
  'dravenna misfire cyl 2,5',
  'after engine swap vibration',
  'boost control solenoid',
  'corroded connector intermittent',
] as const;
