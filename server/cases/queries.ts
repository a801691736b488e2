// Read side of case notes: the detail view and the filtered, sorted, paginated list.
import { alias } from 'drizzle-orm/mysql-core';
import { and, asc, desc, eq, isNotNull, isNull, ne, or, sql, type SQL } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { attachments, caseCodes, caseComments, cases, caseTags, platforms, users, vehicles } from '../../db/schema';
import { parseDtc } from '../../shared/codes';
import { checkVin } from '../../shared/vin';
import { canConfirmFix, canEditCase, canPublish, isSeniorOrAbove, type Actor } from '../../shared/policy';
import type { CaseDetail, CaseListQuery, CaseSummary } from '../../shared/schemas/cases';
import type { AppContext } from '../context';
import { findRepeats } from '../patterns/service';
import { treesForShop } from '../trees/service';
import { causeTitle, suggestionsForCase } from './cause-links';
import { extractFromNote } from './markdown';
import { loadVisibleCase } from './service';

const confirmer = alias(users, 'confirmer');

const summaryColumns = {
  id: cases.id,
  title: cases.title,
  status: cases.status,
  codes: cases.codes,
  symptoms: cases.symptoms,
  platformId: platforms.id,
  make: platforms.make,
  model: platforms.model,
  engine: platforms.engine,
  vehicleId: vehicles.id,
  vin: vehicles.vin,
  plate: vehicles.plate,
  authorId: users.id,
  authorName: users.name,
  confirmedAt: cases.confirmedAt,
  updatedAt: cases.updatedAt,
  visitDate: cases.visitDate,
};

type SummaryRow = { [K in keyof typeof summaryColumns]: unknown } & { updatedAt: Date; confirmedAt: Date | null };

function toSummary(r: SummaryRow): CaseSummary {
  return {
    id: r.id as number,
    title: r.title as string,
    status: r.status as CaseSummary['status'],
    codes: r.codes as string[],
    symptoms: r.symptoms as string[],
    platform: r.platformId ? { id: r.platformId as number, make: r.make as string, model: r.model as string, engine: r.engine as string } : null,
    vehicle: r.vehicleId ? vehicleRef(r.vehicleId as number, r.vin as string, (r.plate as string | null) ?? null) : null,
    author: { id: r.authorId as number, name: r.authorName as string },
    fixConfirmed: r.confirmedAt !== null,
    updatedAt: r.updatedAt.toISOString(),
    visitDate: (r.visitDate as string | null) ?? null,
  };
}

const baseQuery = (db: Db) =>
  db
    .select(summaryColumns)
    .from(cases)
    .innerJoin(users, eq(users.id, cases.authorId))
    .leftJoin(platforms, eq(platforms.id, cases.platformId))
    .leftJoin(vehicles, eq(vehicles.id, cases.vehicleId));

/** Drafts only for their author and for seniors and managers. */
export function visibleTo(actor: Actor): SQL {
  const base = and(eq(cases.shopId, actor.shopId), isNull(cases.deletedAt))!;
  return isSeniorOrAbove(actor) ? base : and(base, or(ne(cases.status, 'draft'), eq(cases.authorId, actor.id)))!;
}

function filters(actor: Actor, q: CaseListQuery): SQL[] {
  const where: SQL[] = [visibleTo(actor)];
  if (q.status) where.push(eq(cases.status, q.status));
  if (q.platformId) where.push(eq(cases.platformId, q.platformId));
  if (q.vehicleId) where.push(eq(cases.vehicleId, q.vehicleId));
  if (q.mine === '1') where.push(eq(cases.authorId, actor.id));
  if (q.confirmed) where.push(q.confirmed === 'yes' ? isNotNull(cases.confirmedAt) : isNull(cases.confirmedAt));
  if (q.code) {
    const parsed = parseDtc(q.code);
    if (parsed.ok) where.push(sql`EXISTS (SELECT 1 FROM ${caseCodes} WHERE ${caseCodes.caseId} = ${cases.id} AND ${caseCodes.code} = ${parsed.dtc.code})`);
  }
  if (q.tag) where.push(sql`EXISTS (SELECT 1 FROM ${caseTags} WHERE ${caseTags.caseId} = ${cases.id} AND ${caseTags.tag} = ${q.tag})`);
  return where;
}

const sortColumn = {
  updated: cases.updatedAt,
  platform: sql`CONCAT(${platforms.make}, ' ', ${platforms.model})`,
  codes: sql`JSON_UNQUOTE(JSON_EXTRACT(${cases.codes}, '$[0]'))`,
  status: cases.status,
  confirmed: cases.confirmedAt,
  title: cases.title,
} as const;

