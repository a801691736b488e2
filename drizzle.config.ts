import { defineConfig } from 'drizzle-kit';
import { loadConfig } from './server/config';

const { db } = loadConfig();

// drizzle-kit has no MariaDB dialect; mysql works for generate. Never `push` or `pull` (see DEVELOPERS.md).
export default defineConfig({
  dialect: 'mysql',
  schema: './db/schema.ts',
  out: './db/migrations',
  dbCredentials: { host: db.host, port: db.port, user: db.user, password: db.password, database: db.database },
});
