// Vehicle platform records: the engine facts a diagnosis leans on (which bank a
// cylinder sits on, which cylinders fire 360 degrees apart). Numbering schemes
// differ between makers, so banks are recorded, never inferred (references.md §6).
import { z } from 'zod';

export const platformLayouts = ['inline', 'V', 'flat'] as const;
export const fuels = ['petrol', 'diesel', 'hybrid', 'electric'] as const;
export const inductions = ['natural', 'turbo', 'supercharged'] as const;

export type PlatformLayout = (typeof platformLayouts)[number];
export type Fuel = (typeof fuels)[number];
export type Induction = (typeof inductions)[number];

/** Oldest year accepted; the VIN model-year cycle with the position-7 rule ends in 2039. */
export const PLATFORM_YEAR_MIN = 1900;
export const PLATFORM_YEAR_MAX = 2039;
export const MAX_CYLINDERS = 16;

const text = (what: string, max: number) =>
  z
    .string()
    .trim()
    .min(1, `${what} is required`)
    .max(max, `${what} is at most ${max} characters`);

const year = (what: string) =>
  z
    .number({ error: `${what} must be a year` })
    .int(`${what} must be a whole year`)
    .min(PLATFORM_YEAR_MIN, `${what} must be ${PLATFORM_YEAR_MIN} or later`)
    .max(PLATFORM_YEAR_MAX, `${what} must be ${PLATFORM_YEAR_MAX} or earlier`);

// An engine has at most MAX_CYLINDERS cylinders, so no list of them is longer (issue 15: a firing
// order of 145,000 entries held the server for seconds).
const cylinderList = z
  .array(z.number().int('cylinder numbers are whole numbers').min(1, 'cylinder numbers start at 1'))
  .max(MAX_CYLINDERS, `An engine has at most ${MAX_CYLINDERS} cylinders: list each once`);

/**
 * The fields alone, without the cross-field rules. zod refuses .partial() and
 * .pick() on a refined object, so derive update schemas from this one and run
 * the merged record through platformInputSchema.
 */
export const platformFieldsSchema = z.object({
  make: text('Make', 60),
  model: text('Model', 80),
  engine: text('Engine', 80),
  yearFrom: year('First year'),
  yearTo: year('Last year'),
  cylinders: z
    .number({ error: 'Cylinders must be a number' })
    .int('Cylinders must be a whole number')
    .min(0, 'Cylinders must be 0 (electric) to 16')
    .max(MAX_CYLINDERS, 'Cylinders must be 0 (electric) to 16'),
  layout: z.enum(platformLayouts, { error: 'Layout must be inline, V or flat' }),
  banks: z.object({ '1': cylinderList, '2': cylinderList }).optional(),
  firingOrder: cylinderList.optional(),
  fuel: z.enum(fuels, { error: 'Fuel must be petrol, diesel, hybrid or electric' }).optional(),
  induction: z.enum(inductions, { error: 'Induction must be natural, turbo or supercharged' }).optional(),
});

type BaseInput = z.infer<typeof platformFieldsSchema>;

/** Entries listed more than once, each named once; one pass with a Set, so linear in the list. */
export function duplicates<T>(list: readonly T[]): T[] {
  const seen = new Set<T>();
  const repeated = new Set<T>();
  for (const item of list) (seen.has(item) ? repeated : seen).add(item);
  return [...repeated];
}

function missing(list: readonly number[], n: number): number[] {
  const present = new Set(list);
  return Array.from({ length: n }, (_, i) => i + 1).filter((c) => !present.has(c));
}

function outOfRange(list: readonly number[], n: number): number[] {
  return list.filter((c) => c > n);
}

