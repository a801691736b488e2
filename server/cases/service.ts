// Case notes: create, edit with optimistic concurrency, and the review workflow.
// Every change bumps `version`, writes a revision snapshot and a change-log row in one transaction.
import { and, eq, isNotNull, isNull, sql } from 'drizzle-orm';
import { transaction, type Db } from '../../db/client';
import { caseCodes, caseComments, caseRevisions, cases, caseTags, platforms } from '../../db/schema';
import { parseDtc } from '../../shared/codes';
import { canConfirmFix, canEditCase, canPublish, canSeeCase, isSeniorOrAbove, type Actor } from '../../shared/policy';
import type { CaseCreate, CasePatch } from '../../shared/schemas/cases';
import type { SessionUser } from '../auth/session-user';
import { recordChange } from '../changes/change-log';
import type { AppContext } from '../context';
import { badRequest, conflict, forbidden, HttpError, notFound } from '../http/errors';
import { authorLink, checkCause, suggestedLink } from './cause-links';
import { notifyReturned, notifySubmitted } from './notify';
import { vehicleIdFor } from './vehicles';

export type CaseRow = typeof cases.$inferSelect;
type CaseChanges = Partial<Omit<CaseRow, 'id' | 'shopId' | 'version' | 'createdAt'>>;

/** The case if the actor may see it; otherwise 404, so ids of other shops or hidden drafts reveal nothing. */
export async function loadVisibleCase(db: Db, actor: Actor, id: number): Promise<CaseRow> {
  const [row] = await db.select().from(cases).where(and(eq(cases.id, id), eq(cases.shopId, actor.shopId), isNull(cases.deletedAt)));
  if (!row || !canSeeCase(actor, row)) throw notFound('That case');
  return row;
}

async function checkPlatform(db: Db, shopId: number, platformId: number | null | undefined) {
  if (!platformId) return;
  const [p] = await db.select({ id: platforms.id }).from(platforms).where(and(eq(platforms.id, platformId), eq(platforms.shopId, shopId)));
  if (!p) throw badRequest('That platform is not one of your shop’s.', { platformId: 'No such platform in your shop.' });
}

async function writeLookups(db: Db, caseId: number, codes: string[], symptoms: string[], fresh = false) {
  // A new case has no rows yet; deleting anyway takes gap locks that deadlock concurrent inserts.
  if (!fresh) {
    await db.delete(caseCodes).where(eq(caseCodes.caseId, caseId));
    await db.delete(caseTags).where(eq(caseTags.caseId, caseId));
  }
  const codeRows = codes.map((full) => {
    const parsed = parseDtc(full);
    return parsed.ok ? { caseId, code: parsed.dtc.code, ftb: parsed.dtc.ftb ?? '' } : null;
  });
  const unique = new Map(codeRows.filter((r) => r !== null).map((r) => [`${r.code}-${r.ftb}`, r]));
  if (unique.size) await db.insert(caseCodes).values([...unique.values()]);
  if (symptoms.length) await db.insert(caseTags).values(symptoms.map((tag) => ({ caseId, tag })));
}

function snapshot(row: CaseRow) {
  const { id: _id, shopId: _shop, title: _title, body: _body, version: _v, createdAt: _c, updatedAt: _u, ...fields } = row;
  return fields as Record<string, unknown>;
}

async function writeRevision(db: Db, row: CaseRow, authorId: number) {
  await db.insert(caseRevisions).values({ caseId: row.id, version: row.version, title: row.title, body: row.body, fields: snapshot(row), authorId });
}

export interface CreateOptions {
  /** Import keeps the file's author, dates and confirmation. */
  authorId?: number;
  createdAt?: Date;
  confirmation?: { byId: number; at: Date; note: string | null } | null;
  slug?: string | null;
  skipEmail?: boolean;
}

