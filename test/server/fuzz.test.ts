// Robustness: thousands of malformed requests across every route (wrong types, missing fields,
// huge strings, unicode edge cases, bad JSON, wrong content types, bad ids), against a shop that
// holds platforms, cases and walks, so real ids reach the services. On top of random bodies, valid
// bodies are mutated: a lone UTF-16 surrogate in every string field, nested Markdown and bracket
// storms in every string field, long lists in every list field (issue 15). None may answer 5xx,
// every error must be JSON with a message, and /api/health must keep answering.
// A fresh seed each run, printed; FUZZ_SEED=<seed> replays a run, FUZZ_RUNS sets its length.
import fc from 'fast-check';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { platforms } from '../../db/schema';
import { agentFor, createTestApp, seedShop, signedIn, type TestApp } from '../support/test-app';
import { listApiRoutes, type RouteInfo } from '../support/routes';

const RUNS = Number(process.env.FUZZ_RUNS ?? 5000);
const SEED = process.env.FUZZ_SEED ? Number(process.env.FUZZ_SEED) : Math.floor(Math.random() * 2 ** 31);
const HEALTH_EVERY = 250;

let t: TestApp;
let routes: RouteInfo[];
let callers: Awaited<ReturnType<typeof agentFor>>[];
const stock = { ids: [] as string[], stepIds: [] as string[], platformId: 0 };
const seen = { requests: 0, byStatus: new Map<number, number>(), templated: new Map<string, number>() };
const tally = (map: Map<string | number, number>) => [...map.entries()].sort().map(([s, n]) => `${s}x${n}`).join(' ');

/** Platforms, cases (draft and published) and walks (open and finished) in the fuzzed shop. */
async function stockShop(shopId: number, manager: (typeof callers)[number], apprentice: (typeof callers)[number]) {
  const [p] = await t.ctx.db
    .insert(platforms)
    .values({ shopId, key: 'fuzz-i4', make: 'Fuzzmark', model: 'Quill', engine: 'FZ16', yearFrom: 2018, yearTo: 2024, cylinders: 4, layout: 'inline', firingOrder: [1, 3, 4, 2], fuel: 'petrol', induction: 'turbo' })
    .$returningId();
  stock.platformId = p!.id;
  const ids = new Set<number>([p!.id]);
  for (const [who, status] of [[manager, 'published'], [apprentice, 'draft'], [manager, 'draft']] as const) {
    const res = await who.agent.post('/api/cases').set('X-CSRF-Token', who.csrf).send({ title: `Fuzz ${status} case`, body: '## Found\n- P0301 coil\n> check [wiring](https://example.test)', platformId: p!.id, codes: ['P0301'], symptoms: ['misfire'], status });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    ids.add(res.body.id);
  }
  for (const who of [manager, apprentice, manager]) {
    const res = await who.agent.post('/api/walks').set('X-CSRF-Token', who.csrf).send({ platformId: p!.id, codes: ['P0301'], symptoms: ['misfire'] });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    ids.add(res.body.id);
    stock.stepIds.push(...res.body.steps.map((s: { id: string }) => s.id));
  }
  const finished = await manager.agent.patch(`/api/walks/${[...ids].at(-1)}/steps/${stock.stepIds[0]}`).set('X-CSRF-Token', manager.csrf).send({ state: 'tested', outcome: 'fault_found' });
  expect(finished.status).toBe(200);
  stock.ids = [...ids].map(String);
  stock.stepIds = [...new Set(stock.stepIds)];
}

beforeAll(async () => {
  console.log(`fuzz: seed ${SEED}, ${RUNS} runs (replay with FUZZ_SEED=${SEED})`);
  t = await createTestApp();
  routes = listApiRoutes(t.ctx).filter((r) => r.path !== '/api/auth/logout');
  const shop = await seedShop(t.ctx, 'Fuzz Garage');
  callers = [await signedIn(t.app, shop.people.manager.email), await signedIn(t.app, shop.people.apprentice.email), await agentFor(t.app)];
  await stockShop(shop.shopId, callers[0]!, callers[1]!);
}, 120_000);
afterAll(async () => {
  console.log(`fuzz: seed ${SEED}: ${seen.requests} requests; statuses ${tally(seen.byStatus)}; mutated valid bodies ${tally(seen.templated)}`);
  await t.close();
});

