// npm run bench:load [-- --seconds 60 --connections 50]
// 60 s of mixed traffic on loopback against a real server process over the demo data:
// sign-in, search, read case, save draft, mark walk steps. Prints errors, latency and throughput.
import path from 'node:path';
import autocannon from 'autocannon';
import mysql from 'mysql2/promise';
import { applyMigrations, connect } from '../../db/client';
import { ensureAppDatabase, startLocalServer } from '../../db/local-server';
import { loadConfig } from '../config';
import { DEMO_PASSWORD, readDemoShop } from '../seed/demo-files';
import { seedDemoShop } from '../seed/seed';
import { benchProductionSettings, startServeProcess } from './serve-process';

const arg = (name: string, fallback: number) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? Number(process.argv[i + 1]) : fallback;
};
const SECONDS = arg('seconds', 60);
const CONNECTIONS = arg('connections', 50);
const DB_NAME = 'cw_bench_load';

const base = loadConfig();
const root = base.root;
const config = { ...base, db: { ...base.db, database: DB_NAME } };
await startLocalServer(base);
ensureAppDatabase(base);
const admin = await mysql.createConnection({ ...base.db, database: undefined });
await admin.query(`DROP DATABASE IF EXISTS \`${DB_NAME}\``);
await admin.query(`CREATE DATABASE \`${DB_NAME}\``);
await admin.end();
const database = connect(config.db);
await applyMigrations(database.db);
await seedDemoShop(database.db, root);
await database.close();

// production settings over the demo data (so demo mode stays on explicitly), stopped on every exit path
const server = await startServeProcess(root, { ...benchProductionSettings(config.db.password, { demoData: true }), DB_NAME, LOG_LEVEL: 'warn', AUTH_LIMIT_PER_ADDRESS: '1000000' });
const url = server.url;

