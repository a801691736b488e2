#!/usr/bin/env node
// Entry point of `npm start` and `npm test` on a machine where nothing may be installed yet.
// Plain Node with no dependencies: it installs what is missing (Debian packages, node_modules)
// and then hands over to the TypeScript command of the same name through tsx.
import { spawnSync, spawn } from 'node:child_process';
import { existsSync, statSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const command = process.argv[2];
const commands = {
  start: { packages: { mariadbd: ['mariadb-server', 'mariadb-client'] }, script: 'server/cli/start.ts' },
  dev: { packages: { mariadbd: ['mariadb-server', 'mariadb-client'] }, script: 'server/cli/start.ts', args: ['--dev'] },
  test: {
    packages: { mariadbd: ['mariadb-server', 'mariadb-client'], chromium: ['chromium'] },
    script: 'server/cli/test.ts',
  },
};

function onPath(binary) {
  const dirs = (process.env.PATH ?? '').split(':').concat(['/usr/sbin', '/usr/bin', '/sbin']);
  return dirs.some((dir) => dir && existsSync(path.join(dir, binary)));
}

function run(cmd, args, extraEnv = {}) {
  const result = spawnSync(cmd, args, { stdio: 'inherit', cwd: root, env: { ...process.env, ...extraEnv } });
  if (result.status !== 0) {
    console.error(`\n${cmd} ${args.join(' ')} failed (exit ${result.status ?? result.signal}).`);
    process.exit(1);
  }
}

function ensureDebianPackages(wanted) {
  const missing = Object.entries(wanted)
    .filter(([binary]) => !onPath(binary))
    .flatMap(([, pkgs]) => pkgs);
  if (missing.length === 0) return;
  const aptCommand = `apt-get update && apt-get install -y ${missing.join(' ')}`;
  if (process.getuid?.() !== 0) {
    console.error(`Causeway needs these Debian packages: ${missing.join(', ')}.\nInstall them as root:\n  sudo sh -c '${aptCommand}'`);
    process.exit(1);
  }
  console.log(`Installing Debian packages: ${missing.join(', ')}`);
  run('apt-get', ['update', '-q']);
  run('apt-get', ['install', '-y', '-q', '--no-install-recommends', ...missing], { DEBIAN_FRONTEND: 'noninteractive' });
}

function ensureNodeModules() {
  const lock = path.join(root, 'package-lock.json');
  const installed = path.join(root, 'node_modules', '.package-lock.json');
  if (existsSync(installed) && statSync(installed).mtimeMs >= statSync(lock).mtimeMs) return;
  console.log('Installing node modules (npm ci)...');
  run('npm', ['ci', '--no-audit', '--no-fund']);
}

const spec = commands[command];
if (!spec) {
  console.error(`usage: bootstrap.mjs ${Object.keys(commands).join('|')}`);
  process.exit(2);
}
ensureDebianPackages(spec.packages);
ensureNodeModules();

const tsx = path.join(root, 'node_modules', '.bin', 'tsx');
const child = spawn(tsx, [spec.script, ...(spec.args ?? []), ...process.argv.slice(3)], { stdio: 'inherit', cwd: root });
for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => child.kill(signal));
child.on('exit', (code, signal) => process.exit(code ?? (signal ? 1 : 0)));