/** Problems with the bank map, as [field path, message] pairs. */
function bankProblems(p: BaseInput): [string[], string][] {
  if (!p.banks) return [];
  if (p.layout === 'inline') return [[['banks'], 'An inline engine has one bank: leave banks out']];
  if (p.cylinders === 0) return [[['banks'], 'An engine with no cylinders has no banks']];
  const all = [...p.banks['1'], ...p.banks['2']];
  const out: [string[], string][] = [];
  if (p.banks['1'].length === 0 || p.banks['2'].length === 0) out.push([['banks'], 'A V or flat engine needs cylinders on both banks']);
  const high = outOfRange(all, p.cylinders);
  if (high.length) out.push([['banks'], `Cylinder ${high.join(', ')} is beyond the ${p.cylinders} cylinders of this engine`]);
  const dup = duplicates(all);
  if (dup.length) out.push([['banks'], `Cylinder ${dup.join(', ')} is listed more than once across the banks`]);
  const gap = missing(all, p.cylinders);
  if (gap.length) out.push([['banks'], `Cylinder ${gap.join(', ')} is on neither bank`]);
  return out;
}

function firingOrderProblems(p: BaseInput): [string[], string][] {
  const fo = p.firingOrder;
  if (!fo) return [];
  if (p.cylinders === 0) return [[['firingOrder'], 'An engine with no cylinders has no firing order']];
  const out: [string[], string][] = [];
  if (fo.length !== p.cylinders) out.push([['firingOrder'], `Firing order lists ${fo.length} cylinders but the engine has ${p.cylinders}`]);
  const high = outOfRange(fo, p.cylinders);
  if (high.length) out.push([['firingOrder'], `Firing order names cylinder ${high.join(', ')}, beyond ${p.cylinders}`]);
  const dup = duplicates(fo);
  if (dup.length) out.push([['firingOrder'], `Firing order lists cylinder ${dup.join(', ')} more than once`]);
  else if (fo.length === p.cylinders && high.length === 0 && missing(fo, p.cylinders).length) {
    out.push([['firingOrder'], 'Firing order must use each cylinder once']);
  }
  return out;
}

/** Cross-field rules (years, cylinders vs fuel, banks, firing order) as [path, message] pairs. */
export function platformProblems(p: BaseInput): [string[], string][] {
  const out: [string[], string][] = [];
  if (p.yearFrom > p.yearTo) out.push([['yearTo'], `Last year (${p.yearTo}) is before first year (${p.yearFrom})`]);
  if (p.cylinders === 0 && p.fuel !== 'electric') out.push([['cylinders'], '0 cylinders is only for electric platforms: set fuel to electric']);
  if (p.fuel === 'electric' && p.cylinders > 0) out.push([['cylinders'], 'An electric platform has 0 cylinders']);
  if (p.layout !== 'inline' && p.cylinders === 1) out.push([['layout'], 'A single-cylinder engine is inline']);
  return [...out, ...bankProblems(p), ...firingOrderProblems(p)];
}

export const platformInputSchema = platformFieldsSchema.superRefine((p, ctx) => {
  for (const [path, message] of platformProblems(p)) ctx.addIssue({ code: 'custom', path, message });
});

export type PlatformInput = z.infer<typeof platformInputSchema>;
export interface Platform extends PlatformInput {
  id: number;
}

type BankFacts = Pick<Platform, 'layout' | 'cylinders' | 'banks'>;
type FiringFacts = Pick<Platform, 'firingOrder' | 'cylinders'>;

function inRange(cylinders: number, c: number): boolean {
  return Number.isInteger(c) && c >= 1 && c <= cylinders;
}

/** Bank of a cylinder: inline is always bank 1; V/flat only when the banks are recorded. */
export function bankOfCylinder(p: BankFacts, cylinder: number): 1 | 2 | null {
  if (!inRange(p.cylinders, cylinder)) return null;
  if (p.layout === 'inline') return 1;
  if (p.banks?.['1'].includes(cylinder)) return 1;
  if (p.banks?.['2'].includes(cylinder)) return 2;
  return null;
}

export function banksOfCylinders(
  p: BankFacts,
  cylinders: readonly number[],
): { bank1: number[]; bank2: number[]; unknown: number[]; bothBanks: boolean } {
  const bank1: number[] = [];
  const bank2: number[] = [];
  const unknown: number[] = [];
  for (const c of new Set(cylinders)) {
    const bank = bankOfCylinder(p, c);
    (bank === 1 ? bank1 : bank === 2 ? bank2 : unknown).push(c);
  }
  return { bank1, bank2, unknown, bothBanks: bank1.length > 0 && bank2.length > 0 };
}