// Each demo user gets a walk to mark and a list of cases to read.
const people = readDemoShop(path.join(root, 'content')).users;
const cookieOf = (h: Headers) => h.getSetCookie().map((c) => c.split(';')[0]).join('; ');
async function session(email: string) {
  const c = await fetch(`${url}/api/auth/csrf`);
  const token = ((await c.json()) as { token: string }).token;
  const res = await fetch(`${url}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json', cookie: cookieOf(c.headers), 'x-csrf-token': token }, body: JSON.stringify({ email, password: DEMO_PASSWORD }) });
  return { cookie: cookieOf(res.headers), token };
}
const first = await session(people[0]!.email);
const caseIds = ((await (await fetch(`${url}/api/cases?pageSize=50&status=published`, { headers: { cookie: first.cookie } })).json()) as { cases: { id: number }[] }).cases.map((c) => c.id);
const walks = new Map<string, { id: number; stepId: string }>();
for (const p of people) {
  const s = await session(p.email);
  const res = await fetch(`${url}/api/walks`, { method: 'POST', headers: { 'content-type': 'application/json', cookie: s.cookie, 'x-csrf-token': s.token }, body: JSON.stringify({ codes: ['P0302', 'P0305'], symptoms: ['rough-idle'], context: ['after-timing-work'] }) });
  const walk = (await res.json()) as { id: number; steps: { id: string }[] };
  walks.set(p.email, { id: walk.id, stepId: walk.steps.at(-1)!.id });
}

const queries = ['misfire cyl 2 and 5 after timing work', 'P0171 lean bank 1', 'boost leak whistle', 'U0100 no comms', 'abs light wheel speed', 'clutch pedal sinks', 'p0299 vt27', 'rough idel'];
type Ctx = { cookie?: string; token?: string; n?: number; email?: string };
let connection = 0;
/** The session cookie from a response; autocannon keeps raw header names, so match case-insensitively. */
function setCookie(headers: Record<string, string | string[] | undefined> | undefined): string {
  if (!headers) return '';
  const key = Object.keys(headers).find((k) => k.toLowerCase() === 'set-cookie');
  const value = key ? headers[key] : undefined;
  return value ? String(Array.isArray(value) ? value[0] : value).split(';')[0]! : '';
}
const jsonHeaders = (ctx: Ctx) => ({ 'content-type': 'application/json', cookie: ctx.cookie ?? '', 'x-csrf-token': ctx.token ?? '' });

const cycle: autocannon.Request[] = [
  { method: 'GET', path: '/api/auth/csrf', setupRequest: (req) => ({ ...req, headers: {} }), onResponse: (_s, body, ctx: Ctx, headers) => {
      ctx.token = JSON.parse(body).token;
      ctx.cookie = setCookie(headers);
    } },
  { method: 'POST', path: '/api/auth/login', setupRequest: (req, ctx: Ctx) => {
      ctx.email ??= people[connection++ % people.length]!.email;
      return { ...req, headers: jsonHeaders(ctx), body: JSON.stringify({ email: ctx.email, password: DEMO_PASSWORD }) };
    }, onResponse: (_s, _b, ctx: Ctx, headers) => {
      ctx.cookie = setCookie(headers) || ctx.cookie;
    } },
];
for (let i = 0; i < 8; i++) {
  cycle.push(
    { method: 'GET', setupRequest: (req, ctx: Ctx) => ({ ...req, path: `/api/search?q=${encodeURIComponent(queries[(ctx.n = (ctx.n ?? 0) + 1) % queries.length]!)}`, headers: jsonHeaders(ctx) }) },
    { method: 'GET', setupRequest: (req, ctx: Ctx) => ({ ...req, path: `/api/cases/${caseIds[(ctx.n ?? 0) % caseIds.length]}`, headers: jsonHeaders(ctx) }) },
    { method: 'POST', path: '/api/cases', setupRequest: (req, ctx: Ctx) => ({ ...req, headers: jsonHeaders(ctx), body: JSON.stringify({ title: `Load draft ${ctx.n}`, body: 'Drafted under load: `14.4 V` at idle.', codes: ['P0562'], symptoms: ['battery-light'] }) }) },
    { method: 'PATCH', setupRequest: (req, ctx: Ctx) => {
        const walk = walks.get(ctx.email!)!;
        const state = (ctx.n ?? 0) % 2 ? { state: 'ruled_out', note: 'checked under load' } : { state: 'open' };
        return { ...req, path: `/api/walks/${walk.id}/steps/${walk.stepId}`, headers: jsonHeaders(ctx), body: JSON.stringify(state) };
      } },
  );
}

// Count answers per kind of request, so a failing part of the mix is named in the report.
const statusByKind = new Map<string, Map<number, number>>();
for (const [i, req] of cycle.entries()) {
  const kind = i === 0 ? 'csrf' : i === 1 ? 'sign-in' : ['search', 'read case', 'save draft', 'mark step'][(i - 2) % 4]!;
  type OnResponse = (status: number, body: string, context: object, headers: Parameters<typeof setCookie>[0]) => void;
  const inner = req.onResponse as OnResponse | undefined;
  req.onResponse = (status, body, ctx, headers) => {
    const counts = statusByKind.get(kind) ?? new Map<number, number>();
    counts.set(status, (counts.get(status) ?? 0) + 1);
    statusByKind.set(kind, counts);
    if (status >= 400 && (counts.get(status) ?? 0) <= 2 && process.env.BENCH_DEBUG) console.error(kind, status, body.slice(0, 200));
    inner?.(status, body, ctx, headers);
  };
}

console.log(`Mixed load: ${CONNECTIONS} connections for ${SECONDS} s against ${url} (${caseIds.length} cases to read)`);
const latencies: number[] = [];
const result = await new Promise<autocannon.Result>((resolve, reject) => {
  const instance = autocannon({ url, connections: CONNECTIONS, duration: SECONDS, requests: cycle }, (err, r) => (err ? reject(err) : resolve(r)));
  instance.on('response', (_client: unknown, _status: number, _bytes: number, ms: number) => latencies.push(ms));
});
await server.stop();
latencies.sort((a, b) => a - b);
const pct = (p: number) => latencies[Math.min(latencies.length - 1, Math.floor((p / 100) * latencies.length))]?.toFixed(1) ?? '-';

const errors = result.errors + result.timeouts + result.non2xx;
const rows = [
  ['requests', String(result.requests.total)],
  ['throughput (req/s, mean)', result.requests.average.toFixed(0)],
  ['latency p50 (ms)', pct(50)],
  ['latency p95 (ms)', pct(95)],
  ['latency p99 (ms)', pct(99)],
  ['errors (connection + timeouts + non-2xx)', `${errors} (${result.errors} + ${result.timeouts} + ${result.non2xx})`],
];
console.log('\n| request | answers |\n|---|---|');
for (const [kind, counts] of statusByKind) console.log(`| ${kind} | ${[...counts].map(([s, n]) => `${n} x ${s}`).join(', ')} |`);
console.log('\n| measure | value |\n|---|---|');
for (const [k, v] of rows) console.log(`| ${k} | ${v} |`);
process.exit(errors === 0 ? 0 : 1);
