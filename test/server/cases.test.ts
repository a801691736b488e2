import { readFileSync, readdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { caseRevisions, platforms, users } from '../../db/schema';
import { parseCaseFile } from '../../server/cases/case-file';
import { importCaseFolder } from '../../server/cases/import-export';
import { extractFromNote } from '../../server/cases/markdown';
import { safeFileName } from '../../server/cases/attachments';
import { createTestApp, seedShop, signedIn, type TestApp } from '../support/test-app';
import { mailTo } from '../support/mail';

let t: TestApp;
let shop: Awaited<ReturnType<typeof seedShop>>;
let other: Awaited<ReturnType<typeof seedShop>>;
let platformId: number;
type Agent = Awaited<ReturnType<typeof signedIn>>;
const as: Partial<Record<'apprentice' | 'technician' | 'senior' | 'manager' | 'outsider', Agent>> = {};

beforeAll(async () => {
  t = await createTestApp();
  shop = await seedShop(t.ctx, 'Case Test Garage');
  other = await seedShop(t.ctx, 'Elsewhere Motors', ['manager']);
  const [p] = await t.ctx.db
    .insert(platforms)
    .values({ shopId: shop.shopId, key: 'test-v6', make: 'Testmark', model: 'Ridge', engine: 'TR30', yearFrom: 2015, yearTo: 2022, cylinders: 6, layout: 'V', banks: { '1': [1, 3, 5], '2': [2, 4, 6] }, firingOrder: [1, 2, 3, 4, 5, 6], fuel: 'petrol', induction: 'turbo' })
    .$returningId();
  platformId = p!.id;
  for (const role of ['apprentice', 'technician', 'senior', 'manager'] as const) as[role] = await signedIn(t.app, shop.people[role].email);
  as.outsider = await signedIn(t.app, other.people.manager.email);
});
afterAll(() => t.close());

const post = (a: Agent, url: string, body?: object) => a.agent.post(url).set('X-CSRF-Token', a.csrf).send(body);
const patch = (a: Agent, url: string, body: object) => a.agent.patch(url).set('X-CSRF-Token', a.csrf).send(body);

const draft = {
  title: 'Misfire cyl 2 and 5 after timing belt',
  body: '## Tests\n- Cam/crank deviation `13 degrees` on bank 2 (limit 4 degrees)\n- Boost held `15 psi`\n- Battery `11.8 V` at crank, fuel trim `+22 %`\n\nAlso saw P0016 stored.',
  codes: ['p0302', 'P0305-00'],
  symptoms: ['Rough idle', 'misfire'],
  platformId: 0,
  vehicle: { vin: '1M8GDM9AXKP042788', mileage: 84120, visitDate: '2026-03-10' },
};

async function newCase(a: Agent, extra: object = {}) {
  const res = await post(a, '/api/cases', { ...draft, platformId, ...extra });
  expect(res.status).toBe(201);
  return res.body as { id: number; version: number };
}

describe('creating cases', () => {
  it('creates a draft with normalised codes and tags and returns id and version', async () => {
    const { id, version } = await newCase(as.technician!);
    expect(version).toBe(1);
    const res = await as.technician!.agent.get(`/api/cases/${id}`).expect(200);
    expect(res.body.case).toMatchObject({ status: 'draft', codes: ['P0302', 'P0305-00'], symptoms: ['rough-idle', 'misfire'], platform: { id: platformId, engine: 'TR30' } });
    expect(res.body.case.vehicle).toMatchObject({ vin: '1M8GDM9AXKP042788', mileage: 84120, mileageUnit: 'km' });
  });

  it('rejects a malformed code with 400 naming the field', async () => {
    const res = await post(as.technician!, '/api/cases', { ...draft, platformId, codes: ['P0302', 'X9999'] });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toContain('codes.1');
    expect(res.body.error.fields['codes.1']).toMatch(/first letter/i);
  });

  it('accepts a VIN with a wrong check digit, with a warning (49 CFR 565.15: 1M8GDM9AXKP042788 computes X)', async () => {
    // ISO 3779 has no check digit: a vehicle built for outside North America is normal, not an error.
    const res = await post(as.technician!, '/api/cases', { ...draft, platformId, vehicle: { vin: '1M8GDM9A1KP042788' } });
    expect(res.status).toBe(201);
    const saved = await as.technician!.agent.get(`/api/cases/${res.body.id}`).expect(200);
    expect(saved.body.case.vehicle.vin).toBe('1M8GDM9A1KP042788');
    expect(saved.body.case.vehicle.vinWarnings[0]).toMatch(/check digit does not match.*only required for North American vehicles/i);
  });

  it('refuses only what no VIN can be (17 characters, no I, O or Q: ISO 3779)', async () => {
    const res = await post(as.technician!, '/api/cases', { ...draft, platformId, vehicle: { vin: '1M8GDM9AXKP04278Q' } });
    expect(res.status).toBe(400);
    expect(res.body.error.fields['vehicle.vin']).toMatch(/I, O and Q/);
  });

  it('lets only seniors and managers create a published case', async () => {
    expect((await post(as.apprentice!, '/api/cases', { ...draft, platformId, status: 'published' })).status).toBe(403);
    expect((await post(as.technician!, '/api/cases', { ...draft, platformId, status: 'published' })).status).toBe(403);
    expect((await post(as.senior!, '/api/cases', { ...draft, platformId, status: 'published' })).status).toBe(201);
  });

  it('refuses a platform of another shop', async () => {
    const [p] = await t.ctx.db.insert(platforms).values({ shopId: other.shopId, make: 'X', model: 'Y', engine: 'Z', yearFrom: 2010, yearTo: 2012, cylinders: 4, layout: 'inline' }).$returningId();
    const res = await post(as.technician!, '/api/cases', { ...draft, platformId: p!.id });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.platformId).toBeDefined();
  });
});

