// The demo Outbox shows managers what was mailed, never a one-time link a mail carried (outside test, finding 10).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { agentFor, createTestApp, seedShop, signedIn, type TestApp } from '../support/test-app';
import { mailTo, tokenFromMail } from '../support/mail';

let t: TestApp;
let shop: Awaited<ReturnType<typeof seedShop>>;

beforeAll(async () => {
  t = await createTestApp({ DEMO_MODE: 'true' });
  shop = await seedShop(t.ctx, 'Outbox Test Garage');
});
afterAll(() => t.close());

async function outboxOf(email: string) {
  const { agent } = await signedIn(t.app, email);
  const res = await agent.get('/api/outbox').expect(200);
  return res.body.messages as { subject: string; to: string[]; text: string }[];
}

describe('Outbox', () => {
  it('shows that a reset mail went to a senior without the token that would take over the account (outside test, finding 10)', async () => {
    const anon = await agentFor(t.app);
    const senior = shop.people.senior.email;
    await anon.agent.post('/api/auth/reset-request').set('X-CSRF-Token', anon.csrf).send({ email: senior }).expect(202);
    const token = await tokenFromMail(senior, /Reset/);
    const messages = await outboxOf(shop.people.manager.email);
    const reset = messages.find((m) => m.to.includes(senior) && /Reset/.test(m.subject));
    expect(reset).toBeDefined();
    expect(reset!.text).toMatch(/Choose a new password: \(one-time link, only in the recipient's own inbox\)/);
    expect(JSON.stringify(messages)).not.toContain(token);
    expect(JSON.stringify(messages)).not.toMatch(/token=/);
  });

  it('hides the link of an invite the manager sent', async () => {
    const { agent, csrf } = await signedIn(t.app, shop.people.manager.email);
    const email = `invitee.${Date.now()}@outbox-test.test`;
    await agent.post('/api/users').set('X-CSRF-Token', csrf).send({ name: 'Invitee', email, role: 'technician' }).expect(201);
    const [sent] = await mailTo(email);
    expect(sent!.text).toMatch(/token=/);
    const invite = (await outboxOf(shop.people.manager.email)).find((m) => m.to.includes(email));
    expect(invite!.subject).toMatch(/invited you/);
    expect(invite!.text).toMatch(/Set your password: \(one-time link/);
    expect(invite!.text).not.toMatch(/token=/);
  });

});
