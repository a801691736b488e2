// Reads what the search index needs from MariaDB: a shop's live cases in pages
// (keyset by id, so a big shop never arrives as one huge result), one case on a
// change, and a shop's platforms. Each case comes with its version, which the index keeps
// beside it for reconciliation (reconcile.ts). The change log is read by server/changes/follower.ts.
import { platformFromRow } from '../platforms/service';
import { and, asc, eq, gt, inArray, isNull } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { cases, platforms } from '../../db/schema';
import type { Platform } from '../../shared/platform';
import type { CaseRow } from './shop-index';

const caseColumns = {
  id: cases.id,
  shopId: cases.shopId,
  title: cases.title,
  body: cases.body,
  rootCause: cases.rootCause,
  fix: cases.fix,
  codes: cases.codes,
  symptoms: cases.symptoms,
  context: cases.context,
  platformId: cases.platformId,
  status: cases.status,
  authorId: cases.authorId,
  confirmedAt: cases.confirmedAt,
  updatedAt: cases.updatedAt,
  version: cases.version,
};

/** A case as the index takes it, with the version it was read at. */
export type LoadedCase = CaseRow & { version: number };

const list = (v: unknown): string[] => (Array.isArray(v) ? v.filter((x): x is string => typeof x === 'string') : []);

function toRow(r: { [K in keyof typeof caseColumns]: unknown }): LoadedCase {
  return {
    id: Number(r.id),
    title: String(r.title),
    body: String(r.body ?? ''),
    rootCause: (r.rootCause as string | null) ?? null,
    fix: (r.fix as string | null) ?? null,
    codes: list(r.codes),
    symptoms: list(r.symptoms),
    context: list(r.context),
    platformId: r.platformId == null ? null : Number(r.platformId),
    status: r.status as CaseRow['status'],
    authorId: Number(r.authorId),
    confirmedAt: (r.confirmedAt as Date | null) ?? null,
    updatedAt: r.updatedAt as Date,
    version: Number(r.version),
  };
}

export const PAGE_SIZE = 2000;

/** One page of a shop's live (not deleted) cases with id > afterId. */
export async function loadCasePage(db: Db, shopId: number, afterId: number, size = PAGE_SIZE): Promise<LoadedCase[]> {
  const rows = await db
    .select(caseColumns)
    .from(cases)
    .where(and(eq(cases.shopId, shopId), isNull(cases.deletedAt), gt(cases.id, afterId)))
    .orderBy(asc(cases.id))
    .limit(size);
  return rows.map(toRow);
}

/** Live cases by id, for the change log; deleted and other shops' ids are simply absent. */
export async function loadCases(db: Db, shopId: number, ids: number[]): Promise<LoadedCase[]> {
  if (ids.length === 0) return [];
  const rows = await db
    .select(caseColumns)
    .from(cases)
    .where(and(eq(cases.shopId, shopId), isNull(cases.deletedAt), inArray(cases.id, ids)));
  return rows.map(toRow);
}

export async function loadPlatforms(db: Db, shopId: number): Promise<Platform[]> {
  const rows = await db.select().from(platforms).where(eq(platforms.shopId, shopId));
  return rows.map((row) => platformFromRow(row) as Platform);
}

export async function shopIdsWithCases(db: Db): Promise<number[]> {
  const rows = await db.selectDistinct({ shopId: cases.shopId }).from(cases).where(isNull(cases.deletedAt));
  return rows.map((r) => Number(r.shopId));
}
