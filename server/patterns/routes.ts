import { Router } from 'express';
import { patternsCsvQuerySchema, patternsQuerySchema } from '../../shared/schemas/patterns';
import type { AppContext } from '../context';
import { can } from '../http/guard';
import { valid, validate } from '../http/validate';
import { patternsCsv } from './csv';
import { sendDigest } from './digest';
import { findRepeats, getPatterns } from './service';

export function patternRoutes(ctx: AppContext) {
  // The case view's "repeat visits" come from here (server/cases/queries.ts keeps the hook).
  const r = Router();

  r.get('/patterns', can('patterns.read'), validate('query', patternsQuerySchema), async (req, res) => {
    res.json(await getPatterns(ctx, req.user!.shopId, valid(req, 'query', patternsQuerySchema)));
  });

  r.get('/patterns.csv', can('patterns.read'), validate('query', patternsCsvQuerySchema), async (req, res) => {
    const { table, ...query } = valid(req, 'query', patternsCsvQuerySchema);
    const { filename, body } = patternsCsv(await getPatterns(ctx, req.user!.shopId, query), table);
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', `attachment; filename="${filename}"`);
    // A byte-order mark so spreadsheet programs read the file as UTF-8.
    res.send('\uFEFF' + body);
  });

  r.post('/digest/send', can('digest.send'), async (req, res) => {
    const now = new Date();
    const { sent } = await sendDigest(ctx, req.user!.shopId, { kind: 'manual', periodKey: `manual-${now.getTime()}`, now });
    res.status(202).json({ sent });
  });

  return r;
}