function requireCylinder(p: FiringFacts, c: number): void {
  if (!inRange(p.cylinders, c)) throw new RangeError(`cylinder ${c} is not on this engine (1-${p.cylinders})`);
}

/**
 * Firing companions sit 360 crank degrees apart in a four-stroke even-firing
 * order: positions i and i + n/2. Both are at top dead centre together, one on
 * compression, one on exhaust overlap. Odd cylinder counts have none.
 * Null when the firing order is not recorded.
 */
export function areFiringCompanions(p: FiringFacts, a: number, b: number): boolean | null {
  requireCylinder(p, a);
  requireCylinder(p, b);
  const fo = p.firingOrder;
  if (!fo || fo.length !== p.cylinders) return null;
  const n = fo.length;
  if (n % 2 !== 0 || a === b) return false;
  return (fo.indexOf(a) + n / 2) % n === fo.indexOf(b);
}

/** True when b fires straight after a, or a after b (the order wraps round). */
export function fireConsecutively(p: FiringFacts, a: number, b: number): boolean | null {
  requireCylinder(p, a);
  requireCylinder(p, b);
  const fo = p.firingOrder;
  if (!fo || fo.length !== p.cylinders) return null;
  if (a === b) return false;
  const n = fo.length;
  const gap = (fo.indexOf(b) - fo.indexOf(a) + n) % n;
  return n > 1 && (gap === 1 || gap === n - 1);
}

/**
 * Whether the bank map fits the firing order. A six-cylinder V or flat engine
 * fires evenly by alternating banks (common practice, no source), so two
 * cylinders of one bank firing one after the other mean the bank map or the
 * firing order is wrong. Other counts are not checked: a cross-plane V8 fires
 * twice in a row on one bank by design. A warning in the platform form; an error
 * for shipped content (server/seed/demo-files.ts).
 */
export function bankFiringWarnings(p: Pick<Platform, 'layout' | 'cylinders' | 'banks' | 'firingOrder'>): string[] {
  const fo = p.firingOrder;
  if (p.layout === 'inline' || p.cylinders !== 6 || !p.banks || !fo || fo.length !== 6) return [];
  const bankOf = (c: number) => (p.banks?.['1'].includes(c) ? 1 : p.banks?.['2'].includes(c) ? 2 : null);
  const repeats = fo
    .map((c, i) => [c, fo[(i + 1) % fo.length] ?? c] as const)
    .filter(([a, b]) => bankOf(a) !== null && bankOf(a) === bankOf(b));
  if (repeats.length === 0) return [];
  const pairs = repeats.map(([a, b]) => `${a} then ${b} on bank ${bankOf(a)}`).join(', ');
  return [`An even-firing six-cylinder ${p.layout} engine alternates banks, but firing order ${fo.join('-')} fires ${pairs}: check the bank map and the firing order`];
}

/** Companion pairs of an even-firing order: 1-3-4-2 -> [[1, 4], [3, 2]]. */
export function firingCompanionPairs(firingOrder: readonly number[]): [number, number][] {
  const n = firingOrder.length;
  if (n === 0 || n % 2 !== 0) return [];
  const pairs: [number, number][] = [];
  for (let i = 0; i < n / 2; i++) pairs.push([firingOrder[i] ?? 0, firingOrder[i + n / 2] ?? 0]);
  return pairs;
}

function listWords(ns: readonly number[]): string {
  if (ns.length <= 1) return ns.join('');
  return `${ns.slice(0, -1).join(', ')} and ${ns[ns.length - 1]}`;
}

