// npm run backfill:causes: links every confirmed case that has no cause to its clearly-best
// suggestion, as confirming it today would (a one-off for cases confirmed before suggestions existed).
import pino from 'pino';
import { applyMigrations, connect } from '../../db/client';
import { ensureAppDatabase, startLocalServer } from '../../db/local-server';
import { backfillCauses } from '../cases/service';
import { loadConfig } from '../config';
import { createMailer } from '../mail/mailer';

const config = loadConfig();
await startLocalServer(config);
ensureAppDatabase(config);
const database = connect(config.db, { connectionLimit: 2 });
await applyMigrations(database.db);
const ctx = { db: database.db, config, mailer: createMailer(config), log: pino({ level: 'warn' }) };
const report = await backfillCauses(ctx);
console.log(`Confirmed cases without a cause: ${report.checked}. Linked by suggestion: ${report.linked.length}. Left for a person to link: ${report.checked - report.linked.length}.`);
for (const { caseId, cause } of report.linked) console.log(`  case ${caseId} -> ${cause}`);
await database.close();
