// npm run bench:search [-- --n 100000 --duration 20 --connections 20 --fresh]
// Generates N synthetic cases into the bench database cw_bench_search, then on the
// same corpus measures (a) a raw minisearch baseline (title, body, tags, codes;
// fuzzy 0.2 + prefix, OR), (b) Causeway's search service in process, and
// (c) GET /api/search over HTTP with autocannon, signed in. Prints one table.
import { createRequire } from 'node:module';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import v8 from 'node:v8';
import vm from 'node:vm';
import { eq } from 'drizzle-orm';
import MiniSearch from 'minisearch';
import mysql from 'mysql2/promise';
import pino from 'pino';
import { applyMigrations, connect } from '../../db/client';
import { startLocalServer } from '../../db/local-server';
import { appMeta, cases, platforms, shops, users } from '../../db/schema';
import { searchQuerySchema } from '../../shared/schemas/search';
import { hashPassword } from '../auth/passwords';
import { loadConfig } from '../config';
import type { AppContext } from '../context';
import { createMailer } from '../mail/mailer';
import { SearchService } from '../search/service';
import { readDemoPlatforms } from '../seed/demo-files';
import { BENCH_QUERIES, generateCase, mulberry32 } from '../search/bench-corpus';
import { benchProductionSettings, startServeProcess } from './serve-process';

// autocannon ships no types: the part used here
interface CannonResult {
  requests: { average: number; total: number };
  errors: number;
  non2xx: number;
}
type Cannon = PromiseLike<CannonResult> & { on(event: 'response', fn: (client: unknown, status: number, bytes: number, ms: number) => void): void };
const autocannon = createRequire(import.meta.url)('autocannon') as (opts: Record<string, unknown>) => Cannon;

const arg = (name: string, fallback: number): number => {
  const i = process.argv.indexOf(`--${name}`);
  const v = i >= 0 ? Number(process.argv[i + 1]) : NaN;
  return Number.isFinite(v) && v > 0 ? v : fallback;
};
const N = arg('n', 100_000);
const DURATION = arg('duration', 20);
const CONNECTIONS = arg('connections', 20);
const ROUNDS = arg('rounds', 10);
const FRESH = process.argv.includes('--fresh');
/** only (c): for working on the HTTP path without the minute-long baseline */
const HTTP_ONLY = process.argv.includes('--http-only');
const DB_NAME = 'cw_bench_search';
const PASSWORD = 'bench-password-not-secret';

v8.setFlagsFromString('--expose-gc');
const gc: () => void = (globalThis as { gc?: () => void }).gc ?? (vm.runInNewContext('gc') as () => void);
const heapMiB = () => {
  gc();
  gc();
  return process.memoryUsage().heapUsed / 1048576;
};

function pct(sorted: number[], p: number): number {
  if (sorted.length === 0) return NaN;
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))]!;
}

const log = (s: string) => process.stderr.write(`${s}\n`);

async function prepareDatabase(config: ReturnType<typeof loadConfig>) {
  await startLocalServer(config);
  const admin = await mysql.createConnection({ ...config.db, database: undefined });
  await admin.query(`CREATE DATABASE IF NOT EXISTS \`${DB_NAME}\``);
  await admin.end();
  const database = connect({ ...config.db, database: DB_NAME });
  await applyMigrations(database.db);
  const [meta] = await database.db.select().from(appMeta).where(eq(appMeta.key, 'bench_n'));
  if (meta?.value === String(N) && !FRESH) {
    log(`bench: reusing ${N} cases in ${DB_NAME}`);
    return database;
  }
  await database.close();
  const again = await mysql.createConnection({ ...config.db, database: undefined });
  await again.query(`DROP DATABASE IF EXISTS \`${DB_NAME}\``);
  await again.query(`CREATE DATABASE \`${DB_NAME}\``);
  await again.end();
  const fresh = connect({ ...config.db, database: DB_NAME });
  await applyMigrations(fresh.db);
  await seedCorpus(fresh.db, config.root);
  return fresh;
}

