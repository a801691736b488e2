import type { RequestHandler } from 'express';
import { allows, policy, type Permission } from '../../shared/policy';
import { forbidden, unauthorised } from './errors';

export type GuardHandler = RequestHandler & { permission: Permission };

/** Route guard from the one policy table; the permission is kept on the handler so tests can read it. */
export function can(permission: Permission): GuardHandler {
  const guard: RequestHandler = (req, _res, next) => {
    const actor = req.user ?? null;
    if (allows(actor, permission)) return next();
    next(actor ? forbidden() : unauthorised());
  };
  return Object.assign(guard, { permission });
}

export const isPublic = (permission: Permission) => policy[permission] === 'public';
