/**
 * The local stand-in for an e-mail provider: an SMTP server (smtp-server) on loopback that parses
 * each message (mailparser) and writes it as JSON into a folder. The app's development-only
 * /api/dev/mail route and the tests read that folder.
 */
import fs from 'node:fs';
import path from 'node:path';
import { randomUUID } from 'node:crypto';
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';

export interface CaughtMail {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string;
  /** The sending organisation, from Brineline's X-Brineline-Organisation header. */
  organisationId?: string;
  /** The member who sent it (a brief's engineer, an invitation's admin), from X-Brineline-Sent-By. */
  sentById?: string;
}

export interface MailCatcher {
  port: number;
  dir: string;
  close: () => Promise<void>;
}

const headerText = (v: unknown): string | undefined => (typeof v === 'string' && v ? v : undefined);

export async function startMailCatcher(opts: { port: number; dir: string }): Promise<MailCatcher> {
  fs.mkdirSync(opts.dir, { recursive: true });
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          const mail: CaughtMail = {
            id: randomUUID(),
            receivedAt: new Date().toISOString(),
            from: parsed.from?.text ?? '',
            to: session.envelope.rcptTo.map((r) => r.address),
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : '',
            organisationId: headerText(parsed.headers.get('x-brineline-organisation')),
            sentById: headerText(parsed.headers.get('x-brineline-sent-by')),
          };
          const name = `${Date.now()}-${mail.id}.json`;
          // Write then rename, so a reader never sees a half-written message.
          const tmp = path.join(opts.dir, `.${name}.partial`);
          fs.writeFileSync(tmp, JSON.stringify(mail, null, 2));
          fs.renameSync(tmp, path.join(opts.dir, name));
          callback();
        })
        .catch((err: Error) => callback(err));
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port, '127.0.0.1', () => resolve());
  });
  const address = server.server.address();
  const port = typeof address === 'object' && address ? address.port : opts.port;
  return { port, dir: opts.dir, close: () => new Promise((resolve) => server.close(() => resolve())) };
}

/** Reads caught messages, newest first. */
export function readCaughtMail(dir: string): CaughtMail[] {
  if (!fs.existsSync(dir)) return [];
  return fs
    .readdirSync(dir)
    .filter((f) => f.endsWith('.json') && !f.startsWith('.'))
    .sort()
    .reverse()
    .map((f) => JSON.parse(fs.readFileSync(path.join(dir, f), 'utf8')) as CaughtMail);
}
