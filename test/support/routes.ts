// Reads every API route from the routers themselves, with the permission its guard names.
import type { Router } from 'express';
import { apiRouters } from '../../server/app';
import type { AppContext } from '../../server/context';
import type { Permission } from '../../shared/policy';

export interface RouteInfo {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  path: string;
  permission: Permission | undefined;
}

interface Layer {
  route?: { path: string; methods: Record<string, boolean>; stack: { handle: { permission?: Permission } }[] };
}

export function listApiRoutes(ctx: AppContext): RouteInfo[] {
  const routes: RouteInfo[] = [];
  for (const router of apiRouters(ctx) as Router[]) {
    for (const layer of router.stack as unknown as Layer[]) {
      if (!layer.route) continue;
      const permission = layer.route.stack.map((s) => s.handle.permission).find(Boolean);
      for (const method of Object.keys(layer.route.methods) as RouteInfo['method'][]) {
        routes.push({ method, path: `/api${layer.route.path}`, permission });
      }
    }
  }
  return routes;
}

/** A concrete URL for a route pattern: every :param gets the given value. */
export const fillPath = (pattern: string, value: string) => pattern.replace(/:[A-Za-z]+/g, value);
