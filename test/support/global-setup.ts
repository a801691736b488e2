// Once per test run: the private MariaDB and a mail catcher that the tests read.
import { ensureAppDatabase, startLocalServer, stopLocalServer } from '../../db/local-server';
import { startMailCatcher } from '../../server/mail/catcher';
import { testConfig } from './env';
import { survivors } from './processes';

export default async function setup() {
  const config = testConfig();
  const leftOver = survivors();
  if (leftOver.length > 0) throw new Error(`Processes from an earlier test run are still alive; stop them first:\n${leftOver.join('\n')}`);
  const { started } = await startLocalServer(config);
  ensureAppDatabase(config);
  const stopCatcher = await startMailCatcher(config);
  return async () => {
    await stopCatcher();
    const alive = survivors();
    if (alive.length > 0) {
      // vitest reports a teardown error but still exits 0: set the exit code as well
      process.exitCode = 1;
      throw new Error(`Tests left processes running:\n${alive.join('\n')}`);
    }
    // Leave a server that was already running (e.g. by npm start) alone.
    if (started && process.env.CI) await stopLocalServer(config);
  };
}
