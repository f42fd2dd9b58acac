/**
 * Outgoing e-mail behind one small interface. In production it is nodemailer over SMTP_URL to the
 * firm's provider; `npm start` and the tests point SMTP_URL at the local mail catcher
 * (scripts/lib/mail-catcher.ts). Tests may inject their own Mailer through AppDeps.
 */
import nodemailer from 'nodemailer';
import type { Config } from '../config';

export interface MailMessage {
  to: string;
  subject: string;
  text: string;
  html: string;
  /** The organisation on whose behalf the message goes (a header, so the development mailbox can keep firms apart). */
  orgId: string;
  /** The member who sent it, if a person did: the development mailbox shows them their own messages. */
  sentBy?: string;
}

/** Header naming the sending organisation; the development mailbox shows a firm only its own. */
export const ORG_HEADER = 'X-Brineline-Organisation';
/** Header naming the member who sent a message (development mailbox only; nothing else reads it). */
export const SENT_BY_HEADER = 'X-Brineline-Sent-By';

export interface Mailer {
  send(message: MailMessage): Promise<void>;
}

export function createMailer(config: Pick<Config, 'SMTP_URL' | 'MAIL_FROM'>): Mailer {
  const transport = nodemailer.createTransport(config.SMTP_URL);
  return {
    async send(message) {
      const { orgId, sentBy, ...mail } = message;
      await transport.sendMail({ from: config.MAIL_FROM, ...mail, headers: { [ORG_HEADER]: orgId, ...(sentBy ? { [SENT_BY_HEADER]: sentBy } : {}) } });
    },
  };
}
