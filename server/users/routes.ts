import { Router } from 'express';
import { idParamsSchema, inviteSchema, userPatchSchema } from '../../shared/schemas/auth';
import type { AppContext } from '../context';
import { can } from '../http/guard';
import { valid, validate } from '../http/validate';
import { inviteUser, listShopUsers, updateUser } from './service';

export function userRoutes(ctx: AppContext) {
  const r = Router();

  r.get('/users', can('users.manage'), async (req, res) => {
    res.json({ users: await listShopUsers(ctx, req.user!.shopId) });
  });

  r.post('/users', can('users.manage'), validate('body', inviteSchema), async (req, res) => {
    const user = await inviteUser(ctx, req.user!, valid(req, 'body', inviteSchema));
    res.status(201).json({ user });
  });

  r.patch('/users/:id', can('users.manage'), validate('params', idParamsSchema), validate('body', userPatchSchema), async (req, res) => {
    const { id } = valid(req, 'params', idParamsSchema);
    res.json({ user: await updateUser(ctx, req.user!, id, valid(req, 'body', userPatchSchema)) });
  });

  return r;
}