const LONE = ['\ud800', '\udbff', '\udc00', '\udfff', '\ud83d'];
const markdownStorms = ['- '.repeat(4_000), '1. '.repeat(3_000), '>'.repeat(4_000), '> - 1. '.repeat(1_000), '[a]('.repeat(10_000), '!['.repeat(5_000), '*a'.repeat(5_000), '`'.repeat(3_000), '- '.repeat(25) + 'deep\n'.repeat(2_000)];
const longLists = [Array.from({ length: 17 }, (_, i) => i + 1), Array.from({ length: 2_000 }, (_, i) => i + 1), Array.from({ length: 20_000 }, () => 'P0301'), Array.from({ length: 5_000 }, () => 'misfire')];
const badEncodings = ['%', '%zz', '%E0%A4%A', '%ED%A0%80', '%C0%AF', '%25%', '%%', '%FF', '%uD800', '1%'];

const weirdStrings = fc.oneof(
  fc.string({ unit: 'binary', maxLength: 40 }),
  fc.string({ unit: 'grapheme', maxLength: 40 }),
  fc.tuple(fc.string({ maxLength: 20 }), fc.constantFrom(...LONE), fc.string({ maxLength: 20 })).map(([a, s, b]) => a + s + b),
  fc.constantFrom(...markdownStorms),
  fc.constantFrom('', ' ', '\u0000', '\uFEFF', '\u202E', '😀'.repeat(30), 'a'.repeat(70_000), "'; DROP TABLE cases;--", '<script>alert(1)</script>', '../../etc/passwd', 'P0302', 'p0302-13', '1M8GDM9AXKP042788', 'NaN', 'Infinity', '-0', '1e309'),
);
const jsonValue = fc.oneof(
  fc.jsonValue({ maxDepth: 3 }),
  weirdStrings,
  fc.constantFrom(...longLists),
  fc.dictionary(fc.constantFrom('title', 'body', 'codes', 'symptoms', 'context', 'version', 'email', 'password', 'role', 'status', 'platformId', 'vehicle', 'comment', 'note', 'state', 'outcome', 'measurement', 'text', 'name', 'disabled', 'token', 'q', 'query', 'make', 'engine', 'firingOrder', 'banks', '__proto__', 'constructor'), fc.oneof(fc.jsonValue({ maxDepth: 2 }), weirdStrings, fc.constantFrom(...longLists))),
);

/** Valid bodies for the routes that write, so mutations get past the first field check. */
const templates = (): Record<string, unknown> => ({
  'post /api/cases': { title: 'Fuzz coil case', body: 'Coil 1 swapped, P0301 gone', platformId: stock.platformId, codes: ['P0301'], symptoms: ['misfire'], context: ['cold-start'], rootCause: 'Coil', fix: 'New coil', vehicle: { plate: 'FZ 12', mileage: 1200, mileageUnit: 'km', visitDate: '2026-01-02' } },
  'patch /api/cases/:id': { title: 'Fuzz coil case again', body: 'Edited note', codes: ['P0301'], version: 1 },
  'post /api/cases/preview': { body: 'P0301 and 13.2 V', codes: ['P0301'] },
  'post /api/cases/:id/comments': { body: 'Checked the coil' },
  'post /api/cases/:id/return': { comment: 'Add the readings' },
  'post /api/cases/:id/confirm': { note: 'Fixed for good' },
  'post /api/walks': { platformId: stock.platformId, codes: ['P0301'], symptoms: ['misfire'], context: ['cold-start'], query: 'misfire on cylinder 1 at idle' },
  'patch /api/walks/:id/steps/:stepId': { state: 'ruled_out', note: 'Swapped, stayed' },
  'post /api/platforms': { make: 'Fuzzmark', model: 'Quill', engine: 'FZ20', yearFrom: 2019, yearTo: 2025, cylinders: 4, layout: 'inline', firingOrder: [1, 3, 4, 2], fuel: 'petrol', induction: 'turbo' },
  'patch /api/platforms/:id': { engine: 'FZ16B', firingOrder: [1, 3, 4, 2] },
  'post /api/users': { name: 'Fuzz Invitee', email: 'invitee@fuzz.test', role: 'apprentice' },
  'post /api/auth/reset-request': { email: 'nobody@fuzz.test' },
});