export async function createCase(ctx: AppContext, actor: SessionUser | Actor, input: CaseCreate, options: CreateOptions = {}): Promise<{ id: number; version: number }> {
  const status = input.status ?? 'draft';
  if (status === 'published' && !canPublish(actor)) throw forbidden('Only senior techs and managers can publish. Send it for review instead.');
  await checkPlatform(ctx.db, actor.shopId, input.platformId);
  await checkCause(ctx, actor.shopId, input.cause);
  const id = await transaction(ctx.db, async (tx) => {
    const vehicleId = await vehicleIdFor(tx, actor.shopId, input.vehicle, input.platformId ?? null);
    const [row] = await tx
      .insert(cases)
      .values({
        shopId: actor.shopId,
        slug: options.slug ?? null,
        title: input.title,
        body: input.body,
        platformId: input.platformId ?? null,
        vehicleId,
        mileage: input.vehicle?.mileage ?? null,
        mileageUnit: input.vehicle?.mileage !== undefined ? (input.vehicle?.mileageUnit ?? 'km') : null,
        visitDate: input.vehicle?.visitDate ?? null,
        codes: input.codes,
        symptoms: input.symptoms,
        context: input.context ?? [],
        rootCause: input.rootCause ?? null,
        fix: input.fix ?? null,
        ...authorLink(input.cause ?? null),
        status,
        authorId: options.authorId ?? actor.id,
        confirmedById: options.confirmation?.byId ?? null,
        confirmedAt: options.confirmation?.at ?? null,
        confirmNote: options.confirmation?.note ?? null,
        ...(options.createdAt ? { createdAt: options.createdAt, updatedAt: options.confirmation?.at ?? options.createdAt } : {}),
      })
      .$returningId();
    const caseId = row!.id;
    await writeLookups(tx, caseId, input.codes, input.symptoms, true);
    const [created] = await tx.select().from(cases).where(eq(cases.id, caseId));
    await writeRevision(tx, created!, options.authorId ?? actor.id);
    await recordChange(tx, actor.shopId, 'case', caseId);
    return caseId;
  });
  if (status === 'review' && !options.skipEmail) await notifySubmitted(ctx, actor.shopId, { id, title: input.title }, 'name' in actor ? actor.name : 'A colleague');
  return { id, version: 1 };
}

type CommentKind = typeof caseComments.$inferInsert.kind;

/** What a status change writes beside the case: its comment, in the same transaction. */
interface ChangeRecord {
  lookups?: { codes: string[]; symptoms: string[] };
  comment?: { kind: CommentKind; body: string };
}

/**
 * Applies changes if the case is still at `expectedVersion`; otherwise 409 with the current version.
 * The case, its lookups, revision, change-log entry and comment commit together or not at all.
 */
async function applyChanges(ctx: AppContext, actor: Actor, row: CaseRow, expectedVersion: number, changes: CaseChanges, { lookups, comment }: ChangeRecord = {}) {
  const next = await transaction(ctx.db, async (tx) => {
    const [result] = await tx
      .update(cases)
      .set({ ...changes, version: sql`${cases.version} + 1`, updatedAt: new Date() })
      .where(and(eq(cases.id, row.id), eq(cases.version, expectedVersion), isNull(cases.deletedAt)));
    if (result.affectedRows !== 1) return null;
    if (lookups) await writeLookups(tx, row.id, lookups.codes, lookups.symptoms);
    const [updated] = await tx.select().from(cases).where(eq(cases.id, row.id));
    await writeRevision(tx, updated!, actor.id);
    await recordChange(tx, row.shopId, 'case', row.id, changes.deletedAt ? 'delete' : 'upsert');
    if (comment) await addComment(tx, row.id, actor.id, comment.kind, comment.body);
    return updated!;
  });
  if (!next) {
    const [current] = await ctx.db.select({ version: cases.version }).from(cases).where(eq(cases.id, row.id));
    throw new StaleVersionError(row.id, current?.version ?? row.version);
  }
  return next;
}

export class StaleVersionError extends HttpError {
  constructor(
    readonly caseId: number,
    readonly currentVersion: number,
  ) {
    super(409, 'conflict', `Someone saved a newer version (${currentVersion}) of this case. Nothing was overwritten: compare and save again.`, undefined, { currentVersion });
  }
}

export async function updateCase(ctx: AppContext, actor: Actor, id: number, patch: CasePatch) {
  const row = await loadVisibleCase(ctx.db, actor, id);
  if (!canEditCase(actor, row)) throw forbidden(row.status === 'published' ? 'Only senior techs and managers can edit a published case.' : 'Only the author or a senior tech can edit this case.');
  const { version, vehicle, ...fields } = patch;
  if (fields.platformId !== undefined) await checkPlatform(ctx.db, actor.shopId, fields.platformId);
  await checkCause(ctx, actor.shopId, fields.cause);
  const { cause, ...rest } = fields;
  const changes: CaseChanges = Object.fromEntries(Object.entries(rest).filter(([, v]) => v !== undefined));
  // Changing or clearing the cause in the editor makes it the author's link, replacing a suggestion's;
  // a save that sends the same cause back leaves who linked it alone.
  if (cause !== undefined && cause !== row.cause) Object.assign(changes, authorLink(cause));
  if (vehicle !== undefined) {
    changes.vehicleId = await vehicleIdFor(ctx.db, actor.shopId, vehicle, fields.platformId ?? row.platformId);
    changes.mileage = vehicle?.mileage ?? null;
    changes.mileageUnit = vehicle?.mileage !== undefined ? (vehicle?.mileageUnit ?? 'km') : null;
    changes.visitDate = vehicle?.visitDate ?? null;
  }
  const touchesLookups = fields.codes !== undefined || fields.symptoms !== undefined;
  const lookups = touchesLookups ? { codes: fields.codes ?? row.codes, symptoms: fields.symptoms ?? row.symptoms } : undefined;
  const updated = await applyChanges(ctx, actor, row, version, changes, { lookups });
  return { id: updated.id, version: updated.version };
}

