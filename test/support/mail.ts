// Reads what the test mail catcher caught.
import { TEST_MAIL } from './env';

export interface CaughtMail {
  id: string;
  subject: string;
  to: { address: string }[];
  text: string;
  html?: string;
}

export async function mailTo(address: string, { timeoutMs = 5000, subject }: { timeoutMs?: number; subject?: RegExp } = {}): Promise<CaughtMail[]> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const res = await fetch(`http://127.0.0.1:${TEST_MAIL.web}/api/email`);
    const all = (await res.json()) as CaughtMail[];
    const mine = all.filter((m) => m.to.some((t) => t.address.toLowerCase() === address.toLowerCase()) && (!subject || subject.test(m.subject)));
    if (mine.length > 0 || Date.now() > until) return mine;
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** The one-time token in the first link of the newest message to `address`. */
export async function tokenFromMail(address: string, subject?: RegExp): Promise<string> {
  const messages = await mailTo(address, { subject });
  const latest = messages.at(-1);
  const match = latest?.text.match(/token=([A-Za-z0-9_-]+)/);
  if (!match) throw new Error(`no token in mail to ${address}`);
  return match[1]!;
}
