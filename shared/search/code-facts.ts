// What ranking needs to know about a code, worked out once per spelling: a
// shop's cases repeat the same few hundred codes, and ranking compares them
// for every candidate of every search.
import { classifyDtc, cylinderForMisfireCode, isMisfireCode, parseDtc } from '../codes';

export interface CodeFacts {
  /** the 5-character code */
  code: string;
  /** first four characters: 'P030' */
  family: string;
  /** 'powertrain:ignition' style key of the system group, if the code has one */
  group: string | null;
  groupLabel: string | null;
  misfire: boolean;
  /** the cylinder a misfire code names (P0305 -> 5) */
  cylinder: number | null;
}

const FACTS = new Map<string, CodeFacts | null>();
const FACTS_MAX = 50_000;

/** Facts of a valid code in any spelling parseDtc accepts; null for anything else. */
export function codeFacts(raw: string): CodeFacts | null {
  const hit = FACTS.get(raw);
  if (hit !== undefined) return hit;
  const r = parseDtc(raw);
  let facts: CodeFacts | null = null;
  if (r.ok) {
    const code = r.dtc.code;
    const g = classifyDtc(code);
    facts = {
      code,
      family: code.slice(0, 4),
      group: g.group ? `${g.system}:${g.group}` : null,
      groupLabel: g.groupLabel,
      misfire: isMisfireCode(code),
      cylinder: cylinderForMisfireCode(code),
    };
  }
  // a bound against odd input piling up; clearing only costs re-parsing
  if (FACTS.size >= FACTS_MAX) FACTS.clear();
  FACTS.set(raw, facts);
  return facts;
}

/** Facts of the valid codes in a list, each code once: case data may hold anything. */
export function validCodeFacts(codes: readonly string[]): CodeFacts[] {
  const out: CodeFacts[] = [];
  for (const c of codes) {
    const f = codeFacts(c);
    if (f && !out.some((o) => o.code === f.code)) out.push(f);
  }
  return out;
}
