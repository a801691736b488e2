// Trade shorthand <-> SAE J1930 standard terms, for search recall and for
// showing a tech which standard term their words were read as.
// Evidence (references.md §4): 'corroborated' = J1930 acronym confirmed by
// general glossaries; 'from-memory' = J1930 acronym not checked against the
// primary text; 'common-practice' = not a J1930 acronym, a trade convention.
// Every informal synonym is common practice; `listed` marks the ones that
// references.md §4 itself lists as common practice.

export type TermEvidence = 'corroborated' | 'from-memory' | 'common-practice';

export interface TermEntry {
  /** Standard form written into normalised text. */
  to: string;
  /** Spelled-out meaning. */
  name: string;
  evidence: TermEvidence;
  /** Other standard spellings (spelled out, or acronym + "sensor"). */
  standard: string[];
  /** Trade shorthand and informal words. */
  informal: string[];
  /** Informal words listed in references.md §4 (subset of `informal`). */
  listed?: string[];
  /** Spellings that only count when written in capitals ("MAP", not "map"). */
  capsOnly?: string[];
  /** Spellings matched without a plural ending. */
  noPlural?: string[];
  /** Neighbouring standard forms worth searching alongside (ECM <-> PCM). */
  related?: string[];
}

export const TERMS: readonly TermEntry[] = [
  {
    to: 'ECM', name: 'engine control module', evidence: 'corroborated',
    standard: ['engine control module'],
    informal: ['ECU', 'engine control unit', 'engine computer', 'engine ECU'],
    listed: ['ECU'], related: ['PCM'],
  },
  {
    to: 'PCM', name: 'powertrain control module', evidence: 'from-memory',
    standard: ['powertrain control module'], informal: ['powertrain computer'], related: ['ECM'],
  },
  {
    to: 'TCM', name: 'transmission control module', evidence: 'from-memory',
    standard: ['transmission control module'],
    informal: ['TCU', 'transmission control unit', 'gearbox computer', 'transmission computer'],
  },
  {
    to: 'TP', name: 'throttle position', evidence: 'from-memory',
    standard: ['throttle position sensor', 'TP sensor', 'throttle position'],
    informal: ['TPS', 'throttle sensor', 'throttle pot'], listed: ['TPS'], capsOnly: ['TP'],
  },
  {
    to: 'APP', name: 'accelerator pedal position', evidence: 'from-memory',
    standard: ['accelerator pedal position sensor', 'APP sensor', 'accelerator pedal position'],
    informal: ['APPS', 'pedal sensor', 'accelerator pedal sensor', 'gas pedal sensor', 'throttle pedal sensor'],
    capsOnly: ['APP'],
  },
  {
    to: 'TAC', name: 'throttle actuator control', evidence: 'from-memory',
    standard: ['throttle actuator control'],
    informal: ['electronic throttle control', 'electronic throttle', 'drive by wire', 'DBW'],
    capsOnly: ['TAC'],
  },
  {
    to: 'CKP', name: 'crankshaft position', evidence: 'from-memory',
    standard: ['crankshaft position sensor', 'CKP sensor', 'crankshaft position'],
    informal: ['CPS', 'crank sensor', 'crankshaft sensor', 'crank position sensor', 'crank angle sensor'],
    listed: ['CPS'],
  },
  {
    to: 'CMP', name: 'camshaft position', evidence: 'from-memory',
    standard: ['camshaft position sensor', 'CMP sensor', 'camshaft position'],
    informal: ['cam sensor', 'camshaft sensor', 'cam position sensor', 'cam angle sensor'],
  },
  {
    to: 'ECT', name: 'engine coolant temperature', evidence: 'corroborated',
    standard: ['engine coolant temperature sensor', 'ECT sensor', 'engine coolant temperature'],
    informal: ['CTS', 'coolant temp sensor', 'coolant temperature sensor', 'coolant sensor', 'coolant temp'],
    listed: ['CTS'],
  },
  {
    to: 'EOT', name: 'engine oil temperature', evidence: 'from-memory',
    standard: ['engine oil temperature sensor', 'EOT sensor', 'engine oil temperature'],
    informal: ['oil temp sensor', 'oil temperature sensor'],
  },
  {
    to: 'IAT', name: 'intake air temperature', evidence: 'corroborated',
    standard: ['intake air temperature sensor', 'IAT sensor', 'intake air temperature'],
    informal: ['ACT', 'MAT', 'air temp sensor', 'intake air temp sensor', 'air charge temperature', 'manifold air temperature'],
    listed: ['ACT', 'MAT'], capsOnly: ['ACT', 'MAT'],
  },
  {
    to: 'MAF', name: 'mass air flow', evidence: 'corroborated',
    standard: ['mass air flow sensor', 'mass airflow sensor', 'MAF sensor', 'mass air flow', 'mass airflow'],
    informal: ['air flow meter', 'airflow meter', 'air mass meter', 'AFM', 'air flow sensor', 'airflow sensor'],
  },
  {
    to: 'MAP', name: 'manifold absolute pressure', evidence: 'corroborated',
    standard: ['manifold absolute pressure sensor', 'MAP sensor', 'manifold absolute pressure'],
    informal: ['manifold pressure sensor', 'manifold pressure'],
    // lower-case "map" is the tune map, so the bare acronym needs capitals
    capsOnly: ['MAP'],
  },
  {
    to: 'BARO', name: 'barometric pressure', evidence: 'from-memory',
    standard: ['barometric pressure sensor', 'BARO sensor', 'barometric pressure'],
    informal: ['baro sensor', 'atmospheric pressure sensor'],
  },
  {
    to: 'HO2S', name: 'heated oxygen sensor', evidence: 'corroborated',
    standard: ['heated oxygen sensor', 'heated O2 sensor'],
    informal: ['HEGO', 'heated lambda sensor', 'heated lambda'],
    related: ['O2S'],
  },
  {
    to: 'O2S', name: 'oxygen sensor', evidence: 'corroborated',
    standard: ['oxygen sensor', 'O2 sensor'],
    informal: ['O2', 'lambda sensor', 'lambda probe', 'lambda', 'O2 probe'],
    related: ['HO2S'],
  },
  {
    to: 'TWC', name: 'three-way catalytic converter', evidence: 'from-memory',
    standard: ['three-way catalytic converter', 'three way catalyst', 'catalyst'],
    informal: ['cat', 'catalytic converter', 'cat converter', 'catalytic'],
    listed: ['cat'],
  },
  {
    to: 'EGR', name: 'exhaust gas recirculation', evidence: 'corroborated',
    standard: ['exhaust gas recirculation', 'EGR valve'], informal: [],
  },
  {
    to: 'EVAP', name: 'evaporative emission', evidence: 'from-memory',
    standard: ['evaporative emission', 'evaporative emissions', 'EVAP system'],
    informal: ['purge valve', 'purge solenoid', 'canister purge', 'charcoal canister', 'evap canister'],
  },
  {
    to: 'PCV', name: 'positive crankcase ventilation', evidence: 'from-memory',
    standard: ['positive crankcase ventilation', 'PCV valve'], informal: ['crankcase breather valve'],
  },
  {
    to: 'AIR', name: 'secondary air injection', evidence: 'from-memory',
    standard: ['secondary air injection', 'secondary air'], informal: ['smog pump', 'secondary air pump'],
    capsOnly: ['AIR'],
  },
  {
    to: 'KS', name: 'knock sensor', evidence: 'from-memory',
    standard: ['knock sensor'], informal: ['det sensor', 'detonation sensor', 'pinging sensor'],
    capsOnly: ['KS'],
  },
  {
    to: 'VSS', name: 'vehicle speed sensor', evidence: 'from-memory',
    standard: ['vehicle speed sensor'], informal: ['speedo sensor', 'road speed sensor'],
  },
  {
    to: 'IAC', name: 'idle air control', evidence: 'from-memory',
    standard: ['idle air control', 'IAC valve'], informal: ['idle control valve', 'idle air valve', 'idle valve'],
  },
  {
    to: 'MIL', name: 'malfunction indicator lamp', evidence: 'from-memory',
    standard: ['malfunction indicator lamp', 'malfunction indicator light'],
    informal: ['check engine light', 'check engine lamp', 'CEL', 'engine light', 'engine warning light',
      'engine management light', 'EML', 'service engine soon light', 'SES light'],
    listed: ['check engine light', 'CEL'],
  },
  {
    to: 'DLC', name: 'data link connector', evidence: 'corroborated',
    standard: ['data link connector'],
    informal: ['OBD port', 'OBD2 port', 'OBDII port', 'OBD-II port', 'OBD connector', 'diagnostic port',
      'diagnostic connector', 'diagnostic socket', 'diag port'],
    listed: ['OBD port'],
  },
  {
    to: 'DTC', name: 'diagnostic trouble code', evidence: 'from-memory',
    standard: ['diagnostic trouble code'], informal: ['trouble code', 'fault code', 'error code'],
  },
  {
    to: 'SFI', name: 'sequential multiport fuel injection', evidence: 'from-memory',
    standard: ['sequential fuel injection', 'sequential multiport fuel injection'], informal: [],
  },
  {
    to: 'MFI', name: 'multiport fuel injection', evidence: 'from-memory',
    standard: ['multiport fuel injection', 'multipoint fuel injection'], informal: ['multipoint injection'],
  },
  {
    to: 'ignition coil', name: 'ignition coil', evidence: 'common-practice',
    standard: ['ignition coil'],
    informal: ['coil pack', 'coil-on-plug', 'coil on plug', 'COP coil', 'plug coil', 'pencil coil', 'coil'],
  },
  {
    to: 'cylinder', name: 'cylinder', evidence: 'common-practice',
    standard: ['cylinder'], informal: ['cyl', 'cyls', 'cylinders'],
    listed: ['cyl'],
  },
  {
    to: 'program', name: 'program (reprogram a control module)', evidence: 'common-practice',
    standard: ['program', 'reprogram', 'programming', 'reprogramming', 'programmed', 'reprogrammed'],
    // not "flashing"/"flashes": a flashing MIL is a misfire warning, not programming
    informal: ['flash', 'reflash', 'reflashed', 'reflashing', 'code the module',
      'coded the module', 'coding the module', 'module coding', 'software update'],
    noPlural: ['flash'],
  },
];

