// The dashboard's figures from a shop's visits. Every rate's denominator is named beside it and
// in docs/patterns.md; a rate with an empty denominator is null, not 0.
import { lookupCodeTitle, parseDtc } from '../codes';
import { findComebacks, type ComebackPair, type ComebackWindow, type Visit } from './comebacks';
import { daysBetween, weeksIn, weekStart } from './dates';

/** A non-draft, non-deleted case as the pattern figures need it. */
export interface PatternCase extends Visit {
  title: string;
  platformId: number | null;
  vin: string | null;
  plate: string | null;
  /** Day the fix was confirmed, or null. */
  confirmedDay: string | null;
  rootCause: string | null;
}

export interface Period {
  from: string;
  to: string;
  platformId?: number | null;
}

export const median = (values: readonly number[]): number | null => {
  if (values.length === 0) return null;
  const s = [...values].sort((a, b) => a - b);
  const mid = Math.floor(s.length / 2);
  return s.length % 2 ? s[mid]! : (s[mid - 1]! + s[mid]!) / 2;
};

/** part / whole, or null when there is nothing to divide by. */
export const rate = (part: number, whole: number): number | null => (whole === 0 ? null : part / whole);

export const inPeriod = (c: Pick<PatternCase, 'day' | 'platformId'>, p: Period) =>
  c.day >= p.from && c.day <= p.to && (p.platformId == null || c.platformId === p.platformId);

/** Root-cause identity: the cause-tree id when there is one, else the written root cause normalised. */
export function rootCauseKey(c: Pick<PatternCase, 'cause' | 'rootCause'>): string | null {
  if (c.cause) return c.cause;
  const text = c.rootCause?.toLowerCase().replace(/[^a-z0-9]+/g, ' ').trim();
  return text ? `text:${text}` : null;
}

const codeOnly = (code: string) => {
  const p = parseDtc(code);
  return p.ok ? p.dtc.code : code;
};

function countBy(lists: string[][], limit: number): { key: string; count: number }[] {
  const counts = new Map<string, number>();
  // A case counts once per code or tag, however often the note repeats it.
  for (const list of lists) for (const key of new Set(list)) counts.set(key, (counts.get(key) ?? 0) + 1);
  return [...counts].map(([key, count]) => ({ key, count })).sort((a, b) => b.count - a.count || a.key.localeCompare(b.key)).slice(0, limit);
}

export function topCodes(cases: readonly PatternCase[], limit = 10) {
  return countBy(cases.map((c) => c.codes.map(codeOnly)), limit).map(({ key, count }) => ({ code: key, title: lookupCodeTitle(key) ?? '', count }));
}

export function topSymptoms(cases: readonly PatternCase[], limit = 10) {
  return countBy(cases.map((c) => c.symptoms), limit).map(({ key, count }) => ({ tag: key, count }));
}

/** Median calendar days from the visit to the confirmed fix, over the confirmed cases given. */
export const medianDaysToConfirm = (cases: readonly PatternCase[]) =>
  median(cases.flatMap((c) => (c.confirmedDay ? [Math.max(0, daysBetween(c.day, c.confirmedDay))] : [])));

export interface ComebackRow {
  vehicle: { id: number; vin: string; plate: string | null };
  code: string | null;
  firstCaseId: number;
  repeatCaseId: number;
  firstTitle: string;
  repeatTitle: string;
  repeatDay: string;
  days: number;
  km: number | null;
  reason: string;
}

function comebackRow(pair: ComebackPair, byId: Map<number, PatternCase>): ComebackRow {
  const first = byId.get(pair.firstId)!;
  const repeat = byId.get(pair.repeatId)!;
  return {
    vehicle: { id: pair.vehicleId, vin: repeat.vin ?? '', plate: repeat.plate },
    code: pair.link.kind === 'same-code' ? pair.link.on : (repeat.codes[0] ? codeOnly(repeat.codes[0]) : null),
    firstCaseId: pair.firstId,
    repeatCaseId: pair.repeatId,
    firstTitle: first.title,
    repeatTitle: repeat.title,
    repeatDay: repeat.day,
    days: pair.days,
    km: pair.km,
    reason: pair.link.reason,
  };
}

export interface PatternFigures {
  totals: { cases: number; confirmed: number; comebacks: number };
  topCodes: { code: string; title: string; count: number }[];
  topSymptoms: { tag: string; count: number }[];
  comebacks: ComebackRow[];
  comebackRate: number | null;
  confirmedRate: number | null;
  medianDaysToConfirm: number | null;
  byPlatform: { platformId: number | null; cases: number; comebacks: number; comebackRate: number | null; confirmedRate: number | null }[];
  byRootCause: { key: string; label: string; fixes: number; cameBack: number; comebackRate: number | null }[];
  trend: { week: string; cases: number; comebacks: number }[];
  repeatPatterns: RepeatPattern[];
}

