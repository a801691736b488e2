import path from 'node:path';
import { drizzle, type MySql2Database } from 'drizzle-orm/mysql2';
import { migrate } from 'drizzle-orm/mysql2/migrator';
import mysql from 'mysql2/promise';
import type { Config } from '../server/config';
import * as schema from './schema';

export type Db = MySql2Database<typeof schema>;

export interface Database {
  db: Db;
  pool: mysql.Pool;
  close(): Promise<void>;
}

export function connect(dbConfig: Config['db'], options: { connectionLimit?: number } = {}): Database {
  const pool = mysql.createPool({
    ...dbConfig,
    connectionLimit: options.connectionLimit ?? 20,
    timezone: 'Z',
    dateStrings: false,
    supportBigNumbers: true,
    charset: 'utf8mb4_unicode_ci',
  });
  const db = drizzle(pool, { schema, mode: 'default' });
  return { db, pool, close: () => pool.end() };
}

const migrationsFolder = path.join(import.meta.dirname, 'migrations');

export async function applyMigrations(db: Db) {
  await migrate(db, { migrationsFolder });
}