export interface TermMatch { from: string; to: string }

// Phrases that contain a term's spelling but mean something else: matched
// and left as written ("coil spring" is suspension, "cat-back" is exhaust).
const GUARDS = ['coil spring', 'coil over', 'coilover', 'cat back', 'cat-back', 'tune map', 'fuel map', 'ignition map'];

interface Pattern { text: string; caseSensitive: boolean; plural: boolean; entry: TermEntry | null }

const escapeRe = (s: string): string => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

// Words inside a phrase may be split by spaces or hyphens ("coil-pack").
const phraseRe = (s: string): string =>
  s.trim().split(/[\s-]+/).map(escapeRe).join('[\\s-]+');

function buildPatterns(): Pattern[] {
  const out: Pattern[] = [];
  for (const entry of TERMS) {
    const caps = new Set(entry.capsOnly ?? []);
    const single = new Set(entry.noPlural ?? []);
    const spellings = new Set([entry.to, ...entry.standard, ...entry.informal]);
    for (const text of spellings) out.push({ text, caseSensitive: caps.has(text), plural: !single.has(text), entry });
  }
  for (const text of GUARDS) out.push({ text, caseSensitive: false, plural: true, entry: null });
  // Longest first, so "MAF sensor" wins over "MAF" and "code the module" over "code".
  return out.sort((a, b) => b.text.length - a.text.length);
}

