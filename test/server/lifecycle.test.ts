// Operations: graceful shutdown lets requests in flight finish; every response carries a request id.
import http from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startServer, type RunningServer } from '../../server/index';
import { testConfig } from '../support/env';
import { createTestDatabase } from '../support/test-db';

let testDb: Awaited<ReturnType<typeof createTestDatabase>>;
let running: RunningServer;

beforeAll(async () => {
  const base = testConfig({ PORT: '0' });
  testDb = await createTestDatabase(base);
  running = await startServer({ ...base, db: { ...base.db, database: testDb.name } });
});
afterAll(() => testDb.drop());

function request(url: string, options: http.RequestOptions, body?: string): Promise<{ status: number; headers: http.IncomingHttpHeaders; body: string }> {
  return new Promise((resolve, reject) => {
    const req = http.request(url, options, (res) => {
      let data = '';
      res.on('data', (c) => (data += c));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: data }));
    });
    req.on('error', reject);
    req.end(body);
  });
}

describe('operations', () => {
  it('tags each response with a request id and reports health', async () => {
    const res = await request(`${running.url}/api/health`, { method: 'GET' });
    expect(res.status).toBe(200);
    expect(res.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
    expect(JSON.parse(res.body)).toMatchObject({ ok: true, db: 'up' });
  });

  it('finishes a request in flight when shutting down, then refuses new connections', async () => {
    const csrf = await request(`${running.url}/api/auth/csrf`, { method: 'GET' });
    const cookie = String(csrf.headers['set-cookie']?.[0]).split(';')[0]!;
    const token = JSON.parse(csrf.body).token as string;
    const body = JSON.stringify({ email: 'nobody@nowhere.test', password: 'not a real password' });
    // Send half the body, start the shutdown, then send the rest.
    const answer = new Promise<number>((resolve, reject) => {
      const req = http.request(`${running.url}/api/auth/login`, { method: 'POST', headers: { 'Content-Type': 'application/json', 'Content-Length': Buffer.byteLength(body), 'X-CSRF-Token': token, Cookie: cookie } }, (res) => {
        res.resume();
        res.on('end', () => resolve(res.statusCode ?? 0));
      });
      req.on('error', reject);
      req.write(body.slice(0, 10));
      setTimeout(() => {
        stopping = running.stop();
        setTimeout(() => req.end(body.slice(10)), 300);
      }, 100);
    });
    let stopping: Promise<void> | undefined;
    expect(await answer).toBe(401); // the request completed normally (wrong password), not cut off
    await stopping;
    await expect(request(`${running.url}/api/health`, { method: 'GET' })).rejects.toThrow(/ECONNREFUSED/);
  });
});
