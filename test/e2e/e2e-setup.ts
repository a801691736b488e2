// Browser tests run against the built web app served by the real server over a fresh, demo-seeded database.
import type { TestProject } from 'vitest/node';
import { buildWebIfChanged } from '../../server/cli/web-build';
import { startServer } from '../../server/index';
import { seedDemoShop } from '../../server/seed/seed';
import { E2E_PORT, testConfig } from '../support/env';
import { createTestDatabase } from '../support/test-db';

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
  }
}

export default async function setup(project: TestProject) {
  const base = testConfig({ PORT: String(E2E_PORT) });
  buildWebIfChanged(base.root);
  const testDb = await createTestDatabase(base);
  await seedDemoShop(testDb.database.db, base.root);
  const running = await startServer({ ...base, db: { ...base.db, database: testDb.name } });
  project.provide('baseUrl', running.url);
  return async () => {
    await running.stop();
    await testDb.drop();
  };
}
