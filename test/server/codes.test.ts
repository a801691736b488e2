import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { codeDetailSchema, codeListResponseSchema, vinCheckSchema } from '../../shared/schemas/codes';
import { agentFor, createTestApp, seedShop, signedIn, type TestApp } from '../support/test-app';

let t: TestApp;
let apprentice: Awaited<ReturnType<typeof signedIn>>;

beforeAll(async () => {
  t = await createTestApp();
  const shop = await seedShop(t.ctx, 'Codes Test Garage', ['apprentice']);
  apprentice = await signedIn(t.app, shop.people.apprentice.email);
});
afterAll(() => t.close());

const get = (path: string) => apprentice.agent.get(path);

describe('GET /api/codes/:code', () => {
  it('asks for a sign-in first', async () => {
    const { agent } = await agentFor(t.app);
    expect((await agent.get('/api/codes/P0302')).status).toBe(401);
  });

  it('decodes P0302 as a generic powertrain misfire code for cylinder 2', async () => {
    const res = await get('/api/codes/P0302').expect(200);
    const body = codeDetailSchema.parse(res.body);
    // SAE J2012 classification by character position (references.md §1)
    expect(body).toMatchObject({ code: 'P0302', system: 'powertrain', scope: 'generic', group: 'ignition-misfire', misfire: { cylinder: 2 } });
    // title from memory of the public code list; compare key words (references.md §1)
    expect(body.title?.toLowerCase()).toMatch(/cylinder 2.*misfire/);
    expect(body.titleNote).toMatch(/memory/i);
    // SAE J1979 service $03 packing: P -> 00, digit 0 -> 00, then 3-0-2 (references.md §2)
    expect(body.pair).toBe('0302');
    expect(body.structure.map((s) => s.chars)).toEqual(['P', '0', '3', '02']);
    expect(body.ftb).toBeUndefined();
  });

  it('reads the failure type byte of P0302-13 as circuit open', async () => {
    const res = await get('/api/codes/p0302-13').expect(200);
    expect(res.body.full).toBe('P0302-13');
    // FTB 0x13 circuit open, high nibble 1 general electrical (references.md §1)
    expect(res.body.ftb).toEqual({ value: '13', category: 'general electrical failure', meaning: 'circuit open' });
  });

  it('classifies U0100 as a generic network code and C0035 as chassis', async () => {
    // letter = system, second character 0 = generic (references.md §1)
    expect((await get('/api/codes/U0100').expect(200)).body).toMatchObject({ system: 'network', scope: 'generic', pair: 'C100' });
    // C0035 -> 40 35 (references.md §2, reverse check value)
    expect((await get('/api/codes/C0035').expect(200)).body).toMatchObject({ system: 'chassis', pair: '4035' });
  });

  it('marks P1xxx as manufacturer specific with no generic title', async () => {
    // P1 manufacturer controlled (references.md §1)
    const res = await get('/api/codes/P1234').expect(200);
    expect(res.body).toMatchObject({ scope: 'manufacturer', title: null });
  });

  it.each([
    ['X0302', /first letter must be P, C, B or U/],
    ['P4302', /second character must be 0-3/],
    ['P03G2', /hex/],
    ['P030', /5 characters/],
    ['P0302-1', /failure type byte/],
  ])('answers 400 for %s with the reason', async (input, reason) => {
    const res = await get(`/api/codes/${input}`).expect(400);
    expect(res.body.error.message).toMatch(reason);
    expect(res.body.error.fields.code).toMatch(reason);
  });
});

describe('GET /api/codes/decode', () => {
  it('decodes J1979 byte pairs to codes', async () => {
    // 01 33 -> P0133, C1 00 -> U0100 (references.md §2 check values)
    const res = await get('/api/codes/decode?pairs=0133C100').expect(200);
    expect(res.body).toEqual({ codes: ['P0133', 'U0100'] });
  });

  it('skips 0000 padding and accepts spaces and lower case', async () => {
    // 0x0000 is padding (references.md §2 [M]); 41 23 C0123, 21 35 P2135 (§2 check values)
    const res = await get('/api/codes/decode?pairs=41%2023%200000%2021%2035').expect(200);
    expect(res.body.codes).toEqual(['C0123', 'P2135']);
    expect((await get('/api/codes/decode?pairs=0420').expect(200)).body.codes).toEqual(['P0420']);
  });

  it('answers 400 for an odd number of hex digits', async () => {
    const res = await get('/api/codes/decode?pairs=013').expect(400);
    expect(res.body.error.fields.pairs).toMatch(/odd/i);
  });

  it('answers 400 for non-hex characters and for a missing parameter', async () => {
    expect((await get('/api/codes/decode?pairs=01ZZ').expect(400)).body.error.fields.pairs).toMatch(/hex/i);
    expect((await get('/api/codes/decode').expect(400)).body.error.fields.pairs).toBeDefined();
  });

  it('answers 400 when the bytes do not split into two-byte codes', async () => {
    expect((await get('/api/codes/decode?pairs=013301').expect(400)).body.error.fields.pairs).toMatch(/two bytes/);
  });
});

