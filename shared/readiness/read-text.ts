// Reading monitor status from what a technician has: a service $01 PID $01 answer
// in hex ('41 01 00 07 65 00', with or without spaces, one line per control unit)
// or the monitor table a scan tool prints ('Catalyst: complete', 'EVAP  incomplete').
import {
  compressionMonitors,
  continuousMonitors,
  decodeMonitorStatus,
  type Ignition,
  mergeReadouts,
  monitorsFor,
  type MonitorState,
  ReadinessDecodeError,
  type ReadinessReadout,
} from './monitors';

// '41 01' then four bytes. Not preceded by a hex digit, so '7E8 06 41 01 ...' (CAN id and
// length) still matches, and the answer may be written without spaces.
const PID01_ANSWER = /(?<![0-9a-f])41\s?01((?:\s?[0-9a-f]{2}){4})(?![0-9a-f])/gi;

function hexBytes(hex: string): number[] {
  const s = hex.replace(/\s+/g, '');
  const out: number[] = [];
  for (let i = 0; i < s.length; i += 2) out.push(parseInt(s.slice(i, i + 2), 16));
  return out;
}

/** Every PID $01 answer in the text, one per control unit, decoded. */
export function findPid01Answers(text: string): ReadinessReadout[] {
  return [...text.matchAll(PID01_ANSWER)].map((m) => decodeMonitorStatus(hexBytes(m[1] ?? '')));
}

/**
 * What `bytes=` carries: one or more whole answers starting 41 01 (CAN ids and
 * prompts around them are skipped), or the four data bytes alone ('00076500').
 * Throws ReadinessDecodeError with the reason.
 */
export function parseMonitorBytes(input: string): ReadinessReadout {
  const answers = findPid01Answers(input);
  if (answers.length > 0) return mergeReadouts(answers);
  const compact = input.replace(/[\s,;:-]+/g, '');
  if (compact === '') throw new ReadinessDecodeError('give the PID $01 bytes, e.g. 41 01 00 07 65 00');
  const bad = /[^0-9a-f]/i.exec(compact);
  if (bad) throw new ReadinessDecodeError(`"${bad[0]}" is not a hex digit (0-9, A-F)`);
  if (compact.length % 2 !== 0) throw new ReadinessDecodeError('odd number of hex digits: each byte is two digits');
  // One answer split oddly ('41018 10F8300') still reads once the spaces are gone.
  const data = compact.length === 12 && /^4101/.test(compact) ? compact.slice(4) : compact;
  if (data.length !== 8) throw new ReadinessDecodeError('expected 4 bytes (A B C D) or an answer starting 41 01 followed by 4 bytes');
  return decodeMonitorStatus(hexBytes(data));
}

// ---------- printed monitor tables

type TableState = 'complete' | 'incomplete' | 'unsupported';

// Order matters: the longer names first ('heated catalyst' before 'catalyst').
const NAME_PATTERNS: [RegExp, string][] = [
  [/\bmisfire\b/i, 'misfire'],
  [/\bfuel\s*(system|sys)?\b(?!.*\blevel\b)/i, 'fuel-system'],
  [/\bcomp(rehensive)?\.?\s*comp(onent)?s?\b|\bccm\b|\bcomponents?\b/i, 'components'],
  [/\bnmhc\b/i, 'nmhc-catalyst'],
  [/\bheated\s*cat(alyst)?\b/i, 'heated-catalyst'],
  [/\bcat(alyst)?\b/i, 'catalyst'],
  [/\bevap(orative)?\b/i, 'evap'],
  [/\bsec(ondary)?\.?\s*air\b|\bair\s*(system|injection)\b/i, 'secondary-air'],
  [/\ba\/?c\b|\brefrigerant\b/i, 'ac-refrigerant'],
  [/\b(o2|oxygen|ho2s?|o2s)\s*(sensors?\s*)?heater\b/i, 'oxygen-sensor-heater'],
  [/\b(o2|oxygen)\s*sensors?\b|\bo2s\b|\bho2s\b/i, 'oxygen-sensor'],
  [/\begr\b|\bvvt\b/i, 'egr-vvt'],
  [/\bnox\b|\bscr\b/i, 'nox-scr'],
  [/\bboost\b/i, 'boost-pressure'],
  [/\bexhaust\s*(gas)?\s*sensors?\b/i, 'exhaust-gas-sensor'],
  [/\bpm\s*filter\b|\bdpf\b|\bparticulate\b/i, 'pm-filter'],
];

