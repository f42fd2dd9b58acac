/** Reads what the local mail catcher received (the folder in inject('testEnv').DEV_MAIL_DIR). */
import { inject } from 'vitest';
import { readCaughtMail, type CaughtMail } from '../../scripts/lib/mail-catcher';

/** Waits for the newest message to `to` (optionally whose subject contains `subject`). */
export async function waitForMail(to: string, opts: { subject?: string; after?: number; timeoutMs?: number } = {}): Promise<CaughtMail> {
  const dir = inject('testEnv').DEV_MAIL_DIR;
  const deadline = Date.now() + (opts.timeoutMs ?? 10_000);
  for (;;) {
    const found = readCaughtMail(dir).find(
      (m) =>
        m.to.some((t) => t.toLowerCase() === to.toLowerCase()) &&
        (!opts.subject || m.subject.includes(opts.subject)) &&
        (!opts.after || Date.parse(m.receivedAt) >= opts.after),
    );
    if (found) return found;
    if (Date.now() > deadline) throw new Error(`no e-mail to ${to} arrived`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** All messages to `to`, newest first. */
export const mailTo = (to: string): CaughtMail[] =>
  readCaughtMail(inject('testEnv').DEV_MAIL_DIR).filter((m) => m.to.some((t) => t.toLowerCase() === to.toLowerCase()));

/** The first Brineline link in a message's text, and the token after its '#'. */
export function linkIn(mail: CaughtMail): { url: string; token: string } {
  const m = /(https?:\/\/\S+?#([A-Za-z0-9_-]{43}))/.exec(mail.text);
  if (!m) throw new Error(`no link in the message "${mail.subject}"`);
  return { url: m[1], token: m[2] };
}
