import { Router } from 'express';
import { searchQuerySchema } from '../../shared/schemas/search';
import type { AppContext } from '../context';
import { can } from '../http/guard';
import { valid, validate } from '../http/validate';
import { searchClientFor } from './client';

export function searchRoutes(ctx: AppContext) {
  const r = Router();
  const search = searchClientFor(ctx);

  r.get('/search', can('search.read'), validate('query', searchQuerySchema), async (req, res) => {
    res.json(await search.search(req.user!, valid(req, 'query', searchQuerySchema)));
  });

  return r;
}
