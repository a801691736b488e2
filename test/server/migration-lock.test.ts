// Migrations under a MariaDB named lock: two instances started at the same moment on an empty
// database both come up on one schema, each migration applied once; a migrator waits while
// another holds the lock.
import { randomBytes } from 'node:crypto';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import mysql from 'mysql2/promise';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { applyMigrations, connect, MIGRATION_LOCK_NAME_SQL } from '../../db/client';
import { compileServer, operatorSettings, productionEnv, startCompiledServer } from '../support/compiled-server';
import { testConfig } from '../support/env';

const config = testConfig();
const journal = JSON.parse(readFileSync(path.join(config.root, 'db/migrations/meta/_journal.json'), 'utf8')) as { entries: unknown[] };
let admin: mysql.Connection;
let build: Awaited<ReturnType<typeof compileServer>>;
const created: string[] = [];

async function emptyDatabase(): Promise<string> {
  const name = `cw_test_lock_${randomBytes(4).toString('hex')}`;
  await admin.query(`CREATE DATABASE \`${name}\``);
  created.push(name);
  return name;
}

async function appliedHashes(database: string): Promise<string[]> {
  const [rows] = await admin.query<mysql.RowDataPacket[]>(`SELECT hash FROM \`${database}\`.__drizzle_migrations`);
  return rows.map((r) => String(r.hash));
}

beforeAll(async () => {
  admin = await mysql.createConnection({ ...config.db, database: undefined });
  build = await compileServer();
}, 120_000);

afterAll(async () => {
  for (const name of created) await admin.query(`DROP DATABASE IF EXISTS \`${name}\``);
  await admin.end();
  build.remove();
});

describe('migrations under a named lock', () => {
  it('brings two instances started at the same moment on an empty database up on one schema', async () => {
    const database = await emptyDatabase();
    const env = productionEnv(database, { ...operatorSettings(), MIGRATE_ON_START: 'true' });
    const servers = await Promise.all([startCompiledServer(build.dir, env), startCompiledServer(build.dir, env)]);
    try {
      for (const server of servers) expect((await fetch(`${server.url}/api/health`)).status).toBe(200);
      const hashes = await appliedHashes(database);
      expect(hashes).toHaveLength(journal.entries.length);
      expect(new Set(hashes).size).toBe(hashes.length);
    } finally {
      await Promise.all(servers.map((s) => s.kill('SIGTERM')));
    }
  });

  it('makes a second migrator wait while the lock is held, then finds nothing left to do', async () => {
    const database = await emptyDatabase();
    const holder = await mysql.createConnection({ ...config.db, database });
    const [got] = await holder.query<mysql.RowDataPacket[]>(`SELECT GET_LOCK(${MIGRATION_LOCK_NAME_SQL}, 5) AS got`);
    expect(Number(got[0]!.got)).toBe(1);
    const first = connect({ ...config.db, database });
    const second = connect({ ...config.db, database });
    try {
      let firstDone = false;
      const firstRun = applyMigrations(first.db).then(() => (firstDone = true));
      await new Promise((r) => setTimeout(r, 700));
      expect(firstDone, 'no migration runs while another process holds the lock').toBe(false);
      const [tables] = await admin.query<mysql.RowDataPacket[]>('SELECT COUNT(*) AS n FROM information_schema.tables WHERE table_schema = ?', [database]);
      expect(Number(tables[0]!.n)).toBe(0);
      await holder.query(`DO RELEASE_LOCK(${MIGRATION_LOCK_NAME_SQL})`);
      await Promise.all([firstRun, applyMigrations(second.db)]);
      expect(await appliedHashes(database)).toHaveLength(journal.entries.length);
    } finally {
      await holder.end();
      await first.close();
      await second.close();
    }
  });
});
