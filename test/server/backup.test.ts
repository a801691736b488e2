import { mkdtempSync, readFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { backup, restore } from '../../db/backup';
import { createTestApp, seedShop, signedIn, type TestApp } from '../support/test-app';

let t: TestApp;
beforeAll(async () => {
  // A data folder of its own, so the attachments of this test are the only ones backed up.
  t = await createTestApp({ UPLOAD_DIR: mkdtempSync(path.join(os.tmpdir(), 'cw-backup-uploads-')) });
});
afterAll(() => t.close());

describe('backup and restore', () => {
  it('round-trips cases and attachment files through mariadb-dump', async () => {
    const shop = await seedShop(t.ctx, 'Backup Bay', ['senior']);
    const a = await signedIn(t.app, shop.people.senior.email);
    const created = await a.agent.post('/api/cases').set('X-CSRF-Token', a.csrf).send({ title: 'Kept safe', body: 'Boost held `15 psi`', codes: ['P0299'], symptoms: ['low-power'], status: 'published' }).expect(201);
    const file = await a.agent.post(`/api/cases/${created.body.id}/attachments`).set('X-CSRF-Token', a.csrf).attach('file', Buffer.from('rpm,boost\n3000,15\n'), 'log.csv').expect(201);
    const dir = mkdtempSync(path.join(os.tmpdir(), 'cw-backup-'));
    const manifest = backup(t.ctx.config, dir);
    expect(manifest.uploads).toBe(true);
    expect(readFileSync(path.join(dir, 'database.sql'), 'utf8')).toContain('Kept safe');

    // lose everything written after the backup, then restore
    await a.agent.patch(`/api/cases/${created.body.id}`).set('X-CSRF-Token', a.csrf).send({ title: 'Changed after the backup', version: 1 }).expect(200);
    restore(t.ctx.config, dir);

    const again = await signedIn(t.app, shop.people.senior.email);
    const res = await again.agent.get(`/api/cases/${created.body.id}`).expect(200);
    expect(res.body.case).toMatchObject({ title: 'Kept safe', version: 1, codes: ['P0299'] });
    const download = await again.agent.get(file.body.url).expect(200);
    expect(download.text ?? download.body.toString()).toContain('3000,15');
  });
});