// 'not complete' and 'incomplete' before 'complete'; 'n/a' and 'not supported' mean unsupported.
const STATE_PATTERNS: [RegExp, TableState][] = [
  [/\bnot\s*(supported|available|avail)\b|\bn\/a\b|\bunsupported\b|\bnot\s*applicable\b/i, 'unsupported'],
  [/\bnot\s*(complete|completed|ready|done)\b|\bincomplete\b|\binc\b|\bnot\s*rdy\b|\bnr\b/i, 'incomplete'],
  [/\bcomplete[d]?\b|\bready\b|\brdy\b|\bdone\b|\bok\b|\bpass(ed)?\b/i, 'complete'],
];

const MIL_LINE = /\b(mil|check engine|malfunction indicator)\b[^a-z0-9]*(?:lamp|light|status)?[^a-z0-9]*(on|off)\b/i;
const CODE_COUNT_LINE = /\b(?:confirmed|stored)?\s*(?:dtcs?|codes?)\s*(?:count|stored)?\s*[:=]\s*(\d{1,3})\b/i;

// Code lines ('P0420 Catalyst System Efficiency...') name a monitor but are not table rows;
// 'distance with MIL on' is a counter, not the lamp; pending and permanent counts are not confirmed ones.
const A_CODE = /\b[PCBU][0-3][0-9A-F]{3}\b/i;
const NOT_MIL_STATE = /\b(distance|time|since|minutes?|km|miles?)\b/i;
const NOT_CONFIRMED = /\b(pending|permanent|history)\b/i;

function firstMatch<T>(text: string, patterns: [RegExp, T][]): T | undefined {
  return patterns.find(([re]) => re.test(text))?.[1];
}

/** One table line to a monitor and its state: the name comes first, the state after it. */
export function readTableLine(line: string): { key: string; state: TableState } | null {
  const key = firstMatch(line, NAME_PATTERNS);
  if (!key) return null;
  const name = NAME_PATTERNS.find(([, k]) => k === key)![0].exec(line)!;
  const after = line.slice(name.index + name[0].length);
  const state = firstMatch(after, STATE_PATTERNS);
  return state ? { key, state } : null;
}

const COMPRESSION_ONLY = new Set(compressionMonitors.map((m) => m.key).filter((k) => k !== 'egr-vvt'));

/** The monitor table in a printout, or null when it lists none. */
export function readMonitorTable(text: string): ReadinessReadout | null {
  const found = new Map<string, TableState>();
  let mil: boolean | null = null;
  let confirmedCodes: number | null = null;
  for (const line of text.split(/\r\n|\r|\n/)) {
    if (A_CODE.test(line)) continue;
    const milMatch = NOT_MIL_STATE.test(line) ? null : MIL_LINE.exec(line);
    if (milMatch && mil === null) mil = milMatch[2]!.toLowerCase() === 'on';
    const count = NOT_CONFIRMED.test(line) ? null : CODE_COUNT_LINE.exec(line);
    if (count && confirmedCodes === null) confirmedCodes = Number(count[1]);
    const row = readTableLine(line);
    if (row && !found.has(row.key)) found.set(row.key, row.state);
  }
  if (found.size === 0) return null;
  const ignition: Ignition = [...found.keys()].some((k) => COMPRESSION_ONLY.has(k)) ? 'compression' : 'spark';
  const monitors: MonitorState[] = monitorsFor(ignition).map((def) => {
    const s = found.get(def.key);
    return { key: def.key, name: def.name, kind: def.kind, supported: s !== undefined && s !== 'unsupported', complete: s === 'complete' };
  });
  return { mil, confirmedCodes, ignition, monitors };
}

/** Monitor status in a pasted printout: PID $01 answers win over a printed table. */
export function readReadiness(text: string): ReadinessReadout | null {
  const answers = findPid01Answers(text);
  if (answers.length > 0) return mergeReadouts(answers);
  return readMonitorTable(text);
}

export const continuousKeys = new Set(continuousMonitors.map((m) => m.key));