const PATTERNS = buildPatterns();

// One regex per case mode; alternation order = longest first.
const B_START = '(?<![\\p{L}\\p{N}])';
const B_END = '(?![\\p{L}\\p{N}])';
const plural = (p: Pattern): string => (p.plural && /[a-z]$/i.test(p.text) ? '(?:e?s)?' : '');
const group = (ps: Pattern[]): string => ps.map((p) => `(?:${phraseRe(p.text)}${plural(p)})`).join('|');
const RE_INSENSITIVE = new RegExp(`${B_START}(?:${group(PATTERNS.filter((p) => !p.caseSensitive))})${B_END}`, 'giu');
const RE_CAPS = new RegExp(`${B_START}(?:${group(PATTERNS.filter((p) => p.caseSensitive))})${B_END}`, 'gu');

const squash = (s: string): string => s.toLowerCase().replace(/[\s-]+/g, ' ').trim();

const BY_SPELLING = new Map<string, TermEntry | null>();
for (const p of PATTERNS) if (!p.caseSensitive) BY_SPELLING.set(squash(p.text), p.entry);
const BY_CAPS = new Map<string, TermEntry | null>();
for (const p of PATTERNS) if (p.caseSensitive) BY_CAPS.set(p.text, p.entry);

function lookup(found: string, caps: boolean): TermEntry | null | undefined {
  const map = caps ? BY_CAPS : BY_SPELLING;
  const key = caps ? found.replace(/[\s-]+/g, ' ') : squash(found);
  return map.get(key) ?? map.get(key.replace(/e?s$/, '')) ?? map.get(key.replace(/s$/, ''));
}

