// The real Express app over a fresh database, with helpers to act as a signed-in user.
import pino, { type Logger } from 'pino';
import request from 'supertest';
import type { Express } from 'express';
import { createApp, type CausewayApp } from '../../server/app';
import type { AppContext } from '../../server/context';
import { createMailer } from '../../server/mail/mailer';
import { hashPassword } from '../../server/auth/passwords';
import { shops, users } from '../../db/schema';
import type { Role } from '../../shared/roles';
import { testConfig } from './env';
import { createTestDatabase } from './test-db';
import { connect } from '../../db/client';

export interface TestApp {
  app: CausewayApp;
  ctx: AppContext;
  close(): Promise<void>;
}

/** `log` replaces the silent logger, for tests that read what the server logs. */
export async function createTestApp(overrides: Record<string, string> = {}, { log }: { log?: Logger } = {}): Promise<TestApp> {
  const base = testConfig(overrides);
  const testDb = await createTestDatabase(base);
  const config = { ...base, db: { ...base.db, database: testDb.name } };
  const ctx: AppContext = { db: testDb.database.db, config, mailer: createMailer(config), log: log ?? pino({ level: config.logLevel }) };
  const app = createApp({ ctx, pool: testDb.database.pool, sessionSecret: config.session.secret! });
  return {
    app,
    ctx,
    close: async () => {
      await app.shutdown();
      await testDb.drop();
    },
  };
}

/** A second app instance over the same database, as a load balancer would run it. */
export function secondInstance(first: TestApp): TestApp {
  const database = connect(first.ctx.config.db);
  const ctx: AppContext = { ...first.ctx, db: database.db };
  const app = createApp({ ctx, pool: database.pool, sessionSecret: first.ctx.config.session.secret! });
  return {
    app,
    ctx,
    close: async () => {
      await app.shutdown();
      await database.close();
    },
  };
}

export const TEST_PASSWORD = 'correct horse battery';
let hashed: Promise<string> | null = null;

/** Inserts a shop with one user per requested role; e-mails are unique across the whole run. */
export async function seedShop(ctx: AppContext, name: string, roles: Role[] = ['apprentice', 'technician', 'senior', 'manager']) {
  hashed ??= hashPassword(TEST_PASSWORD);
  const passwordHash = await hashed;
  const [shop] = await ctx.db.insert(shops).values({ name }).$returningId();
  const tag = Math.random().toString(36).slice(2, 8);
  const people: Record<string, { id: number; email: string; role: Role }> = {};
  for (const role of roles) {
    const email = `${role}.${tag}@${name.toLowerCase().replace(/[^a-z]+/g, '-')}.test`;
    const [u] = await ctx.db
      .insert(users)
      .values({ shopId: shop!.id, name: `${role[0]!.toUpperCase()}${role.slice(1)} ${tag}`, email, role, passwordHash, passwordChangedAt: new Date() })
      .$returningId();
    people[role] = { id: u!.id, email, role };
  }
  return { shopId: shop!.id, people: people as Record<Role, { id: number; email: string; role: Role }> };
}

/** A supertest agent with its own cookie jar and CSRF token. */
export async function agentFor(app: Express) {
  const agent = request.agent(app);
  const res = await agent.get('/api/auth/csrf').expect(200);
  return { agent, csrf: res.body.token as string };
}

export async function signedIn(app: Express, email: string, password = TEST_PASSWORD) {
  const a = await agentFor(app);
  await a.agent.post('/api/auth/login').set('X-CSRF-Token', a.csrf).send({ email, password }).expect(200);
  return a;
}
