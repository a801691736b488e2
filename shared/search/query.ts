// Query understanding: a tech's search box text -> structured parts the
// ranking can use (codes, cylinders, banks, symptom and recent-work tags,
// platforms, standard terms) plus the free words left over.
// Stages run in a fixed order on one string, each masking what it used, so a
// later stage never reads the same words twice:
// codes -> recent work -> cylinders -> platforms -> J1930 terms -> symptoms -> free words.
import { cylinderForMisfireCode, isMisfireCode, misfireCodeForCylinder } from '../codes';
import { banksOfCylinders, type Platform } from '../platform';
import { normaliseTerms, type TermMatch } from '../terms';
import { CONTEXT_LABELS, type ContextTag, extractContext } from './context';
import { extractCylinders } from './cylinders';
import { extractCodes } from './query-codes';
import { extractPlatforms } from './query-platforms';
import { matchSymptomTags, rewriteSymptomPhrases } from './symptoms';
import { hasWordCharacters, kebabToWords, sanitiseQuery, STOP_WORDS, tokenize, unique } from './text';

export interface QueryBanks { bank1: number[]; bank2: number[]; bothBanks: boolean }

export interface ParsedQuery {
  /** codes typed in the query, 5 characters ('P0302'; an FTB is dropped) */
  codes: string[];
  /** cylinders named, plus those of typed misfire codes */
  cylinders: number[];
  /** misfire words, or a misfire code */
  misfire: boolean;
  /** misfire codes of named cylinders (and P0300 for "random misfire"), not already typed */
  impliedCodes: string[];
  /** banks of the cylinders on the query's platform; null without a platform or cylinders */
  banks: QueryBanks | null;
  /** the shop's symptom tags found */
  tags: string[];
  /** recent-work tags (after-timing-work, ...) */
  context: string[];
  terms: TermMatch[];
  /** best-matching shop platforms, or the one passed in */
  platformIds: number[];
  /** free text left over, J1930-normalised, stop words removed */
  text: string;
  /** the same, lower case, unique */
  words: string[];
}

export interface ParseContext {
  platforms: readonly Platform[];
  symptomTags: readonly string[];
  /** a platform chosen outside the text (a vehicle filter); wins over words in the text */
  platform?: Platform | null;
}

// No real word is longer; a longer run is pasted junk and would only slow the index.
const MAX_WORD_CHARS = 40;

export const emptyParse = (): ParsedQuery => ({
  codes: [], cylinders: [], misfire: false, impliedCodes: [], banks: null, tags: [], context: [],
  terms: [], platformIds: [], text: '', words: [],
});

function impliedCodesFor(cylinders: number[], misfire: boolean, random: boolean, typed: string[]): string[] {
  if (!misfire) return [];
  const codes = cylinders.map(misfireCodeForCylinder).filter((c): c is string => c !== null);
  if (random) codes.push('P0300');
  return unique(codes).filter((c) => !typed.includes(c));
}

function banksFor(platform: Platform | undefined, cylinders: number[]): QueryBanks | null {
  if (!platform || cylinders.length === 0) return null;
  const b = banksOfCylinders(platform, cylinders);
  if (b.bank1.length === 0 && b.bank2.length === 0) return null;
  return { bank1: b.bank1, bank2: b.bank2, bothBanks: b.bothBanks };
}

/** Reads a search query. Never throws; input past 500 characters is ignored. */
export function parseQuery(input: string, ctx: ParseContext): ParsedQuery {
  const clean = sanitiseQuery(input);
  if (!hasWordCharacters(clean)) return emptyParse();

  const codes = extractCodes(clean);
  const context = extractContext(codes.rest);
  const cyl = extractCylinders(context.rest);
  const plat = extractPlatforms(cyl.rest, ctx.platforms ?? []);
  const terms = normaliseTerms(rewriteSymptomPhrases(plat.rest));
  const tokens = tokenize(terms.text);
  const symptoms = matchSymptomTags(tokens, ctx.symptomTags ?? []);

  const free = tokens.filter((t, i) => !symptoms.used.has(i) && !STOP_WORDS.has(t.lower) && t.text.length <= MAX_WORD_CHARS);
  const fromCodes = codes.codes.map(cylinderForMisfireCode).filter((n): n is number => n !== null);
  const cylinders = unique([...cyl.cylinders, ...fromCodes]).sort((a, b) => a - b);
  const misfire = cyl.misfire || codes.codes.some(isMisfireCode);

  const platformIds = ctx.platform
    ? unique([ctx.platform.id, ...plat.platformIds])
    : plat.platformIds;
  const chosen = ctx.platform ?? ctx.platforms.find((p) => p.id === platformIds[0]);

  return {
    codes: codes.codes,
    cylinders,
    misfire,
    impliedCodes: impliedCodesFor(cyl.cylinders, misfire, cyl.randomMisfire, codes.codes),
    banks: banksFor(chosen, cylinders),
    tags: symptoms.tags,
    context: context.context,
    terms: terms.terms,
    platformIds,
    text: free.map((t) => t.text).join(' '),
    words: unique(free.map((t) => t.lower)),
  };
}

export type ChipKind = 'code' | 'cylinder' | 'tag' | 'context' | 'platform' | 'term';
export interface QueryChip { kind: ChipKind; value: string; label: string }

function bankOf(banks: QueryBanks | null, c: number): string {
  if (!banks) return '';
  if (banks.bank1.includes(c)) return ', bank 1';
  if (banks.bank2.includes(c)) return ', bank 2';
  return '';
}

export const platformLabel = (p: Platform): string => `${p.make} ${p.model} ${p.engine} (${p.yearFrom}-${p.yearTo})`;

export const contextLabel = (tag: string): string => CONTEXT_LABELS[tag as ContextTag] ?? kebabToWords(tag);

/** Chips that show the tech how the query was read, in the order the UI lists them. */
export function describeQuery(parsed: ParsedQuery, platforms: readonly Platform[]): QueryChip[] {
  const chips: QueryChip[] = [];
  for (const c of parsed.codes) chips.push({ kind: 'code', value: c, label: c });
  for (const c of parsed.impliedCodes) {
    const n = cylinderForMisfireCode(c);
    chips.push({ kind: 'code', value: c, label: n ? `${c} (cylinder ${n} misfire)` : `${c} (random or multiple misfire)` });
  }
  for (const c of parsed.cylinders) chips.push({ kind: 'cylinder', value: String(c), label: `cylinder ${c}${bankOf(parsed.banks, c)}` });
  if (parsed.banks?.bothBanks) chips.push({ kind: 'cylinder', value: 'both-banks', label: 'both banks' });
  for (const t of parsed.tags) chips.push({ kind: 'tag', value: t, label: kebabToWords(t) });
  for (const t of parsed.context) chips.push({ kind: 'context', value: t, label: contextLabel(t) });
  for (const id of parsed.platformIds) {
    const p = platforms.find((x) => x.id === id);
    if (p) chips.push({ kind: 'platform', value: String(id), label: platformLabel(p) });
  }
  const seenTerms = new Set<string>();
  for (const t of parsed.terms) {
    const key = `${t.from.toLowerCase()}>${t.to}`;
    if (seenTerms.has(key)) continue;
    seenTerms.add(key);
    const same = t.from.toLowerCase() === t.to.toLowerCase();
    chips.push({ kind: 'term', value: t.to, label: same ? t.to : `${t.from} = ${t.to}` });
  }
  return chips;
}
