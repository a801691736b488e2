import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { users } from '../../db/schema';
import { GENERIC_LOGIN_FAILURE, lockDurationMs } from '../../server/auth/service';
import { SESSION_COOKIE } from '../../server/auth/session';
import { agentFor, createTestApp, seedShop, signedIn, TEST_PASSWORD, type TestApp } from '../support/test-app';
import { mailTo, tokenFromMail } from '../support/mail';

let t: TestApp;
let shop: Awaited<ReturnType<typeof seedShop>>;

beforeAll(async () => {
  t = await createTestApp();
  shop = await seedShop(t.ctx, 'Auth Test Garage');
});
afterAll(() => t.close());

const sessionCookie = (res: { headers: Record<string, unknown> }) =>
  ([] as string[]).concat((res.headers['set-cookie'] as string[]) ?? []).find((c) => c.startsWith(SESSION_COOKIE));

describe('CSRF', () => {
  it('refuses a sign-in without the X-CSRF-Token header with 403', async () => {
    const { agent } = await agentFor(t.app);
    const res = await agent.post('/api/auth/login').send({ email: shop.people.manager.email, password: TEST_PASSWORD });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('csrf');
  });

  it('refuses a token from another session', async () => {
    const a = await agentFor(t.app);
    const b = await agentFor(t.app);
    const res = await b.agent.post('/api/auth/login').set('X-CSRF-Token', a.csrf).send({ email: shop.people.manager.email, password: TEST_PASSWORD });
    expect(res.status).toBe(403);
  });
});