async function seedCorpus(db: AppContext['db'], root: string) {
  const t0 = performance.now();
  const [shop] = await db.insert(shops).values({ name: 'Bench Motors' }).$returningId();
  const passwordHash = await hashPassword(PASSWORD);
  const authorIds: number[] = [];
  const roles = ['senior', 'technician', 'technician', 'technician', 'apprentice', 'senior', 'technician', 'manager'] as const;
  for (const [i, role] of roles.entries()) {
    const [u] = await db
      .insert(users)
      .values({ shopId: shop!.id, name: `Bench ${role} ${i}`, email: `bench${i}@bench.test`, role, passwordHash, passwordChangedAt: new Date() })
      .$returningId();
    authorIds.push(u!.id);
  }
  const platformIds: number[] = [];
  const demo = readDemoPlatforms(`${root}/content`);
  for (const p of demo) {
    const [row] = await db.insert(platforms).values({ ...p, shopId: shop!.id }).$returningId();
    platformIds.push(row!.id);
  }
  const rand = mulberry32(20261201);
  const BATCH = 1000;
  for (let i = 0; i < N; i += BATCH) {
    const rows = [];
    for (let j = i; j < Math.min(N, i + BATCH); j++) {
      const c = generateCase(rand, demo);
      rows.push({
        shopId: shop!.id,
        title: c.title,
        body: c.body,
        platformId: platformIds[c.platformIndex]!,
        codes: c.codes,
        symptoms: c.symptoms,
        context: c.context,
        rootCause: c.rootCause,
        fix: c.fix,
        status: c.status,
        authorId: authorIds[Math.floor(rand() * authorIds.length)]!,
        confirmedAt: c.confirmed ? c.updatedAt : null,
        createdAt: c.updatedAt,
        updatedAt: c.updatedAt,
      });
    }
    await db.insert(cases).values(rows);
    if ((i / BATCH) % 10 === 0) log(`bench: inserted ${i + rows.length} / ${N}`);
  }
  await db.insert(appMeta).values({ key: 'bench_n', value: String(N) });
  log(`bench: corpus of ${N} cases written in ${((performance.now() - t0) / 1000).toFixed(1)} s`);
}

async function timeQueries(run: (q: string) => Promise<unknown> | unknown): Promise<number[]> {
  for (const q of BENCH_QUERIES.slice(0, 10)) await run(q); // warm-up
  const times: number[] = [];
  for (let r = 0; r < ROUNDS; r++) {
    for (const q of BENCH_QUERIES) {
      const t0 = performance.now();
      await run(q);
      times.push(performance.now() - t0);
    }
  }
  return times.sort((a, b) => a - b);
}

/** Starts server/cli/serve.ts on the bench database and waits until its index is built. */
async function startBenchServer(root: string, dbPassword: string): Promise<{ base: string; stop: () => Promise<void> }> {
  const server = await startServeProcess(root, { ...benchProductionSettings(dbPassword, { demoData: false }), DB_NAME, LOG_LEVEL: 'warn', AUTH_LIMIT_PER_ADDRESS: '100000' });
  const base = server.url;
  try {
    await waitForIndex(base);
  } catch (err) {
    await server.stop();
    throw err;
  }
  return { base, stop: server.stop };
}

/** Ready when its index holds the corpus; a poll that fails (a busy server dropping an idle keep-alive socket) is tried again. */
async function waitForIndex(base: string) {
  const deadline = Date.now() + 180_000;
  for (;;) {
    const health = await fetch(`${base}/api/health`)
      .then((r) => r.json() as Promise<{ index: { state: string; cases: number } }>)
      .catch(() => null);
    if (health?.index.state === 'ready' && health.index.cases >= N) return;
    if (Date.now() > deadline) throw new Error('bench: the server did not finish its index in 3 minutes');
    await new Promise((r) => setTimeout(r, 250));
  }
}

