// Once per test run: the private MariaDB and a mail catcher that the tests read.
import { ensureAppDatabase, startLocalServer, stopLocalServer } from '../../db/local-server';
import { startMailCatcher } from '../../server/mail/catcher';
import { testConfig } from './env';

export default async function setup() {
  const config = testConfig();
  const { started } = await startLocalServer(config);
  ensureAppDatabase(config);
  const stopCatcher = await startMailCatcher(config);
  return async () => {
    await stopCatcher();
    // Leave a server that was already running (e.g. by npm start) alone.
    if (started && process.env.CI) await stopLocalServer(config);
  };
}
