// Shop patterns: loads the shop's non-draft history once and hands it to the pure figures in
// shared/patterns. Drafts are private work in progress and never count; deleted cases neither.
import { and, desc, eq, isNull, ne, sql } from 'drizzle-orm';
import { caseComments, cases, platforms, shops, users, vehicles } from '../../db/schema';
import { computeFigures, dayOf, daysBetween, defaultPeriod, DEFAULT_WINDOW, repeatsFor, type ComebackWindow, type PatternCase } from '../../shared/patterns';
import { MAX_PERIOD_DAYS, type PatternsQuery, type PatternsResponse } from '../../shared/schemas/patterns';
import type { AppContext } from '../context';
import { badRequest } from '../http/errors';
import { dayIn } from '../../shared/shop-time';
import { shopTimeZone } from '../shop/service';

const DAY = /^\d{4}-\d{2}-\d{2}$/;

/** The shop's comeback window (shops.comebackDays, shops.comebackKm). */
export async function shopWindow(ctx: AppContext, shopId: number): Promise<ComebackWindow> {
  const [shop] = await ctx.db.select({ days: shops.comebackDays, km: shops.comebackKm }).from(shops).where(eq(shops.id, shopId));
  return shop ? { days: shop.days, km: shop.km } : DEFAULT_WINDOW;
}

/** Every non-draft, non-deleted case of the shop in the shape the pattern logic reads. */
export async function loadPatternCases(ctx: AppContext, shopId: number, vehicleId?: number): Promise<PatternCase[]> {
  const rows = await ctx.db
    .select({
      id: cases.id,
      title: cases.title,
      platformId: cases.platformId,
      vehicleId: cases.vehicleId,
      mileage: cases.mileage,
      mileageUnit: cases.mileageUnit,
      visitDate: cases.visitDate,
      codes: cases.codes,
      symptoms: cases.symptoms,
      cause: cases.cause,
      rootCause: cases.rootCause,
      confirmedAt: cases.confirmedAt,
      createdAt: cases.createdAt,
      vin: vehicles.vin,
      plate: vehicles.plate,
    })
    .from(cases)
    .leftJoin(vehicles, and(eq(vehicles.id, cases.vehicleId), eq(vehicles.shopId, shopId)))
    .where(and(eq(cases.shopId, shopId), isNull(cases.deletedAt), ne(cases.status, 'draft'), vehicleId ? eq(cases.vehicleId, vehicleId) : undefined));
  return rows.map((r) => ({
    id: r.id,
    title: r.title,
    platformId: r.platformId,
    vehicleId: r.vin ? r.vehicleId : null,
    vin: r.vin,
    plate: r.plate,
    // The visit day; a case without one counts on the day it was written.
    day: r.visitDate && DAY.test(r.visitDate) ? r.visitDate : dayOf(r.createdAt),
    mileage: r.mileage,
    mileageUnit: r.mileage === null ? null : (r.mileageUnit ?? 'km'),
    codes: Array.isArray(r.codes) ? r.codes : [],
    symptoms: Array.isArray(r.symptoms) ? r.symptoms : [],
    cause: r.cause,
    rootCause: r.rootCause,
    confirmed: r.confirmedAt !== null,
    confirmedDay: r.confirmedAt ? dayOf(r.confirmedAt) : null,
  }));
}

export async function platformLabels(ctx: AppContext, shopId: number): Promise<Map<number, string>> {
  const rows = await ctx.db
    .select({ id: platforms.id, make: platforms.make, model: platforms.model, engine: platforms.engine })
    .from(platforms)
    .where(eq(platforms.shopId, shopId));
  return new Map(rows.map((p) => [p.id, `${p.make} ${p.model} ${p.engine}`]));
}

