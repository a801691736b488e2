// Every route of the server (read from the routers, so a new one cannot be missed) against
// every role and an anonymous caller, compared with the one policy table in shared/policy.ts.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { allows, policy } from '../../shared/policy';
import { roles, type Role } from '../../shared/roles';
import { agentFor, createTestApp, seedShop, signedIn, type TestApp } from '../support/test-app';
import { fillPath, listApiRoutes, type RouteInfo } from '../support/routes';

let t: TestApp;
let routes: RouteInfo[];
const callers: Record<string, Awaited<ReturnType<typeof agentFor>>> = {};
let shop: Awaited<ReturnType<typeof seedShop>>;

beforeAll(async () => {
  t = await createTestApp();
  routes = listApiRoutes(t.ctx);
  shop = await seedShop(t.ctx, 'Policy Test Garage');
  for (const role of roles) callers[role] = await signedIn(t.app, shop.people[role].email);
  callers.anonymous = await agentFor(t.app);
});
afterAll(() => t.close());

// Routes whose answer to an allowed caller is itself a 401 by contract.
const answersUnauthorisedByDesign = new Set(['get /api/auth/me']);
// Routes that would end the caller's session or lock it; called last or skipped for signed-in callers.
const sessionEnding = new Set(['post /api/auth/logout', 'post /api/auth/login', 'post /api/auth/signup']);

describe('the policy table', () => {
  it('finds a good number of routes, each with a guard naming a known permission', () => {
    expect(routes.length).toBeGreaterThan(20);
    const unguarded = routes.filter((r) => !r.permission || !(r.permission in policy)).map((r) => `${r.method.toUpperCase()} ${r.path}`);
    expect(unguarded).toEqual([]);
  });

  for (const who of [...roles, 'anonymous'] as const) {
    it(`answers ${who} exactly as the table says on every route`, async () => {
      const caller = callers[who]!;
      const actor = who === 'anonymous' ? null : { id: shop.people[who as Role].id, role: who as Role, shopId: shop.shopId };
      const mismatches: string[] = [];
      // session-ending routes go last so the caller's session lives through the others
      const ordered = [...routes].sort((a, b) => Number(sessionEnding.has(`${a.method} ${a.path}`)) - Number(sessionEnding.has(`${b.method} ${b.path}`)));
      for (const route of ordered) {
        const key = `${route.method} ${route.path}`;
        if (actor && sessionEnding.has(key)) continue;
        const url = fillPath(route.path, '999999');
        const res = await caller.agent[route.method](url).set('X-CSRF-Token', caller.csrf).send({});
        const allowed = allows(actor, route.permission!);
        const denied = res.status === 401 || res.status === 403;
        if (allowed && denied && !(answersUnauthorisedByDesign.has(key) && !actor)) mismatches.push(`${key}: allowed but got ${res.status}`);
        if (!allowed && !denied) mismatches.push(`${key}: should be refused but got ${res.status}`);
        if (!allowed && res.status !== (actor ? 403 : 401)) mismatches.push(`${key}: refused with ${res.status}, expected ${actor ? 403 : 401}`);
        expect(res.status, `${key} must never answer 5xx`).toBeLessThan(500);
      }
      expect(mismatches).toEqual([]);
    });
  }
});
