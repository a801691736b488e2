// The one place that reads process.env. Everything else receives a Config.
import { existsSync } from 'node:fs';
import path from 'node:path';
import { z } from 'zod';
import type { DbSettings } from '../db/settings';
import pkg from '../package.json' with { type: 'json' };

/** The folder holding package.json: the repository, whether this file runs from server/ or build/server/. */
function findRoot(start: string): string {
  for (let dir = start; ; dir = path.dirname(dir)) {
    if (existsSync(path.join(dir, 'package.json'))) return dir;
    if (path.dirname(dir) === dir) return start;
  }
}

// drizzle-kit loads this file as CommonJS, where import.meta is empty; it always runs from the repo root.
const root = import.meta.dirname ? findRoot(path.resolve(import.meta.dirname, '..')) : process.cwd();

const flag = z
  .enum(['1', '0', 'true', 'false', 'yes', 'no'])
  .transform((v) => v === '1' || v === 'true' || v === 'yes');

/** Search feed timings, also the defaults of a SearchService made without a config (tests, bench). */
export const SEARCH_DEFAULTS = {
  /** a change-log id missing below the newest is waited for this long (docs/search.md, "Live updates") */
  gapTimeoutMs: 120_000,
  /** how often each shop index is compared with the cases table */
  reconcileMs: 60_000,
};

const configSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  HOST: z.string().default('127.0.0.1'),
  PORT: z.coerce.number().int().min(0).max(65535).default(8080), // 0: any free port (tests)
  PUBLIC_URL: z.url().optional(),
  DATA_DIR: z.string().default(path.join(root, '.data')),
  UPLOAD_DIR: z.string().optional(),
  DB_HOST: z.string().default('127.0.0.1'),
  DB_PORT: z.coerce.number().int().min(1).max(65535).default(3391),
  DB_NAME: z.string().regex(/^[a-z0-9_]+$/, 'lower-case letters, digits and _ only').default('causeway'),
  DB_USER: z.string().default('app'),
  DB_PASSWORD: z.string().default('causeway-local'),
  SESSION_SECRET: z.string().min(32).optional(),
  SESSION_IDLE_MINUTES: z.coerce.number().int().positive().default(120),
  SESSION_ABSOLUTE_HOURS: z.coerce.number().int().positive().default(12),
  COOKIE_SECURE: flag.default(false),
  SMTP_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().min(1).max(65535).default(1025),
  MAIL_WEB_PORT: z.coerce.number().int().min(1).max(65535).default(1080),
  MAIL_FROM: z.string().default('Causeway <causeway@causeway.test>'),
  DEMO_MODE: flag.default(true),
  // Search worker threads, each with its own copy of the index (about 200 MiB per 100,000 cases).
  // One on a 2-core machine: a second competed with the HTTP thread and lost (docs/performance.md).
  SEARCH_WORKERS: z.coerce.number().int().min(1).max(16).default(1),
  // Longer than any transaction that writes a change-log row may stay open (ours take milliseconds).
  SEARCH_GAP_TIMEOUT_MS: z.coerce.number().int().min(100).default(SEARCH_DEFAULTS.gapTimeoutMs),
  // 0 turns reconciliation off.
  SEARCH_RECONCILE_MS: z.coerce.number().int().min(0).default(SEARCH_DEFAULTS.reconcileMs),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  DIGEST_CRON: z.string().default('0 7 * * 1'),
  AUTH_LIMIT_PER_ADDRESS: z.coerce.number().int().positive().default(60),
  // Unset: migrate on start outside production only; production runs npm run db:migrate as a step.
  MIGRATE_ON_START: flag.optional(),
});

/**
 * Settings whose demo default is unsafe for real data, with why. In production each must be
 * set explicitly; what the operator then chooses is theirs (e.g. COOKIE_SECURE=false behind TLS
 * offload on loopback).
 */
export const PRODUCTION_REQUIRED = {
  DEMO_MODE: 'demo mode shows every sent e-mail in the Outbox page; set DEMO_MODE=false',
  DB_PASSWORD: 'the database password defaults to the published demo value',
  SESSION_SECRET: 'without it a secret is generated into the data folder, different on every instance',
  COOKIE_SECURE: 'session cookies are sent over plain HTTP unless COOKIE_SECURE=true',
} as const;

/** The unsafe demo defaults a production start would run with, one line per variable. */
export function productionProblems(env: NodeJS.ProcessEnv = process.env): string[] {
  if (env.NODE_ENV !== 'production') return [];
  return Object.entries(PRODUCTION_REQUIRED)
    .filter(([name]) => env[name] === undefined || env[name] === '')
    .map(([name, why]) => `${name} is not set: ${why}`);
}

export type Config = ReturnType<typeof loadConfig>;

export function loadConfig(env: NodeJS.ProcessEnv = process.env) {
  const parsed = configSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Invalid configuration:\n${lines.join('\n')}`);
  }
  const c = parsed.data;
  const dataDir = path.resolve(c.DATA_DIR);
  return {
    env: c.NODE_ENV,
    root,
    host: c.HOST,
    port: c.PORT,
    publicUrl: c.PUBLIC_URL ?? `http://${c.HOST}:${c.PORT}`,
    dataDir,
    uploadDir: c.UPLOAD_DIR ? path.resolve(c.UPLOAD_DIR) : path.join(dataDir, 'uploads'),
    webDist: path.join(root, 'dist'),
    /** npm run dev: pages come from Expo's dev server instead of dist/. */
    webDevServer: undefined as string | undefined,
    db: { host: c.DB_HOST, port: c.DB_PORT, database: c.DB_NAME, user: c.DB_USER, password: c.DB_PASSWORD } satisfies DbSettings,
    session: {
      secret: c.SESSION_SECRET,
      idleMinutes: c.SESSION_IDLE_MINUTES,
      absoluteHours: c.SESSION_ABSOLUTE_HOURS,
      secureCookie: c.COOKIE_SECURE,
    },
    mail: { host: c.SMTP_HOST, port: c.SMTP_PORT, webPort: c.MAIL_WEB_PORT, from: c.MAIL_FROM },
    demoMode: c.DEMO_MODE,
    migrateOnStart: c.MIGRATE_ON_START ?? c.NODE_ENV !== 'production',
    logLevel: c.LOG_LEVEL,
    searchWorkers: c.SEARCH_WORKERS,
    searchGapTimeoutMs: c.SEARCH_GAP_TIMEOUT_MS,
    searchReconcileMs: c.SEARCH_RECONCILE_MS,
    digestCron: c.DIGEST_CRON,
    limits: { authPerAddress: c.AUTH_LIMIT_PER_ADDRESS, jsonBody: '1mb' },
    version: pkg.version,
  };
}
