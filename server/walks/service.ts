// Cause walks: start one from the evidence over the best-matching tree, raised by the shop's
// confirmed fixes on similar cases; mark steps with optimistic concurrency; write one up as a draft case.
import { and, desc, eq, isNotNull, isNull, sql } from 'drizzle-orm';
import { transaction, type Db } from '../../db/client';
import { cases, platforms, users, walks } from '../../db/schema';
import { isSeniorOrAbove } from '../../shared/policy';
import type { CaseCreate } from '../../shared/schemas/cases';
import type { StepMarkInput, WalkResponse, WalkStart, WalkSummary } from '../../shared/schemas/walks';
import {
  buildWriteUp,
  isSameMark,
  markStep,
  pickPrecedents,
  refreshWalk,
  scoreHistory,
  selectTrees,
  startWalk,
  walkStateSchema,
  WalkError,
  type ConfirmedCase,
  type HistoryCase,
  type Tree,
  type Walk,
  type WalkErrorCode,
  type WalkEvidence,
} from '../../shared/walk';
import type { SessionUser } from '../auth/session-user';
import { createCase } from '../cases/service';
import type { AppContext } from '../context';
import { forbidden, HttpError, notFound } from '../http/errors';
import { treesForShop } from '../trees/service';
import { buildEvidence, toPlatform, type PlatformRow } from './evidence';

/** What the evidence column holds: the evidence, how the tree was chosen, and the precedents it opened with. */
interface StoredEvidence {
  evidence: WalkEvidence;
  query: string | null;
  alternatives: WalkResponse['alternatives'];
  treeReasons: string[];
  precedents?: WalkResponse['precedents'];
}

// ---- learning ----

/** The shop's published, confirmed cases, each with its similarity to the walk (shared/walk/history.ts). */
async function shopHistory(ctx: AppContext, shopId: number, ev: WalkEvidence, platform: PlatformRow | null) {
  const rows = await ctx.db
    .select({ id: cases.id, title: cases.title, cause: cases.cause, codes: cases.codes, symptoms: cases.symptoms, context: cases.context, platform: platforms })
    .from(cases)
    .leftJoin(platforms, eq(platforms.id, cases.platformId))
    .where(and(eq(cases.shopId, shopId), eq(cases.status, 'published'), isNotNull(cases.confirmedAt), isNull(cases.deletedAt)));
  const history: HistoryCase[] = rows.map((row) => ({
    caseId: row.id,
    title: row.title,
    cause: row.cause,
    codes: row.codes,
    symptoms: row.symptoms,
    context: row.context,
    platform: row.platform ? toPlatform(row.platform) : null,
  }));
  return scoreHistory(ev, platform ? toPlatform(platform) : null, history);
}

type ScoredCase = Awaited<ReturnType<typeof shopHistory>>[number];

/** Cases whose cause is in the walk's tree teach it (learnFromCases ignores the rest). */
const confirmedIn = (tree: Tree, scored: ScoredCase[]): ConfirmedCase[] =>
  scored.flatMap((c) => (c.cause?.startsWith(`${tree.id}/`) ? [{ caseId: c.caseId, title: c.title, cause: c.cause, similarity: c.similarity }] : []));

function precedentsOf(walk: Walk, scored: ScoredCase[]): WalkResponse['precedents'] {
  return pickPrecedents(scored).map((c) => ({
    caseId: Number(c.caseId),
    title: c.title,
    cause: c.cause,
    causeTitle: walk.steps.find((s) => s.cause === c.cause)?.title ?? null,
    similarity: c.similarity,
    sameEngine: c.sameEngine,
  }));
}

// ---- reading ----

const walkColumns = {
  walk: walks,
  ownerName: users.name,
  platform: { id: platforms.id, make: platforms.make, model: platforms.model, engine: platforms.engine },
};

type WalkRow = typeof walks.$inferSelect;

function readState(row: WalkRow): Walk {
  // refreshWalk recomputes order and minutes, so a walk saved by an older build still reads right.
  return refreshWalk(walkStateSchema.parse(row.state) as Walk);
}

