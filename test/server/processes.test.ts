// Processes tests start die whole: tsx runs a script in a child process of its own, and a
// SIGKILL to tsx alone left that child (the real server) running. The helper kills the group.
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { groupAlive, startProcess } from '../support/processes';

const root = path.resolve(import.meta.dirname, '../..');
const alive = (pid: number) => {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
};

describe('started processes', () => {
  it('kills the process tsx runs the script in, not only tsx itself', async () => {
    const started = startProcess(path.join(root, 'node_modules/.bin/tsx'), ['-e', 'console.log(process.pid); setInterval(() => {}, 1000)'], { cwd: root, stdio: ['ignore', 'pipe', 'inherit'] });
    const scriptPid = await new Promise<number>((resolve) => started.child.stdout!.once('data', (d: Buffer) => resolve(Number(d.toString().trim()))));
    expect(scriptPid, 'tsx runs the script in a child process').not.toBe(started.child.pid);
    await started.kill('SIGKILL');
    expect(alive(scriptPid)).toBe(false);
    expect(groupAlive(started.child.pid!)).toBe(false);
  });
});