async function addComment(db: Db, caseId: number, authorId: number, kind: CommentKind, body: string) {
  await db.insert(caseComments).values({ caseId, authorId, kind, body });
}

export async function submitCase(ctx: AppContext, actor: SessionUser, id: number) {
  const row = await loadVisibleCase(ctx.db, actor, id);
  if (row.authorId !== actor.id && !isSeniorOrAbove(actor)) throw forbidden('Only the author can send this case for review.');
  if (row.status !== 'draft') throw conflict(row.status === 'review' ? 'This case is already waiting for review.' : 'This case is already published.');
  await applyChanges(ctx, actor, row, row.version, { status: 'review' }, { comment: { kind: 'submitted', body: 'Sent for review.' } });
  await notifySubmitted(ctx, actor.shopId, row, actor.name);
}

export async function publishCase(ctx: AppContext, actor: SessionUser, id: number) {
  const row = await loadVisibleCase(ctx.db, actor, id);
  if (!canPublish(actor)) throw forbidden('Only senior techs and managers can publish.');
  if (row.status === 'published') throw conflict('This case is already published.');
  await applyChanges(ctx, actor, row, row.version, { status: 'published' }, { comment: { kind: 'published', body: 'Published.' } });
}

export async function returnCase(ctx: AppContext, actor: SessionUser, id: number, comment: string) {
  const row = await loadVisibleCase(ctx.db, actor, id);
  if (!canPublish(actor)) throw forbidden('Only senior techs and managers can return a case.');
  if (row.status !== 'review') throw conflict('Only a case waiting for review can be returned.');
  await applyChanges(ctx, actor, row, row.version, { status: 'draft' }, { comment: { kind: 'returned', body: comment } });
  await notifyReturned(ctx, row, actor.name, comment);
}

/**
 * The cause link a confirmation writes: the cause given with it (the author's), else the case's
 * own link, else the best suggestion when it is clearly ahead (recorded as linked by suggestion).
 */
async function confirmLink(ctx: AppContext, row: CaseRow, cause: string | undefined): Promise<CaseChanges> {
  if (cause !== undefined) {
    await checkCause(ctx, row.shopId, cause);
    return authorLink(cause);
  }
  if (row.cause) return {};
  const suggested = await suggestedLink(ctx, row);
  return suggested ? { cause: suggested, causeLinkedBy: 'suggestion' } : {};
}

export async function confirmFix(ctx: AppContext, actor: SessionUser, id: number, note: string | undefined, cause?: string) {
  const row = await loadVisibleCase(ctx.db, actor, id);
  if (!canConfirmFix(actor)) throw forbidden('Only senior techs and managers can confirm a fix.');
  if (!row.fix?.trim()) throw badRequest('Write down the fix before confirming it.', { fix: 'Describe the fix first.' });
  if (row.confirmedAt) throw conflict('This fix is already confirmed.');
  const link = await confirmLink(ctx, row, cause);
  const changes = { confirmedById: actor.id, confirmedAt: new Date(), confirmNote: note ?? null, ...link };
  await applyChanges(ctx, actor, row, row.version, changes, { comment: { kind: 'confirmed', body: note ? `Fix confirmed: ${note}` : 'Fix confirmed.' } });
}

export async function commentOnCase(ctx: AppContext, actor: SessionUser, id: number, body: string) {
  await loadVisibleCase(ctx.db, actor, id);
  await addComment(ctx.db, id, actor.id, 'comment', body);
}

export async function deleteCase(ctx: AppContext, actor: SessionUser, id: number) {
  const row = await loadVisibleCase(ctx.db, actor, id);
  await applyChanges(ctx, actor, row, row.version, { deletedAt: new Date() });
}

export interface BackfillReport {
  checked: number;
  linked: { caseId: number; cause: string }[];
}

/**
 * The one-off backfill (`npm run backfill:causes`): every confirmed case with no cause, in every
 * shop, gets the link a confirmation would make today (the best suggestion, when clearly ahead).
 */
export async function backfillCauses(ctx: AppContext): Promise<BackfillReport> {
  const rows = await ctx.db.select().from(cases).where(and(isNull(cases.cause), isNotNull(cases.confirmedAt), isNull(cases.deletedAt)));
  const linked: BackfillReport['linked'] = [];
  for (const row of rows) {
    const suggested = await suggestedLink(ctx, row);
    if (!suggested) continue;
    // The revision is in the name of whoever confirmed the fix: the link follows from their confirmation.
    const actor: Actor = { id: row.confirmedById ?? row.authorId, shopId: row.shopId, role: 'senior' };
    await applyChanges(ctx, actor, row, row.version, { cause: suggested, causeLinkedBy: 'suggestion' });
    linked.push({ caseId: row.id, cause: suggested });
  }
  return { checked: rows.length, linked };
}
