import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { platforms } from '../../db/schema';
import { scanReportResponseSchema } from '../../shared/schemas/codes';
import { readinessRulesResponseSchema, readinessSchema, snapshotListSchema, snapshotSchema } from '../../shared/schemas/readiness';
import { agentFor, createTestApp, seedShop, signedIn, type TestApp } from '../support/test-app';

// PID $01 bytes are hand-worked from the SAE J1979 service $01 PID $01 layout (recalled from memory).
// C=0x65: catalyst, EVAP, O2 sensor and O2 heater supported; D picks the incomplete ones.
// VIN 1G4AH59H45G118341: published 49 CFR 565 check-digit example, position 10 '5' = 2005.
// Printouts are invented; no scan tool's layout is copied.

let t: TestApp;
type Agent = Awaited<ReturnType<typeof signedIn>>;
let tech: Agent;
let manager: Agent;
let outsider: Agent;
let platformId: number;

beforeAll(async () => {
  t = await createTestApp();
  const shop = await seedShop(t.ctx, 'Readiness Test Garage', ['technician', 'manager']);
  const other = await seedShop(t.ctx, 'Other Readiness Garage', ['technician']);
  const [p] = await t.ctx.db
    .insert(platforms)
    .values({ shopId: shop.shopId, key: 'rd-i4', make: 'Testmark', model: 'Wren', engine: 'TW16', yearFrom: 2003, yearTo: 2008, cylinders: 4, layout: 'inline', fuel: 'petrol', induction: 'natural' })
    .$returningId();
  platformId = p!.id;
  tech = await signedIn(t.app, shop.people.technician.email);
  manager = await signedIn(t.app, shop.people.manager.email);
  outsider = await signedIn(t.app, other.people.technician.email);
});
afterAll(() => t.close());

const send = (a: Agent, method: 'post' | 'put', url: string, body: object) => a.agent[method](url).set('X-CSRF-Token', a.csrf).send(body);
const decode = (query: string, a = tech) => a.agent.get(`/api/readiness/decode?${query}`);
const setRule = (rule: string, a = manager) => send(a, 'put', '/api/readiness/rules/current', { rule });

