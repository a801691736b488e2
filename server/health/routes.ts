import { Router } from 'express';
import { sql } from 'drizzle-orm';
import type { AppContext } from '../context';
import { can } from '../http/guard';
import { searchIndexStatus } from '../search/client';

export function healthRoutes(ctx: AppContext) {
  const r = Router();
  r.get('/health', can('health.read'), async (_req, res) => {
    const db = await ctx.db
      .execute(sql`SELECT 1`)
      .then(() => 'up' as const)
      .catch(() => 'down' as const);
    res.status(db === 'up' ? 200 : 503).json({ ok: db === 'up', db, version: ctx.config.version, index: await searchIndexStatus(ctx) });
  });
  return r;
}
