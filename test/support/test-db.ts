// A fresh database per test file: created, migrated, and dropped at the end.
import { randomBytes } from 'node:crypto';
import mysql from 'mysql2/promise';
import { applyMigrations, connect, type Database } from '../../db/client';
import type { Config } from '../../server/config';

export async function createTestDatabase(config: Config): Promise<{ name: string; database: Database; drop: () => Promise<void> }> {
  const name = `cw_test_${process.pid}_${randomBytes(4).toString('hex')}`;
  const admin = await mysql.createConnection({ ...config.db, database: undefined });
  await admin.query(`CREATE DATABASE \`${name}\``);
  const database = connect({ ...config.db, database: name });
  await applyMigrations(database.db);
  return {
    name,
    database,
    drop: async () => {
      await database.close();
      await admin.query(`DROP DATABASE IF EXISTS \`${name}\``);
      await admin.end();
    },
  };
}
