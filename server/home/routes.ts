import { Router } from 'express';
import type { AppContext } from '../context';
import { can } from '../http/guard';
import { homeFor } from './service';

export function homeRoutes(ctx: AppContext) {
  const r = Router();
  r.get('/home', can('home.read'), async (req, res) => {
    res.json(await homeFor(ctx, req.user!));
  });
  return r;
}