function bankWords(p: BankFacts & FiringFacts, cyls: number[]): string | null {
  if (p.layout === 'inline') return null;
  const b = banksOfCylinders(p, cyls);
  if (b.unknown.length === cyls.length) return 'bank not recorded';
  const parts: string[] = [];
  if (cyls.length === 1) parts.push(`bank ${b.bank1.length ? 1 : 2}`);
  else if (cyls.length === 2 && b.bothBanks) parts.push('one on each bank');
  else if (!b.bothBanks && b.unknown.length === 0) parts.push(`${cyls.length === 2 ? 'both' : 'all'} on bank ${b.bank1.length ? 1 : 2}`);
  else {
    if (b.bank1.length) parts.push(`${listWords(b.bank1)} on bank 1`);
    if (b.bank2.length) parts.push(`${listWords(b.bank2)} on bank 2`);
  }
  if (b.unknown.length && b.unknown.length < cyls.length) parts.push(`bank not recorded for ${listWords(b.unknown)}`);
  return parts.join(', ');
}

function firingWords(p: FiringFacts, cyls: number[]): string | null {
  if (!p.firingOrder || cyls.length < 2) return null;
  if (cyls.length === 2) {
    const [a = 0, b = 0] = cyls;
    if (areFiringCompanions(p, a, b)) return 'firing companions';
    if (fireConsecutively(p, a, b)) return 'fire one after the other';
    return null;
  }
  const pairs = firingCompanionPairs(p.firingOrder).filter(([a, b]) => cyls.includes(a) && cyls.includes(b));
  return pairs.length ? `firing companions ${pairs.map((pr) => pr.join(' and ')).join(', ')}` : null;
}

/** Short plain words for a set of cylinders, e.g. 'cylinders 2 and 5: one on each bank, firing companions'. */
export function describeCylinders(p: BankFacts & FiringFacts, cylinders: readonly number[]): string {
  const unique = [...new Set(cylinders)];
  if (unique.length === 0) return 'no cylinders';
  const bad = unique.filter((c) => !inRange(p.cylinders, c));
  if (bad.length) {
    return `${bad.length === 1 ? 'cylinder' : 'cylinders'} ${listWords(bad)} ${bad.length === 1 ? 'is' : 'are'} not on this engine (${p.cylinders} cylinders)`;
  }
  const head = `${unique.length === 1 ? 'cylinder' : 'cylinders'} ${listWords(unique)}`;
  const facts = [bankWords(p, unique), firingWords(p, unique)].filter((s): s is string => !!s);
  return facts.length ? `${head}: ${facts.join(', ')}` : head;
}

function same(a: string | undefined, b: string | undefined): boolean {
  const n = (s: string | undefined) => (s ?? '').trim().replace(/\s+/g, ' ').toLowerCase();
  return n(a) !== '' && n(a) === n(b);
}

function yearsOverlap(a: Platform, b: Platform): boolean {
  return a.yearFrom <= b.yearTo && b.yearFrom <= a.yearTo;
}

/**
 * How alike two platforms are, for "cases on similar vehicles":
 * same-engine (same make and engine, same cylinder count and layout) 0.85-1,
 * same-model (same make and model, other engine) 0.6-0.7,
 * same-layout (same layout and cylinder count, other make or model) 0.3-0.4,
 * otherwise none 0. Overlapping years and matching fuel/induction add a little.
 */
export function platformSimilarity(
  a: Platform,
  b: Platform,
): { level: 'same-engine' | 'same-model' | 'same-layout' | 'none'; score: number } {
  if (a.id === b.id) return { level: 'same-engine', score: 1 };
  const overlap = yearsOverlap(a, b) ? 1 : 0;
  const sameShape = a.layout === b.layout && a.cylinders === b.cylinders;
  if (same(a.make, b.make) && same(a.engine, b.engine) && sameShape) {
    return { level: 'same-engine', score: round(0.85 + 0.1 * (same(a.model, b.model) ? 1 : 0) + 0.05 * overlap) };
  }
  if (same(a.make, b.make) && same(a.model, b.model)) return { level: 'same-model', score: round(0.6 + 0.1 * overlap) };
  if (sameShape && a.fuel !== 'electric') {
    const extras = (a.fuel !== undefined && a.fuel === b.fuel ? 0.05 : 0) + (a.induction !== undefined && a.induction === b.induction ? 0.05 : 0);
    return { level: 'same-layout', score: round(0.3 + extras) };
  }
  return { level: 'none', score: 0 };
}

function round(n: number): number {
  return Math.round(n * 1000) / 1000;
}
