import { Router } from 'express';
import { shopPatchSchema } from '../../shared/schemas/shop';
import type { AppContext } from '../context';
import { can } from '../http/guard';
import { valid, validate } from '../http/validate';
import { getShopSettings, updateShopSettings } from './service';

export function shopRoutes(ctx: AppContext) {
  const r = Router();
  r.get('/shop', can('auth.self'), async (req, res) => {
    res.json({ shop: await getShopSettings(ctx, req.user!.shopId) });
  });
  r.patch('/shop', can('shop.settings'), validate('body', shopPatchSchema), async (req, res) => {
    res.json({ shop: await updateShopSettings(ctx, req.user!.shopId, valid(req, 'body', shopPatchSchema)) });
  });
  return r;
}