describe('sign-up', () => {
  it('mails a link that sets the password and opens the new shop, signed in as its manager', async () => {
    const { agent, csrf } = await agentFor(t.app);
    const email = `owner.${Date.now()}@new-shop.test`;
    const res = await agent.post('/api/auth/signup').set('X-CSRF-Token', csrf).send({ shopName: 'Brand New Bay', name: 'Ora Fenwick', email });
    expect(res.status).toBe(202);
    // not signed in until the address is proven
    await agent.get('/api/auth/me').expect(401);
    const token = await tokenFromMail(email, /Confirm/);
    await agent.post('/api/auth/reset').set('X-CSRF-Token', csrf).send({ token, password: 'a long enough password' }).expect(200);
    const me = await signedIn(t.app, email, 'a long enough password');
    const who = await me.agent.get('/api/auth/me').expect(200);
    expect(who.body.user).toMatchObject({ email, role: 'manager', shopName: 'Brand New Bay' });
  });

  it('rejects a missing shop name, naming the field', async () => {
    const { agent, csrf } = await agentFor(t.app);
    const res = await agent.post('/api/auth/signup').set('X-CSRF-Token', csrf).send({ shopName: '', name: 'Someone', email: 'short@shop.test' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.shopName).toMatch(/shop name/);
  });

  it('answers a taken e-mail exactly like a new one and mails its owner instead (outside test, finding 5)', async () => {
    const { agent, csrf } = await agentFor(t.app);
    const fresh = `fresh.${Date.now()}@new-shop.test`;
    const taken = shop.people.senior.email;
    const asNew = await agent.post('/api/auth/signup').set('X-CSRF-Token', csrf).send({ shopName: 'Dup Bay', name: 'Dup', email: fresh });
    const asTaken = await agent.post('/api/auth/signup').set('X-CSRF-Token', csrf).send({ shopName: 'Dup Bay', name: 'Dup', email: taken });
    expect(asTaken.status).toBe(asNew.status);
    expect(asTaken.body).toEqual(asNew.body);
    const [notice] = await mailTo(taken, { subject: /already has a Causeway account/ });
    expect(notice!.text).toMatch(/Someone tried to create a new shop with this address/);
    // the owner keeps their account and shop; no second shop appears under their address
    const [owner] = await t.ctx.db.select().from(users).where(eq(users.email, taken));
    expect(owner!.shopId).toBe(shop.shopId);
    expect(owner!.passwordHash).not.toBeNull();
  });
});

describe('sign-in and sign-out', () => {
  it('signs in with the right password and issues a new session id', async () => {
    const { agent, csrf } = await agentFor(t.app);
    const before = await agent.get('/api/auth/csrf');
    const res = await agent.post('/api/auth/login').set('X-CSRF-Token', csrf).send({ email: shop.people.technician.email, password: TEST_PASSWORD });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ role: 'technician', shopId: shop.shopId, shopName: 'Auth Test Garage' });
    const cookie = sessionCookie(res);
    expect(cookie).toBeDefined();
    expect(cookie).toMatch(/HttpOnly/);
    expect(cookie).toMatch(/SameSite=Lax/);
    // the anonymous session that held the CSRF token was replaced by a new id
    expect(cookie!.split(';')[0]).not.toBe(sessionCookie(before)?.split(';')[0]);
  });

  it('answers a wrong password and an unknown e-mail with the same 401 message', async () => {
    const { agent, csrf } = await agentFor(t.app);
    const wrong = await agent.post('/api/auth/login').set('X-CSRF-Token', csrf).send({ email: shop.people.apprentice.email, password: 'not the password' });
    const unknown = await agent.post('/api/auth/login').set('X-CSRF-Token', csrf).send({ email: 'nobody@nowhere.test', password: 'not the password' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body.error.message).toBe(GENERIC_LOGIN_FAILURE);
    expect(unknown.body.error.message).toBe(GENERIC_LOGIN_FAILURE);
  });

  it('signs out and ends the session on the server', async () => {
    const { agent, csrf } = await signedIn(t.app, shop.people.senior.email);
    await agent.get('/api/auth/me').expect(200);
    await agent.post('/api/auth/logout').set('X-CSRF-Token', csrf).expect(204);
    await agent.get('/api/auth/me').expect(401);
  });

  it('rejects malformed JSON with a 400 and a message', async () => {
    const { agent, csrf } = await agentFor(t.app);
    const res = await agent.post('/api/auth/login').set('X-CSRF-Token', csrf).set('Content-Type', 'application/json').send('{"email": ');
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/not valid JSON/);
  });

  it('backs off an account after repeated failures (ASVS 2.2.1: well under 100 per hour)', async () => {
    const victim = (await seedShop(t.ctx, 'Lockout Garage', ['technician'])).people.technician;
    const { agent, csrf } = await agentFor(t.app);
    for (let i = 0; i < 6; i++) await agent.post('/api/auth/login').set('X-CSRF-Token', csrf).send({ email: victim.email, password: 'wrong password' }).expect(401);
    // even the right password waits out the lock
    const right = await agent.post('/api/auth/login').set('X-CSRF-Token', csrf).send({ email: victim.email, password: TEST_PASSWORD });
    expect(right.status).toBe(401);
    const [row] = await t.ctx.db.select().from(users).where(eq(users.id, victim.id));
    expect(row!.lockedUntil!.getTime()).toBeGreaterThan(Date.now());
    // the lock doubles and is capped at an hour: at most a few dozen failures an hour
    expect(lockDurationMs(4)).toBe(0);
    expect(lockDurationMs(5)).toBe(30_000);
    expect(lockDurationMs(6)).toBe(60_000);
    expect(lockDurationMs(40)).toBe(3_600_000);
  });

  it('answers a locked account exactly like an unknown e-mail (outside test, finding 5)', async () => {
    const known = (await seedShop(t.ctx, 'Probe Garage', ['technician'])).people.technician.email;
    const unknown = `nobody.${Date.now()}@probe.test`;
    const { agent, csrf } = await agentFor(t.app);
    const answers = async (email: string) => {
      const out: { status: number; body: unknown }[] = [];
      for (let i = 0; i < 8; i++) {
        const res = await agent.post('/api/auth/login').set('X-CSRF-Token', csrf).send({ email, password: 'wrong password' });
        out.push({ status: res.status, body: res.body });
      }
      return out;
    };
    expect(await answers(known)).toEqual(await answers(unknown));
  });
});

