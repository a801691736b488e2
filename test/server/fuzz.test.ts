// Robustness: thousands of malformed requests across every route (wrong types, missing fields,
// huge strings, unicode edge cases, bad JSON, wrong content types, bad ids). None may answer 5xx,
// and every error must be JSON with a message.
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { agentFor, createTestApp, seedShop, signedIn, type TestApp } from '../support/test-app';
import { fillPath, listApiRoutes, type RouteInfo } from '../support/routes';

const RUNS = Number(process.env.FUZZ_RUNS ?? 5000);

let t: TestApp;
let routes: RouteInfo[];
let callers: Awaited<ReturnType<typeof agentFor>>[];
const seen = { requests: 0, byStatus: new Map<number, number>() };

beforeAll(async () => {
  t = await createTestApp();
  routes = listApiRoutes(t.ctx).filter((r) => r.path !== '/api/auth/logout');
  const shop = await seedShop(t.ctx, 'Fuzz Garage');
  callers = [await signedIn(t.app, shop.people.manager.email), await signedIn(t.app, shop.people.apprentice.email), await agentFor(t.app)];
}, 60_000);
afterAll(async () => {
  console.log(`fuzz: ${seen.requests} requests; statuses ${[...seen.byStatus.entries()].sort().map(([s, n]) => `${s}x${n}`).join(' ')}`);
  await t.close();
});

const weirdStrings = fc.oneof(
  fc.string({ unit: 'binary', maxLength: 40 }),
  fc.string({ unit: 'grapheme', maxLength: 40 }),
  fc.constantFrom('', ' ', '\u0000', '\uFEFF', '\u202E', '😀'.repeat(30), 'a'.repeat(70_000), "'; DROP TABLE cases;--", '<script>alert(1)</script>', '../../etc/passwd', 'P0302', 'p0302-13', '1M8GDM9AXKP042788', 'NaN', 'Infinity', '-0', '1e309'),
);
const jsonValue = fc.oneof(
  fc.jsonValue({ maxDepth: 3 }),
  weirdStrings,
  fc.dictionary(fc.constantFrom('title', 'body', 'codes', 'symptoms', 'version', 'email', 'password', 'role', 'status', 'platformId', 'vehicle', 'comment', 'note', 'state', 'outcome', 'measurement', 'text', 'name', 'disabled', 'token', 'q', '__proto__', 'constructor'), fc.oneof(fc.jsonValue({ maxDepth: 2 }), weirdStrings)),
);
const badId = fc.constantFrom('0', '-1', 'abc', '1.5', '1e400', '99999999999999999999', '%00', "1'--", 'NaN', '%EF%BC%91', '%F0%9F%98%80', 'x'.repeat(300), '1', '2', '%2e%2e');
const queryString = fc.array(fc.tuple(fc.constantFrom('q', 'page', 'pageSize', 'status', 'code', 'tag', 'platformId', 'from', 'to', 'limit', 'pairs', 'sort', 'mine', 'page[]', 'page[a]', 'table'), fc.oneof(weirdStrings.map((s) => s.slice(0, 300)), fc.integer().map(String))), { maxLength: 4 });
const bodyKind = fc.constantFrom('json', 'raw-bad-json', 'text', 'form', 'multipart', 'none');

const asText = (b: unknown) => (typeof b === 'string' ? b : (JSON.stringify(b) ?? ''));

async function send(route: RouteInfo, caller: (typeof callers)[number], id: string, query: [string, string][], kind: string, body: unknown) {
  const qs = query.map(([k, v]) => `${encodeURIComponent(k)}=${encodeURIComponent(v)}`).join('&');
  const url = fillPath(route.path, id) + (qs ? `?${qs}` : '');
  let req = caller.agent[route.method](url).set('X-CSRF-Token', caller.csrf);
  if (route.method === 'get' || route.method === 'delete' || kind === 'none') return req;
  if (kind === 'json') return req.set('Content-Type', 'application/json').send(JSON.stringify(body) ?? 'null');
  if (kind === 'raw-bad-json') return req.set('Content-Type', 'application/json').send('{"title": "x", ' + asText(body).slice(0, 100));
  if (kind === 'text') return req.set('Content-Type', 'text/plain').send(asText(body).slice(0, 5000));
  if (kind === 'form') return req.type('form').send({ a: asText(body).slice(0, 200) });
  return req.set('Content-Type', 'multipart/form-data; boundary=xyz').send(`--xyz\r\nContent-Disposition: form-data; name="file"; filename="${asText(body).slice(0, 50)}"\r\n\r\n${asText(body).slice(0, 500)}\r\n--xyz`);
}

describe('fuzzing every route', () => {
  it(`answers ${RUNS} malformed requests without a 5xx, always with a JSON error message`, async () => {
    await fc.assert(
      fc.asyncProperty(fc.nat(), fc.nat(), badId, queryString, bodyKind, jsonValue, async (r, c, id, query, kind, body) => {
        const route = routes[r % routes.length]!;
        const caller = callers[c % callers.length]!;
        const res = await send(route, caller, id, query, kind, body);
        seen.requests++;
        seen.byStatus.set(res.status, (seen.byStatus.get(res.status) ?? 0) + 1);
        const where = `${route.method.toUpperCase()} ${route.path} id=${id.slice(0, 20)} kind=${kind} -> ${res.status}`;
        expect(res.status, where).toBeLessThan(500);
        if (res.status >= 400 && res.status !== 404) {
          expect(res.headers['content-type'], where).toMatch(/application\/json/);
          expect(typeof res.body?.error?.message, where).toBe('string');
        }
      }),
      { numRuns: RUNS, seed: Number(process.env.FUZZ_SEED ?? 20261201), endOnFailure: true },
    );
    expect(seen.requests).toBeGreaterThanOrEqual(RUNS);
  }, 600_000);
});