function toResponse(row: WalkRow, ownerName: string, platform: WalkResponse['platform'] | null): WalkResponse {
  const stored = row.evidence as unknown as StoredEvidence;
  return {
    ...readState(row),
    id: row.id,
    revision: row.version,
    owner: { id: row.userId, name: ownerName },
    platform: platform?.id ? platform : null,
    evidence: stored.evidence,
    query: stored.query ?? null,
    caseId: row.caseId ?? null,
    alternatives: stored.alternatives ?? [],
    treeReasons: stored.treeReasons ?? [],
    precedents: stored.precedents ?? [],
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

async function loadRow(ctx: AppContext, actor: SessionUser, id: number) {
  const [row] = await ctx.db
    .select(walkColumns)
    .from(walks)
    .innerJoin(users, eq(users.id, walks.userId))
    .leftJoin(platforms, eq(platforms.id, walks.platformId))
    .where(and(eq(walks.id, id), eq(walks.shopId, actor.shopId)));
  // Apprentices and technicians see only their own walks; seniors and managers look over the shop's.
  if (!row || (row.walk.userId !== actor.id && !isSeniorOrAbove(actor))) throw notFound('That walk');
  return row;
}

export async function getWalk(ctx: AppContext, actor: SessionUser, id: number): Promise<WalkResponse> {
  const row = await loadRow(ctx, actor, id);
  return toResponse(row.walk, row.ownerName, row.platform);
}

export async function listWalks(ctx: AppContext, actor: SessionUser, mine: boolean): Promise<WalkSummary[]> {
  const onlyMine = mine || !isSeniorOrAbove(actor);
  const rows = await ctx.db
    .select(walkColumns)
    .from(walks)
    .innerJoin(users, eq(users.id, walks.userId))
    .leftJoin(platforms, eq(platforms.id, walks.platformId))
    .where(onlyMine ? and(eq(walks.shopId, actor.shopId), eq(walks.userId, actor.id)) : eq(walks.shopId, actor.shopId))
    .orderBy(sql`${walks.status} = 'finished'`, desc(walks.updatedAt), desc(walks.id))
    .limit(200);
  return rows.map(({ walk: row, ownerName, platform }) => {
    const state = readState(row);
    const stored = row.evidence as unknown as StoredEvidence;
    const confirmed = state.steps.find((s) => s.id === state.confirmedStepId);
    const next = state.steps.find((s) => s.id === state.nextStepId);
    return {
      id: row.id,
      treeId: state.treeId,
      treeTitle: state.treeTitle,
      status: state.status,
      owner: { id: row.userId, name: ownerName },
      platform: platform?.id ? platform : null,
      codes: stored.evidence.codes,
      symptoms: stored.evidence.symptoms,
      confirmedCause: confirmed?.title ?? null,
      nextStep: next?.title ?? null,
      marks: state.marks,
      caseId: row.caseId ?? null,
      updatedAt: row.updatedAt.toISOString(),
    };
  });
}

// ---- starting ----

export async function createWalk(ctx: AppContext, actor: SessionUser, input: WalkStart): Promise<WalkResponse> {
  const trees = await treesForShop(ctx, actor.shopId);
  const { evidence, platform, impliedCodes } = await buildEvidence(ctx, actor.shopId, input, trees);
  const [best, ...others] = selectTrees(trees, { ...evidence, codes: [...evidence.codes, ...impliedCodes] });
  if (!best) {
    throw new HttpError(
      400,
      'no_tree',
      'No cause tree fits this evidence. Add a trouble code (e.g. P0302) or a symptom such as misfire, rough-idle or no-start.',
    );
  }
  const scored = await shopHistory(ctx, actor.shopId, evidence, platform);
  const walk = startWalk(best.tree, evidence, { confirmedCases: confirmedIn(best.tree, scored) });
  const stored: StoredEvidence = {
    evidence,
    query: input.query ?? null,
    alternatives: others.slice(0, 4).map((m) => ({ treeId: m.tree.id, title: m.tree.title, score: m.score, reasons: m.reasons })),
    treeReasons: best.reasons,
    precedents: precedentsOf(walk, scored),
  };
  const [inserted] = await ctx.db
    .insert(walks)
    .values({
      shopId: actor.shopId,
      userId: actor.id,
      platformId: platform?.id ?? null,
      treeId: walk.treeId,
      evidence: stored as unknown as Record<string, unknown>,
      state: walk as unknown as Record<string, unknown>,
      status: walk.status,
    })
    .$returningId();
  return getWalk(ctx, actor, inserted!.id);
}

// ---- marking ----

const WALK_ERROR_STATUS: Record<WalkErrorCode, number> = {
  unknown_step: 404,
  walk_finished: 409,
  outcome_required: 400,
  outcome_not_allowed: 400,
  measurement_not_allowed: 400,
  invalid_measurement: 400,
  reason_required: 400,
  wrong_unit: 400,
};

const WALK_ERROR_FIELD: Partial<Record<WalkErrorCode, string>> = {
  outcome_required: 'outcome',
  outcome_not_allowed: 'outcome',
  measurement_not_allowed: 'measurement',
  invalid_measurement: 'measurement',
  reason_required: 'note',
  wrong_unit: 'measurement.unit',
};

function toHttp(error: WalkError): HttpError {
  const field = WALK_ERROR_FIELD[error.code];
  const message = error.message.charAt(0).toUpperCase() + error.message.slice(1) + '.';
  return new HttpError(WALK_ERROR_STATUS[error.code], error.code, message, field ? { [field]: message } : undefined);
}

/** Only the tech walking it marks or writes up a walk; a senior looking over it reads it. */
function ownWalk(actor: SessionUser, row: WalkRow) {
  if (row.userId !== actor.id) throw forbidden('This walk belongs to someone else: you can look it over, but only they mark its steps.');
}

/** The walk row, locked until the transaction ends: requests on one walk queue up instead of racing. */
async function lockWalk(tx: Db, shopId: number, id: number): Promise<WalkRow> {
  const [row] = await tx.select().from(walks).where(and(eq(walks.id, id), eq(walks.shopId, shopId))).for('update');
  if (!row) throw notFound('That walk');
  return row;
}

/**
 * Marks are applied to the walk as it is in the database. Several devices marking at once
 * all succeed: the row lock queues them and each applies to the state the one before left
 * (marks on different steps commute; a repeat of the same mark is a no-op).
 */
export async function markWalkStep(ctx: AppContext, actor: SessionUser, id: number, stepId: string, mark: StepMarkInput): Promise<WalkResponse> {
  ownWalk(actor, (await loadRow(ctx, actor, id)).walk);
  await transaction(ctx.db, async (tx) => {
    const row = await lockWalk(tx, actor.shopId, id);
    const current = readState(row);
    const step = current.steps.find((s) => s.id === stepId);
    if (step && isSameMark(step, mark)) return;
    let next: Walk;
    try {
      next = markStep(current, stepId, mark);
    } catch (error) {
      if (error instanceof WalkError) throw toHttp(error);
      throw error;
    }
    await tx
      .update(walks)
      .set({ state: next as unknown as Record<string, unknown>, status: next.status, version: row.version + 1, updatedAt: new Date() })
      .where(eq(walks.id, id));
  });
  return getWalk(ctx, actor, id);
}

// ---- writing up ----

function writeUpTitle(walk: Walk, ev: WalkEvidence, platform: WalkResponse['platform']): string {
  const confirmed = walk.steps.find((s) => s.id === walk.confirmedStepId);
  const head = [platform?.engine, ev.codes.slice(0, 4).join(' ')].filter(Boolean).join(' ');
  const title = `${head ? `${head}: ` : ''}${confirmed?.title ?? walk.treeTitle}`;
  return title.length > 200 ? `${title.slice(0, 197)}...` : title;
}

/**
 * A draft case from a finished walk; later calls return the case already written. The row lock
 * makes parallel write-ups (a double tap, an offline replay) wait for the first, which links its case.
 */
export async function writeUpWalk(ctx: AppContext, actor: SessionUser, id: number): Promise<{ caseId: number; created: boolean }> {
  const { walk: seen, platform } = await loadRow(ctx, actor, id);
  ownWalk(actor, seen);
  return transaction(ctx.db, async (tx) => {
    const row = await lockWalk(tx, actor.shopId, id);
    if (row.caseId) return { caseId: row.caseId, created: false };
    const walk = readState(row);
    const confirmed = walk.steps.find((s) => s.id === walk.confirmedStepId);
    if (walk.status !== 'finished' || !confirmed) {
      throw new HttpError(409, 'walk_open', 'Finish the walk first: mark the step where you found the fault as "Fault found".');
    }
    const { evidence } = row.evidence as unknown as StoredEvidence;
    const input: CaseCreate = {
      title: writeUpTitle(walk, evidence, platform?.id ? platform : null),
      body: buildWriteUp(walk, evidence),
      platformId: row.platformId ?? null,
      codes: evidence.codes,
      symptoms: evidence.symptoms.filter((s) => s.length >= 2).slice(0, 30),
      context: evidence.context.filter((s) => s.length >= 2).slice(0, 10),
      rootCause: confirmed.title,
      cause: confirmed.cause,
      status: 'draft',
    };
    const created = await createCase({ ...ctx, db: tx }, actor, input);
    await tx.update(walks).set({ caseId: created.id }).where(eq(walks.id, id));
    return { caseId: created.id, created: true };
  });
}