/** Cases waiting for review, oldest submission first (the submission comment, else the last edit). */
export async function waitingForReview(ctx: AppContext, shopId: number, platformId?: number | null) {
  const submittedAt = sql<Date | string | null>`(SELECT MAX(${caseComments.createdAt}) FROM ${caseComments} WHERE ${caseComments.caseId} = ${cases.id} AND ${caseComments.kind} = 'submitted')`;
  const rows = await ctx.db
    .select({ id: cases.id, title: cases.title, author: users.name, submittedAt, updatedAt: cases.updatedAt })
    .from(cases)
    .innerJoin(users, eq(users.id, cases.authorId))
    .where(and(eq(cases.shopId, shopId), eq(cases.status, 'review'), isNull(cases.deletedAt), platformId ? eq(cases.platformId, platformId) : undefined))
    .orderBy(desc(cases.updatedAt));
  return rows
    .map((r) => ({ id: r.id, title: r.title, author: r.author, submittedAt: toIso(r.submittedAt) ?? r.updatedAt.toISOString() }))
    .sort((a, b) => a.submittedAt.localeCompare(b.submittedAt));
}

function toIso(v: Date | string | null): string | null {
  if (v === null) return null;
  const d = v instanceof Date ? v : new Date(v.includes('T') ? v : `${v.replace(' ', 'T')}Z`);
  return Number.isNaN(d.getTime()) ? null : d.toISOString();
}

export interface ResolvedPeriod {
  from: string;
  to: string;
  platformId: number | null;
  defaulted: boolean;
}

/**
 * The period asked for. Defaults: no dates -> the 90 days ending today (both ends included);
 * only `from` -> up to today; only `to` -> the 90 days ending on `to`.
 */
export function resolvePeriod(q: PatternsQuery, today = dayOf(new Date())): ResolvedPeriod {
  const to = q.to ?? (q.from && q.from > today ? q.from : today);
  const from = q.from ?? defaultPeriod(to).from;
  if (daysBetween(from, to) + 1 > MAX_PERIOD_DAYS) throw badRequest(`Choose a period of at most ${MAX_PERIOD_DAYS} days.`, { from: 'The period is too long.' });
  return { from, to, platformId: q.platformId ?? null, defaulted: !q.from && !q.to };
}

export async function getPatterns(ctx: AppContext, shopId: number, q: PatternsQuery, today?: string): Promise<PatternsResponse> {
  // "Today" is the shop's day, not the server's: a period ending today must include this evening's cases.
  const period = resolvePeriod(q, today ?? dayIn(await shopTimeZone(ctx, shopId)));
  const [all, window, labels, waiting] = await Promise.all([
    loadPatternCases(ctx, shopId),
    shopWindow(ctx, shopId),
    platformLabels(ctx, shopId),
    waitingForReview(ctx, shopId, period.platformId),
  ]);
  // Another shop's platform id simply matches nothing: no figures, no hint that it exists.
  const figures = computeFigures(all, window, period);
  const label = (id: number | null) => (id === null ? 'No platform' : (labels.get(id) ?? `Platform ${id}`));
  return {
    ...figures,
    period,
    window,
    byPlatform: figures.byPlatform.map((p) => ({ ...p, label: label(p.platformId) })),
    repeatPatterns: figures.repeatPatterns.map((p) => ({ ...p, platform: label(p.platformId) })),
    waitingForReview: waiting,
    platforms: [...labels].map(([id, l]) => ({ id, label: l })).sort((a, b) => a.label.localeCompare(b.label)),
  };
}

export interface RepeatVisit {
  caseId: number;
  title: string;
  relation: 'comeback-of' | 'came-back-as';
  days: number;
  reason: string;
}

/** The comebacks a case is part of, for its case view: what it came back after, and what came back after it. */
export async function findRepeats(ctx: AppContext, shopId: number, caseId: number): Promise<RepeatVisit[]> {
  const [row] = await ctx.db
    .select({ vehicleId: cases.vehicleId })
    .from(cases)
    .where(and(eq(cases.id, caseId), eq(cases.shopId, shopId)));
  if (!row?.vehicleId) return [];
  const [all, window] = await Promise.all([loadPatternCases(ctx, shopId, row.vehicleId), shopWindow(ctx, shopId)]);
  return repeatsFor(caseId, all, window);
}