interface Hit { start: number; end: number; from: string; entry: TermEntry | null }

function collect(text: string, re: RegExp, caps: boolean): Hit[] {
  const hits: Hit[] = [];
  for (const m of text.matchAll(re)) {
    const entry = lookup(m[0], caps);
    if (entry !== undefined && m.index !== undefined) hits.push({ start: m.index, end: m.index + m[0].length, from: m[0], entry });
  }
  return hits;
}

/** Replaces trade shorthand with J1930 forms; lists what was recognised. */
export function normaliseTerms(text: string): { text: string; terms: TermMatch[] } {
  const hits = [...collect(text, RE_INSENSITIVE, false), ...collect(text, RE_CAPS, true)]
    .sort((a, b) => a.start - b.start || b.end - a.end);
  const kept: Hit[] = [];
  for (const h of hits) {
    const last = kept[kept.length - 1];
    if (!last || h.start >= last.end) kept.push(h);
  }
  let out = '';
  let pos = 0;
  const terms: TermMatch[] = [];
  for (const h of kept) {
    out += text.slice(pos, h.start) + (h.entry ? h.entry.to : h.from);
    pos = h.end;
    if (h.entry) terms.push({ from: h.from, to: h.entry.to });
  }
  out += text.slice(pos);
  return { text: out, terms };
}

/** Finds the entry a word belongs to, by any of its spellings (guards map to null and fall through). */
export function findTerm(term: string): TermEntry | undefined {
  const t = term.trim();
  return BY_CAPS.get(t) ?? BY_SPELLING.get(squash(t)) ?? TERMS.find((e) => e.to.toLowerCase() === t.toLowerCase());
}

/** Standard form first, then its spelled-out and informal synonyms, for search recall. */
export function expandTerm(term: string): string[] {
  const entry = findTerm(term);
  if (!entry) return [term];
  const all = [entry.to, entry.name, ...entry.standard, ...entry.informal, ...(entry.related ?? [])];
  const seen = new Set<string>();
  return all.filter((s) => {
    const k = s.toLowerCase();
    if (seen.has(k)) return false;
    seen.add(k);
    return true;
  });
}
