// Issue 15, finding 1: a note of deeply nested lists or quotes froze the server (remark took
// seconds per read, 4,000 '>' overflowed the stack) and its case answered 500 for good.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, seedShop, signedIn, type TestApp } from '../support/test-app';

let t: TestApp;
let apprentice: Awaited<ReturnType<typeof signedIn>>;
let senior: Awaited<ReturnType<typeof signedIn>>;

beforeAll(async () => {
  t = await createTestApp();
  const shop = await seedShop(t.ctx, 'Deep Note Garage', ['apprentice', 'senior']);
  apprentice = await signedIn(t.app, shop.people.apprentice.email);
  senior = await signedIn(t.app, shop.people.senior.email);
});
afterAll(() => t.close());

const NOTE_LIMIT = 200_000; // shared/schemas/cases.ts
const upToLimit = (unit: string, tail: string) => unit.repeat(Math.floor((NOTE_LIMIT - tail.length) / unit.length)) + tail;

const notes: [string, string][] = [
  ['"- " x 4,000 (the reported 8 KB note)', '- '.repeat(4_000)],
  ['"1. " x 4,000', '1. '.repeat(4_000)],
  ['4,000 ">"', '>'.repeat(4_000)],
  ['"- " up to the note limit', upToLimit('- ', 'P0301 after')],
  ['"1. " up to the note limit', upToLimit('1. ', 'P0301 after')],
  ['">" up to the note limit', upToLimit('>', 'P0301 after')],
  ['mixed "> - 1. " up to the note limit', upToLimit('> - 1. ', 'P0301 after')],
  ['many lines each 25 deep, up to the note limit', upToLimit('- '.repeat(25) + 'P0301 line\n', '')],
];

/** Saves the note, reads its case as author and as a senior while /api/health is asked too, and checks the notice. */
async function expectOpenable(body: string, notice: RegExp) {
  const created = await apprentice.agent.post('/api/cases').set('X-CSRF-Token', apprentice.csrf).send({ title: 'Hard note', body });
  expect(created.status).toBe(201);
  const [own, other, health] = await Promise.all([
    apprentice.agent.get(`/api/cases/${created.body.id}`),
    senior.agent.get(`/api/cases/${created.body.id}`),
    request(t.app).get('/api/health'),
  ]);
  expect(health.status).toBe(200);
  for (const res of [own, other]) {
    expect(res.status).toBe(200);
    expect(res.body.case.body).toBe(body); // stored and returned as written
    expect(res.body.case.markdownNotice).toMatch(notice);
    expect(res.body.case.extracted.markdownNotice).toBe(res.body.case.markdownNotice);
  }
  if (body.includes('P0301')) expect(own.body.case.extracted.codes).toEqual(['P0301']);
}

describe('a case whose note nests lists or quotes thousands deep', () => {
  for (const [name, body] of notes) {
    it(`stays openable for every viewer, says what was cut and does not stall /api/health: ${name}`, async () => {
      await expectOpenable(body, /flattened to 20 levels/);
    });
  }

  it('bounds the live preview the same way', async () => {
    const res = await apprentice.agent.post('/api/cases/preview').set('X-CSRF-Token', apprentice.csrf).send({ body: '>'.repeat(4_000) + ' P0420', codes: [] });
    expect(res.status).toBe(200);
    expect(res.body.suggestedCodes).toEqual(['P0420']);
    expect(res.body.markdownNotice).toMatch(/4,000 deep/);
  });

  it('reports nothing cut for an ordinary note', async () => {
    const created = await apprentice.agent.post('/api/cases').set('X-CSRF-Token', apprentice.csrf).send({ title: 'Plain note', body: '- a\n  - b\n> quote P0171' });
    const res = await apprentice.agent.get(`/api/cases/${created.body.id}`).expect(200);
    expect(res.body.case.markdownNotice).toBeNull();
    expect(res.body.case.extracted.codes).toEqual(['P0171']);
  });
});

// markdown-it 10 scans from every unclosed '[' to the end of its paragraph: "[a](" x 50,000 took
// about a minute per read before shared/markdown/link-openers.ts (measured 63 s on this machine).
const bracketNotes: [string, string][] = [
  ['"[a](" x 50,000 (the reported note)', '[a]('.repeat(50_000)],
  ['"![a](" up to the note limit', upToLimit('![a](', ' P0301 after')],
  ['"[" up to the note limit', upToLimit('[', ' P0301 after')],
];

describe('a case whose note holds tens of thousands of unclosed link brackets', () => {
  for (const [name, body] of bracketNotes) {
    it(`stays openable for every viewer, says what was shown as text and answers /api/health: ${name}`, async () => {
      await expectOpenable(body, /shown as plain text\. The note is stored as written\.$/);
    });
  }
});
