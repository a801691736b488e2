// Session lifetimes (ASVS 7.3.1 / 7.3.2): an idle session expires, and a busy one still ends
// at the absolute limit. The clock is moved by ageing the session row in MariaDB.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sql } from 'drizzle-orm';
import { sessions } from '../../db/schema';
import { createTestApp, seedShop, signedIn, type TestApp } from '../support/test-app';

let t: TestApp;
let email: string;
beforeAll(async () => {
  t = await createTestApp();
  email = (await seedShop(t.ctx, 'Timeout Bay', ['technician'])).people.technician.email;
});
afterAll(() => t.close());

const signedInSessions = () => sql`JSON_VALUE(${sessions.data}, '$.passport.user') IS NOT NULL`;

describe('session timeouts', () => {
  it('ends a session idle for longer than the idle limit', async () => {
    const a = await signedIn(t.app, email);
    await a.agent.get('/api/auth/me').expect(200);
    // express-mysql-session stores the expiry in seconds; put it in the past
    await t.ctx.db.update(sessions).set({ expires: Math.floor(Date.now() / 1000) - 60 }).where(signedInSessions());
    await a.agent.get('/api/auth/me').expect(401);
  });

  it('ends a session at the absolute limit even while it is in use', async () => {
    const a = await signedIn(t.app, email);
    await a.agent.get('/api/auth/me').expect(200);
    const limitMs = t.ctx.config.session.absoluteHours * 3600_000;
    const longAgo = Date.now() - limitMs - 60_000;
    await t.ctx.db
      .update(sessions)
      .set({ data: sql`JSON_SET(${sessions.data}, '$.signedInAt', ${longAgo})` })
      .where(signedInSessions());
    await a.agent.get('/api/auth/me').expect(401);
  });

  it('keeps an active session inside both limits', async () => {
    const a = await signedIn(t.app, email);
    for (let i = 0; i < 3; i++) await a.agent.get('/api/auth/me').expect(200);
    const res = await a.agent.get('/api/auth/me').expect(200);
    expect(res.body.user.email).toBe(email);
  });
});
