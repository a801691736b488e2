// Durability: 1,000 writes through the API, the server and MariaDB killed with SIGKILL in the
// middle, both restarted; every write the API acknowledged must be there, intact.
// Runs on a MariaDB instance of its own (own data folder and port), with the default
// innodb_flush_log_at_trx_commit=1 that real data uses.
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { applyMigrations, connect } from '../../db/client';
import { ensureAppDatabase, localServerPaths, startLocalServer, stopLocalServer } from '../../db/local-server';
import { shops, users } from '../../db/schema';
import { hashPassword } from '../../server/auth/passwords';
import { TEST_PORT_OFFSET, testConfig } from '../support/env';

const WRITES = Number(process.env.DURABILITY_WRITES ?? 1000);
const KILL_AFTER = Math.floor(WRITES * 0.4);
const PORT = 8097 + TEST_PORT_OFFSET;
const env = { DATA_DIR: mkdtempSync(path.join(os.tmpdir(), 'cw-durable-')), DB_PORT: String(3392 + TEST_PORT_OFFSET), DB_NAME: 'causeway', PORT: String(PORT) };
const config = testConfig(env);
const root = path.resolve(import.meta.dirname, '../..');
let server: ChildProcess | null = null;

async function startApp() {
  await startLocalServer(config);
  ensureAppDatabase(config);
  server = spawn(path.join(root, 'node_modules/.bin/tsx'), ['server/cli/serve.ts'], {
    cwd: root,
    env: { ...process.env, ...env, LOG_LEVEL: process.env.DURABILITY_LOG ?? 'silent', SESSION_SECRET: config.session.secret, SMTP_PORT: String(config.mail.port), MAIL_WEB_PORT: String(config.mail.webPort) },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  await new Promise<void>((resolve, reject) => {
    server!.stdout!.on('data', (d: Buffer) => {
      if (process.env.DURABILITY_LOG) process.stdout.write(d);
      if (d.toString().includes('listening')) resolve();
    });
    server!.on('exit', (code) => reject(new Error(`server exited ${code}`)));
  });
}

function killEverything() {
  server?.kill('SIGKILL');
  const pid = Number(readFileSync(localServerPaths(config).pidFile, 'utf8'));
  process.kill(pid, 'SIGKILL');
}

async function signIn() {
  const agent = request.agent(`http://127.0.0.1:${PORT}`);
  const csrf = (await agent.get('/api/auth/csrf')).body.token as string;
  await agent.post('/api/auth/login').set('X-CSRF-Token', csrf).send({ email: 'writer@durable.test', password: 'durable password' }).expect(200);
  return { agent, csrf };
}

beforeAll(async () => {
  await startLocalServer(config);
  ensureAppDatabase(config);
  const database = connect(config.db);
  await applyMigrations(database.db);
  const [shop] = await database.db.insert(shops).values({ name: 'Durable Garage' }).$returningId();
  await database.db.insert(users).values({ shopId: shop!.id, name: 'Writer', email: 'writer@durable.test', role: 'senior', passwordHash: await hashPassword('durable password') });
  await database.close();
  await startApp();
}, 120_000);

afterAll(async () => {
  server?.kill('SIGKILL');
  await stopLocalServer(config);
});

describe('durability under SIGKILL', () => {
  it(`keeps every acknowledged write of ${WRITES} across a kill of server and database`, async () => {
    const acknowledged = new Map<number, string>();
    let session = await signIn();
    let attempted = 0;
    let killed = false;
    const writeOne = async () => {
      const n = attempted++;
      const title = `Durable write ${n}`;
      try {
        const res = await session.agent.post('/api/cases').set('X-CSRF-Token', session.csrf).send({ title, body: `body of write ${n}: \`${n} psi\``, codes: ['P0299'], symptoms: ['low-power'], status: 'published' });
        if (res.status === 201) acknowledged.set(res.body.id, title);
      } catch {
        // connection cut by the kill: not acknowledged, so not expected to be there
      }
    };
    let restarting: Promise<void> | null = null;
    const worker = async () => {
      while (attempted < WRITES) {
        if (!killed && acknowledged.size >= KILL_AFTER) {
          killed = true;
          killEverything();
          // the other workers wait for the restart instead of hammering a dead port
          restarting = (async () => {
            await new Promise((r) => setTimeout(r, 200));
            await startApp();
            session = await signIn();
          })();
        }
        if (restarting) await restarting;
        await writeOne();
      }
    };
    await Promise.all(Array.from({ length: 8 }, worker));
    expect(killed).toBe(true);
    // Restart once more so nothing is answered from a process that saw the writes.
    server?.kill('SIGKILL');
    await startApp();
    const check = await signIn();
    const missing: number[] = [];
    for (const [id, title] of acknowledged) {
      const res = await check.agent.get(`/api/cases/${id}`);
      if (res.status !== 200 || res.body.case.title !== title || !res.body.case.body.startsWith('body of write')) missing.push(id);
    }
    console.log(`durability: ${attempted} writes attempted, ${acknowledged.size} acknowledged, ${missing.length} acknowledged writes lost`);
    expect(missing).toEqual([]);
    expect(acknowledged.size).toBeGreaterThan(WRITES * 0.9);
  }, 300_000);
});
