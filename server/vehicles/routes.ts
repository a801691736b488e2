import { Router } from 'express';
import { vehicleIdParamsSchema } from '../../shared/schemas/patterns';
import type { AppContext } from '../context';
import { can } from '../http/guard';
import { valid, validate } from '../http/validate';
import { getVehicle, listVehicles } from './service';

export function vehicleRoutes(ctx: AppContext) {
  const r = Router();

  r.get('/vehicles', can('cases.read'), async (req, res) => {
    res.json({ vehicles: await listVehicles(ctx, req.user!) });
  });

  r.get('/vehicles/:id', can('cases.read'), validate('params', vehicleIdParamsSchema), async (req, res) => {
    const { id } = valid(req, 'params', vehicleIdParamsSchema);
    res.json(await getVehicle(ctx, req.user!, id));
  });

  return r;
}
