// Removable chips: each chip of a parsed query carries the query text that
// reads back the same without that chip, so the screen can drop a chip and
// search again without knowing how the parser works. The text is rebuilt from
// the parsed parts (codes, platforms, recent work, cylinders, tags, free text),
// in phrasings the parser itself reads.
import { cylinderForMisfireCode, misfireCodeForCylinder } from '../codes';
import type { Platform } from '../platform';
import { CONTEXT_LABELS, type ContextTag } from './context';
import { describeQuery, type ParsedQuery, type QueryChip } from './query';
import { kebabToWords, unique } from './text';

export interface RemovableChip extends QueryChip {
  /** the query text without this chip; run it to search again */
  without: string;
  /** false for chips that only explain a reading (J1930 terms) */
  removable: boolean;
}

interface Parts {
  codes: string[];
  cylinders: number[];
  tags: string[];
  context: string[];
  platformIds: number[];
  text: string;
}

const partsOf = (p: ParsedQuery): Parts => ({
  codes: [...p.codes],
  cylinders: [...p.cylinders],
  tags: [...p.tags],
  context: [...p.context],
  platformIds: [...p.platformIds],
  text: p.text,
});

/**
 * Words that name exactly these platforms: the engine code when every platform
 * with that engine is kept, else model and engine (the parser keeps only the
 * best-named platforms, so "Sable VT27" drops a Marsh VT27).
 */
function platformWords(ids: number[], platforms: readonly Platform[]): string[] {
  const kept = platforms.filter((p) => ids.includes(p.id));
  const words = kept.map((p) => {
    const sameEngine = platforms.filter((o) => o.engine.toLowerCase() === p.engine.toLowerCase());
    return sameEngine.every((o) => ids.includes(o.id)) ? p.engine : `${p.model} ${p.engine}`;
  });
  return unique(words);
}

/** Cylinders still to mention: those not already named by a typed misfire code. */
function namedCylinders(parts: Parts): number[] {
  const fromCodes = new Set(parts.codes.map(cylinderForMisfireCode).filter((n): n is number => n !== null));
  return parts.cylinders.filter((c) => !fromCodes.has(c));
}

/** Query text that parses back to these parts (the free text goes last, as typed words). */
export function queryText(parts: Parts, platforms: readonly Platform[]): string {
  const cyls = namedCylinders(parts);
  const out = [
    ...parts.codes,
    ...platformWords(parts.platformIds, platforms),
    ...parts.context.map((c) => CONTEXT_LABELS[c as ContextTag] ?? kebabToWords(c)),
    cyls.length ? `cyl ${cyls.join(' ')}` : '',
    ...parts.tags.map(kebabToWords),
    parts.text,
  ];
  return out.filter((s) => s.trim().length > 0).join(' ');
}

function removeCode(parts: Parts, code: string): void {
  parts.codes = parts.codes.filter((c) => c !== code);
  // a misfire code's cylinder goes with it (typed, or implied by "cyl N misfire")
  const n = cylinderForMisfireCode(code);
  if (n !== null) parts.cylinders = parts.cylinders.filter((c) => c !== n);
  // P0300 came from "random" or "multiple": those words go too
  if (code === 'P0300') parts.text = parts.text.replace(/(?<![\p{L}])(?:random|multiple|multi)(?![\p{L}])/giu, ' ').replace(/\s+/g, ' ').trim();
}

function removeCylinder(parts: Parts, value: string, banksWord: boolean): void {
  if (banksWord) {
    // "both banks" is a reading of the cylinders, not a word: nothing else to drop
    return;
  }
  const n = Number(value);
  parts.cylinders = parts.cylinders.filter((c) => c !== n);
  const code = misfireCodeForCylinder(n);
  if (code) parts.codes = parts.codes.filter((c) => c !== code);
}

/** The query text without one chip. */
export function queryWithout(parsed: ParsedQuery, chip: QueryChip, platforms: readonly Platform[], fixedPlatformId?: number | null): string {
  const parts = partsOf(parsed);
  // a platform chosen as a filter is not part of the text
  if (fixedPlatformId != null) parts.platformIds = parts.platformIds.filter((id) => id !== fixedPlatformId);
  switch (chip.kind) {
    case 'code':
      removeCode(parts, chip.value);
      break;
    case 'cylinder':
      removeCylinder(parts, chip.value, chip.value === 'both-banks');
      break;
    case 'tag':
      parts.tags = parts.tags.filter((t) => t !== chip.value);
      break;
    case 'context':
      // a belt job is timing work too: dropping either drops the phrase that gave both
      parts.context = parts.context.filter((t) => t !== chip.value && !(chip.value === 'after-timing-work' && t === 'after-belt-job'));
      break;
    case 'platform':
      parts.platformIds = parts.platformIds.filter((id) => String(id) !== chip.value);
      break;
    case 'term':
      break;
  }
  return queryText(parts, platforms);
}

/** describeQuery's chips, each with the text to search without it. */
export function removableChips(parsed: ParsedQuery, platforms: readonly Platform[], fixedPlatformId?: number | null): RemovableChip[] {
  return describeQuery(parsed, platforms)
    .filter((c) => !(c.kind === 'platform' && fixedPlatformId != null && c.value === String(fixedPlatformId)))
    .map((c) => {
      const removable = c.kind !== 'term' && c.value !== 'both-banks';
      return { ...c, removable, without: removable ? queryWithout(parsed, c, platforms, fixedPlatformId) : '' };
    });
}