describe('reading the note: codes, measurements, headings', () => {
  it('suggests codes mentioned in the body but not on the case, and finds readings with units', () => {
    const found = extractFromNote(draft.body, ['P0302', 'P0305-00']);
    expect(found.suggestedCodes).toEqual(['P0016']);
    expect(found.measurements.map((m) => `${m.value} ${m.unit}`)).toEqual(expect.arrayContaining(['13 deg', '15 psi', '11.8 V', '22 %']));
    expect(found.headings).toEqual([{ depth: 2, text: 'Tests' }]);
  });

  it('reads GFM tables cell by cell (GFM spec 0.29, example 198) and task lists (example 279)', () => {
    const table = '| foo | bar |\n| --- | --- |\n| baz | bim |\n| P0171 | `+18 %` |';
    expect(extractFromNote(table).codes).toEqual(['P0171']);
    expect(extractFromNote(table).measurements.map((m) => m.value)).toEqual([18]);
    const tasks = '- [ ] foo\n- [x] bar checked P0420 at `2.4 V`';
    const got = extractFromNote(tasks);
    expect(got.codes).toEqual(['P0420']);
    expect(got.measurements[0]).toMatchObject({ value: 2.4, unit: 'V' });
  });

  it('offers the same through POST /api/cases/preview', async () => {
    const res = await post(as.apprentice!, '/api/cases/preview', { body: 'Found P0171 and `15 psi`', codes: [] });
    expect(res.status).toBe(200);
    expect(res.body.suggestedCodes).toEqual(['P0171']);
  });
});

