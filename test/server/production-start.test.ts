// npm run build + npm run start:prod: the compiled server (plain node, no tsx) refuses demo
// defaults in production, naming each variable; refuses a schema that is behind and demo people
// still on the demo password; and, set up properly, serves the API, the search worker and the web app.
import { randomBytes } from 'node:crypto';
import mysql from 'mysql2/promise';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { connect } from '../../db/client';
import { shops, users } from '../../db/schema';
import { hashPassword } from '../../server/auth/passwords';
import { PRODUCTION_REQUIRED } from '../../server/config';
import { searchResponseSchema } from '../../shared/schemas/search';
import { buildWebIfChanged } from '../../server/cli/web-build';
import { loadDemoData } from '../../server/seed/demo';
import { compileServer, operatorSettings, productionEnv, runCompiled, startCompiledServer } from '../support/compiled-server';
import { testConfig } from '../support/env';
import { TEST_PASSWORD } from '../support/test-app';

const config = testConfig();
const dbName = `cw_test_prod_${randomBytes(4).toString('hex')}`;
let build: Awaited<ReturnType<typeof compileServer>>;
let admin: mysql.Connection;
const operator = { email: 'operator@prod-start.test' };

beforeAll(async () => {
  buildWebIfChanged(config.root); // npm run build's second half; a no-op when dist/ is current
  build = await compileServer();
  admin = await mysql.createConnection({ ...config.db, database: undefined });
  await admin.query(`CREATE DATABASE \`${dbName}\``);
}, 600_000);

afterAll(async () => {
  await admin.query(`DROP DATABASE IF EXISTS \`${dbName}\``);
  await admin.end();
  build.remove();
});

describe('production start', () => {
  it('refuses to start with demo defaults, naming every unset safety variable', async () => {
    const run = await runCompiled(build.dir, 'server/cli/serve.js', [], productionEnv(dbName));
    expect(run.code).toBe(1);
    for (const name of Object.keys(PRODUCTION_REQUIRED)) expect(run.stderr).toContain(`${name} is not set`);
  });

  it('names only the variables still unset, and accepts a value set explicitly even when it equals the default', async () => {
    const run = await runCompiled(build.dir, 'server/cli/serve.js', [], productionEnv(dbName, { DB_PASSWORD: config.db.password, COOKIE_SECURE: 'false' }));
    expect(run.code).toBe(1);
    expect(run.stderr).toContain('DEMO_MODE is not set');
    expect(run.stderr).toContain('SESSION_SECRET is not set');
    expect(run.stderr).not.toContain('DB_PASSWORD');
    expect(run.stderr).not.toContain('COOKIE_SECURE');
  });

  it('does not migrate in production: refuses an empty database until the migrate step has run', async () => {
    const refused = await runCompiled(build.dir, 'server/cli/serve.js', [], productionEnv(dbName, operatorSettings()));
    expect(refused.code).toBe(1);
    expect(refused.stderr).toMatch(/missing \d+ migration\(s\).*db:migrate/);
    const migrated = await runCompiled(build.dir, 'server/cli/db.js', ['migrate'], productionEnv(dbName, operatorSettings()));
    expect(migrated.code, migrated.stderr).toBe(0);
    const database = connect({ ...config.db, database: dbName });
    const [shop] = await database.db.insert(shops).values({ name: 'Operator Garage' }).$returningId();
    await database.db.insert(users).values({ shopId: shop!.id, name: 'Operator', email: operator.email, role: 'manager', passwordHash: await hashPassword(TEST_PASSWORD) });
    await database.close();
  });

  it('serves the API, the compiled search worker and the prebuilt web app', async () => {
    const server = await startCompiledServer(build.dir, productionEnv(dbName, operatorSettings()));
    try {
      const health = await fetch(`${server.url}/api/health`).then((r) => r.json());
      expect(health).toMatchObject({ ok: true, db: 'up' });
      const agent = request.agent(server.url);
      const csrf = (await agent.get('/api/auth/csrf').expect(200)).body.token as string;
      await agent.post('/api/auth/login').set('X-CSRF-Token', csrf).send({ email: operator.email, password: TEST_PASSWORD }).expect(200);
      const found = await agent.get('/api/search').query({ q: 'P0171' }).expect(200); // answered by the compiled worker
      expect(searchResponseSchema.parse(found.body).total).toBe(0);
      const page = await fetch(`${server.url}/cases/123`); // a deep link falls back to the app's page
      expect(page.status).toBe(200);
      const html = await page.text();
      const script = /<script src="(\/_expo\/static\/js\/web\/[^"]+\.js)"/.exec(html)?.[1];
      expect(script, 'the page loads the exported bundle').toBeTruthy();
      const bundle = await fetch(`${server.url}${script}`, { headers: { 'Accept-Encoding': 'br' } });
      expect(bundle.status).toBe(200);
      expect(bundle.headers.get('content-encoding')).toBe('br');
    } finally {
      await server.kill('SIGTERM');
    }
  });

  it('refuses to start while demo people still have the published demo password', async () => {
    const database = connect({ ...config.db, database: dbName });
    await loadDemoData(database.db, config.root);
    await database.close();
    const run = await runCompiled(build.dir, 'server/cli/serve.js', [], productionEnv(dbName, operatorSettings()));
    expect(run.code).toBe(1);
    expect(run.stderr).toMatch(/still have the published demo password: \S+@/);
  });
});