type Mode = 'surrogates' | 'markdown' | 'long-lists' | 'one-weird';

/** How many leaves of the template the mode can change: strings, or lists for long-lists, or fields for one-weird. */
function targets(value: unknown, mode: Mode): number {
  if (typeof value === 'string') return mode === 'surrogates' || mode === 'markdown' ? 1 : 0;
  if (Array.isArray(value)) return (mode === 'long-lists' ? 1 : 0) + value.reduce((n: number, v) => n + targets(v, mode), 0);
  if (value && typeof value === 'object') return Object.values(value).reduce((n: number, v) => n + (mode === 'one-weird' ? 1 : 0) + targets(v, mode), 0);
  return 0;
}

/**
 * The template with one target changed as the mode says (`pick` chooses which, so across runs every
 * string, list or field gets its turn): a lone surrogate inserted, a Markdown storm, a long list, any value.
 */
function mutate(template: unknown, mode: Mode, pick: number, weird: unknown): unknown {
  let left = pick % Math.max(1, targets(template, mode));
  const hit = () => left-- === 0;
  const walk = (value: unknown): unknown => {
    if (typeof value === 'string' && (mode === 'surrogates' || mode === 'markdown') && hit()) {
      if (mode === 'markdown') return markdownStorms[pick % markdownStorms.length];
      const at = pick % (value.length + 1);
      return value.slice(0, at) + LONE[pick % LONE.length] + value.slice(at);
    }
    if (Array.isArray(value)) return mode === 'long-lists' && hit() ? longLists[pick % longLists.length] : value.map(walk);
    if (value && typeof value === 'object') return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, mode === 'one-weird' && hit() ? weird : walk(v)]));
    return value;
  };
  return walk(template);
}

const badId = fc.oneof(
  fc.constantFrom('0', '-1', 'abc', '1.5', '1e400', '99999999999999999999', '%00', "1'--", 'NaN', '%EF%BC%91', '%F0%9F%98%80', 'x'.repeat(300), '%2e%2e'),
  fc.constantFrom(...badEncodings),
  fc.constant('real'), // replaced by one of the shop's ids
);
const queryString = fc.array(fc.tuple(fc.constantFrom('q', 'page', 'pageSize', 'status', 'code', 'tag', 'platformId', 'from', 'to', 'limit', 'pairs', 'sort', 'mine', 'page[]', 'page[a]', 'table'), fc.oneof(weirdStrings.map((s) => s.slice(0, 300)), fc.integer().map(String))), { maxLength: 4 });
const bodyKind = fc.constantFrom('json', 'template', 'template', 'raw-bad-json', 'raw-bad-utf8', 'text', 'form', 'multipart', 'none');
const mode = fc.constantFrom<Mode>('surrogates', 'markdown', 'long-lists', 'one-weird');

const asText = (b: unknown) => (typeof b === 'string' ? b : (JSON.stringify(b) ?? ''));

interface Draw {
  id: string;
  pick: number;
  query: [string, string][];
  rawQuery: string | null;
  kind: string;
  mode: Mode;
  body: unknown;
}

const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g;
/** encodeURIComponent, with a lone surrogate sent the way a broken client would: as its 3 bytes (ED A0 80, not UTF-8). */
const encodeLoosely = (s: string) => encodeURIComponent(s.replace(LONE_SURROGATE, '\uE000')).replaceAll('%EE%80%80', '%ED%A0%80');

function urlFor(route: RouteInfo, d: Draw) {
  const id = d.id === 'real' ? stock.ids[d.pick % stock.ids.length]! : d.id;
  const path = route.path.replace(/:([A-Za-z]+)/g, (_, name: string) => (name === 'stepId' && d.id === 'real' ? stock.stepIds[d.pick % stock.stepIds.length]! : id));
  const qs = d.rawQuery ?? d.query.map(([k, v]) => `${encodeLoosely(k)}=${encodeLoosely(v)}`).join('&');
  return path + (qs ? `?${qs}` : '');
}

