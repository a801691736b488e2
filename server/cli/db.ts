// npm run db:start | db:stop | db:migrate
import { applyMigrations, connect } from '../../db/client';
import { ensureAppDatabase, startLocalServer, stopLocalServer } from '../../db/local-server';
import { loadConfig } from '../config';

const config = loadConfig();
const action = process.argv[2];

if (action === 'start') {
  const { started } = await startLocalServer(config);
  ensureAppDatabase(config);
  console.log(`MariaDB ${started ? 'started' : 'already running'} on 127.0.0.1:${config.db.port}`);
} else if (action === 'stop') {
  const stopped = await stopLocalServer(config);
  console.log(stopped ? 'MariaDB stopped' : 'MariaDB was not running');
} else if (action === 'migrate') {
  // production databases are the operator's; only the demo's private MariaDB is started here
  if (config.env !== 'production') {
    await startLocalServer(config);
    ensureAppDatabase(config);
  }
  const database = connect(config.db);
  await applyMigrations(database.db);
  await database.close();
  console.log('Migrations applied');
} else {
  console.error('usage: db.ts start|stop|migrate');
  process.exit(2);
}
