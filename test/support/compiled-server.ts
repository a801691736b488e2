// The server as npm run build makes it, run by plain node in a process group of its own.
import { randomBytes } from 'node:crypto';
import { rmSync } from 'node:fs';
import path from 'node:path';
import { buildServer } from '../../server/cli/build';
import { PRODUCTION_REQUIRED } from '../../server/config';
import { testConfig } from './env';
import { startProcess, type Started } from './processes';

const root = path.resolve(import.meta.dirname, '../..');

/** Compiles the server into a build folder of this test file's own (inside the repo, so it finds package.json). */
export async function compileServer(): Promise<{ dir: string; remove(): void }> {
  const dir = path.join(root, '.data', `test-build-${process.pid}-${randomBytes(3).toString('hex')}`);
  await buildServer(root, dir);
  return { dir, remove: () => rmSync(dir, { recursive: true, force: true }) };
}

/** The environment an operator would give, without the four safety settings unless `extra` has them. */
export function productionEnv(database: string, extra: Record<string, string> = {}): NodeJS.ProcessEnv {
  const config = testConfig();
  const env: NodeJS.ProcessEnv = { ...process.env, NODE_ENV: 'production', PORT: '0', LOG_LEVEL: 'warn', DB_NAME: database, SMTP_PORT: String(config.mail.port), ...extra };
  for (const name of Object.keys(PRODUCTION_REQUIRED)) if (!(name in extra)) delete env[name];
  return env;
}

/** All four safety settings set explicitly, as an operator would. */
export function operatorSettings(): Record<string, string> {
  return { DEMO_MODE: 'false', DB_PASSWORD: testConfig().db.password, SESSION_SECRET: randomBytes(32).toString('hex'), COOKIE_SECURE: 'false' };
}

export interface RunResult {
  code: number | null;
  stdout: string;
  stderr: string;
}

/** Runs one compiled program to its end. */
export async function runCompiled(dir: string, program: string, args: string[], env: NodeJS.ProcessEnv): Promise<RunResult> {
  const started = startProcess(process.execPath, [path.join(dir, program), ...args], { cwd: root, env, stdio: ['ignore', 'pipe', 'pipe'] });
  const out = collect(started);
  const code = await started.exited;
  await started.kill();
  return { code, ...out() };
}

/** Starts the compiled server and resolves with its URL once it listens (or rejects with its output). */
export async function startCompiledServer(dir: string, env: NodeJS.ProcessEnv): Promise<Started & { url: string }> {
  const started = startProcess(process.execPath, [path.join(dir, 'server/cli/serve.js')], { cwd: root, env, stdio: ['ignore', 'pipe', 'pipe'] });
  const out = collect(started);
  const url = await new Promise<string>((resolve, reject) => {
    started.child.stdout!.on('data', () => {
      const m = /listening (http:\/\/\S+)/.exec(out().stdout);
      if (m) resolve(m[1]!);
    });
    void started.exited.then((code) => reject(new Error(`server exited ${code} before listening:\n${out().stderr}`)));
  });
  return { ...started, url };
}

function collect(started: Started) {
  let stdout = '';
  let stderr = '';
  started.child.stdout!.on('data', (d: Buffer) => (stdout += d.toString()));
  started.child.stderr!.on('data', (d: Buffer) => (stderr += d.toString()));
  return () => ({ stdout, stderr });
}
