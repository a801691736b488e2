import { Router } from 'express';
import { treeParamsSchema, treeSaveSchema } from '../../shared/schemas/walks';
import type { AppContext } from '../context';
import { can } from '../http/guard';
import { valid, validate } from '../http/validate';
import { getTree, listTrees, saveTree } from './service';

export function treeRoutes(ctx: AppContext) {
  const r = Router();

  r.get('/trees', can('trees.manage'), async (req, res) => {
    res.json({ trees: await listTrees(ctx, req.user!.shopId) });
  });

  r.get('/trees/:treeId', can('trees.manage'), validate('params', treeParamsSchema), async (req, res) => {
    const { treeId } = valid(req, 'params', treeParamsSchema);
    res.json({ tree: await getTree(ctx, req.user!.shopId, treeId) });
  });

  r.put('/trees/:treeId', can('trees.manage'), validate('params', treeParamsSchema), validate('body', treeSaveSchema), async (req, res) => {
    const { treeId } = valid(req, 'params', treeParamsSchema);
    const { yaml } = valid(req, 'body', treeSaveSchema);
    res.json({ tree: await saveTree(ctx, req.user!, treeId, yaml) });
  });

  return r;
}
