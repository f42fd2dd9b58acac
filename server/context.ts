/**
 * What the app is built from. `createApp` (server/app.ts) takes these once, builds every service from
 * them (server/services/index.ts) and hands the routes their services; nothing below the root reads
 * them again on its own.
 */
import type { Logger } from 'pino';
import type { Config } from './config';
import type { Db } from './db/knex';
import type { Mailer } from './mail/mailer';
import type { PhotoStorage } from './storage/photo-store';

export interface AppDeps {
  db: Db;
  config: Config;
  logger: Logger;
  /** Folder with the built client (index.html and assets); not served when absent. */
  clientDir?: string;
  /** Outgoing e-mail; nodemailer over SMTP_URL when not given. */
  mailer?: Mailer;
  /** Photo bytes; S3-compatible storage from S3_* config when not given. */
  storage?: PhotoStorage;
}

/** AppDeps with every optional dependency resolved: what the service factories receive. */
export type AppContext = AppDeps & { mailer: Mailer; storage: PhotoStorage };
