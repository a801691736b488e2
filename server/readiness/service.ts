// Readiness: decoding under the shop's rule, the rule setting, and case snapshots over time.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { and, asc, eq, inArray, isNull } from 'drizzle-orm';
import { parse } from 'yaml';
import { cases, readinessSnapshots, shops, users, vehicles } from '../../db/schema';
import { canSeeCase, type Actor } from '../../shared/policy';
import {
  assessReadiness,
  compareReadouts,
  driveCycleGuideSchema,
  type DriveCycleGuide,
  monitorsFor,
  nextSteps,
  parseMonitorBytes,
  readinessModelYear,
  readinessRule,
  readinessRules,
  type ReadinessRule,
  type ReadinessReadout,
  REGIONAL_NOTE,
  ReadinessDecodeError,
  readReadiness,
} from '../../shared/readiness';
import type { ReadinessView, SnapshotCreate, SnapshotView } from '../../shared/schemas/readiness';
import { modelYearCandidates } from '../../shared/vin';
import type { AppContext } from '../context';
import { badRequest, notFound } from '../http/errors';
import { loadVisibleCase } from '../cases/service';

const guides = new Map<string, DriveCycleGuide>();

/** content/readiness/drive-cycles.yaml, read and checked once per process. */
export function driveCycleGuide(root: string): DriveCycleGuide {
  const hit = guides.get(root);
  if (hit) return hit;
  const file = path.join(root, 'content', 'readiness', 'drive-cycles.yaml');
  const guide = driveCycleGuideSchema.parse(parse(readFileSync(file, 'utf8')));
  guides.set(root, guide);
  return guide;
}

export async function shopReadinessRule(ctx: AppContext, shopId: number): Promise<ReadinessRule> {
  const [shop] = await ctx.db.select({ rule: shops.readinessRule }).from(shops).where(eq(shops.id, shopId));
  return readinessRule(shop?.rule ?? '');
}

export async function setShopReadinessRule(ctx: AppContext, shopId: number, ruleId: string) {
  await ctx.db.update(shops).set({ readinessRule: ruleId }).where(eq(shops.id, shopId));
  return readinessRulesFor(readinessRule(ruleId));
}

export function readinessRulesFor(current: ReadinessRule) {
  const rules = readinessRules.map(({ id, name, summary, source }) => ({ id, name, summary, source }));
  return { rules, current: current.id, note: REGIONAL_NOTE };
}

/** The full answer: readout, verdict under the rule, and drive-cycle steps for what is incomplete. */
export function readinessAnswer(ctx: AppContext, readout: ReadinessReadout, rule: ReadinessRule, modelYear: number | null): ReadinessView {
  const assessment = assessReadiness(readout, rule, modelYear);
  return { ...assessment, nextSteps: nextSteps(assessment.incomplete, driveCycleGuide(ctx.config.root)) };
}

export const modelYearOfVin = (vin: string | null | undefined) => (vin ? readinessModelYear(modelYearCandidates(vin)) : null);

/** PID $01 bytes as given; a reason the bytes cannot be read is a 400 on the field. */
export function readBytes(bytes: string, field = 'bytes'): ReadinessReadout {
  try {
    return parseMonitorBytes(bytes);
  } catch (err) {
    if (err instanceof ReadinessDecodeError) throw badRequest(`The monitor status could not be read: ${err.message}.`, { [field]: err.message });
    throw err;
  }
}

export async function decodeForShop(ctx: AppContext, actor: Actor, bytes: string, modelYear: number | undefined): Promise<ReadinessView> {
  return readinessAnswer(ctx, readBytes(bytes), await shopReadinessRule(ctx, actor.shopId), modelYear ?? null);
}

// ---------- snapshots

type SnapshotRow = typeof readinessSnapshots.$inferSelect;

/** A stored row back to a readout; names come from the monitor table, so renames reach old snapshots. */
function readoutOf(row: SnapshotRow): ReadinessReadout {
  const stored = new Map(row.monitors.map((m) => [m.key, m]));
  return {
    mil: row.mil,
    confirmedCodes: row.confirmedCodes,
    ignition: row.ignition,
    monitors: monitorsFor(row.ignition).map((d) => {
      const s = stored.get(d.key);
      return { key: d.key, name: d.name, kind: d.kind, supported: s?.supported ?? false, complete: s?.complete ?? false };
    }),
  };
}

