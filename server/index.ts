// Runs Causeway's server: connects, migrates, listens, and shuts down gracefully.
import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import type { Server } from 'node:http';
import path from 'node:path';
import pino from 'pino';
import { safeLogger } from './http/safe-log';
import { applyMigrations, connect, pendingMigrations, type Db } from '../db/client';
import { createApp } from './app';
import type { Config } from './config';
import type { AppContext } from './context';
import { createMailer } from './mail/mailer';
import { startDigestScheduler } from './patterns/scheduler';
import { accountsOnDemoPassword } from './seed/demo';

/** Thrown when the server must not start; the message tells the operator what to change. */
export class StartRefused extends Error {}

/** Migrates when told to; otherwise refuses a database whose schema is behind this build. */
async function prepareSchema(db: Db, config: Config) {
  if (config.migrateOnStart) return applyMigrations(db);
  const pending = await pendingMigrations(db);
  if (pending.length > 0) throw new StartRefused(`The database is missing ${pending.length} migration(s) (${pending.join(', ')}). Run the migration step first (npm run migrate:prod; npm run db:migrate in a checkout), or set MIGRATE_ON_START=true.`);
}

/** Production without demo mode: demo people must not still sign in with the published password. */
async function refuseDemoPasswords(db: Db, config: Config) {
  if (config.env !== 'production' || config.demoMode) return;
  const accounts = await accountsOnDemoPassword(db, config.root);
  if (accounts.length > 0) throw new StartRefused(`These accounts still have the published demo password: ${accounts.join(', ')}. Change their passwords or remove them before a production start.`);
}

/** The configured secret, or one generated once and kept under .data/ so sessions survive restarts. */
export function sessionSecret(config: Config): string {
  if (config.session.secret) return config.session.secret;
  const file = path.join(config.dataDir, 'session-secret');
  if (!existsSync(file)) {
    mkdirSync(config.dataDir, { recursive: true });
    writeFileSync(file, randomBytes(48).toString('base64url'), { mode: 0o600 });
  }
  return readFileSync(file, 'utf8').trim();
}

export interface RunningServer {
  server: Server;
  ctx: AppContext;
  url: string;
  stop(): Promise<void>;
}

export async function startServer(config: Config): Promise<RunningServer> {
  // scheduler and mail failures log errors too: the same redaction as requests
  const log = safeLogger(pino({ level: config.logLevel, base: { app: 'causeway' } }));
  const database = connect(config.db);
  try {
    await prepareSchema(database.db, config);
    await refuseDemoPasswords(database.db, config);
  } catch (err) {
    await database.close();
    throw err;
  }
  const ctx: AppContext = { db: database.db, config, mailer: createMailer(config), log };
  const app = createApp({ ctx, pool: database.pool, sessionSecret: sessionSecret(config) });
  const server = await new Promise<Server>((resolve, reject) => {
    const s = app.listen(config.port, config.host, () => resolve(s));
    s.on('error', reject);
  });
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : config.port;
  const stopDigest = startDigestScheduler(ctx);
  let stopping: Promise<void> | null = null;
  const stop = () =>
    (stopping ??= new Promise<void>((resolve) => {
      stopDigest();
      // close() waits for in-flight requests; idle keep-alive sockets are closed at once.
      server.close(() => resolve());
      server.closeIdleConnections();
    })
      .then(() => app.shutdown())
      .then(() => database.close()));
  return { server, ctx, url: `http://${config.host}:${port}`, stop };
}