async function send(route: RouteInfo, caller: (typeof callers)[number], d: Draw) {
  let req = caller.agent[route.method](urlFor(route, d)).set('X-CSRF-Token', caller.csrf);
  if (route.method === 'get' || route.method === 'delete' || d.kind === 'none') return req;
  const template = templates()[`${route.method} ${route.path}`];
  if (d.kind === 'template' && template) return req.set('Content-Type', 'application/json').send(JSON.stringify(mutate(template, d.mode, d.pick, d.body)));
  if (d.kind === 'json' || d.kind === 'template') return req.set('Content-Type', 'application/json').send(JSON.stringify(d.body) ?? 'null');
  if (d.kind === 'raw-bad-json') return req.set('Content-Type', 'application/json').send('{"title": "x", ' + asText(d.body).slice(0, 100));
  if (d.kind === 'raw-bad-utf8') return req.set('Content-Type', 'application/json').send(Buffer.concat([Buffer.from('{"title": "'), Buffer.from([0xff, 0xfe, 0xed, 0xa0, 0x80, 0xc0]), Buffer.from('", "body": "x"}')]));
  if (d.kind === 'text') return req.set('Content-Type', 'text/plain').send(asText(d.body).slice(0, 5000));
  if (d.kind === 'form') return req.type('form').send({ a: asText(d.body).slice(0, 200) });
  return req.set('Content-Type', 'multipart/form-data; boundary=xyz').send(`--xyz\r\nContent-Disposition: form-data; name="file"; filename="${asText(d.body).slice(0, 50)}"\r\n\r\n${asText(d.body).slice(0, 500)}\r\n--xyz`);
}

async function expectResponsive(after: string) {
  const health = await request(t.app).get('/api/health').timeout(10_000);
  expect(health.status, `health after ${after}`).toBe(200);
}

const draw = fc.record({
  id: badId,
  pick: fc.nat(),
  query: queryString,
  rawQuery: fc.option(fc.constantFrom(...badEncodings.map((e) => `q=${e}`), `page=${badEncodings[2]}&q=%ED%A0%80`), { freq: 4 }),
  kind: bodyKind,
  mode,
  body: jsonValue,
});

describe('fuzzing every route', () => {
  it(`answers ${RUNS} malformed requests without a 5xx, always with a JSON error message, and stays responsive`, async () => {
    await fc.assert(
      fc.asyncProperty(fc.nat(), fc.nat(), fc.boolean(), draw, async (r, c, aimAtTemplate, d) => {
        // half the runs mutate a valid body, so the mutation reaches the services and MariaDB
        const templated = routes.filter((x) => `${x.method} ${x.path}` in templates());
        const route = aimAtTemplate ? templated[r % templated.length]! : routes[r % routes.length]!;
        if (aimAtTemplate) d = { ...d, kind: 'template', rawQuery: null };
        const caller = callers[c % callers.length]!;
        const res = await send(route, caller, d);
        seen.requests++;
        seen.byStatus.set(res.status, (seen.byStatus.get(res.status) ?? 0) + 1);
        if (aimAtTemplate) seen.templated.set(`${d.mode}:${res.status}`, (seen.templated.get(`${d.mode}:${res.status}`) ?? 0) + 1);
        const where = `${route.method.toUpperCase()} ${urlFor(route, d).slice(0, 80)} kind=${d.kind} mode=${d.mode} -> ${res.status} (FUZZ_SEED=${SEED})`;
        expect(res.status, where).toBeLessThan(500);
        if (res.status >= 400 && res.status !== 404) {
          expect(res.headers['content-type'], where).toMatch(/application\/json/);
          expect(typeof res.body?.error?.message, where).toBe('string');
        }
        if (seen.requests % HEALTH_EVERY === 0) await expectResponsive(where);
      }),
      { numRuns: RUNS, seed: SEED, endOnFailure: true },
    );
    expect(seen.requests).toBeGreaterThanOrEqual(RUNS);
    await expectResponsive('the last request');
  }, 900_000);
});
