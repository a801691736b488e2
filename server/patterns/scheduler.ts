// The weekly digest timer inside the server (config.digestCron, default Mondays 07:00 server time).
// Every instance runs it; digest_runs makes sure each shop gets one digest per week.
import { Cron } from 'croner';
import { shops } from '../../db/schema';
import { isoWeekKey } from '../../shared/patterns';
import { dayIn } from '../../shared/shop-time';
import type { AppContext } from '../context';
import { sendDigest } from './digest';

/** One scheduled round over every shop; the period is the ISO week (e.g. 2026-W49) of the shop's own day at `now`. */
export async function runScheduledDigests(ctx: AppContext, now = new Date()): Promise<{ shopId: number; sent: number; skipped: boolean }[]> {
  const all = await ctx.db.select({ id: shops.id, timeZone: shops.timeZone }).from(shops);
  const results = [];
  for (const shop of all) {
    const periodKey = isoWeekKey(dayIn(shop.timeZone, now));
    try {
      results.push({ shopId: shop.id, ...(await sendDigest(ctx, shop.id, { kind: 'scheduled', periodKey, now })) });
    } catch (err) {
      ctx.log.error({ err, shopId: shop.id }, 'scheduled digest failed');
    }
  }
  return results;
}

/** Starts the timer; the returned function stops it (call it on shutdown). */
export function startDigestScheduler(ctx: AppContext): () => void {
  const job = new Cron(ctx.config.digestCron, { name: 'weekly-digest', protect: true, catch: (err) => ctx.log.error({ err }, 'digest scheduler') }, async () => {
    const results = await runScheduledDigests(ctx);
    ctx.log.info({ results }, 'weekly digest round');
  });
  ctx.log.info({ cron: ctx.config.digestCron, next: job.nextRun()?.toISOString() ?? null }, 'digest scheduler started');
  return () => job.stop();
}
