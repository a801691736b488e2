// Processes a test starts: each leads its own process group, so a kill reaches every child
// (a tsx wrapper's server included), and each pid is recorded so the run's teardown can fail
// when one outlived its test.
import { spawn, type ChildProcess, type SpawnOptions } from 'node:child_process';
import { mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import net from 'node:net';
import path from 'node:path';

const root = path.resolve(import.meta.dirname, '../..');
/** One file per started process group, removed when the group is gone. */
export const STARTED_DIR = path.join(root, '.data', `test-processes-${process.env.CAUSEWAY_TEST_PORT_OFFSET ?? 0}`);

export interface Started {
  child: ChildProcess;
  /** Signals the whole group and resolves once the leader has exited. */
  kill(signal?: NodeJS.Signals): Promise<void>;
  exited: Promise<number | null>;
}

export function startProcess(command: string, args: string[], options: SpawnOptions): Started {
  const child = spawn(command, args, { ...options, detached: true });
  const pid = child.pid!;
  mkdirSync(STARTED_DIR, { recursive: true });
  const record = path.join(STARTED_DIR, String(pid));
  writeFileSync(record, `${command} ${args.join(' ')}`);
  const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
  const kill = async (signal: NodeJS.Signals = 'SIGKILL') => {
    signalGroup(pid, signal);
    await exited;
    await waitForGroupGone(pid);
    rmSync(record, { force: true });
  };
  // a leader that exits by itself may leave its group behind: the record stays until kill()
  return { child, kill, exited };
}

function signalGroup(pgid: number, signal: NodeJS.Signals) {
  try {
    process.kill(-pgid, signal);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code !== 'ESRCH') throw err;
  }
}

/** True while any process of the group is alive (signal 0 only checks). */
export function groupAlive(pgid: number): boolean {
  try {
    process.kill(-pgid, 0);
    return true;
  } catch {
    return false;
  }
}

async function waitForGroupGone(pgid: number, ms = 5000) {
  const until = Date.now() + ms;
  while (groupAlive(pgid) && Date.now() < until) await new Promise((r) => setTimeout(r, 20));
}

/** Recorded groups with a process still alive (and what started them); dead records are cleared. */
export function survivors(): string[] {
  let names: string[] = [];
  try {
    names = readdirSync(STARTED_DIR);
  } catch {
    return [];
  }
  const alive: string[] = [];
  for (const name of names) {
    const file = path.join(STARTED_DIR, name);
    if (groupAlive(Number(name))) alive.push(`process group ${name}: ${readFileSync(file, 'utf8')}`);
    else rmSync(file, { force: true });
  }
  return alive;
}

/** A port nobody listens on now (the OS picks it). */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as net.AddressInfo;
      server.close(() => resolve(port));
    });
  });
}
