// Finding trouble codes mentioned in free text (case notes, pasted printouts).
import type { Dtc } from './dtc-format';

// A code must stand alone: no letter or digit touching either side, so parts
// of VINs, part numbers or words ('XP0301Y') are skipped. Only the hyphen form
// carries an FTB here: in prose 'P0302 13' is more often a count or a reading.
const CODE_IN_TEXT = /(?<![A-Za-z0-9])([PCBU][0-3][0-9A-F]{3})(?:-([0-9A-F]{2}))?(?![A-Za-z0-9])/gi;

export interface DtcMention {
  dtc: Dtc;
  /** index of the first character of the mention in the text */
  index: number;
  /** length of the mention, including any '-FTB' */
  length: number;
}

/** Every mention in order, duplicates kept, with positions. */
export function findDtcMentions(text: string): DtcMention[] {
  const out: DtcMention[] = [];
  for (const m of text.matchAll(CODE_IN_TEXT)) {
    const code = (m[1] ?? '').toUpperCase();
    const ftb = m[2]?.toUpperCase();
    const dtc: Dtc = ftb ? { code, ftb, full: `${code}-${ftb}` } : { code, full: code };
    out.push({ dtc, index: m.index, length: m[0].length });
  }
  return out;
}

/**
 * Every code mentioned, in order of first mention, deduplicated by the full
 * form (so 'P0302' and 'P0302-13' are two entries).
 */
export function findDtcsInText(text: string): Dtc[] {
  const seen = new Set<string>();
  const out: Dtc[] = [];
  for (const { dtc } of findDtcMentions(text)) {
    if (seen.has(dtc.full)) continue;
    seen.add(dtc.full);
    out.push(dtc);
  }
  return out;
}