export async function listCases(ctx: AppContext, actor: Actor, q: CaseListQuery) {
  const where = and(...filters(actor, q));
  const order = q.dir === 'asc' ? asc : desc;
  const [rows, [count]] = await Promise.all([
    baseQuery(ctx.db)
      .where(where)
      .orderBy(order(sortColumn[q.sort]), desc(cases.id))
      .limit(q.pageSize)
      .offset((q.page - 1) * q.pageSize),
    ctx.db.select({ n: sql<number>`COUNT(*)` }).from(cases).leftJoin(platforms, eq(platforms.id, cases.platformId)).where(where),
  ]);
  return { cases: rows.map((r) => toSummary(r as SummaryRow)), total: Number(count?.n ?? 0), page: q.page, pageSize: q.pageSize };
}

export const attachmentUrl = (id: number) => `/api/attachments/${id}`;


export async function getCaseDetail(ctx: AppContext, actor: Actor, id: number): Promise<CaseDetail> {
  const row = await loadVisibleCase(ctx.db, actor, id);
  const [[summary], extra, files, comments, repeats] = await Promise.all([
    baseQuery(ctx.db).where(eq(cases.id, id)),
    ctx.db
      .select({ name: confirmer.name, mileage: cases.mileage, mileageUnit: cases.mileageUnit })
      .from(cases)
      .leftJoin(confirmer, eq(confirmer.id, cases.confirmedById))
      .where(eq(cases.id, id)),
    ctx.db.select().from(attachments).where(eq(attachments.caseId, id)).orderBy(asc(attachments.id)),
    ctx.db
      .select({ id: caseComments.id, kind: caseComments.kind, body: caseComments.body, authorId: users.id, authorName: users.name, createdAt: caseComments.createdAt })
      .from(caseComments)
      .innerJoin(users, eq(users.id, caseComments.authorId))
      .where(eq(caseComments.caseId, id))
      .orderBy(asc(caseComments.id)),
    findRepeats(ctx, actor.shopId, id),
  ]);
  const trees = await treesForShop(ctx, row.shopId);
  const base = toSummary(summary as SummaryRow);
  const facts = extra[0];
  const editable = canEditCase(actor, row);
  const extracted = extractFromNote(row.body, row.codes);
  return {
    ...base,
    body: row.body,
    context: row.context,
    rootCause: row.rootCause,
    fix: row.fix,
    cause: row.cause,
    causeTitle: causeTitle(trees, row.cause),
    causeLinkedBy: row.cause ? (row.causeLinkedBy ?? 'author') : null,
    causeSuggestions: await suggestionsForCase(ctx, row, trees),
    vehicle: base.vehicle ? { ...base.vehicle, mileage: facts?.mileage ?? null, mileageUnit: facts?.mileageUnit ?? null } : null,
    confirmation:
      row.confirmedAt && row.confirmedById ? { by: { id: row.confirmedById, name: facts?.name ?? 'Unknown' }, at: row.confirmedAt.toISOString(), note: row.confirmNote } : null,
    version: row.version,
    createdAt: row.createdAt.toISOString(),
    attachments: files.map((f) => ({ id: f.id, name: f.originalName, size: f.size, mime: f.mime, url: attachmentUrl(f.id), createdAt: f.createdAt.toISOString() })),
    comments: comments.map((c) => ({ id: c.id, kind: c.kind, body: c.body, author: { id: c.authorId, name: c.authorName }, createdAt: c.createdAt.toISOString() })),
    extracted,
    markdownNotice: extracted.markdownNotice,
    repeats,
    permissions: {
      edit: editable,
      submit: row.status === 'draft' && (row.authorId === actor.id || isSeniorOrAbove(actor)),
      publish: row.status !== 'published' && canPublish(actor),
      return: row.status === 'review' && canPublish(actor),
      confirm: !row.confirmedAt && canConfirmFix(actor),
      delete: isSeniorOrAbove(actor),
    },
  };
}

export async function listTags(ctx: AppContext, actor: Actor) {
  const rows = await ctx.db
    .select({ tag: caseTags.tag, count: sql<number>`COUNT(*)` })
    .from(caseTags)
    .innerJoin(cases, eq(cases.id, caseTags.caseId))
    .where(visibleTo(actor))
    .groupBy(caseTags.tag)
    .orderBy(desc(sql`COUNT(*)`), asc(caseTags.tag));
  return rows.map((r) => ({ tag: r.tag, count: Number(r.count) }));
}

function vehicleRef(id: number, vin: string, plate: string | null) {
  return { id, vin, plate, vinWarnings: checkVin(vin).warnings };
}
