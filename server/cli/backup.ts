// npm run db:backup [-- <folder>]   and   npm run db:restore -- <folder>
import path from 'node:path';
import { backup, restore } from '../../db/backup';
import { ensureAppDatabase, startLocalServer } from '../../db/local-server';
import { loadConfig } from '../config';

const config = loadConfig();
const [action, target] = process.argv.slice(2);
await startLocalServer(config);
ensureAppDatabase(config);
if (action === 'backup') {
  const dir = path.resolve(target ?? path.join(config.dataDir, 'backups', new Date().toISOString().replace(/[:.]/g, '-')));
  backup(config, dir);
  console.log(`Backed up ${config.db.database} and attachments to ${dir}`);
} else if (action === 'restore' && target) {
  const m = restore(config, path.resolve(target));
  console.log(`Restored ${config.db.database} from the backup of ${m.createdAt}. Restart the app so it rebuilds its search index.`);
} else {
  console.error('usage: npm run db:backup [-- <folder>] | npm run db:restore -- <folder>');
  process.exit(2);
}