describe('review workflow', () => {
  it('runs draft -> review -> returned -> review -> published -> confirmed, mailing seniors and the author', async () => {
    const { id } = await newCase(as.apprentice!);
    const submitted = await post(as.apprentice!, `/api/cases/${id}/submit`);
    expect(submitted.status).toBe(200);
    expect(submitted.body.case.status).toBe('review');
    const [toSenior] = await mailTo(shop.people.senior.email, { subject: /Review wanted/ });
    expect(toSenior!.text).toContain(draft.title);
    // apprentices and technicians cannot publish, return or confirm
    expect((await post(as.apprentice!, `/api/cases/${id}/publish`)).status).toBe(403);
    expect((await post(as.technician!, `/api/cases/${id}/return`, { comment: 'nope nope' })).status).toBe(403);
    expect((await post(as.technician!, `/api/cases/${id}/confirm`, {})).status).toBe(403);
    const returned = await post(as.senior!, `/api/cases/${id}/return`, { comment: 'Add the compression readings, please.' });
    expect(returned.body.case.status).toBe('draft');
    expect(returned.body.case.comments.at(-1)).toMatchObject({ kind: 'returned', body: 'Add the compression readings, please.' });
    const [toAuthor] = await mailTo(shop.people.apprentice.email, { subject: /Returned/ });
    expect(toAuthor!.text).toContain('Add the compression readings');
    await post(as.apprentice!, `/api/cases/${id}/submit`).expect(200);
    const published = await post(as.senior!, `/api/cases/${id}/publish`);
    expect(published.body.case.status).toBe('published');
    // the apprentice can no longer edit a published case
    const v = published.body.case.version;
    expect((await patch(as.apprentice!, `/api/cases/${id}`, { title: 'Changed by apprentice', version: v })).status).toBe(403);
    // confirming needs a fix written down
    expect((await post(as.senior!, `/api/cases/${id}/confirm`, { note: 'held' })).status).toBe(400);
    await patch(as.senior!, `/api/cases/${id}`, { fix: 'Re-timed the bank 2 exhaust cam', version: v }).expect(200);
    const confirmed = await post(as.manager!, `/api/cases/${id}/confirm`, { note: 'Road test 40 km, no misfire counts' });
    expect(confirmed.status).toBe(200);
    expect(confirmed.body.case.fixConfirmed).toBe(true);
    expect(confirmed.body.case.confirmation).toMatchObject({ by: { id: shop.people.manager.id }, note: 'Road test 40 km, no misfire counts' });
  });

  it('shows drafts only to their author and to seniors and managers', async () => {
    const { id } = await newCase(as.apprentice!);
    await as.apprentice!.agent.get(`/api/cases/${id}`).expect(200);
    await as.technician!.agent.get(`/api/cases/${id}`).expect(404);
    await as.senior!.agent.get(`/api/cases/${id}`).expect(200);
    const list = await as.technician!.agent.get('/api/cases?status=draft&pageSize=100').expect(200);
    expect(list.body.cases.some((c: { id: number }) => c.id === id)).toBe(false);
  });

  it('answers another shop’s case id with 404, not 403', async () => {
    const { id } = await newCase(as.senior!, { status: 'published' });
    await as.outsider!.agent.get(`/api/cases/${id}`).expect(404);
    expect((await patch(as.outsider!, `/api/cases/${id}`, { title: 'hijack', version: 1 })).status).toBe(404);
    expect((await post(as.outsider!, `/api/cases/${id}/confirm`, {})).status).toBe(404);
  });

  it('soft-deletes for seniors only; a deleted case is gone from reads and lists', async () => {
    const { id } = await newCase(as.senior!, { status: 'published' });
    expect((await as.technician!.agent.delete(`/api/cases/${id}`).set('X-CSRF-Token', as.technician!.csrf)).status).toBe(403);
    await as.senior!.agent.delete(`/api/cases/${id}`).set('X-CSRF-Token', as.senior!.csrf).expect(204);
    await as.senior!.agent.get(`/api/cases/${id}`).expect(404);
  });
});

describe('optimistic concurrency', () => {
  it('gives exactly one of two writers of the same version the save; the other gets 409 with the current version and loses nothing', async () => {
    const { id } = await newCase(as.technician!);
    const [a, b] = await Promise.all([
      patch(as.technician!, `/api/cases/${id}`, { body: 'Writer A was here', version: 1 }),
      patch(as.senior!, `/api/cases/${id}`, { body: 'Writer B was here', version: 1 }),
    ]);
    const statuses = [a.status, b.status].sort();
    expect(statuses).toEqual([200, 409]);
    const loser = a.status === 409 ? a : b;
    expect(loser.body.currentVersion).toBe(2);
    expect(loser.body.current.version).toBe(2);
    // the loser saves on top of the current version and both texts survive in the revisions
    await patch(a.status === 409 ? as.technician! : as.senior!, `/api/cases/${id}`, { body: 'Merged text', version: 2 }).expect(200);
    const revs = await as.senior!.agent.get(`/api/cases/${id}/revisions`).expect(200);
    expect(revs.body.revisions.map((r: { version: number }) => r.version)).toEqual([1, 2, 3]);
    const bodies = (await t.ctx.db.select().from(caseRevisions).where(eq(caseRevisions.caseId, id))).map((r) => r.body);
    expect(bodies).toContain(a.status === 200 ? 'Writer A was here' : 'Writer B was here');
    const diff = await as.senior!.agent.get(`/api/cases/${id}/diff?from=2&to=3`).expect(200);
    expect(diff.body.body.some((p: { kind: string; text: string }) => p.kind === 'added' && p.text.includes('Merged text'))).toBe(true);
  });

  it('rejects a diff of a version that does not exist', async () => {
    const { id } = await newCase(as.technician!);
    expect((await as.technician!.agent.get(`/api/cases/${id}/diff?from=1&to=9`)).status).toBe(400);
  });
});

