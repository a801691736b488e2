// npm test: every suite (shared unit tests, API tests on MariaDB, browser tests in Chromium).
// Vitest's global setups start MariaDB, the mail catcher and the built app; this wrapper
// builds the web app first and ends with one plain "N passed, N failed" line.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import path from 'node:path';
import { buildWebIfChanged } from './web-build';

const root = path.resolve(import.meta.dirname, '../..');
const report = path.join(root, 'test-results', 'vitest.json');
mkdirSync(path.dirname(report), { recursive: true });
rmSync(report, { force: true });

buildWebIfChanged(root);

const result = spawnSync(
  path.join(root, 'node_modules', '.bin', 'vitest'),
  ['run', '--reporter=default', '--reporter=json', `--outputFile.json=${report}`, ...process.argv.slice(2)],
  { cwd: root, stdio: 'inherit', env: { ...process.env, EXPO_NO_TELEMETRY: '1' } },
);

if (existsSync(report)) {
  const r = JSON.parse(readFileSync(report, 'utf8')) as { numPassedTests: number; numFailedTests: number; numPendingTests: number; numTotalTests: number };
  console.log(`\n${r.numPassedTests} passed, ${r.numFailedTests} failed, ${r.numPendingTests} skipped`);
  if (r.numTotalTests === 0) {
    console.error('No tests ran.');
    process.exit(1);
  }
}
process.exit(result.status ?? 1);
