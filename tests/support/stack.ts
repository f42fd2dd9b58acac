/**
 * The services a test run needs, each started fresh and thrown away at the end: a PostgreSQL
 * cluster in .tmp (never the `npm start` data), the mail catcher and the S3-compatible store.
 */
import fs from 'node:fs';
import path from 'node:path';
import { startPostgres, type PgCluster } from '../../scripts/lib/postgres';
import { migrateLatest } from '../../server/db/migrate';
import { startMailCatcher, type MailCatcher } from '../../scripts/lib/mail-catcher';
import { startS3Fake, type S3Fake } from '../../scripts/lib/s3-fake';
import { createDb } from '../../server/db/knex';
import { freePort } from './free-port';

export const ROOT = path.resolve(import.meta.dirname, '../..');

export interface TestStack {
  pg: PgCluster;
  mail: MailCatcher;
  s3: S3Fake;
  workDir: string;
  env: Record<string, string>;
  stop: () => Promise<void>;
}

export async function startTestStack(name: string): Promise<TestStack> {
  const workDir = path.join(ROOT, '.tmp', `${name}-${process.pid}-${Date.now()}`);
  fs.mkdirSync(workDir, { recursive: true });
  const pg = startPostgres({
    dataDir: path.join(workDir, 'postgres'),
    port: await freePort(),
    database: 'brineline_test',
    log: () => undefined,
  });
  const db = createDb(pg.url);
  try {
    await migrateLatest(db);
  } finally {
    await db.destroy();
  }
  const mail = await startMailCatcher({ port: await freePort(), dir: path.join(workDir, 'mail') });
  const s3 = await startS3Fake({ port: await freePort(), dir: path.join(workDir, 's3'), bucket: 'brineline-photos' });
  const env = {
    NODE_ENV: 'test',
    DATABASE_URL: pg.url,
    SMTP_URL: `smtp://127.0.0.1:${mail.port}`,
    DEV_MAIL_DIR: mail.dir,
    S3_ENDPOINT: s3.endpoint,
    BCRYPT_COST: '4',
    LOG_LEVEL: 'silent',
    JWT_SECRET: 'test-secret-test-secret-test-secret-0123456789',
  };
  return {
    pg,
    mail,
    s3,
    workDir,
    env,
    stop: async () => {
      await mail.close().catch(() => undefined);
      await s3.close().catch(() => undefined);
      pg.stop();
      fs.rmSync(workDir, { recursive: true, force: true });
    },
  };
}
