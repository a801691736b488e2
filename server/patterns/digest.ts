// The weekly digest for a shop's managers: new comebacks, cases waiting for review, top codes.
// Plain text first with an HTML twin; links go to the case and vehicle pages.
import { and, eq } from 'drizzle-orm';
import { digestRuns, shops, users } from '../../db/schema';
import { escapeHtml } from '../../shared/html';
import { addDays, dayOf } from '../../shared/patterns';
import type { PatternsResponse } from '../../shared/schemas/patterns';
import { isDuplicate } from '../auth/service';
import type { AppContext } from '../context';
import type { OutgoingMail } from '../mail/mailer';
import { getPatterns } from './service';
import { dayIn } from '../../shared/shop-time';
import { shopTimeZone } from '../shop/service';

const percent = (r: number | null) => (r === null ? 'no cases yet' : `${Math.round(r * 100)} %`);

export interface DigestContent {
  shopName: string;
  /** The week the new comebacks are taken from, both ends included. */
  week: { from: string; to: string };
  recent: PatternsResponse;
  quarter: PatternsResponse;
}

interface Section {
  heading: string;
  empty: string;
  items: { text: string; url?: string }[];
}

function sections(d: DigestContent, baseUrl: string): Section[] {
  return [
    {
      heading: `New comebacks (${d.week.from} to ${d.week.to})`,
      empty: `No comebacks this week. ${d.quarter.totals.comebacks} in the last 90 days.`,
      items: d.recent.comebacks.map((c) => ({
        text: `${c.vehicle.plate ?? c.vehicle.vin}: "${c.repeatTitle}" came back ${c.days} days after "${c.firstTitle}" (${c.reason}).`,
        url: `${baseUrl}/cases/${c.repeatCaseId}`,
      })),
    },
    {
      heading: `Waiting for review (${d.quarter.waitingForReview.length})`,
      empty: 'Nothing is waiting for review.',
      items: d.quarter.waitingForReview.map((w) => ({ text: `"${w.title}" by ${w.author}, sent ${w.submittedAt.slice(0, 10)}.`, url: `${baseUrl}/cases/${w.id}` })),
    },
    {
      heading: `Top codes, last 90 days (${d.quarter.period.from} to ${d.quarter.period.to})`,
      empty: 'No trouble codes in the last 90 days.',
      items: d.quarter.topCodes.slice(0, 5).map((c) => ({ text: `${c.code}${c.title ? ` ${c.title}` : ''}: ${c.count} ${c.count === 1 ? 'case' : 'cases'}` })),
    },
  ];
}

export function composeDigest(to: string[], d: DigestContent, baseUrl: string): OutgoingMail {
  const subject = `Causeway weekly digest for ${d.shopName}: ${d.recent.comebacks.length} new ${d.recent.comebacks.length === 1 ? 'comeback' : 'comebacks'}, ${d.quarter.waitingForReview.length} waiting for review`;
  const lead = `Last 90 days: confirmed-fix rate ${percent(d.quarter.confirmedRate)}, comeback rate ${percent(d.quarter.comebackRate)}, over ${d.quarter.totals.cases} cases.`;
  const parts = sections(d, baseUrl);
  const text = [
    `Weekly digest for ${d.shopName}`,
    lead,
    ...parts.map((s) => [s.heading, ...(s.items.length ? s.items.map((i) => `- ${i.text}${i.url ? `\n  ${i.url}` : ''}`) : [s.empty])].join('\n')),
    `The dashboard: ${baseUrl}/patterns`,
    '-- Causeway',
  ].join('\n\n');
  const html = [
    '<!doctype html><html><body style="font-family:Georgia,serif;line-height:1.5">',
    `<h1 style="font-size:20px">Weekly digest for ${escapeHtml(d.shopName)}</h1>`,
    `<p>${escapeHtml(lead)}</p>`,
    ...parts.map(
      (s) =>
        `<h2 style="font-size:17px">${escapeHtml(s.heading)}</h2>` +
        (s.items.length
          ? `<ul>${s.items.map((i) => `<li>${i.url ? `<a href="${escapeHtml(i.url)}">${escapeHtml(i.text)}</a>` : escapeHtml(i.text)}</li>`).join('')}</ul>`
          : `<p>${escapeHtml(s.empty)}</p>`),
    ),
    `<p><a href="${escapeHtml(baseUrl)}/patterns">Open the dashboard</a></p>`,
    '<p style="color:#66737A">Causeway</p></body></html>',
  ].join('');
  return { to, subject, text: text + '\n', html };
}

async function managersOf(ctx: AppContext, shopId: number): Promise<string[]> {
  const rows = await ctx.db
    .select({ email: users.email })
    .from(users)
    .where(and(eq(users.shopId, shopId), eq(users.role, 'manager'), eq(users.disabled, false)));
  return rows.map((r) => r.email);
}

export async function digestContent(ctx: AppContext, shopId: number, today: string): Promise<DigestContent> {
  const [shop] = await ctx.db.select({ name: shops.name }).from(shops).where(eq(shops.id, shopId));
  // The week before today: on a Monday 07:00 run that is last Monday to Sunday.
  const week = { from: addDays(today, -7), to: addDays(today, -1) };
  const [recent, quarter] = await Promise.all([getPatterns(ctx, shopId, week, today), getPatterns(ctx, shopId, {}, today)]);
  return { shopName: shop?.name ?? 'your shop', week, recent, quarter };
}

/**
 * Claims a digest run. The unique index on (shop, period, kind) lets exactly one instance
 * claim a scheduled period; the others hit the duplicate key and skip.
 */
async function claimRun(ctx: AppContext, shopId: number, kind: 'scheduled' | 'manual', periodKey: string, recipients: number): Promise<boolean> {
  try {
    await ctx.db.insert(digestRuns).values({ shopId, periodKey, kind, recipients });
    return true;
  } catch (err) {
    if (isDuplicate(err)) return false;
    throw err;
  }
}

export interface DigestRun {
  sent: number;
  skipped: boolean;
}

/** Sends the digest to every active manager of the shop; a scheduled period is sent at most once. */
export async function sendDigest(ctx: AppContext, shopId: number, opts: { kind: 'scheduled' | 'manual'; periodKey: string; now?: Date }): Promise<DigestRun> {
  const recipients = await managersOf(ctx, shopId);
  if (!(await claimRun(ctx, shopId, opts.kind, opts.periodKey, recipients.length))) return { sent: 0, skipped: true };
  if (recipients.length === 0) return { sent: 0, skipped: false };
  const content = await digestContent(ctx, shopId, dayIn(await shopTimeZone(ctx, shopId), opts.now ?? new Date()));
  let sent = 0;
  for (const to of recipients) {
    // One message per manager, so nobody sees the others' addresses; a failure is logged, not thrown.
    try {
      await ctx.mailer.send(composeDigest([to], content, ctx.config.publicUrl));
      sent += 1;
    } catch (err) {
      ctx.log.error({ err, shopId }, 'digest e-mail failed');
    }
  }
  return { sent, skipped: false };
}
