// Benchmarks run the app as a separate server process. It leads its own process group (tsx runs
// the script in a child, which a kill of tsx alone leaves running), listens on a port the OS
// picks, and is killed on every way this process can end.
import { spawn } from 'node:child_process';
import path from 'node:path';

export interface ServeProcess {
  url: string;
  stop(): Promise<void>;
}

function killGroup(pgid: number, signal: NodeJS.Signals) {
  try {
    process.kill(-pgid, signal);
  } catch {
    // already gone
  }
}

/** Starts server/cli/serve.ts with `env` on a free port; resolves once it listens. */
export async function startServeProcess(root: string, env: NodeJS.ProcessEnv): Promise<ServeProcess> {
  const child = spawn(path.join(root, 'node_modules/.bin/tsx'), ['server/cli/serve.ts'], {
    cwd: root,
    env: { ...process.env, ...env, PORT: '0' },
    stdio: ['ignore', 'pipe', 'inherit'],
    detached: true,
  });
  const pgid = child.pid!;
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  const killOnExit = () => killGroup(pgid, 'SIGKILL');
  const endOnSignal = (signal: NodeJS.Signals) => {
    killOnExit();
    process.exit(signal === 'SIGINT' ? 130 : 143);
  };
  process.on('exit', killOnExit); // also runs after process.exit() and an uncaught error
  process.once('SIGINT', endOnSignal);
  process.once('SIGTERM', endOnSignal);
  const url = await new Promise<string>((resolve, reject) => {
    let out = '';
    child.stdout!.on('data', (d: Buffer) => {
      out += d.toString();
      const m = /listening (http:\/\/\S+)/.exec(out);
      if (m) resolve(m[1]!);
    });
    child.once('exit', (code) => reject(new Error(`server exited (${code}) before listening`)));
  });
  return {
    url,
    stop: async () => {
      killGroup(pgid, 'SIGTERM'); // graceful: finishes requests in flight
      await exited;
      killGroup(pgid, 'SIGKILL');
      process.off('exit', killOnExit);
      process.off('SIGINT', endOnSignal);
      process.off('SIGTERM', endOnSignal);
    },
  };
}

/** The four safety settings a production start insists on, set for a benchmark's own database. */
export function benchProductionSettings(dbPassword: string, { demoData }: { demoData: boolean }): NodeJS.ProcessEnv {
  return {
    NODE_ENV: 'production',
    DEMO_MODE: demoData ? 'true' : 'false', // demo data signs in with the published demo password
    DB_PASSWORD: dbPassword,
    SESSION_SECRET: 'benchmark-only-secret-not-for-real-data-0123456789',
    COOKIE_SECURE: 'false',
  };
}
