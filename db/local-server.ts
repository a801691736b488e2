// A private MariaDB server for this checkout: data under .data/, bound to 127.0.0.1 only.
// Every client and server call passes --no-defaults first so /etc/mysql/my.cnf is never read.
import { execFileSync, spawn } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { LocalDbSettings } from './settings';

export interface LocalServerPaths {
  dataDir: string;
  runDir: string;
  socket: string;
  pidFile: string;
  errorLog: string;
}

export function localServerPaths(config: LocalDbSettings): LocalServerPaths {
  const runDir = path.join(config.dataDir, 'run');
  return {
    dataDir: path.join(config.dataDir, 'mariadb'),
    runDir,
    socket: path.join(runDir, 'mariadb.sock'),
    pidFile: path.join(runDir, 'mariadb.pid'),
    errorLog: path.join(runDir, 'mariadb.err'),
  };
}

const osUser = () => os.userInfo().username;

function ping(paths: LocalServerPaths): boolean {
  try {
    execFileSync('mariadb-admin', ['--no-defaults', `--socket=${paths.socket}`, '--connect-timeout=2', 'ping'], {
      stdio: 'ignore',
    });
    return true;
  } catch {
    return false;
  }
}

function livePid(paths: LocalServerPaths): number | null {
  if (!existsSync(paths.pidFile)) return null;
  const pid = Number(readFileSync(paths.pidFile, 'utf8').trim());
  try {
    process.kill(pid, 0);
    return pid;
  } catch {
    return null;
  }
}

function errorLogTail(paths: LocalServerPaths): string {
  if (!existsSync(paths.errorLog)) return '(no error log)';
  return readFileSync(paths.errorLog, 'utf8').split('\n').slice(-25).join('\n');
}

function initialise(paths: LocalServerPaths) {
  mkdirSync(paths.dataDir, { recursive: true });
  execFileSync(
    'mariadb-install-db',
    [
      '--no-defaults',
      `--datadir=${paths.dataDir}`,
      `--user=${osUser()}`,
      '--auth-root-authentication-method=socket',
      '--skip-test-db',
      '--skip-name-resolve',
    ],
    { stdio: 'pipe' },
  );
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Starts the private server unless it already answers; resolves once it accepts connections. */
export async function startLocalServer(config: LocalDbSettings): Promise<{ started: boolean }> {
  const paths = localServerPaths(config);
  mkdirSync(paths.runDir, { recursive: true });
  if (livePid(paths) && ping(paths)) return { started: false };
  if (!existsSync(path.join(paths.dataDir, 'mysql'))) initialise(paths);
  rmSync(paths.socket, { force: true });
  const child = spawn(
    'mariadbd',
    [
      '--no-defaults',
      `--user=${osUser()}`,
      `--datadir=${paths.dataDir}`,
      '--bind-address=127.0.0.1',
      `--port=${config.db.port}`,
      `--socket=${paths.socket}`,
      `--pid-file=${paths.pidFile}`,
      `--log-error=${paths.errorLog}`,
      '--skip-name-resolve',
      '--skip-log-bin',
      '--character-set-server=utf8mb4',
      '--collation-server=utf8mb4_unicode_ci',
      '--default-time-zone=+00:00',
      '--innodb-flush-log-at-trx-commit=1',
      '--max-connections=500',
    ],
    { detached: true, stdio: 'ignore' },
  );
  child.unref();
  let exited = false;
  child.on('exit', () => (exited = true));
  for (let i = 0; i < 300; i++) {
    if (ping(paths)) return { started: true };
    if (exited) break;
    await sleep(100);
  }
  throw new Error(`MariaDB did not start on 127.0.0.1:${config.db.port}. Error log:\n${errorLogTail(paths)}`);
}

export async function stopLocalServer(config: LocalDbSettings): Promise<boolean> {
  const paths = localServerPaths(config);
  const pid = livePid(paths);
  if (!pid) return false;
  process.kill(pid, 'SIGTERM');
  for (let i = 0; i < 300 && livePid(paths) && ping(paths); i++) await sleep(100);
  return true;
}

/** Runs SQL as the socket-authenticated admin that mariadb-install-db created for the OS user. */
export function adminSql(config: LocalDbSettings, sql: string): string {
  const paths = localServerPaths(config);
  return execFileSync('mariadb', ['--no-defaults', `--socket=${paths.socket}`, `--user=${osUser()}`, '-N', '-e', sql], {
    encoding: 'utf8',
  });
}

const quote = (s: string) => `'${s.replace(/\\/g, '\\\\').replace(/'/g, "\\'")}'`;

/** Creates the app database and user; the user may also create and drop cw_test_* databases. */
export function ensureAppDatabase(config: LocalDbSettings) {
  const { database, user, password } = config.db;
  const statements = [`CREATE DATABASE IF NOT EXISTS \`${database}\``];
  for (const host of ['127.0.0.1', 'localhost']) {
    const account = `${quote(user)}@${quote(host)}`;
    statements.push(
      `CREATE USER IF NOT EXISTS ${account} IDENTIFIED BY ${quote(password)}`,
      `ALTER USER ${account} IDENTIFIED BY ${quote(password)}`,
      `GRANT ALL PRIVILEGES ON \`${database}\`.* TO ${account}`,
      `GRANT ALL PRIVILEGES ON \`cw\\_test\\_%\`.* TO ${account}`,
      `GRANT ALL PRIVILEGES ON \`cw\\_bench\\_%\`.* TO ${account}`,
    );
  }
  adminSql(config, statements.join(';\n') + ';');
}
