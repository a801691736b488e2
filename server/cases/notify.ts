// E-mails of the review workflow: seniors hear of submissions, authors of returns.
import { and, eq, inArray } from 'drizzle-orm';
import { users } from '../../db/schema';
import type { AppContext } from '../context';
import { composeMail } from '../mail/templates';

const caseUrl = (ctx: AppContext, id: number) => `${ctx.config.publicUrl}/cases/${id}`;

async function send(ctx: AppContext, mail: Parameters<AppContext['mailer']['send']>[0]) {
  // A mail failure must not undo the workflow step; it is logged for the manager to chase.
  await ctx.mailer.send(mail).catch((err) => ctx.log.error({ err, subject: mail.subject }, 'workflow e-mail failed'));
}

export async function notifySubmitted(ctx: AppContext, shopId: number, c: { id: number; title: string }, authorName: string) {
  const seniors = await ctx.db
    .select({ email: users.email })
    .from(users)
    .where(and(eq(users.shopId, shopId), eq(users.role, 'senior'), eq(users.disabled, false)));
  const fallback = seniors.length
    ? seniors
    : await ctx.db.select({ email: users.email }).from(users).where(and(eq(users.shopId, shopId), inArray(users.role, ['manager']), eq(users.disabled, false)));
  for (const s of fallback) {
    await send(
      ctx,
      composeMail(s.email, `Review wanted: ${c.title}`, [`${authorName} sent a case for review: "${c.title}".`, 'Publish it, or return it with a comment saying what to change.'], {
        label: 'Open the case',
        url: caseUrl(ctx, c.id),
      }),
    );
  }
}

export async function notifyReturned(ctx: AppContext, c: { id: number; title: string; authorId: number }, reviewer: string, comment: string) {
  const [author] = await ctx.db.select({ email: users.email, name: users.name }).from(users).where(eq(users.id, c.authorId));
  if (!author) return;
  await send(
    ctx,
    composeMail(author.email, `Returned for changes: ${c.title}`, [`Hello ${author.name},`, `${reviewer} returned "${c.title}" with this comment:`, comment], {
      label: 'Open the case',
      url: caseUrl(ctx, c.id),
    }),
  );
}
