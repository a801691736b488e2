// Linking a case to the tree cause it confirms: suggestions from the write-up (shared/walk/suggest.ts),
// the check that a linked cause exists in the shop's trees, and the link made at confirm time.
import { and, eq } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { platforms } from '../../db/schema';
import type { Platform } from '../../shared/platform';
import type { CauseOption } from '../../shared/schemas/cases';
import { clearSuggestion, evidenceFrom, listCauses, suggestCauses, type CauseSuggestion, type Tree } from '../../shared/walk';
import type { AppContext } from '../context';
import { badRequest } from '../http/errors';
import { platformFromRow } from '../platforms/service';
import { treesForShop } from '../trees/service';

export type CauseLinkedBy = 'author' | 'suggestion';

interface CaseFacts {
  shopId: number;
  platformId: number | null;
  title: string;
  rootCause: string | null;
  fix: string | null;
  codes: string[];
  symptoms: string[];
  context: string[];
}

async function platformOf(db: Db, shopId: number, platformId: number | null): Promise<Platform | null> {
  if (!platformId) return null;
  const [row] = await db.select().from(platforms).where(and(eq(platforms.id, platformId), eq(platforms.shopId, shopId)));
  return row ? (platformFromRow(row) as Platform) : null;
}

export function causeTitle(trees: Tree[], cause: string | null): string | null {
  if (!cause) return null;
  const [treeId] = cause.split('/');
  const tree = trees.find((t) => t.id === treeId);
  return tree ? (listCauses(tree).find((c) => c.globalId === cause)?.title ?? null) : null;
}

export async function suggestionsForCase(ctx: AppContext, row: CaseFacts, trees?: Tree[]): Promise<CauseSuggestion[]> {
  const shopTrees = trees ?? (await treesForShop(ctx, row.shopId));
  const ev = evidenceFrom(row, await platformOf(ctx.db, row.shopId, row.platformId));
  return suggestCauses(shopTrees, row, ev);
}

/** The suggestion to link when a fix is confirmed without a cause, or null when none is clearly ahead. */
export async function suggestedLink(ctx: AppContext, row: CaseFacts): Promise<string | null> {
  return clearSuggestion(await suggestionsForCase(ctx, row))?.cause ?? null;
}

/** 400 unless the cause is one of the shop's tree causes (ids are a contract: content/trees/README.md). */
export async function checkCause(ctx: AppContext, shopId: number, cause: string | null | undefined): Promise<void> {
  if (!cause) return;
  if (causeTitle(await treesForShop(ctx, shopId), cause) === null) {
    throw badRequest('That cause is not in this shop’s cause trees.', { cause: 'Pick a cause from the list.' });
  }
}

/** The columns to write for a cause set by a person (null clears the link). */
export const authorLink = (cause: string | null) => ({ cause, causeLinkedBy: cause ? ('author' as const) : null });

/** Every cause of the shop's trees, tree by tree in file order. */
export async function listShopCauses(ctx: AppContext, shopId: number): Promise<CauseOption[]> {
  const trees = await treesForShop(ctx, shopId);
  return trees.flatMap((tree) =>
    listCauses(tree).map((c) => ({ cause: c.globalId, title: c.title, treeId: tree.id, treeTitle: tree.title, system: c.system })),
  );
}
