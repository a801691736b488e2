import { readFileSync } from 'node:fs';
import path from 'node:path';
import { sql } from 'drizzle-orm';
import { drizzle, type MySql2Database } from 'drizzle-orm/mysql2';
import { migrate } from 'drizzle-orm/mysql2/migrator';
import mysql from 'mysql2/promise';
import type { DbSettings } from './settings';
import * as schema from './schema';

export type Db = MySql2Database<typeof schema>;

export interface Database {
  db: Db;
  pool: mysql.Pool;
  close(): Promise<void>;
}

export function connect(dbConfig: DbSettings, options: { connectionLimit?: number } = {}): Database {
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

/** SQL giving the named lock of the connected database (lock names are server-wide, at most 64 characters). */
export const MIGRATION_LOCK_NAME_SQL = "CONCAT('causeway-migrate-', MD5(DATABASE()))";

/**
 * Applies pending migrations while holding a MariaDB named lock, so instances that start
 * together run them one after the other: the second finds them applied and does nothing.
 * The lock lives on one pooled connection for the whole run; the migrations use another.
 */
export async function applyMigrations(db: Db, { waitSeconds = 300 } = {}) {
  const pool = (db as unknown as { $client: mysql.Pool }).$client; // set by drizzle(pool) in connect()
  const lockHolder = await pool.getConnection();
  const lockName = await lockHolder.query<mysql.RowDataPacket[]>(`SELECT ${MIGRATION_LOCK_NAME_SQL} AS name`).then(([rows]) => String(rows[0]!.name));
  try {
    const [rows] = await lockHolder.query<mysql.RowDataPacket[]>('SELECT GET_LOCK(?, ?) AS got', [lockName, waitSeconds]);
    if (Number(rows[0]?.got) !== 1) throw new Error(`Another process held the migration lock for more than ${waitSeconds} s; is a migration stuck?`);
    await migrate(db, { migrationsFolder });
  } finally {
    await lockHolder.query('DO RELEASE_LOCK(?)', [lockName]).catch(() => undefined);
    lockHolder.release();
  }
}

/** The migrations this build carries that the database has not applied yet (their tags). */
export async function pendingMigrations(db: Db): Promise<string[]> {
  const journal = JSON.parse(readFileSync(path.join(migrationsFolder, 'meta', '_journal.json'), 'utf8')) as { entries: { tag: string; when: number }[] };
  let applied = 0;
  try {
    const [rows] = (await db.execute(sql`SELECT COUNT(*) AS n FROM __drizzle_migrations`)) as unknown as [{ n: number }[]];
    applied = Number(rows[0]?.n ?? 0);
  } catch (err) {
    const e = err as { code?: string; cause?: { code?: string } };
    if ((e.cause?.code ?? e.code) !== 'ER_NO_SUCH_TABLE') throw err;
  }
  return journal.entries.slice(applied).map((e) => e.tag);
}

let writes = 0;

/**
 * A count of this process's writes that readers of the change log must see: bumped
 * after every transaction() commits and by recordChange. Search compares it to skip a
 * log read when nothing was written here; other processes' writes reach it by its poll.
 */
export const localWrites = (): number => writes;

/** Counts a write (recordChange outside a transaction is committed once it returns). */
export const noteWrite = () => {
  writes++;
};

const RETRYABLE = new Set(['ER_LOCK_DEADLOCK', 'ER_LOCK_WAIT_TIMEOUT']);

/**
 * Runs work, retrying a few times when InnoDB picks it as a deadlock victim: the usual advice
 * for such errors, and safe when the work is one transaction (it was rolled back whole).
 */
export async function retryDeadlocks<T>(work: () => Promise<T>, attempts = 4): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await work();
    } catch (err) {
      const code = (err as { cause?: { code?: string }; code?: string }).cause?.code ?? (err as { code?: string }).code;
      if (!code || !RETRYABLE.has(code) || attempt >= attempts) throw err;
      await new Promise((r) => setTimeout(r, 5 * attempt + Math.random() * 20));
    }
  }
}

/** A transaction retried on deadlock, counted as a local write once it commits. */
export async function transaction<T>(db: Db, work: (tx: Db) => Promise<T>, attempts = 4): Promise<T> {
  const result = await retryDeadlocks(() => db.transaction((tx) => work(tx as unknown as Db)), attempts);
  noteWrite();
  return result;
}
