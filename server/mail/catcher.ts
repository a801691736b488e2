// The local mail catcher (maildev) on loopback: every e-mail Causeway sends lands here in demo mode.
import path from 'node:path';
import { MailDev } from 'maildev';
import type { Config } from '../config';

async function answering(config: Config): Promise<boolean> {
  const res = await fetch(`http://${config.mail.host}:${config.mail.webPort}/api/email`, { signal: AbortSignal.timeout(1000) }).catch(() => null);
  return Boolean(res?.ok);
}

/** Starts maildev unless one already answers on the configured ports; returns a stop function. */
export async function startMailCatcher(config: Config, options: { persist?: boolean } = {}): Promise<() => Promise<void>> {
  if (await answering(config)) return async () => {};
  const maildev = new MailDev({
    smtp: config.mail.port,
    ip: '127.0.0.1',
    web: config.mail.webPort,
    webIp: '127.0.0.1',
    silent: true,
    ...(options.persist ? { mailDirectory: path.join(config.dataDir, 'mail') } : {}),
  });
  try {
    await maildev.start();
  } catch (err) {
    // Another process started one on these ports a moment ago: use that one.
    if ((err as { code?: string }).code === 'EADDRINUSE') return async () => {};
    throw err;
  }
  return () => maildev.stop();
}