async function signIn(base: string): Promise<string> {
  const csrfRes = await fetch(`${base}/api/auth/csrf`);
  const cookie = (csrfRes.headers.get('set-cookie') ?? '').split(';')[0]!;
  const { token } = (await csrfRes.json()) as { token: string };
  const login = await fetch(`${base}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', cookie, 'x-csrf-token': token },
    body: JSON.stringify({ email: 'bench0@bench.test', password: PASSWORD }),
  });
  if (!login.ok) throw new Error(`bench: sign-in failed (${login.status})`);
  const sessionCookie = (login.headers.get('set-cookie') ?? cookie).split(';')[0]!;
  const check = await fetch(`${base}/api/search?q=P0302`, { headers: { cookie: sessionCookie } });
  if (!check.ok) throw new Error(`bench: signed-in search failed (${check.status})`);
  return sessionCookie;
}

async function measureHttp(root: string, dbPassword: string): Promise<{ result: CannonResult; times: number[] }> {
  const server = await startBenchServer(root, dbPassword);
  try {
    const cookie = await signIn(server.base);
    // warm-up, as for (b): the worker's code is compiled while it serves the first queries
    for (let r = 0; r < 5; r++) {
      for (const q of BENCH_QUERIES) await fetch(`${server.base}/api/search?q=${encodeURIComponent(q)}`, { headers: { cookie } });
    }
    const instance = autocannon({
      url: server.base,
      connections: CONNECTIONS,
      duration: DURATION,
      headers: { cookie },
      requests: BENCH_QUERIES.map((q) => ({ method: 'GET' as const, path: `/api/search?q=${encodeURIComponent(q)}` })),
    });
    const times: number[] = [];
    instance.on('response', (_client: unknown, _status: number, _bytes: number, ms: number) => times.push(ms));
    const result = await instance;
    return { result, times: times.sort((a, b) => a - b) };
  } finally {
    await server.stop();
  }
}

function httpTable(http: { result: CannonResult; times: number[] }): string[] {
  const f = (x: number) => x.toFixed(1);
  return [
    '| (c) HTTP GET /api/search | value | target |',
    '|---|---|---|',
    `| requests per second | ${http.result.requests.average.toFixed(0)} | |`,
    `| latency p50 / p95 / p99 | ${f(pct(http.times, 50))} / ${f(pct(http.times, 95))} / ${f(pct(http.times, 99))} ms | p95 <= 60 ms |`,
    `| errors, non-2xx | ${http.result.errors}, ${http.result.non2xx} | 0, 0 |`,
    '',
    `(c): ${CONNECTIONS} connections, ${DURATION} s, one signed-in session, ${http.result.requests.total} requests; server: its own process, NODE_ENV=production.`,
  ];
}

async function main() {
  const config = loadConfig({ ...process.env, LOG_LEVEL: 'warn', SESSION_SECRET: 'bench-secret-long-enough-for-the-config-check', AUTH_LIMIT_PER_ADDRESS: '100000' });
  const database = await prepareDatabase(config);
  if (HTTP_ONLY) {
    await database.close();
    console.log(httpTable(await measureHttp(config.root, config.db.password)).join('\n'));
    return;
  }
  const db = database.db;
  const ctx: AppContext = { db, config: { ...config, db: { ...config.db, database: DB_NAME } }, mailer: createMailer(config), log: pino({ level: 'warn' }) };
  const [shop] = await db.select().from(shops).limit(1);
  const [senior] = await db.select().from(users).where(eq(users.email, 'bench0@bench.test'));
  const actor = { id: senior!.id, role: senior!.role, shopId: shop!.id };

  // (b) Causeway's index
  const heap0 = heapMiB();
  let service: SearchService | null = new SearchService(ctx, { warm: false });
  const tb = performance.now();
  await service.shop(shop!.id).ready;
  const buildB = (performance.now() - tb) / 1000;
  const heapB = heapMiB() - heap0;
  log(`bench: (b) index built in ${buildB.toFixed(1)} s, ${heapB.toFixed(0)} MiB`);
  const sample = await service.search(actor, searchQuerySchema.parse({ q: BENCH_QUERIES[0] }));
  log(`bench: (b) "${BENCH_QUERIES[0]}" -> ${sample.total} matches, first: ${sample.results[0]?.title} (${sample.results[0]?.why.join('; ')})`);
  const timesB = await timeQueries((q) => service!.search(actor, searchQuerySchema.parse({ q })));
  // (b)'s index goes before (a) and (c): a big live heap in this process would slow autocannon's GC
  service.stop();
  service = null;
  gc();

  // (a) the naive baseline, on the same rows
  const heapA0 = heapMiB();
  const ta = performance.now();
  let baseline: MiniSearch | null = new MiniSearch({ fields: ['title', 'body', 'tags', 'codes'], storeFields: [] });
  let after = 0;
  for (;;) {
    const rows = await db
      .select({ id: cases.id, title: cases.title, body: cases.body, symptoms: cases.symptoms, codes: cases.codes })
      .from(cases)
      .where(eq(cases.shopId, shop!.id))
      .orderBy(cases.id)
      .limit(10_000)
      .offset(after);
    if (rows.length === 0) break;
    baseline.addAll(rows.map((r) => ({ id: r.id, title: r.title, body: r.body, tags: r.symptoms.join(' '), codes: r.codes.join(' ') })));
    after += rows.length;
  }
  const buildA = (performance.now() - ta) / 1000;
  const heapA = heapMiB() - heapA0;
  log(`bench: (a) baseline built in ${buildA.toFixed(1)} s, ${heapA.toFixed(0)} MiB`);
  const timesA = await timeQueries((q) => baseline!.search(q, { fuzzy: 0.2, prefix: true, combineWith: 'OR' }).slice(0, 20));
  baseline = null;
  gc();

  // (c) HTTP, signed in, through the full middleware stack, in a server process of its own
  // (as deployed: the load generator must not share the server's event loop)
  const http = await measureHttp(config.root, config.db.password);

  const a95 = pct(timesA, 95);
  const b95 = pct(timesB, 95);
  const f = (x: number) => x.toFixed(1);
  const lines = [
    `Search benchmark: ${N} cases, ${BENCH_QUERIES.length} queries x ${ROUNDS} rounds, node ${process.version}, ${v8.getHeapStatistics().heap_size_limit / 1048576 | 0} MiB heap limit`,
    '',
    '| measure | (a) raw minisearch baseline | (b) Causeway service | target |',
    '|---|---|---|---|',
    `| index build | ${f(buildA)} s | ${f(buildB)} s | (b) <= 15 s |`,
    `| index heap | ${heapA.toFixed(0)} MiB | ${heapB.toFixed(0)} MiB | (b) <= 300 MiB |`,
    `| query p50 | ${f(pct(timesA, 50))} ms | ${f(pct(timesB, 50))} ms | |`,
    `| query p95 | ${f(a95)} ms | ${f(b95)} ms | (b) <= 50 ms and <= half of (a) |`,
    `| query p99 | ${f(pct(timesA, 99))} ms | ${f(pct(timesB, 99))} ms | |`,
    `| ratio (b)/(a) p95 | | ${(b95 / a95).toFixed(3)} | <= 0.5 |`,
    '',
    ...httpTable(http),
  ];
  console.log(lines.join('\n'));
  await database.close();
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
