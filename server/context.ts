import type { Logger } from 'pino';
import type { Db } from '../db/client';
import type { Config } from './config';
import type { Mailer } from './mail/mailer';

/** What every service receives: handed in, never imported, so tests can give their own. */
export interface AppContext {
  db: Db;
  config: Config;
  mailer: Mailer;
  log: Logger;
}
