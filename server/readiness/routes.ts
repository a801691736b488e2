import { Router } from 'express';
import { idParamsSchema } from '../../shared/schemas/auth';
import { readinessDecodeQuerySchema, readinessRuleBodySchema, snapshotCreateSchema } from '../../shared/schemas/readiness';
import type { AppContext } from '../context';
import { can } from '../http/guard';
import { valid, validate } from '../http/validate';
import {
  addCaseSnapshot,
  decodeForShop,
  listCaseSnapshots,
  listVehicleSnapshots,
  readinessRulesFor,
  setShopReadinessRule,
  shopReadinessRule,
} from './service';

export function readinessRoutes(ctx: AppContext) {
  const r = Router();

  r.get('/readiness/decode', can('codes.read'), validate('query', readinessDecodeQuerySchema), async (req, res) => {
    const { bytes, modelYear } = valid(req, 'query', readinessDecodeQuerySchema);
    res.json(await decodeForShop(ctx, req.user!, bytes, modelYear));
  });

  r.get('/readiness/rules', can('codes.read'), async (req, res) => {
    res.json(readinessRulesFor(await shopReadinessRule(ctx, req.user!.shopId)));
  });

  r.put('/readiness/rules/current', can('shop.settings'), validate('body', readinessRuleBodySchema), async (req, res) => {
    res.json(await setShopReadinessRule(ctx, req.user!.shopId, valid(req, 'body', readinessRuleBodySchema).rule));
  });

  r.get('/cases/:id/readiness', can('cases.read'), validate('params', idParamsSchema), async (req, res) => {
    res.json({ snapshots: await listCaseSnapshots(ctx, req.user!, valid(req, 'params', idParamsSchema).id) });
  });

  r.post('/cases/:id/readiness', can('cases.write'), validate('params', idParamsSchema), validate('body', snapshotCreateSchema), async (req, res) => {
    const snapshot = await addCaseSnapshot(ctx, req.user!, valid(req, 'params', idParamsSchema).id, valid(req, 'body', snapshotCreateSchema));
    res.status(201).json(snapshot);
  });

  r.get('/vehicles/:id/readiness', can('cases.read'), validate('params', idParamsSchema), async (req, res) => {
    res.json({ snapshots: await listVehicleSnapshots(ctx, req.user!, valid(req, 'params', idParamsSchema).id) });
  });

  return r;
}