describe('listing', () => {
  it('filters by code, tag, platform and status, sorts and paginates', async () => {
    await newCase(as.senior!, { status: 'published', codes: ['P0420'], symptoms: ['cat-rattle'], title: 'Catalyst efficiency bank 1' });
    const byCode = await as.technician!.agent.get('/api/cases?code=p0420').expect(200);
    expect(byCode.body.cases.every((c: { codes: string[] }) => c.codes.includes('P0420'))).toBe(true);
    expect(byCode.body.total).toBeGreaterThan(0);
    const byTag = await as.technician!.agent.get('/api/cases?tag=cat-rattle').expect(200);
    expect(byTag.body.cases).toHaveLength(1);
    const page = await as.senior!.agent.get(`/api/cases?platformId=${platformId}&pageSize=2&page=1&sort=title&dir=asc`).expect(200);
    expect(page.body.cases.length).toBeLessThanOrEqual(2);
    expect(page.body.total).toBeGreaterThan(2);
    const titles = page.body.cases.map((c: { title: string }) => c.title);
    expect([...titles].sort()).toEqual(titles);
  });

  it('answers bad list parameters with 400', async () => {
    for (const q of ['page=0', 'pageSize=1000', 'status=lost', 'code=Q1234', 'sort=random']) {
      expect((await as.technician!.agent.get(`/api/cases?${q}`)).status).toBe(400);
    }
  });

  it('lists the shop’s symptom tags with counts for suggestions', async () => {
    const res = await as.apprentice!.agent.get('/api/tags').expect(200);
    expect(res.body.tags.find((t: { tag: string }) => t.tag === 'misfire').count).toBeGreaterThan(0);
  });
});

describe('attachments', () => {
  const png = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478da63f8ffff3f0005fe02fea7d6a2d20000000049454e44ae426082', 'hex');

  it('stores a PNG under a generated name and serves it inline as an image', async () => {
    const { id } = await newCase(as.technician!);
    const res = await as.technician!.agent.post(`/api/cases/${id}/attachments`).set('X-CSRF-Token', as.technician!.csrf).attach('file', png, '../../etc/passwd.png');
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ mime: 'image/png', size: png.length, name: 'passwd.png' });
    const file = await as.technician!.agent.get(res.body.url).expect(200);
    expect(file.headers['content-type']).toBe('image/png');
    expect(file.headers['content-disposition']).toMatch(/^inline/);
    expect(file.headers['content-security-policy']).toContain('sandbox');
    await as.outsider!.agent.get(res.body.url).expect(404);
  });

  it('keeps a non-ASCII file name as UTF-8 and strips control and bidirectional characters (outside test, finding 11)', async () => {
    const { id } = await newCase(as.technician!);
    const upload = (name: string) => as.technician!.agent.post(`/api/cases/${id}/attachments`).set('X-CSRF-Token', as.technician!.csrf).attach('file', png, name);
    const emoji = await upload('🚗🔧.png');
    expect(emoji.status).toBe(201);
    expect(emoji.body.name).toBe('🚗🔧.png');
    const served = await as.technician!.agent.get(emoji.body.url).expect(200);
    expect(served.headers['content-disposition']).toContain(`filename*=UTF-8''${encodeURIComponent('🚗🔧.png')}`);
    expect((await upload('Zündspule Ø.png')).body.name).toBe('Zündspule Ø.png');
    // a right-to-left override would show "invoice.exe.png" as "invoicegnp.exe"; C0, C1 and bidi marks go
    expect((await upload('invoice\u202Egnp.exe.png')).body.name).toBe('invoicegnp.exe.png');
    // (a raw C0 control in the part header is refused by the multipart parser already: see safeFileName below)
    const marks = await upload('ab\u0085c\u200Fd\u2066e\u2069\u061C\uFEFF.png');
    expect(marks.status, JSON.stringify(marks.body)).toBe(201);
    expect(marks.body.name).toBe('abcde.png');
    expect(safeFileName('a\u0007b\u001bc\u007f.png')).toBe('abc.png');
  });

  it('refuses a disguised executable renamed .jpg (checked by magic bytes)', async () => {
    const { id } = await newCase(as.technician!);
    const exe = Buffer.concat([Buffer.from('4d5a90000300000004000000ffff0000', 'hex'), Buffer.alloc(64)]);
    const res = await as.technician!.agent.post(`/api/cases/${id}/attachments`).set('X-CSRF-Token', as.technician!.csrf).attach('file', exe, 'photo.jpg');
    expect(res.status).toBe(415);
    expect(res.body.error.message).toMatch(/whatever its name says/);
  });

  it('refuses HTML or SVG dressed as text', async () => {
    const { id } = await newCase(as.technician!);
    const res = await as.technician!.agent.post(`/api/cases/${id}/attachments`).set('X-CSRF-Token', as.technician!.csrf).attach('file', Buffer.from('<svg onload="alert(1)"></svg>'), 'notes.txt');
    expect(res.status).toBe(415);
  });

  it('refuses a file over 15 MB with 413', async () => {
    const { id } = await newCase(as.technician!);
    const big = Buffer.alloc(15 * 1024 * 1024 + 10, 0x41);
    const res = await as.technician!.agent.post(`/api/cases/${id}/attachments`).set('X-CSRF-Token', as.technician!.csrf).attach('file', big, 'big.txt');
    expect(res.status).toBe(413);
  });

  it('serves CSV as a download, never inline', async () => {
    const { id } = await newCase(as.technician!);
    const res = await as.technician!.agent.post(`/api/cases/${id}/attachments`).set('X-CSRF-Token', as.technician!.csrf).attach('file', Buffer.from('pid,value\nLTFT B1,+22\n'), 'trims.csv');
    expect(res.body.mime).toBe('text/csv');
    const file = await as.technician!.agent.get(res.body.url).expect(200);
    expect(file.headers['content-disposition']).toMatch(/^attachment/);
  });

  it('answers an upload without a file with 400', async () => {
    const { id } = await newCase(as.technician!);
    const res = await as.technician!.agent.post(`/api/cases/${id}/attachments`).set('X-CSRF-Token', as.technician!.csrf).field('note', 'x');
    expect(res.status).toBe(400);
  });
});

