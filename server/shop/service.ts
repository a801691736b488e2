import { eq } from 'drizzle-orm';
import { shops } from '../../db/schema';
import type { ShopPatch, ShopSettings } from '../../shared/schemas/shop';
import { countryName, dayIn, usesNorthAmericanVinRules } from '../../shared/shop-time';
import { forgetShopUsers } from '../auth/session';
import type { AppContext } from '../context';
import { notFound } from '../http/errors';

/** The shop's time zone, for "today" and the week on the server side. */
export async function shopTimeZone(ctx: AppContext, shopId: number): Promise<string> {
  const [row] = await ctx.db.select({ timeZone: shops.timeZone }).from(shops).where(eq(shops.id, shopId));
  return row?.timeZone ?? 'UTC';
}

function regionalNotes(country: string | null, readinessRule: string): string[] {
  const notes: string[] = [];
  if (!usesNorthAmericanVinRules(country))
    notes.push('VIN check digit and model-year letter follow North American rules (49 CFR 565); for vehicles built for elsewhere (ISO 3779) a mismatch is shown as a note, never refused.');
  if (country !== 'US' && readinessRule.startsWith('us'))
    notes.push('The emissions-readiness rule is a common US practice; inspection rules differ by country and region, so check the local rule and choose it under readiness.');
  return notes;
}

export async function getShopSettings(ctx: AppContext, shopId: number, now = new Date()): Promise<ShopSettings> {
  const [row] = await ctx.db.select().from(shops).where(eq(shops.id, shopId));
  if (!row) throw notFound('The shop');
  return {
    name: row.name,
    country: row.country,
    countryName: row.country ? countryName(row.country) : null,
    timeZone: row.timeZone,
    comebackDays: row.comebackDays,
    comebackKm: row.comebackKm,
    today: dayIn(row.timeZone, now),
    regionalNotes: regionalNotes(row.country, row.readinessRule),
  };
}

export async function updateShopSettings(ctx: AppContext, shopId: number, patch: ShopPatch): Promise<ShopSettings> {
  await ctx.db.update(shops).set(patch).where(eq(shops.id, shopId));
  forgetShopUsers(shopId);
  return getShopSettings(ctx, shopId);
}