describe('GET /api/readiness/decode', () => {
  it('asks for a sign-in first', async () => {
    const { agent } = await agentFor(t.app);
    expect((await agent.get('/api/readiness/decode?bytes=41010007 6504')).status).toBe(401);
  });

  it('decodes a spark-ignition answer with EVAP incomplete and judges it under the default rule', async () => {
    const res = await decode(`bytes=${encodeURIComponent('41 01 00 07 65 04')}`).expect(200);
    const body = readinessSchema.parse(res.body);
    expect(body).toMatchObject({ mil: false, confirmedCodes: 0, ignition: 'spark' });
    expect(body.monitors.find((m) => m.key === 'catalyst')).toEqual({ key: 'catalyst', name: 'Catalyst', kind: 'non-continuous', supported: true, complete: true });
    expect(body.monitors.find((m) => m.key === 'secondary-air')).toMatchObject({ supported: false, complete: false });
    expect(body.incomplete).toEqual([{ key: 'evap', name: 'Evaporative system', kind: 'non-continuous' }]);
    // common US practice (no source): one incomplete monitor allowed; unknown model year takes the strictest band
    expect(body.verdict).toMatchObject({ rule: { id: 'us-common' }, ready: true, maxIncomplete: 1, modelYear: null });
    expect(body.verdict.note).toMatch(/local inspection rules decide/);
    expect(body.nextSteps[0]).toMatchObject({ monitor: 'evap' });
    expect(body.nextSteps[0]!.caution).toMatch(/manufacturer's procedure, local regulations and licensed practice/);
  });

  it('applies the model-year band: two incomplete fail for 2005 and pass for 1999', async () => {
    // D=0x05: catalyst and EVAP incomplete
    expect((await decode('bytes=00076505&modelYear=2005').expect(200)).body.verdict).toMatchObject({ ready: false, maxIncomplete: 1 });
    expect((await decode('bytes=00076505&modelYear=1999').expect(200)).body.verdict).toMatchObject({ ready: true, maxIncomplete: 2 });
  });

  it('fails a commanded-on MIL and reads compression ignition monitors', async () => {
    // A=0x81 MIL on, 1 code; B=0x0F compression; C=0x83 NMHC, NOx/SCR, EGR/VVT; D=0x00
    const body = readinessSchema.parse((await decode(`bytes=${encodeURIComponent('41 01 81 0F 83 00')}`).expect(200)).body);
    expect(body).toMatchObject({ mil: true, confirmedCodes: 1, ignition: 'compression', incomplete: [] });
    expect(body.verdict.ready).toBe(false);
    expect(body.monitors.filter((m) => m.supported).map((m) => m.key)).toEqual(['misfire', 'fuel-system', 'components', 'nmhc-catalyst', 'nox-scr', 'egr-vvt']);
  });

  it.each([
    ['', 'bytes', /PID \$01 answer in hex/],
    ['bytes=41%2001%2000%2007%2065', 'bytes', /4 bytes/],
    ['bytes=ZZ076504', 'bytes', /"Z" is not a hex digit/],
    ['bytes=00076504&modelYear=abc', 'modelYear', /modelYear must be a year/],
    ['bytes=00076504&modelYear=1850', 'modelYear', /1980 or later/],
  ])('answers 400 for %j with the reason on %s', async (query, field, reason) => {
    const res = await decode(query).expect(400);
    expect(res.body.error.fields[field]).toMatch(reason);
  });
});

describe('the shop rule', () => {
  it('lists the rule sets with the current one and the regional note', async () => {
    const body = readinessRulesResponseSchema.parse((await tech.agent.get('/api/readiness/rules').expect(200)).body);
    expect(body.current).toBe('us-common');
    expect(body.rules.map((r) => r.id)).toEqual(['us-common', 'all-complete', 'mil-only']);
    expect(body.note).toMatch(/differ between regions/);
  });

  it('is changed by a manager only, and the verdict follows it', async () => {
    expect((await setRule('all-complete', tech)).status).toBe(403);
    expect((await setRule('strictest')).status).toBe(400);
    expect((await setRule('all-complete').expect(200)).body.current).toBe('all-complete');
    const body = (await decode('bytes=00076504').expect(200)).body;
    expect(body.verdict).toMatchObject({ rule: { id: 'all-complete' }, ready: false, maxIncomplete: 0 });
    await setRule('us-common').expect(200);
  });
});

describe('POST /api/scan-reports with monitor status', () => {
  const printout = `Bay 3 scan - Wren 1.6
VIN: 1G4AH59H45G118341
Odometer: 141,200 km
Stored codes: none
MIL status: OFF
Monitor status
  Misfire ............ complete
  Fuel system ........ complete
  Comp. components ... complete
  Catalyst ........... incomplete
  EVAP ............... incomplete
  Secondary air ...... not supported
  O2 sensor .......... complete
  O2 sensor heater ... complete
`;

  it('returns the readiness part, judged for the model year of the VIN', async () => {
    const res = await send(tech, 'post', '/api/scan-reports', { text: printout }).expect(200);
    const body = scanReportResponseSchema.parse(res.body);
    expect(body.vin).toBe('1G4AH59H45G118341');
    expect(body.readiness).toMatchObject({ mil: false, ignition: 'spark' });
    expect(body.readiness!.incomplete.map((m) => m.key)).toEqual(['catalyst', 'evap']);
    expect(body.readiness!.verdict).toMatchObject({ ready: false, modelYear: 2005, maxIncomplete: 1 });
    expect(body.readiness!.nextSteps.map((s) => s.monitor)).toEqual(['catalyst', 'evap']);
  });

  it('accepts a report that holds only a PID $01 answer', async () => {
    const body = scanReportResponseSchema.parse((await send(tech, 'post', '/api/scan-reports', { text: '>0101\n7E8 06 41 01 00 07 65 00\n' }).expect(200)).body);
    expect(body.codes).toEqual([]);
    expect(body.readiness?.verdict.ready).toBe(true);
  });

  it('leaves readiness out when the report has no monitor status', async () => {
    const body = (await send(tech, 'post', '/api/scan-reports', { text: 'Stored codes:\nP0302\n' }).expect(200)).body;
    expect(body.readiness).toBeUndefined();
  });
});

describe('case snapshots', () => {
  let caseId: number;
  let vehicleId: number;

  beforeAll(async () => {
    const created = await send(tech, 'post', '/api/cases', {
      title: 'EVAP and catalyst incomplete after battery job',
      body: 'Battery replaced; monitors reset.',
      codes: [],
      symptoms: ['monitors incomplete'],
      platformId,
      vehicle: { vin: '1G4AH59H45G118341' },
    }).expect(201);
    caseId = created.body.id;
    vehicleId = (await tech.agent.get(`/api/cases/${caseId}`).expect(200)).body.case.vehicle.id;
  });

  it('stores a before and an after snapshot and says what the drive cycle finished', async () => {
    // D=0x25: catalyst, EVAP and O2 sensor incomplete
    const before = snapshotSchema.parse((await send(tech, 'post', `/api/cases/${caseId}/readiness`, { label: 'Before drive cycle', bytes: '41 01 00 07 65 25' }).expect(201)).body);
    expect(before.readiness.verdict).toMatchObject({ ready: false, modelYear: 2005 });
    expect(before.change).toBeNull();
    const table = 'MIL: off\nCatalyst: complete\nEVAP: incomplete\nO2 sensor: complete\nO2 sensor heater: complete\nMisfire: complete';
    const after = snapshotSchema.parse((await send(tech, 'post', `/api/cases/${caseId}/readiness`, { label: 'After drive cycle', text: table }).expect(201)).body);
    expect(after.readiness.verdict.ready).toBe(true);
    expect(after.change).toEqual({ finished: ['Catalyst', 'Oxygen sensor'], stillIncomplete: ['Evaporative system'], reset: [] });
    expect(after.takenBy).toMatch(/^Technician/);
  });

  it('lists them on the case and on the vehicle, oldest first', async () => {
    const onCase = snapshotListSchema.parse((await tech.agent.get(`/api/cases/${caseId}/readiness`).expect(200)).body);
    expect(onCase.snapshots.map((s) => s.label)).toEqual(['Before drive cycle', 'After drive cycle']);
    const onVehicle = snapshotListSchema.parse((await tech.agent.get(`/api/vehicles/${vehicleId}/readiness`).expect(200)).body);
    expect(onVehicle.snapshots.map((s) => [s.caseId, s.label])).toEqual([
      [caseId, 'Before drive cycle'],
      [caseId, 'After drive cycle'],
    ]);
    expect(onVehicle.snapshots[0]!.caseTitle).toMatch(/EVAP and catalyst/);
  });

  it.each([
    [{ label: 'x', bytes: '00076500', text: 'Catalyst: complete' }, 'bytes', /either bytes .* or text/],
    [{ label: 'x' }, 'bytes', /either bytes/],
    [{ label: '', bytes: '00076500' }, 'label', /label/],
    [{ label: 'x', bytes: '0007650' }, 'bytes', /odd number/],
    [{ label: 'x', text: 'Odometer 12 km' }, 'text', /No monitor status/],
  ])('answers 400 for %j', async (body, field, reason) => {
    const res = await send(tech, 'post', `/api/cases/${caseId}/readiness`, body).expect(400);
    expect(res.body.error.fields[field]).toMatch(reason);
  });

  it("hides another shop's case and vehicle", async () => {
    expect((await outsider.agent.get(`/api/cases/${caseId}/readiness`)).status).toBe(404);
    expect((await send(outsider, 'post', `/api/cases/${caseId}/readiness`, { label: 'x', bytes: '00076500' })).status).toBe(404);
    expect((await outsider.agent.get(`/api/vehicles/${vehicleId}/readiness`)).status).toBe(404);
  });
});
