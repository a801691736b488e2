// The demo shop with its people and platforms, then its case notes from content/cases.
import path from 'node:path';
import pino from 'pino';
import type { Db } from '../../db/client';
import { importCaseFolder } from '../cases/import-export';
import type { Config } from '../config';
import type { AppContext } from '../context';
import { loadDemoData } from './demo';

const silentMailer = { send: async () => {} };

export function seedDemoShop(db: Db, root: string) {
  return loadDemoData(db, root, async (tx, shopId) => {
    // Inside the seed transaction: either the whole demo shop lands or none of it.
    const ctx = { db: tx, config: { root } as Config, mailer: silentMailer, log: pino({ level: 'silent' }) } as AppContext;
    const report = await importCaseFolder(ctx, shopId, path.join(root, 'content', 'cases'));
    if (report.errors.length) throw new Error(`Demo cases failed to import:\n${report.errors.join('\n')}`);
  });
}