describe('role guards and shop isolation on users', () => {
  it('lets only managers list users', async () => {
    for (const role of ['apprentice', 'technician', 'senior'] as const) {
      const { agent } = await signedIn(t.app, shop.people[role].email);
      await agent.get('/api/users').expect(403);
    }
    const anonymous = await agentFor(t.app);
    await anonymous.agent.get('/api/users').expect(401);
    const { agent } = await signedIn(t.app, shop.people.manager.email);
    const res = await agent.get('/api/users').expect(200);
    expect(res.body.users.map((u: { email: string }) => u.email).sort()).toEqual(Object.values(shop.people).map((p) => p.email).sort());
  });

  it('never shows or changes another shop’s users (404, not 403)', async () => {
    const other = await seedShop(t.ctx, 'Other Shop Motors', ['manager', 'technician']);
    const { agent, csrf } = await signedIn(t.app, shop.people.manager.email);
    const list = await agent.get('/api/users').expect(200);
    expect(list.body.users.some((u: { email: string }) => u.email === other.people.technician.email)).toBe(false);
    const res = await agent.patch(`/api/users/${other.people.technician.id}`).set('X-CSRF-Token', csrf).send({ role: 'senior' });
    expect(res.status).toBe(404);
    const [untouched] = await t.ctx.db.select().from(users).where(eq(users.id, other.people.technician.id));
    expect(untouched!.role).toBe('technician');
  });

  it('keeps at least one active manager', async () => {
    const solo = await seedShop(t.ctx, 'Solo Manager Bay', ['manager']);
    const { agent, csrf } = await signedIn(t.app, solo.people.manager.email);
    const res = await agent.patch(`/api/users/${solo.people.manager.id}`).set('X-CSRF-Token', csrf).send({ role: 'technician' });
    expect(res.status).toBe(409);
  });

  it('keeps a manager when two managers demote themselves at the same moment (outside test, finding 2)', async () => {
    for (let round = 0; round < 15; round++) {
      const pair = await seedShop(t.ctx, `Twin Managers ${round}`, ['manager', 'senior']);
      // a second manager in the same shop, promoted from the senior seat
      await t.ctx.db.update(users).set({ role: 'manager' }).where(eq(users.id, pair.people.senior.id));
      const a = await signedIn(t.app, pair.people.manager.email);
      const b = await signedIn(t.app, pair.people.senior.email);
      const answers = await Promise.all([
        a.agent.patch(`/api/users/${pair.people.manager.id}`).set('X-CSRF-Token', a.csrf).send({ role: 'technician' }),
        b.agent.patch(`/api/users/${pair.people.senior.id}`).set('X-CSRF-Token', b.csrf).send({ role: 'technician' }),
      ]);
      expect(answers.map((r) => r.status).sort()).toEqual([200, 409]);
      const managers = await t.ctx.db.select().from(users).where(and(eq(users.shopId, pair.shopId), eq(users.role, 'manager')));
      expect(managers).toHaveLength(1);
    }
  });

  it('does not count an invited manager who never set a password as the remaining manager (outside test, finding 3)', async () => {
    const solo = await seedShop(t.ctx, 'Invite Then Leave Bay', ['manager']);
    const { agent, csrf } = await signedIn(t.app, solo.people.manager.email);
    await agent.post('/api/users').set('X-CSRF-Token', csrf).send({ name: 'Nobody Home', email: `nobody.${Date.now()}@unowned.test`, role: 'manager' }).expect(201);
    const res = await agent.patch(`/api/users/${solo.people.manager.id}`).set('X-CSRF-Token', csrf).send({ role: 'technician' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('last_manager');
  });

  it('validates the user patch and the id', async () => {
    const { agent, csrf } = await signedIn(t.app, shop.people.manager.email);
    expect((await agent.patch('/api/users/abc').set('X-CSRF-Token', csrf).send({ role: 'senior' })).status).toBe(400);
    expect((await agent.patch(`/api/users/${shop.people.apprentice.id}`).set('X-CSRF-Token', csrf).send({ role: 'wizard' })).status).toBe(400);
    expect((await agent.patch(`/api/users/${shop.people.apprentice.id}`).set('X-CSRF-Token', csrf).send({})).status).toBe(400);
  });
});

describe('invites and password resets through the mail catcher', () => {
  it('invites a technician who sets a password from the e-mailed link and signs in', async () => {
    const { agent, csrf } = await signedIn(t.app, shop.people.manager.email);
    const email = `new.tech.${Date.now()}@auth-test.test`;
    const res = await agent.post('/api/users').set('X-CSRF-Token', csrf).send({ name: 'New Tech', email, role: 'technician' });
    expect(res.status).toBe(201);
    expect(res.body.user).toMatchObject({ email, role: 'technician', invited: true });
    const [mail] = await mailTo(email);
    expect(mail!.subject).toMatch(/invited you to Auth Test Garage/);
    expect(mail!.html).toContain('Set your password');
    const token = await tokenFromMail(email);
    const anon = await agentFor(t.app);
    // signing in before the password is set fails like any wrong password
    expect((await anon.agent.post('/api/auth/login').set('X-CSRF-Token', anon.csrf).send({ email, password: 'whatever it is' })).status).toBe(401);
    await anon.agent.post('/api/auth/reset').set('X-CSRF-Token', anon.csrf).send({ token, password: 'my new shop password' }).expect(200);
    // the link works once
    expect((await anon.agent.post('/api/auth/reset').set('X-CSRF-Token', anon.csrf).send({ token, password: 'another password here' })).status).toBe(400);
    await signedIn(t.app, email, 'my new shop password');
  });

  it('answers 202 to a reset request whether or not the account exists, and mails only real accounts', async () => {
    const anon = await agentFor(t.app);
    const ghost = `ghost.${Date.now()}@nowhere.test`;
    const known = await anon.agent.post('/api/auth/reset-request').set('X-CSRF-Token', anon.csrf).send({ email: shop.people.apprentice.email });
    const unknown = await anon.agent.post('/api/auth/reset-request').set('X-CSRF-Token', anon.csrf).send({ email: ghost });
    expect(known.status).toBe(202);
    expect(unknown.status).toBe(202);
    expect(unknown.body).toEqual(known.body);
    const token = await tokenFromMail(shop.people.apprentice.email, /Reset/);
    expect(await mailTo(ghost, { timeoutMs: 300 })).toHaveLength(0);
    // a session that was open before the reset is ended by it
    const before = await signedIn(t.app, shop.people.apprentice.email);
    await anon.agent.post('/api/auth/reset').set('X-CSRF-Token', anon.csrf).send({ token, password: 'reset password value' }).expect(200);
    await before.agent.get('/api/auth/me').expect(401);
    await signedIn(t.app, shop.people.apprentice.email, 'reset password value');
  });

  it('kills a superseded reset link, and every link of the user once the password changed (outside test, finding 6)', async () => {
    const person = (await seedShop(t.ctx, 'Reset Twice Bay', ['technician'])).people.technician;
    const anon = await agentFor(t.app);
    const resetLink = async () => {
      const before = (await mailTo(person.email, { timeoutMs: 0, subject: /Reset/ })).length;
      await anon.agent.post('/api/auth/reset-request').set('X-CSRF-Token', anon.csrf).send({ email: person.email }).expect(202);
      for (let i = 0; i < 50 && (await mailTo(person.email, { timeoutMs: 0, subject: /Reset/ })).length === before; i++) await new Promise((r) => setTimeout(r, 100));
      return tokenFromMail(person.email, /Reset/);
    };
    const reset = (token: string, password: string) => anon.agent.post('/api/auth/reset').set('X-CSRF-Token', anon.csrf).send({ token, password });
    const older = await resetLink();
    const newer = await resetLink();
    expect(newer).not.toBe(older);
    // the newer link supersedes the older one at once
    expect((await reset(older, 'older link password')).body.error.code).toBe('bad_token');
    const third = await resetLink();
    const fourth = await resetLink();
    // using one link kills every other link of the user, older or newer
    await reset(fourth, 'fourth link password').expect(200);
    expect((await reset(third, 'third link password')).status).toBe(400);
    expect((await reset(newer, 'newer link password')).status).toBe(400);
    await signedIn(t.app, person.email, 'fourth link password');
  });

  it('refuses a made-up token', async () => {
    const anon = await agentFor(t.app);
    const res = await anon.agent.post('/api/auth/reset').set('X-CSRF-Token', anon.csrf).send({ token: 'x'.repeat(43), password: 'whatever password' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('bad_token');
  });
});

describe('disabled accounts', () => {
  it('ends the sessions of a disabled user and refuses their sign-in', async () => {
    const target = (await seedShop(t.ctx, 'Disable Bay', ['manager', 'technician'])).people;
    const victim = await signedIn(t.app, target.technician.email);
    const manager = await signedIn(t.app, target.manager.email);
    await manager.agent.patch(`/api/users/${target.technician.id}`).set('X-CSRF-Token', manager.csrf).send({ disabled: true }).expect(200);
    await victim.agent.get('/api/auth/me').expect(401);
    const again = await agentFor(t.app);
    expect((await again.agent.post('/api/auth/login').set('X-CSRF-Token', again.csrf).send({ email: target.technician.email, password: TEST_PASSWORD })).status).toBe(401);
  });
});

describe('health', () => {
  it('reports the database and version', async () => {
    const res = await (await agentFor(t.app)).agent.get('/api/health').expect(200);
    expect(res.body).toMatchObject({ ok: true, db: 'up' });
    expect(res.body.version).toMatch(/^\d+\.\d+\.\d+/);
  });
});
