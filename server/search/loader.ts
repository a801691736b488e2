// Reads what the search index needs from MariaDB: a shop's live cases in pages
// (keyset by id, so a big shop never arrives as one huge result), one case on a
// change, a shop's platforms, and the change log after a given id.
import { platformFromRow } from '../platforms/service';
import { and, asc, eq, gt, inArray, isNull, max } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { cases, changeLog, platforms } from '../../db/schema';
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
};

const list = (v: unknown): string[] => (Array.isArray(v) ? v.filter((x): x is string => typeof x === 'string') : []);

function toRow(r: { [K in keyof typeof caseColumns]: unknown }): CaseRow {
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
  };
}

export const PAGE_SIZE = 2000;

/** One page of a shop's live (not deleted) cases with id > afterId. */
export async function loadCasePage(db: Db, shopId: number, afterId: number, size = PAGE_SIZE): Promise<CaseRow[]> {
  const rows = await db
    .select(caseColumns)
    .from(cases)
    .where(and(eq(cases.shopId, shopId), isNull(cases.deletedAt), gt(cases.id, afterId)))
    .orderBy(asc(cases.id))
    .limit(size);
  return rows.map(toRow);
}

/** Live cases by id, for the change log; deleted and other shops' ids are simply absent. */
export async function loadCases(db: Db, shopId: number, ids: number[]): Promise<CaseRow[]> {
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

export interface Change {
  id: number;
  shopId: number;
  entity: string;
  entityId: number;
  op: 'upsert' | 'delete';
}

/** Changes after `afterId`, oldest first: one primary-key range read. */
export async function loadChanges(db: Db, afterId: number, size = 5000): Promise<Change[]> {
  const rows = await db
    .select({ id: changeLog.id, shopId: changeLog.shopId, entity: changeLog.entity, entityId: changeLog.entityId, op: changeLog.op })
    .from(changeLog)
    .where(gt(changeLog.id, afterId))
    .orderBy(asc(changeLog.id))
    .limit(size);
  return rows.map((r) => ({ id: Number(r.id), shopId: Number(r.shopId), entity: r.entity, entityId: Number(r.entityId), op: r.op }));
}

export async function lastChangeId(db: Db): Promise<number> {
  const [row] = await db.select({ id: max(changeLog.id) }).from(changeLog);
  return Number(row?.id ?? 0);
}

export async function shopIdsWithCases(db: Db): Promise<number[]> {
  const rows = await db.selectDistinct({ shopId: cases.shopId }).from(cases).where(isNull(cases.deletedAt));
  return rows.map((r) => Number(r.shopId));
}
