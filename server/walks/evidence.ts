// A walk's evidence from the request: codes, cylinders from misfire codes and the free text,
// banks from the platform record, symptoms and context, the platform's facts.
import { and, eq, isNotNull, isNull } from 'drizzle-orm';
import { caseTags, cases, platforms } from '../../db/schema';
import type { Platform } from '../../shared/platform';
import { parseQuery } from '../../shared/search';
import type { WalkStart } from '../../shared/schemas/walks';
import { evidenceFrom, type Tree, type WalkEvidence } from '../../shared/walk';
import type { AppContext } from '../context';
import { platformFromRow } from '../platforms/service';
import { badRequest } from '../http/errors';

export type PlatformRow = typeof platforms.$inferSelect;

/** The shared/platform.ts view of a row (the platforms service's mapping). */
export const toPlatform = (row: PlatformRow): Platform => platformFromRow(row) as Platform;

export async function shopPlatforms(ctx: AppContext, shopId: number): Promise<PlatformRow[]> {
  return ctx.db.select().from(platforms).where(eq(platforms.shopId, shopId));
}

/** Symptom words the query reader may turn into tags: the trees' own plus the shop's case tags. */
async function symptomVocabulary(ctx: AppContext, shopId: number, trees: Tree[]): Promise<string[]> {
  const rows = await ctx.db
    .selectDistinct({ tag: caseTags.tag })
    .from(caseTags)
    .innerJoin(cases, eq(cases.id, caseTags.caseId))
    .where(and(eq(cases.shopId, shopId), isNull(cases.deletedAt), isNotNull(caseTags.tag)));
  return [...new Set([...trees.flatMap((t) => t.appliesTo.symptoms), ...rows.map((r) => r.tag)])];
}

export interface BuiltEvidence {
  evidence: WalkEvidence;
  platform: PlatformRow | null;
  /** Misfire codes of cylinders named in the text ("misfire cyl 2"): they help choose the tree but were never stored on the car. */
  impliedCodes: string[];
}

export async function buildEvidence(ctx: AppContext, shopId: number, input: WalkStart, trees: Tree[]): Promise<BuiltEvidence> {
  const rows = await shopPlatforms(ctx, shopId);
  let platform: PlatformRow | null = null;
  if (input.platformId !== undefined) {
    platform = rows.find((r) => r.id === input.platformId) ?? null;
    // Another shop's platform id reads the same as a missing one.
    if (!platform) throw badRequest('That platform is not in this shop.', { platformId: 'Pick a platform from this shop, or leave it out.' });
  }
  const parsed = input.query
    ? parseQuery(input.query, {
        platforms: rows.map(toPlatform),
        symptomTags: await symptomVocabulary(ctx, shopId, trees),
        platform: platform ? toPlatform(platform) : null,
      })
    : null;
  if (!platform && parsed?.platformIds[0] !== undefined) platform = rows.find((r) => r.id === parsed.platformIds[0]) ?? null;

  const evidence = evidenceFrom(
    {
      codes: [...input.codes, ...(parsed?.codes ?? [])],
      cylinders: parsed?.cylinders ?? [],
      symptoms: [...input.symptoms, ...(parsed?.tags ?? []), ...(parsed?.misfire ? ['misfire'] : [])],
      context: [...input.context, ...(parsed?.context ?? [])],
    },
    platform ? toPlatform(platform) : null,
  );
  return { evidence, platform, impliedCodes: parsed?.impliedCodes ?? [] };
}