describe('import and export', () => {
  it('imports the demo case files and exports each one losslessly', async () => {
    const root = path.resolve(import.meta.dirname, '../..');
    const demoDir = path.join(root, 'content', 'cases');
    const target = await seedShop(t.ctx, 'Import Test Bay', ['senior', 'technician', 'apprentice', 'manager']);
    // demo files refer to people by handle and to platforms by key
    const handles: Record<string, number> = { senior: target.people.senior.id, senior2: target.people.senior.id, technician: target.people.technician.id, technician2: target.people.technician.id, apprentice: target.people.apprentice.id, manager: target.people.manager.id };
    for (const [handle, id] of Object.entries(handles)) if (!['senior2', 'technician2'].includes(handle)) await t.ctx.db.update(users).set({ handle }).where(eq(users.id, id));
    const keys = new Set(readdirSync(demoDir).filter((f) => f.endsWith('.md') && f !== 'README.md').map((f) => parseCaseFile(readFileSync(path.join(demoDir, f), 'utf8')).platform));
    for (const key of keys) await t.ctx.db.insert(platforms).values({ shopId: target.shopId, key: key!, make: 'M', model: key!, engine: 'E', yearFrom: 2010, yearTo: 2030, cylinders: 4, layout: 'inline' });
    // second seniors/technicians of the demo map to the same people here
    const dir = mkdtempSync(path.join(os.tmpdir(), 'cw-import-'));
    const files = readdirSync(demoDir).filter((f) => f.endsWith('.md') && f !== 'README.md');
    for (const f of files) writeFileSync(path.join(dir, f), readFileSync(path.join(demoDir, f), 'utf8').replace(/\b(senior|technician)2\b/g, '$1'));
    const report = await importCaseFolder(t.ctx, target.shopId, dir);
    expect(report.errors).toEqual([]);
    expect(report.imported).toBe(files.length);
    // importing again duplicates nothing
    expect((await importCaseFolder(t.ctx, target.shopId, dir)).imported).toBe(0);
    const manager = await signedIn(t.app, target.people.manager.email);
    const list = await manager.agent.get('/api/cases?pageSize=100').expect(200);
    expect(list.body.total).toBe(files.length);
    for (const summary of list.body.cases) {
      const exported = await manager.agent.get(`/api/cases/${summary.id}/export`).expect(200);
      expect(exported.headers['content-type']).toMatch(/text\/markdown/);
      const back = parseCaseFile(exported.text);
      const original = parseCaseFile(readFileSync(path.join(dir, `${back.slug}.md`), 'utf8'));
      expect(back).toEqual(original);
    }
  });
});
