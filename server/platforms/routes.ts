import { Router } from 'express';
import { idParamsSchema } from '../../shared/schemas/auth';
import { platformCreateSchema, platformPatchSchema } from '../../shared/schemas/platforms';
import type { AppContext } from '../context';
import { can } from '../http/guard';
import { valid, validate } from '../http/validate';
import { createPlatform, getPlatform, listPlatforms, updatePlatform } from './service';

export function platformRoutes(ctx: AppContext) {
  const r = Router();

  r.get('/platforms', can('platforms.read'), async (req, res) => {
    res.json({ platforms: await listPlatforms(ctx, req.user!.shopId) });
  });

  r.post('/platforms', can('platforms.manage'), validate('body', platformCreateSchema), async (req, res) => {
    const id = await createPlatform(ctx, req.user!.shopId, valid(req, 'body', platformCreateSchema));
    res.status(201).json({ id });
  });

  r.get('/platforms/:id', can('platforms.read'), validate('params', idParamsSchema), async (req, res) => {
    res.json(await getPlatform(ctx, req.user!.shopId, valid(req, 'params', idParamsSchema).id));
  });

  r.patch('/platforms/:id', can('platforms.manage'), validate('params', idParamsSchema), validate('body', platformPatchSchema), async (req, res) => {
    const { id } = valid(req, 'params', idParamsSchema);
    res.json(await updatePlatform(ctx, req.user!.shopId, id, valid(req, 'body', platformPatchSchema)));
  });

  return r;
}
