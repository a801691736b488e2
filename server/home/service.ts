// The home screen's lists: what waits for this person today. Each list is a capped
// query plus a count, so the answer stays small however large the shop grows.
import { Cron } from 'croner';
import { and, count, desc, eq, isNull, sql } from 'drizzle-orm';
import { caseComments, cases, digestRuns, users, walks } from '../../db/schema';
import { addDays, computeFigures } from '../../shared/patterns';
import { dayIn } from '../../shared/shop-time';
import { isSeniorOrAbove } from '../../shared/policy';
import { HOME_LIST_LIMIT, type HomeResponse } from '../../shared/schemas/home';
import type { SessionUser } from '../auth/session-user';
import type { AppContext } from '../context';
import { loadPatternCases, shopWindow, waitingForReview } from '../patterns/service';
import { listWalks } from '../walks/service';

const capped = <T>(items: T[]) => ({ total: items.length, items: items.slice(0, HOME_LIST_LIMIT) });

async function openWalksOf(ctx: AppContext, actor: SessionUser): Promise<HomeResponse['openWalks']> {
  const open = (await listWalks(ctx, actor, true)).filter((w) => w.status === 'open');
  return capped(
    open.map((w) => ({
      id: w.id,
      treeTitle: w.treeTitle,
      platform: w.platform ? `${w.platform.make} ${w.platform.model} ${w.platform.engine}` : null,
      codes: w.codes,
      nextStep: w.nextStep,
      updatedAt: w.updatedAt,
    })),
  );
}

/** The kind of the latest comment on a case: 'returned' means a reviewer sent it back. */
const lastCommentKind = sql<string | null>`(SELECT ${caseComments.kind} FROM ${caseComments} WHERE ${caseComments.caseId} = ${cases.id} ORDER BY ${caseComments.id} DESC LIMIT 1)`;

function myDrafts(actor: SessionUser) {
  return and(eq(cases.shopId, actor.shopId), eq(cases.authorId, actor.id), eq(cases.status, 'draft'), isNull(cases.deletedAt));
}

async function draftsOf(ctx: AppContext, actor: SessionUser): Promise<Pick<HomeResponse, 'drafts' | 'returned'>> {
  const where = myDrafts(actor);
  const returnedWhere = and(where, sql`${lastCommentKind} = 'returned'`);
  const freshWhere = and(where, sql`COALESCE(${lastCommentKind}, '') <> 'returned'`);
  const [[fresh], [returned], freshRows, returnedRows] = await Promise.all([
    ctx.db.select({ n: count() }).from(cases).where(freshWhere),
    ctx.db.select({ n: count() }).from(cases).where(returnedWhere),
    ctx.db.select({ id: cases.id, title: cases.title, updatedAt: cases.updatedAt }).from(cases).where(freshWhere).orderBy(desc(cases.updatedAt)).limit(HOME_LIST_LIMIT),
    ctx.db.select({ id: cases.id, title: cases.title, updatedAt: cases.updatedAt }).from(cases).where(returnedWhere).orderBy(desc(cases.updatedAt)).limit(HOME_LIST_LIMIT),
  ]);
  const notes = await returnNotes(ctx, returnedRows.map((r) => r.id));
  return {
    drafts: { total: fresh?.n ?? 0, items: freshRows.map((r) => ({ ...r, updatedAt: r.updatedAt.toISOString() })) },
    returned: {
      total: returned?.n ?? 0,
      items: returnedRows.map((r) => ({ ...r, updatedAt: r.updatedAt.toISOString(), ...(notes.get(r.id) ?? { returnedBy: '', comment: '' }) })),
    },
  };
}

/** The latest return comment (who sent it back and why) for each case. */
async function returnNotes(ctx: AppContext, caseIds: number[]) {
  const notes = new Map<number, { returnedBy: string; comment: string }>();
  if (caseIds.length === 0) return notes;
  const rows = await ctx.db
    .select({ caseId: caseComments.caseId, body: caseComments.body, by: users.name })
    .from(caseComments)
    .innerJoin(users, eq(users.id, caseComments.authorId))
    .where(and(eq(caseComments.kind, 'returned'), sql`${caseComments.caseId} IN (${sql.join(caseIds.map((id) => sql`${id}`), sql`, `)})`))
    .orderBy(caseComments.id);
  for (const r of rows) notes.set(r.caseId, { returnedBy: r.by, comment: r.body });
  return notes;
}

async function thisWeeksComebacks(ctx: AppContext, shopId: number, zone: string, now: Date): Promise<NonNullable<HomeResponse['comebacks']>> {
  const to = dayIn(zone, now);
  const from = addDays(to, -6);
  const [all, window] = await Promise.all([loadPatternCases(ctx, shopId), shopWindow(ctx, shopId)]);
  const { comebacks } = computeFigures(all, window, { from, to, platformId: null });
  return { ...capped(comebacks), from, to };
}

async function digestStatus(ctx: AppContext, shopId: number, now: Date): Promise<HomeResponse['digest']> {
  const [last] = await ctx.db.select().from(digestRuns).where(eq(digestRuns.shopId, shopId)).orderBy(desc(digestRuns.createdAt)).limit(1);
  const next = new Cron(ctx.config.digestCron, { paused: true }).nextRun(now);
  return {
    lastSentAt: last ? last.createdAt.toISOString() : null,
    lastKind: last?.kind ?? null,
    recipients: last?.recipients ?? null,
    nextRunAt: next ? next.toISOString() : null,
  };
}

export async function homeFor(ctx: AppContext, actor: SessionUser, now = new Date()): Promise<HomeResponse> {
  const senior = isSeniorOrAbove(actor);
  const manager = actor.role === 'manager';
  const [openWalks, drafts, review, comebacks, digest] = await Promise.all([
    openWalksOf(ctx, actor),
    draftsOf(ctx, actor),
    senior ? waitingForReview(ctx, actor.shopId).then(capped) : null,
    manager ? thisWeeksComebacks(ctx, actor.shopId, actor.shopTimeZone, now) : null,
    manager ? digestStatus(ctx, actor.shopId, now) : null,
  ]);
  return { openWalks, ...drafts, review, comebacks, digest };
}
