// Revision history: every saved version of a case, and a readable diff between two.
import { diffLines } from 'diff';
import { and, asc, eq } from 'drizzle-orm';
import { caseRevisions, users } from '../../db/schema';
import type { Actor } from '../../shared/policy';
import type { AppContext } from '../context';
import { badRequest } from '../http/errors';
import { loadVisibleCase } from './service';

export async function listRevisions(ctx: AppContext, actor: Actor, caseId: number) {
  await loadVisibleCase(ctx.db, actor, caseId);
  const rows = await ctx.db
    .select({ version: caseRevisions.version, title: caseRevisions.title, authorId: users.id, authorName: users.name, createdAt: caseRevisions.createdAt })
    .from(caseRevisions)
    .innerJoin(users, eq(users.id, caseRevisions.authorId))
    .where(eq(caseRevisions.caseId, caseId))
    .orderBy(asc(caseRevisions.version));
  return rows.map((r) => ({ version: r.version, title: r.title, author: { id: r.authorId, name: r.authorName }, createdAt: r.createdAt.toISOString() }));
}

const show = (v: unknown) => (v === null || v === undefined ? '' : typeof v === 'string' ? v : JSON.stringify(v));

export async function diffRevisions(ctx: AppContext, actor: Actor, caseId: number, from: number, to: number) {
  await loadVisibleCase(ctx.db, actor, caseId);
  const load = async (version: number) => {
    const [row] = await ctx.db.select().from(caseRevisions).where(and(eq(caseRevisions.caseId, caseId), eq(caseRevisions.version, version)));
    if (!row) throw badRequest(`This case has no version ${version}.`, { [version === from ? 'from' : 'to']: 'No such version.' });
    return row;
  };
  const [a, b] = await Promise.all([load(from), load(to)]);
  const before = { title: a.title, ...a.fields };
  const after = { title: b.title, ...b.fields };
  const fields = [...new Set([...Object.keys(before), ...Object.keys(after)])]
    .filter((k) => show(before[k as keyof typeof before]) !== show(after[k as keyof typeof after]))
    .map((field) => ({ field, before: show(before[field as keyof typeof before]), after: show(after[field as keyof typeof after]) }));
  const body = diffLines(a.body, b.body).map((part) => ({ kind: part.added ? ('added' as const) : part.removed ? ('removed' as const) : ('same' as const), text: part.value }));
  return { from, to, fields, body };
}