function byPlatform(cases: readonly PatternCase[], repeatIds: Set<number>) {
  const groups = new Map<number | null, PatternCase[]>();
  for (const c of cases) groups.set(c.platformId, [...(groups.get(c.platformId) ?? []), c]);
  return [...groups]
    .map(([platformId, list]) => {
      const comebacks = list.filter((c) => repeatIds.has(c.id)).length;
      const confirmed = list.filter((c) => c.confirmed).length;
      return { platformId, cases: list.length, comebacks, comebackRate: rate(comebacks, list.length), confirmedRate: rate(confirmed, list.length) };
    })
    .sort((a, b) => b.cases - a.cases || (a.platformId ?? 0) - (b.platformId ?? 0));
}

/** Confirmed fixes in the period by root cause, and how many of them came back (at any later date). */
function byRootCause(cases: readonly PatternCase[], pairs: readonly ComebackPair[]) {
  const cameBack = new Set(pairs.map((p) => p.firstId));
  const groups = new Map<string, { label: string; fixes: number; cameBack: number }>();
  for (const c of cases) {
    const key = c.confirmed ? rootCauseKey(c) : null;
    if (!key) continue;
    const g = groups.get(key) ?? { label: c.cause ?? c.rootCause ?? key, fixes: 0, cameBack: 0 };
    g.fixes += 1;
    if (cameBack.has(c.id)) g.cameBack += 1;
    groups.set(key, g);
  }
  return [...groups]
    .map(([key, g]) => ({ key, ...g, comebackRate: rate(g.cameBack, g.fixes) }))
    .sort((a, b) => b.cameBack - a.cameBack || b.fixes - a.fixes || a.key.localeCompare(b.key));
}

export interface RepeatPattern {
  platformId: number;
  causeKey: string;
  causeLabel: string;
  vehicles: number;
  cases: { id: number; title: string; vin: string | null; day: string }[];
}

/**
 * The same root cause on the same platform on two or more different vehicles. History up to the
 * period's end is searched, so a pattern shows while any of its cases falls in the period.
 */
export function repeatPatterns(all: readonly PatternCase[], p: Period): RepeatPattern[] {
  const groups = new Map<string, PatternCase[]>();
  for (const c of all) {
    const key = rootCauseKey(c);
    if (c.platformId === null || key === null || c.day > p.to) continue;
    if (p.platformId != null && c.platformId !== p.platformId) continue;
    const k = `${c.platformId} ${key}`;
    groups.set(k, [...(groups.get(k) ?? []), c]);
  }
  const out: RepeatPattern[] = [];
  for (const list of groups.values()) {
    const vehicles = new Set(list.flatMap((c) => (c.vehicleId === null ? [] : [c.vehicleId])));
    if (vehicles.size < 2 || !list.some((c) => inPeriod(c, p))) continue;
    const sorted = [...list].sort((a, b) => a.day.localeCompare(b.day) || a.id - b.id);
    const first = sorted[0]!;
    out.push({
      platformId: first.platformId!,
      causeKey: rootCauseKey(first)!,
      causeLabel: first.rootCause ?? first.cause ?? '',
      vehicles: vehicles.size,
      cases: sorted.map((c) => ({ id: c.id, title: c.title, vin: c.vin, day: c.day })),
    });
  }
  return out.sort((a, b) => b.vehicles - a.vehicles || b.cases.length - a.cases.length || a.causeKey.localeCompare(b.causeKey));
}

/**
 * All figures for a period. `all` is the shop's whole non-draft history: comebacks are found
 * over it (a fix from before the period can come back inside it).
 */
export function computeFigures(all: readonly PatternCase[], window: ComebackWindow, p: Period): PatternFigures {
  const pairs = findComebacks(all, window);
  const byId = new Map(all.map((c) => [c.id, c]));
  const cases = all.filter((c) => inPeriod(c, p));
  const ids = new Set(cases.map((c) => c.id));
  // A comeback belongs to the period of the return visit.
  const inside = pairs.filter((pair) => ids.has(pair.repeatId));
  const repeatIds = new Set(inside.map((pair) => pair.repeatId));
  const confirmed = cases.filter((c) => c.confirmed);
  const weeks = weeksIn(p.from, p.to).map((week) => ({ week, cases: 0, comebacks: 0 }));
  const weekIndex = new Map(weeks.map((w, i) => [w.week, i]));
  for (const c of cases) {
    const w = weeks[weekIndex.get(weekStart(c.day)) ?? -1];
    if (!w) continue;
    w.cases += 1;
    if (repeatIds.has(c.id)) w.comebacks += 1;
  }
  return {
    totals: { cases: cases.length, confirmed: confirmed.length, comebacks: inside.length },
    topCodes: topCodes(cases),
    topSymptoms: topSymptoms(cases),
    comebacks: inside.map((pair) => comebackRow(pair, byId)).sort((a, b) => b.repeatDay.localeCompare(a.repeatDay) || b.repeatCaseId - a.repeatCaseId),
    comebackRate: rate(inside.length, cases.length),
    confirmedRate: rate(confirmed.length, cases.length),
    medianDaysToConfirm: medianDaysToConfirm(confirmed),
    byPlatform: byPlatform(cases, repeatIds),
    byRootCause: byRootCause(cases, pairs),
    trend: weeks,
    repeatPatterns: repeatPatterns(all, p),
  };
}