async function caseModelYear(ctx: AppContext, vehicleId: number | null): Promise<number | null> {
  if (!vehicleId) return null;
  const [v] = await ctx.db.select({ vin: vehicles.vin }).from(vehicles).where(eq(vehicles.id, vehicleId));
  return modelYearOfVin(v?.vin);
}

function readoutOfInput(input: SnapshotCreate): ReadinessReadout {
  if (input.bytes !== undefined) return readBytes(input.bytes);
  const found = readReadiness(input.text ?? '');
  if (!found) throw badRequest('No monitor status in that text: paste the PID $01 answer (41 01 ...) or the monitor table.', { text: 'No monitor status found.' });
  return found;
}

export async function addCaseSnapshot(ctx: AppContext, actor: Actor, caseId: number, input: SnapshotCreate): Promise<SnapshotView> {
  const record = await loadVisibleCase(ctx.db, actor, caseId);
  const readout = readoutOfInput(input);
  const modelYear = input.modelYear ?? (await caseModelYear(ctx, record.vehicleId));
  const [inserted] = await ctx.db
    .insert(readinessSnapshots)
    .values({
      shopId: actor.shopId,
      caseId,
      label: input.label,
      mil: readout.mil,
      confirmedCodes: readout.confirmedCodes,
      ignition: readout.ignition,
      monitors: readout.monitors.map(({ key, supported, complete }) => ({ key, supported, complete })),
      modelYear,
      takenById: actor.id,
    })
    .$returningId();
  const all = await snapshotsOfCases(ctx, actor, [{ id: caseId, title: record.title }]);
  return all.find((s) => s.id === inserted!.id)!;
}

/** Snapshots of the given (visible) cases, oldest first, each compared with the one before on its case. */
async function snapshotsOfCases(ctx: AppContext, actor: Actor, visible: { id: number; title: string }[]): Promise<SnapshotView[]> {
  if (visible.length === 0) return [];
  const titles = new Map(visible.map((c) => [c.id, c.title]));
  const rows = await ctx.db
    .select({ snapshot: readinessSnapshots, takenBy: users.name })
    .from(readinessSnapshots)
    .innerJoin(users, eq(users.id, readinessSnapshots.takenById))
    .where(and(eq(readinessSnapshots.shopId, actor.shopId), inArray(readinessSnapshots.caseId, [...titles.keys()])))
    .orderBy(asc(readinessSnapshots.createdAt), asc(readinessSnapshots.id));
  const rule = await shopReadinessRule(ctx, actor.shopId);
  const previous = new Map<number, ReadinessReadout>();
  return rows.map(({ snapshot, takenBy }) => {
    const readout = readoutOf(snapshot);
    const before = previous.get(snapshot.caseId);
    previous.set(snapshot.caseId, readout);
    return {
      id: snapshot.id,
      caseId: snapshot.caseId,
      caseTitle: titles.get(snapshot.caseId) ?? '',
      label: snapshot.label,
      takenAt: snapshot.createdAt.toISOString(),
      takenBy,
      readiness: readinessAnswer(ctx, readout, rule, snapshot.modelYear),
      change: before ? compareReadouts(before, readout) : null,
    };
  });
}

export async function listCaseSnapshots(ctx: AppContext, actor: Actor, caseId: number): Promise<SnapshotView[]> {
  const record = await loadVisibleCase(ctx.db, actor, caseId);
  return snapshotsOfCases(ctx, actor, [{ id: record.id, title: record.title }]);
}

/** Every snapshot on the vehicle's cases the actor may see; another shop's vehicle is not found. */
export async function listVehicleSnapshots(ctx: AppContext, actor: Actor, vehicleId: number): Promise<SnapshotView[]> {
  const [vehicle] = await ctx.db.select({ id: vehicles.id }).from(vehicles).where(and(eq(vehicles.id, vehicleId), eq(vehicles.shopId, actor.shopId)));
  if (!vehicle) throw notFound('That vehicle');
  const rows = await ctx.db
    .select({ id: cases.id, title: cases.title, status: cases.status, authorId: cases.authorId })
    .from(cases)
    .where(and(eq(cases.shopId, actor.shopId), eq(cases.vehicleId, vehicleId), isNull(cases.deletedAt)));
  return snapshotsOfCases(ctx, actor, rows.filter((r) => canSeeCase(actor, r)));
}
