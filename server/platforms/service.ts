// Platform records per shop: the engine facts diagnosis leans on (banks, firing order).
import { and, asc, eq } from 'drizzle-orm';
import type { z } from 'zod';
import { transaction, type Db } from '../../db/client';
import { platforms } from '../../db/schema';
import { describeCylinders, firingCompanionPairs } from '../../shared/platform';
import { platformCreateSchema, type PlatformDetailResponse, type PlatformPatch, type PlatformView } from '../../shared/schemas/platforms';
import { recordChange } from '../changes/change-log';
import type { AppContext } from '../context';
import { badRequest, fieldsFromZod, notFound } from '../http/errors';

type PlatformRow = typeof platforms.$inferSelect;
type PlatformRecord = z.infer<typeof platformCreateSchema>;

/** A row as the API and shared/platform.ts see it: absent facts are left out, never null. Reuse it. */
export function platformFromRow(row: PlatformRow): PlatformView {
  return {
    id: row.id,
    make: row.make,
    model: row.model,
    engine: row.engine,
    yearFrom: row.yearFrom,
    yearTo: row.yearTo,
    cylinders: row.cylinders,
    layout: row.layout,
    ...(row.banks ? { banks: row.banks } : {}),
    ...(row.firingOrder ? { firingOrder: row.firingOrder } : {}),
    ...(row.fuel ? { fuel: row.fuel } : {}),
    ...(row.induction ? { induction: row.induction } : {}),
  };
}

/** Column values for a validated record; a fact left out is stored as NULL. */
function toColumns(p: PlatformRecord) {
  return {
    make: p.make,
    model: p.model,
    engine: p.engine,
    yearFrom: p.yearFrom,
    yearTo: p.yearTo,
    cylinders: p.cylinders,
    layout: p.layout,
    banks: p.banks ?? null,
    firingOrder: p.firingOrder ?? null,
    fuel: p.fuel ?? null,
    induction: p.induction ?? null,
  };
}

function listWords(ns: readonly number[]): string {
  if (ns.length <= 1) return ns.join('');
  return `${ns.slice(0, -1).join(', ')} and ${ns[ns.length - 1]}`;
}

/** Banks, companion pairs and both in plain words, for the detail screen and the cause walk. */
export function platformFacts(p: PlatformView): PlatformDetailResponse['facts'] {
  const all = Array.from({ length: p.cylinders }, (_, i) => i + 1);
  const banks = p.cylinders === 0 ? null : p.layout === 'inline' ? { '1': all, '2': [] } : (p.banks ?? null);
  const companionPairs = p.firingOrder && p.firingOrder.length === p.cylinders ? firingCompanionPairs(p.firingOrder) : [];
  const bankWords = !banks
    ? [p.cylinders === 0 ? 'No cylinders: an electric platform.' : 'Which cylinders sit on which bank is not recorded.']
    : p.layout === 'inline'
      ? [`One bank (inline): cylinders ${listWords(all)}.`]
      : (['1', '2'] as const).map((b) => `Bank ${b}: cylinders ${listWords(banks[b])}${b === '1' ? ' (the bank with cylinder 1)' : ''}.`);
  return { banks, companionPairs, companionWords: companionPairs.map((pair) => describeCylinders(p, pair)), bankWords };
}

async function findRow(db: Db, shopId: number, id: number): Promise<PlatformRow> {
  const [row] = await db.select().from(platforms).where(and(eq(platforms.id, id), eq(platforms.shopId, shopId)));
  if (!row) throw notFound('That platform');
  return row;
}

export async function listPlatforms(ctx: AppContext, shopId: number): Promise<PlatformView[]> {
  const rows = await ctx.db
    .select()
    .from(platforms)
    .where(eq(platforms.shopId, shopId))
    .orderBy(asc(platforms.make), asc(platforms.model), asc(platforms.yearFrom), asc(platforms.id));
  return rows.map(platformFromRow);
}

export async function getPlatform(ctx: AppContext, shopId: number, id: number): Promise<PlatformDetailResponse> {
  const platform = platformFromRow(await findRow(ctx.db, shopId, id));
  return { platform, facts: platformFacts(platform) };
}

export async function createPlatform(ctx: AppContext, shopId: number, input: PlatformRecord): Promise<number> {
  return transaction(ctx.db, async (tx) => {
    const [row] = await tx.insert(platforms).values({ shopId, ...toColumns(input) }).$returningId();
    const id = row!.id;
    await recordChange(tx, shopId, 'platform', id);
    return id;
  });
}

/** Merges the patch into the stored record and checks the whole record again (cross-field rules). */
export async function updatePlatform(ctx: AppContext, shopId: number, id: number, patch: PlatformPatch): Promise<PlatformDetailResponse> {
  await transaction(ctx.db, async (tx) => {
    const { id: _id, ...current } = platformFromRow(await findRow(tx, shopId, id));
    const merged: Record<string, unknown> = { ...current };
    for (const [key, value] of Object.entries(patch)) {
      if (value === null) delete merged[key];
      else if (value !== undefined) merged[key] = value;
    }
    const checked = platformCreateSchema.safeParse(merged);
    if (!checked.success) throw badRequest('Some fields are not valid.', fieldsFromZod(checked.error));
    await tx.update(platforms).set(toColumns(checked.data)).where(and(eq(platforms.id, id), eq(platforms.shopId, shopId)));
    await recordChange(tx, shopId, 'platform', id);
  });
  return getPlatform(ctx, shopId, id);
}
