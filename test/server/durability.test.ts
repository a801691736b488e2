// Durability: 1,000 writes through the API, the server and MariaDB killed with SIGKILL in the
// middle, both restarted; every write the API acknowledged must be there, intact.
// Runs on a MariaDB instance of its own (own data folder and port), with the default
// innodb_flush_log_at_trx_commit=1 that real data uses.
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { applyMigrations, connect } from '../../db/client';
import { ensureAppDatabase, localServerPaths, startLocalServer, stopLocalServer } from '../../db/local-server';
import { shops, users } from '../../db/schema';
import { hashPassword } from '../../server/auth/passwords';
import { compileServer, startCompiledServer } from '../support/compiled-server';
import { testConfig } from '../support/env';
import { freePort, groupAlive } from '../support/processes';

const WRITES = Number(process.env.DURABILITY_WRITES ?? 1000);
const KILL_AFTER = Math.floor(WRITES * 0.4);
const dataDir = mkdtempSync(path.join(os.tmpdir(), 'cw-durable-'));
let env: Record<string, string>;
let config: ReturnType<typeof testConfig>;
let build: Awaited<ReturnType<typeof compileServer>>;
let server: Awaited<ReturnType<typeof startCompiledServer>> | null = null;

/** The compiled server run by node itself: the process that is killed is the one that serves. */
async function startApp() {
  await startLocalServer(config);
  ensureAppDatabase(config);
  server = await startCompiledServer(build.dir, {
    ...process.env,
    ...env,
    PORT: '0', // a free port each start
    LOG_LEVEL: process.env.DURABILITY_LOG ?? 'silent',
    SESSION_SECRET: config.session.secret,
    SMTP_PORT: String(config.mail.port),
    MAIL_WEB_PORT: String(config.mail.webPort),
  });
}

/** SIGKILL to the server's process group and to MariaDB; resolves once the server's group is gone. */
async function killEverything() {
  const dying = server!;
  const gone = dying.kill('SIGKILL'); // the server first, so it dies holding requests, not answering DB errors
  process.kill(Number(readFileSync(localServerPaths(config).pidFile, 'utf8')), 'SIGKILL');
  await gone;
  return dying;
}

async function signIn() {
  const agent = request.agent(server!.url);
  const csrf = (await agent.get('/api/auth/csrf')).body.token as string;
  await agent.post('/api/auth/login').set('X-CSRF-Token', csrf).send({ email: 'writer@durable.test', password: 'durable password' }).expect(200);
  return { agent, csrf };
}

beforeAll(async () => {
  env = { DATA_DIR: dataDir, DB_PORT: String(await freePort()), DB_NAME: 'causeway' };
  config = testConfig(env);
  build = await compileServer();
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
  await server?.kill('SIGKILL');
  await stopLocalServer(config);
  build.remove();
  rmSync(dataDir, { recursive: true, force: true });
});

describe('durability under SIGKILL', () => {
  it(`keeps every acknowledged write of ${WRITES} across a kill of server and database`, async () => {
    const acknowledged = new Map<number, string>();
    let session = await signIn();
    let attempted = 0;
    let killed = false;
    let inFlight = 0;
    const atKill: { inFlight: number; server?: Awaited<ReturnType<typeof killEverything>> } = { inFlight: 0 };
    const writeOne = async () => {
      const n = attempted++;
      const title = `Durable write ${n}`;
      inFlight++;
      try {
        const res = await session.agent.post('/api/cases').set('X-CSRF-Token', session.csrf).send({ title, body: `body of write ${n}: \`${n} psi\``, codes: ['P0299'], symptoms: ['low-power'], status: 'published' });
        if (res.status === 201) acknowledged.set(res.body.id, title);
      } catch {
        // connection cut by the kill: not acknowledged, so not expected to be there
      } finally {
        inFlight--;
      }
    };
    let restarting: Promise<void> | null = null;
    const worker = async () => {
      while (attempted < WRITES) {
        if (!killed && acknowledged.size >= KILL_AFTER) {
          killed = true;
          atKill.inFlight = inFlight;
          // the other workers wait for the restart instead of hammering a dead port
          restarting = (async () => {
            atKill.server = await killEverything();
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
    const dead = atKill.server!;
    expect(groupAlive(dead.child.pid!), 'no process of the killed server survives').toBe(false);
    await expect(fetch(`${dead.url}/api/health`), 'nothing answers on the killed server\'s port').rejects.toThrow();
    // Restart once more so nothing is answered from a process that saw the writes.
    await server!.kill('SIGKILL');
    await startApp();
    const check = await signIn();
    const missing: number[] = [];
    for (const [id, title] of acknowledged) {
      const res = await check.agent.get(`/api/cases/${id}`);
      if (res.status !== 200 || res.body.case.title !== title || !res.body.case.body.startsWith('body of write')) missing.push(id);
    }
    console.log(`durability: ${attempted} writes attempted, ${atKill.inFlight} in flight when the server (pid ${dead.child.pid}) and MariaDB were killed, ${acknowledged.size} acknowledged, ${missing.length} acknowledged writes lost`);
    expect(missing).toEqual([]);
    expect(atKill.inFlight, 'the server was killed mid-write').toBeGreaterThan(0);
    expect(acknowledged.size).toBeGreaterThan(WRITES * 0.9);
  }, 300_000);
});
