/**
 * The evidence a walk starts from, and the small vocabulary the trees use to
 * test it: code patterns, tags, misfire patterns and platform attributes.
 */
export interface WalkPlatform {
  fuel?: string;
  induction?: string;
  layout?: string;
  cylinders?: number;
}

export interface WalkEvidence {
  codes: string[];
  cylinders: number[];
  banks: { bank1: number[]; bank2: number[]; bothBanks: boolean } | null;
  symptoms: string[];
  context: string[];
  platform: WalkPlatform | null;
}

// Matches shared/platform.ts (petrol, diesel, hybrid, electric) plus gas and flex-fuel engines.
export const FUELS = ['petrol', 'diesel', 'hybrid', 'electric', 'lpg', 'cng', 'flex'] as const;
export const INDUCTIONS = ['natural', 'turbo', 'supercharged'] as const;
export const LAYOUTS = ['inline', 'v', 'flat', 'w'] as const;
export const MISFIRE_PATTERNS = ['single-cylinder', 'multi-cylinder', 'one-bank', 'both-banks'] as const;

export type Fuel = (typeof FUELS)[number];
export type Induction = (typeof INDUCTIONS)[number];
export type Layout = (typeof LAYOUTS)[number];
export type MisfirePattern = (typeof MISFIRE_PATTERNS)[number];

export function emptyEvidence(): WalkEvidence {
  return { codes: [], cylinders: [], banks: null, symptoms: [], context: [], platform: null };
}

/** 'P0302-00 ' -> 'P0302-00'. */
export function normaliseCode(code: string): string {
  return code.trim().toUpperCase().replace(/\s+/g, '');
}

/** 'After timing work' -> 'after-timing-work', so tags typed by hand still match. */
export function normaliseTag(tag: string): string {
  return tag
    .trim()
    .toLowerCase()
    .replace(/[\s_]+/g, '-')
    .replace(/[^a-z0-9-]/g, '')
    .replace(/-+/g, '-')
    .replace(/^-|-$/g, '');
}

/**
 * Tree code patterns: a full code ('P0171'), a family ending in '*' ('P030*'),
 * '?' for any one character ('P03?0'). Matched against the 5-character base code,
 * so a failure-type suffix ('P0301-00') does not stop a match.
 */
export function codeMatches(pattern: string, code: string): boolean {
  const base = normaliseCode(code).slice(0, 5);
  const p = pattern.toUpperCase();
  const star = p.endsWith('*');
  const body = star ? p.slice(0, -1) : p;
  if (!star && base.length !== body.length) return false;
  if (base.length < body.length) return false;
  return [...body].every((ch, i) => ch === '?' || ch === base[i]);
}

export const anyCodeMatches = (patterns: string[], codes: string[]): boolean =>
  codes.some((code) => patterns.some((p) => codeMatches(p, code)));

const hasTag = (tags: string[], wanted: string[]): boolean => {
  const have = new Set(tags.map(normaliseTag));
  return wanted.some((t) => have.has(normaliseTag(t)));
};

export const hasSymptom = (ev: WalkEvidence, wanted: string[]) => hasTag(ev.symptoms, wanted);
export const hasContext = (ev: WalkEvidence, wanted: string[]) => hasTag(ev.context, wanted);

/** P0301..P0309 and P0310..P0312 name the misfiring cylinder. */
function cylinderFromCode(code: string): number | undefined {
  const m = /^P03(0[1-9]|1[0-2])$/.exec(normaliseCode(code).slice(0, 5));
  return m?.[1] === undefined ? undefined : Number(m[1]);
}

/** Misfiring cylinders from the evidence, topped up from per-cylinder misfire codes. */
export function misfiringCylinders(ev: WalkEvidence): number[] {
  const fromCodes = ev.codes.map(cylinderFromCode).filter((n): n is number => n !== undefined);
  return [...new Set([...ev.cylinders, ...fromCodes])].sort((a, b) => a - b);
}

export function misfirePatterns(ev: WalkEvidence): Set<MisfirePattern> {
  const cylinders = misfiringCylinders(ev);
  const found = new Set<MisfirePattern>();
  if (cylinders.length === 1) found.add('single-cylinder');
  if (cylinders.length >= 2) found.add('multi-cylinder');
  if (ev.banks?.bothBanks) found.add('both-banks');
  else if (ev.banks && cylinders.length >= 2) found.add('one-bank');
  return found;
}

const SYNONYMS: Record<string, string> = {
  gasoline: 'petrol', gas: 'petrol', benzine: 'petrol', benzin: 'petrol', ulp: 'petrol',
  autogas: 'lpg', 'e85': 'flex', 'flex-fuel': 'flex',
  na: 'natural', 'n-a': 'natural', 'naturally-aspirated': 'natural', atmospheric: 'natural', aspirated: 'natural',
  turbocharged: 'turbo', 'twin-turbo': 'turbo', biturbo: 'turbo', 'turbo-charged': 'turbo',
  supercharger: 'supercharged', blown: 'supercharged',
  straight: 'inline', 'in-line': 'inline', i: 'inline', vee: 'v', 'v-type': 'v',
  boxer: 'flat', 'horizontally-opposed': 'flat', opposed: 'flat',
};

/** A platform attribute in the trees' vocabulary ('Gasoline' -> 'petrol', 'V6' -> 'v', 'I4' -> 'inline'). */
export function normalisePlatformValue(value: string): string {
  const tag = normaliseTag(value);
  if (/^v\d+$/.test(tag)) return 'v';
  if (/^[ilr]\d+$/.test(tag)) return 'inline';
  if (/^[hf]\d+$/.test(tag)) return 'flat';
  if (/^w\d+$/.test(tag)) return 'w';
  return SYNONYMS[tag] ?? tag;
}

export type PlatformKey = 'fuel' | 'induction' | 'layout';

/** undefined when the platform does not say; the caller decides what unknown means. */
export function platformIs(ev: WalkEvidence, key: PlatformKey, allowed: readonly string[]): boolean | undefined {
  const raw = ev.platform?.[key];
  if (raw === undefined || raw.trim() === '') return undefined;
  return allowed.includes(normalisePlatformValue(raw));
}