describe('GET /api/codes', () => {
  it('browses the reference page by page', async () => {
    const first = codeListResponseSchema.parse((await get('/api/codes?page=1&pageSize=10').expect(200)).body);
    const second = codeListResponseSchema.parse((await get('/api/codes?page=2&pageSize=10').expect(200)).body);
    expect(first.codes).toHaveLength(10);
    expect(first.total).toBeGreaterThanOrEqual(400);
    expect(second.codes[0]?.code).not.toBe(first.codes[0]?.code);
    expect(first.note).toMatch(/memory/i);
  });

  it('looks up by code prefix', async () => {
    const res = codeListResponseSchema.parse((await get('/api/codes?q=p030&pageSize=100').expect(200)).body);
    expect(res.codes.length).toBeGreaterThanOrEqual(10);
    expect(res.codes.every((c) => c.code.startsWith('P030'))).toBe(true);
  });

  it('finds codes by words in their titles', async () => {
    const res = codeListResponseSchema.parse((await get('/api/codes?q=lean%20bank%202').expect(200)).body);
    // P0174 System Too Lean Bank 2 (references.md §1, secondary transcription)
    expect(res.codes.map((c) => c.code)).toContain('P0174');
    expect(res.codes.map((c) => c.code)).not.toContain('P0171');
  });

  it('understands trade shorthand in words ("cyl" for cylinder)', async () => {
    const res = codeListResponseSchema.parse((await get('/api/codes?q=cyl%205%20misfire').expect(200)).body);
    expect(res.codes.map((c) => c.code)).toContain('P0305');
  });

  it('filters by system', async () => {
    const res = codeListResponseSchema.parse((await get('/api/codes?system=network&pageSize=100').expect(200)).body);
    expect(res.total).toBeGreaterThan(0);
    expect(res.codes.every((c) => c.code.startsWith('U'))).toBe(true);
  });

  it('names an exact code even when the reference has no title for it', async () => {
    const res = codeListResponseSchema.parse((await get('/api/codes?q=P1234').expect(200)).body);
    expect(res.exact).toBe('P1234');
    expect(res.total).toBe(0);
  });

  it('answers 400 for a bad system or page', async () => {
    expect((await get('/api/codes?system=engine').expect(400)).body.error.fields.system).toBeDefined();
    expect((await get('/api/codes?page=0').expect(400)).body.error.fields.page).toBeDefined();
  });
});

describe('GET /api/vin/:vin', () => {
  it('passes 1M8GDM9AXKP042788 with check digit X', async () => {
    // common textbook example, check X, sum 351 (references.md §3)
    const res = await get('/api/vin/1M8GDM9AXKP042788').expect(200);
    const body = vinCheckSchema.parse(res.body);
    expect(body).toMatchObject({ valid: true, checkDigit: 'X', expectedCheckDigit: 'X', wmi: '1M8', vds: 'GDM9A', vis: 'KP042788', errors: [] });
    // position 10 K = 1989 or 2019; position 7 numeric (9) -> 1980-2009 for light vehicles (references.md §3 [M])
    expect(body.modelYears).toEqual([1989]);
  });

  it('passes 1G4AH59H45G118341 with check digit 4', async () => {
    // older 49 CFR 565 Table V example, check 4, sum 411 (references.md §3)
    const res = await get('/api/vin/1G4AH59H45G118341').expect(200);
    expect(res.body).toMatchObject({ valid: true, checkDigit: '4', expectedCheckDigit: '4' });
    // position 10 '5' = 2005 (cycle ABCDEFGHJKLMNPRSTVWXY123456789 from 1980, references.md §3)
    expect(res.body.modelYears).toEqual([2005]);
  });

  it('warns about a corrupted VIN with the check digit mismatch', async () => {
    // 1M8GDM9AXKP042788 with the last digit changed: weight 2 adds 2, sum 353, 353 mod 11 = 1 (49 CFR 565.15(c))
    const res = await get('/api/vin/1M8GDM9AXKP042789').expect(200);
    expect(res.body).toMatchObject({ valid: true, checkDigit: 'X', expectedCheckDigit: '1', errors: [] });
    expect(res.body.warnings.join(' ')).toMatch(/position 9 is X, the VIN computes 1/);
  });

  it('explains short VINs and forbidden letters', async () => {
    const short = await get('/api/vin/1M8GDM9AX').expect(200);
    expect(short.body.valid).toBe(false);
    expect(short.body.errors[0]).toMatch(/17 characters/);
    // I, O and Q are never used (references.md §3)
    const withO = await get('/api/vin/1M8GDM9AXKPO42788').expect(200);
    expect(withO.body.errors.join(' ')).toMatch(/I, O and Q/);
  });

  it('answers 400 only for absurd input', async () => {
    const res = await get(`/api/vin/${'A'.repeat(65)}`).expect(400);
    expect(res.body.error.fields.vin).toMatch(/too long/);
  });
});
