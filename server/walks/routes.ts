import { Router } from 'express';
import { stepMarkSchema, stepParamsSchema, walkListQuerySchema, walkParamsSchema, walkStartSchema } from '../../shared/schemas/walks';
import type { AppContext } from '../context';
import { can } from '../http/guard';
import { valid, validate } from '../http/validate';
import { createWalk, getWalk, listWalks, markWalkStep, writeUpWalk } from './service';

export function walkRoutes(ctx: AppContext) {
  const r = Router();

  r.get('/walks', can('walks.use'), validate('query', walkListQuerySchema), async (req, res) => {
    const { mine } = valid(req, 'query', walkListQuerySchema);
    res.json({ walks: await listWalks(ctx, req.user!, mine === '1') });
  });

  r.post('/walks', can('walks.use'), validate('body', walkStartSchema), async (req, res) => {
    res.status(201).json(await createWalk(ctx, req.user!, valid(req, 'body', walkStartSchema)));
  });

  r.get('/walks/:id', can('walks.use'), validate('params', walkParamsSchema), async (req, res) => {
    res.json(await getWalk(ctx, req.user!, valid(req, 'params', walkParamsSchema).id));
  });

  r.patch('/walks/:id/steps/:stepId', can('walks.use'), validate('params', stepParamsSchema), validate('body', stepMarkSchema), async (req, res) => {
    const { id, stepId } = valid(req, 'params', stepParamsSchema);
    res.json(await markWalkStep(ctx, req.user!, id, stepId, valid(req, 'body', stepMarkSchema)));
  });

  r.post('/walks/:id/write-up', can('walks.use'), validate('params', walkParamsSchema), async (req, res) => {
    const { caseId, created } = await writeUpWalk(ctx, req.user!, valid(req, 'params', walkParamsSchema).id);
    res.status(created ? 201 : 200).json({ caseId });
  });

  return r;
}
