// npm start: private MariaDB, migrations, demo data (first start only), web build, mail catcher, server.
import { applyMigrations, connect } from '../../db/client';
import { ensureAppDatabase, startLocalServer } from '../../db/local-server';
import { loadConfig } from '../config';
import { startServer } from '../index';
import { startMailCatcher } from '../mail/catcher';
import { DEMO_PASSWORD } from '../seed/demo-files';
import { seedDemoShop } from '../seed/seed';
import { buildWebIfChanged, startExpoDevServer } from './web-build';

const started = Date.now();
const dev = process.argv.includes('--dev');
const config = { ...loadConfig(), webDevServer: dev ? 'http://127.0.0.1:8081' : undefined };

const db = await startLocalServer(config);
ensureAppDatabase(config);
console.log(`MariaDB ${db.started ? 'started' : 'already running'} on 127.0.0.1:${config.db.port} (data in ${config.dataDir})`);

const database = connect(config.db, { connectionLimit: 2 });
await applyMigrations(database.db);
const demo = await seedDemoShop(database.db, config.root);
await database.close();
console.log(demo.loaded ? 'Demo data loaded.' : 'Demo data already present.');

if (dev) startExpoDevServer(config.root);
else buildWebIfChanged(config.root);
const stopCatcher = await startMailCatcher(config, { persist: true });
const running = await startServer(config);

const width = Math.max(...demo.users.map((u) => u.email.length));
console.log(`
Causeway is running at ${running.url}   (ready in ${((Date.now() - started) / 1000).toFixed(1)} s)
Mail catcher inbox: http://${config.mail.host}:${config.mail.webPort}

Demo sign-ins (password for all: ${DEMO_PASSWORD}):
${demo.users.map((u) => `  ${u.role.padEnd(11)} ${u.email.padEnd(width)}  ${u.name}`).join('\n')}

Ctrl-C stops the app; MariaDB keeps running until npm run db:stop.`);

async function shutdown(signal: string) {
  console.log(`\n${signal}: finishing requests in flight...`);
  await running.stop();
  await stopCatcher();
  process.exit(0);
}
process.on('SIGINT', () => void shutdown('SIGINT'));
process.on('SIGTERM', () => void shutdown('SIGTERM'));
