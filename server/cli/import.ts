// npm run import -- <dir> [--shop <id>]: loads a folder of case files into a shop (default: the demo shop).
import path from 'node:path';
import { eq } from 'drizzle-orm';
import pino from 'pino';
import { applyMigrations, connect } from '../../db/client';
import { ensureAppDatabase, startLocalServer } from '../../db/local-server';
import { appMeta, shops } from '../../db/schema';
import { importCaseFolder } from '../cases/import-export';
import { loadConfig } from '../config';
import { createMailer } from '../mail/mailer';

const args = process.argv.slice(2);
const dir = args.find((a) => !a.startsWith('--') && args[args.indexOf(a) - 1] !== '--shop');
const shopArg = args.includes('--shop') ? Number(args[args.indexOf('--shop') + 1]) : undefined;
if (!dir) {
  console.error('usage: npm run import -- <folder of case .md files> [--shop <id>]');
  process.exit(2);
}

const config = loadConfig();
await startLocalServer(config);
ensureAppDatabase(config);
const database = connect(config.db, { connectionLimit: 2 });
await applyMigrations(database.db);
const [demo] = await database.db.select().from(appMeta).where(eq(appMeta.key, 'demo_loaded'));
const shopId = shopArg ?? (demo ? Number(demo.value) : undefined);
const [shop] = shopId ? await database.db.select().from(shops).where(eq(shops.id, shopId)) : [];
if (!shop) {
  console.error(shopArg ? `No shop with id ${shopArg}.` : 'No demo shop yet: run npm start once, or pass --shop <id>.');
  process.exit(1);
}
const ctx = { db: database.db, config, mailer: createMailer(config), log: pino({ level: 'warn' }) };
const report = await importCaseFolder(ctx, shop.id, path.resolve(dir));
console.log(`${shop.name}: imported ${report.imported}, skipped ${report.skipped} already present, ${report.errors.length} failed.`);
for (const e of report.errors) console.error(`  ${e}`);
await database.close();
process.exit(report.errors.length ? 1 : 0);
