import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { scanReportResponseSchema } from '../../shared/schemas/codes';
import { agentFor, createTestApp, seedShop, signedIn, type TestApp } from '../support/test-app';

let t: TestApp;
let tech: Awaited<ReturnType<typeof signedIn>>;

beforeAll(async () => {
  t = await createTestApp();
  const shop = await seedShop(t.ctx, 'Scan Test Garage', ['apprentice', 'technician']);
  tech = await signedIn(t.app, shop.people.technician.email);
});
afterAll(() => t.close());

const postText = (text: unknown) => tech.agent.post('/api/scan-reports').set('X-CSRF-Token', tech.csrf).send({ text });
const postFile = (content: Buffer | string, name = 'report.txt', type = 'text/plain') =>
  tech.agent.post('/api/scan-reports').set('X-CSRF-Token', tech.csrf).attach('file', Buffer.from(content), { filename: name, contentType: type });

// All printouts below are invented; no scan tool's format is copied.
describe('POST /api/scan-reports, pasted text', () => {
  it('reads one code per line with status words and titles', async () => {
    const res = await postText('Stored codes:\nP0302\nP0171\nPending codes:\nP0420\n').expect(200);
    const body = scanReportResponseSchema.parse(res.body);
    expect(body.codes.map((c) => [c.code, c.status])).toEqual([
      ['P0302', 'confirmed'],
      ['P0171', 'confirmed'],
      ['P0420', 'pending'],
    ]);
    // titles from memory of the public code list; key words only (references.md §1)
    expect(body.codes[0]?.title?.toLowerCase()).toMatch(/cylinder 2.*misfire/);
  });

  it('reads a CSV with a header, failure type bytes and a VIN column', async () => {
    const csv = ['Module,DTC,FTB,Status,VIN', 'Engine,P0302,13,Confirmed,1M8GDM9AXKP042788', 'ABS,C0040,,Pending,1M8GDM9AXKP042788'].join('\n');
    const body = scanReportResponseSchema.parse((await postText(csv).expect(200)).body);
    // FTB 0x13 circuit open (references.md §1)
    expect(body.codes[0]).toMatchObject({ code: 'P0302', ftb: '13', ftbMeaning: 'circuit open', status: 'confirmed' });
    expect(body.codes[1]).toMatchObject({ code: 'C0040', status: 'pending' });
    // common textbook example VIN, check X (references.md §3)
    expect(body.vin).toBe('1M8GDM9AXKP042788');
    expect(body.vinCheck?.valid).toBe(true);
  });

  it('does not list a freeze-frame mention twice, and finds VIN and mileage', async () => {
    const text = [
      'Bay 3 quick scan',
      'VIN: 1G4AH59H45G118341',
      'Odometer: 84,210 km',
      'Confirmed: P0305-00',
      'Freeze frame for P0305: RPM 812, ECT 88 C',
    ].join('\r\n');
    const body = scanReportResponseSchema.parse((await postText(text).expect(200)).body);
    expect(body.codes).toHaveLength(1);
    expect(body.codes[0]).toMatchObject({ code: 'P0305', ftb: '00', status: 'confirmed' });
    // older 49 CFR 565 Table V example, check 4 (references.md §3)
    expect(body.vin).toBe('1G4AH59H45G118341');
    expect(body.mileage).toEqual({ value: 84210, unit: 'km' });
  });

  it('answers 400 with a reason when nothing is found', async () => {
    const res = await postText('Hello, the car makes a noise.').expect(400);
    expect(res.body.error.message).toMatch(/No trouble codes or VIN found/);
  });

  it('answers 400 for empty text and for text that is not a string', async () => {
    expect((await postText('   \n ').expect(400)).body.error.message).toMatch(/empty/);
    expect((await postText(42).expect(400)).body.error.fields.text).toBeDefined();
    expect((await tech.agent.post('/api/scan-reports').set('X-CSRF-Token', tech.csrf).send({})).status).toBe(400);
  });

  it('asks for a sign-in first', async () => {
    const a = await agentFor(t.app);
    expect((await a.agent.post('/api/scan-reports').set('X-CSRF-Token', a.csrf).send({ text: 'P0302' })).status).toBe(401);
  });
});

describe('POST /api/scan-reports, uploaded file', () => {
  it('reads an uploaded text file', async () => {
    const body = scanReportResponseSchema.parse((await postFile('DTC list\nP0133 pending\nU0100 permanent\n').expect(200)).body);
    expect(body.codes.map((c) => `${c.code}:${c.status}`)).toEqual(['P0133:pending', 'U0100:permanent']);
  });

  it('reads an uploaded CSV with a byte order mark and semicolons', async () => {
    const csv = '\uFEFFCode;Description;State\nP0420;Catalyst;Stored\nP0430;Catalyst;Stored\n';
    const body = scanReportResponseSchema.parse((await postFile(csv, 'codes.csv', 'text/csv').expect(200)).body);
    expect(body.codes.map((c) => c.code)).toEqual(['P0420', 'P0430']);
  });

  it('reads a UTF-16 file with its byte order mark', async () => {
    const utf16 = Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from('Codes: P0300 confirmed', 'utf16le')]);
    const body = (await postFile(utf16).expect(200)).body;
    expect(body.codes[0]).toMatchObject({ code: 'P0300', status: 'confirmed' });
  });

  it('answers 400 for a binary file, never a crash', async () => {
    const binary = Buffer.from(Array.from({ length: 600 }, (_, i) => (i * 37) % 256));
    const res = await postFile(binary, 'dump.bin', 'application/octet-stream').expect(400);
    expect(res.body.error.message).toMatch(/binary|not readable/i);
  });

  it('names a PDF and an empty file', async () => {
    expect((await postFile('%PDF-1.7 ...', 'r.pdf', 'application/pdf').expect(400)).body.error.message).toMatch(/PDF/);
    expect((await postFile('', 'empty.txt').expect(400)).body.error.message).toMatch(/empty/);
  });

  it('answers 413 for a file over 1 MB', async () => {
    const big = `P0302\n${'x'.repeat(1024 * 1024 + 10)}`;
    expect((await postFile(big)).status).toBe(413);
  });

  it('answers 400 for a file in the wrong form field', async () => {
    const res = await tech.agent.post('/api/scan-reports').set('X-CSRF-Token', tech.csrf).attach('upload', Buffer.from('P0302'), 'r.txt');
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/"file"/);
  });
});
