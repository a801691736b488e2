// The shop's vehicles and their visits in order, with comeback flags from shared/patterns.
import { and, asc, eq, isNull } from 'drizzle-orm';
import { cases, platforms, vehicles } from '../../db/schema';
import { canSeeCase } from '../../shared/policy';
import { dayOf, findComebacks } from '../../shared/patterns';
import type { VehicleSummary, VehicleVisit } from '../../shared/schemas/patterns';
import type { SessionUser } from '../auth/session-user';
import type { AppContext } from '../context';
import { notFound } from '../http/errors';
import { loadPatternCases, shopWindow } from '../patterns/service';

const DAY = /^\d{4}-\d{2}-\d{2}$/;

async function vehicleRows(ctx: AppContext, shopId: number, vehicleId?: number) {
  return ctx.db
    .select({ id: vehicles.id, vin: vehicles.vin, plate: vehicles.plate, fleetNumber: vehicles.fleetNumber, platformId: vehicles.platformId, make: platforms.make, model: platforms.model, engine: platforms.engine })
    .from(vehicles)
    .leftJoin(platforms, and(eq(platforms.id, vehicles.platformId), eq(platforms.shopId, shopId)))
    .where(and(eq(vehicles.shopId, shopId), vehicleId ? eq(vehicles.id, vehicleId) : undefined))
    .orderBy(asc(vehicles.vin));
}

/** Visits the actor may see: drafts only for their author and seniors (shared/policy). */
async function visitRows(ctx: AppContext, actor: SessionUser, vehicleId?: number) {
  const rows = await ctx.db
    .select({
      id: cases.id,
      vehicleId: cases.vehicleId,
      title: cases.title,
      visitDate: cases.visitDate,
      createdAt: cases.createdAt,
      mileage: cases.mileage,
      mileageUnit: cases.mileageUnit,
      codes: cases.codes,
      status: cases.status,
      authorId: cases.authorId,
      confirmedAt: cases.confirmedAt,
    })
    .from(cases)
    .where(and(eq(cases.shopId, actor.shopId), isNull(cases.deletedAt), vehicleId ? eq(cases.vehicleId, vehicleId) : undefined));
  return rows
    .filter((r) => r.vehicleId !== null && canSeeCase(actor, r))
    .map((r) => ({ ...r, day: r.visitDate && DAY.test(r.visitDate) ? r.visitDate : dayOf(r.createdAt) }))
    .sort((a, b) => a.day.localeCompare(b.day) || a.id - b.id);
}

type Row = Awaited<ReturnType<typeof vehicleRows>>[number];

function summary(v: Row, visits: { day: string }[], comebacks: number): VehicleSummary {
  return {
    id: v.id,
    vin: v.vin,
    plate: v.plate,
    fleetNumber: v.fleetNumber,
    platform: v.platformId && v.make ? { id: v.platformId, label: `${v.make} ${v.model} ${v.engine}` } : null,
    visits: visits.length,
    lastVisit: visits.at(-1)?.day ?? null,
    comebacks,
  };
}

async function comebacksOf(ctx: AppContext, shopId: number, vehicleId?: number) {
  const [all, window] = await Promise.all([loadPatternCases(ctx, shopId, vehicleId), shopWindow(ctx, shopId)]);
  return { pairs: findComebacks(all, window), window };
}

/** Every vehicle of the shop, most recent visit first (vehicles never seen last). */
export async function listVehicles(ctx: AppContext, actor: SessionUser): Promise<VehicleSummary[]> {
  const [rows, visits, { pairs }] = await Promise.all([vehicleRows(ctx, actor.shopId), visitRows(ctx, actor), comebacksOf(ctx, actor.shopId)]);
  const byVehicle = new Map<number, { day: string }[]>();
  for (const v of visits) byVehicle.set(v.vehicleId!, [...(byVehicle.get(v.vehicleId!) ?? []), v]);
  const comebackCount = new Map<number, number>();
  for (const p of pairs) comebackCount.set(p.vehicleId, (comebackCount.get(p.vehicleId) ?? 0) + 1);
  return rows
    .map((v) => summary(v, byVehicle.get(v.id) ?? [], comebackCount.get(v.id) ?? 0))
    .sort((a, b) => (b.lastVisit ?? '').localeCompare(a.lastVisit ?? '') || a.vin.localeCompare(b.vin));
}

/** One vehicle with its visits in order; another shop's vehicle is not found. */
export async function getVehicle(ctx: AppContext, actor: SessionUser, vehicleId: number) {
  const [row] = await vehicleRows(ctx, actor.shopId, vehicleId);
  if (!row) throw notFound('That vehicle');
  const [visits, { pairs, window }] = await Promise.all([visitRows(ctx, actor, vehicleId), comebacksOf(ctx, actor.shopId, vehicleId)]);
  const list: VehicleVisit[] = visits.map((v) => {
    const of = pairs.find((p) => p.repeatId === v.id);
    return {
      caseId: v.id,
      title: v.title,
      day: v.day,
      mileage: v.mileage,
      mileageUnit: v.mileage === null ? null : (v.mileageUnit ?? 'km'),
      codes: Array.isArray(v.codes) ? v.codes : [],
      status: v.status,
      confirmed: v.confirmedAt !== null,
      comebackOf: of ? { caseId: of.firstId, days: of.days, reason: of.link.reason } : null,
      cameBackAs: pairs.filter((p) => p.firstId === v.id).map((p) => ({ caseId: p.repeatId, days: p.days, reason: p.link.reason })),
    };
  });
  return { vehicle: summary(row, visits, pairs.length), visits: list, window };
}
