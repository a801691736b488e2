// Demo-mode Outbox: the messages the local catcher holds for this shop's people.
import { Router } from 'express';
import { eq } from 'drizzle-orm';
import { z } from 'zod';
import { users } from '../../db/schema';
import type { AppContext } from '../context';
import { notFound } from '../http/errors';
import { can } from '../http/guard';

const caughtSchema = z.array(
  z.object({
    id: z.string(),
    subject: z.string().default(''),
    date: z.string().optional(),
    time: z.string().optional(),
    to: z.array(z.object({ address: z.string(), name: z.string().optional() })).default([]),
    text: z.string().optional(),
    html: z.string().optional(),
  }).loose(),
);

/** A link that carries a token (invite, reset) signs in as its recipient: the Outbox says it was sent, never what it was. */
const ONE_TIME_LINK = /\S*[?&]token=\S*/gi;
export const hideOneTimeLinks = (text: string) => text.replace(ONE_TIME_LINK, "(one-time link, only in the recipient's own inbox)");

export async function fetchCaughtMail(ctx: AppContext) {
  const url = `http://${ctx.config.mail.host}:${ctx.config.mail.webPort}/api/email`;
  const res = await fetch(url, { signal: AbortSignal.timeout(3000) }).catch(() => null);
  if (!res?.ok) return null;
  const parsed = caughtSchema.safeParse(await res.json().catch(() => null));
  return parsed.success ? parsed.data : null;
}

export function outboxRoutes(ctx: AppContext) {
  const r = Router();
  r.get('/outbox', can('outbox.read'), async (req, res, next) => {
    if (!ctx.config.demoMode) return next(notFound('The Outbox'));
    const people = await ctx.db.select({ email: users.email }).from(users).where(eq(users.shopId, req.user!.shopId));
    const ours = new Set(people.map((p) => p.email.toLowerCase()));
    const caught = await fetchCaughtMail(ctx);
    if (!caught) return res.json({ messages: [], catcherDown: true, notice: 'The local mail catcher is not answering, so sent mail cannot be shown. Restart with npm start.' });
    const messages = caught
      .filter((m) => m.to.some((t) => ours.has(t.address.toLowerCase())))
      .map((m) => ({ id: m.id, subject: m.subject, to: m.to.map((t) => t.address), date: m.date ?? m.time ?? null, text: hideOneTimeLinks(m.text ?? '') }))
      .sort((a, b) => String(b.date).localeCompare(String(a.date)));
    res.json({ messages });
  });
  return r;
}
