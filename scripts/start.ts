/**
 * `npm start`: everything Brineline needs on one machine, in one process group.
 * PostgreSQL (Debian's package, data in .data/postgres), migrations and the demo seed, the local
 * mail catcher and S3-compatible store, the client built by Vite, and the Express server (in WORKERS
 * processes when set; see server/cluster.ts).
 * Ctrl-C stops all of it, the database included.
 */
import path from 'node:path';
import { build, createServer } from 'vite';
import { startPostgres } from './lib/postgres';
import { migrateLatest } from '../server/db/migrate';
import { startMailCatcher } from './lib/mail-catcher';
import { startS3Fake } from './lib/s3-fake';
import { loadConfig } from '../server/config';
import { createDb } from '../server/db/knex';
import { startServer, ROOT_DIR } from '../server/index';
import { forkWorkers, workersWanted } from '../server/cluster';
import { seedDemo } from '../seeds/seed-demo';
import { createS3PhotoStorage } from '../server/storage/photo-store';
import { DEMO_USERS } from '../seeds/demo-people';

const step = (msg: string) => console.log(`[brineline] ${msg}`);

async function main() {
  const dataDir = path.join(ROOT_DIR, '.data');
  const pgPort = Number(process.env.PG_PORT ?? 54329);
  const pg = startPostgres({ dataDir: path.join(dataDir, 'postgres'), port: pgPort, database: 'brineline', log: step });
  const cleanups: Array<() => Promise<void> | void> = [() => pg.stop()];
  let stopping = false;
  const stopAll = async (code: number) => {
    if (stopping) return;
    stopping = true;
    step('Stopping…');
    for (const fn of cleanups.reverse()) {
      try {
        await fn();
      } catch (err) {
        console.error(err);
      }
    }
    step('Stopped.');
    process.exit(code);
  };
  process.on('SIGINT', () => void stopAll(0));
  process.on('SIGTERM', () => void stopAll(0));

  try {
    const mailDir = path.join(dataDir, 'mail');
    const mail = await startMailCatcher({ port: Number(process.env.SMTP_PORT ?? 2525), dir: mailDir });
    cleanups.push(() => mail.close());
    step(`Mail catcher on smtp://127.0.0.1:${mail.port} (messages in ${mailDir})`);

    const s3 = await startS3Fake({ port: Number(process.env.S3_PORT ?? 4569), dir: path.join(dataDir, 's3'), bucket: 'brineline-photos' });
    cleanups.push(() => s3.close());
    step(`S3-compatible store on ${s3.endpoint}`);

    const config = loadConfig({
      DATABASE_URL: pg.url,
      SMTP_URL: `smtp://127.0.0.1:${mail.port}`,
      S3_ENDPOINT: s3.endpoint,
      DEV_MAIL_DIR: mailDir,
      ...process.env,
    });

    const db = createDb(config.DATABASE_URL);
    const applied = await migrateLatest(db);
    step(applied.length ? `Applied ${applied.length} migration(s).` : 'Database schema is up to date.');
    const seeded = await seedDemo(db, { bcryptCost: config.BCRYPT_COST, photos: createS3PhotoStorage(config) });
    step(seeded.created ? 'Seeded the demo firm and casualty.' : 'Demo data already present: kept as it is.');

    const dev = process.argv.includes('--dev');
    if (!dev && process.env.SKIP_BUILD !== '1') {
      step('Building the client with Vite…');
      await build({ configFile: path.join(ROOT_DIR, 'vite.config.ts'), logLevel: 'warn' });
    }

    const workers = dev ? 1 : workersWanted();
    if (workers > 1) {
      // N server processes sharing PORT (server/cluster.ts); each reads this configuration from its environment.
      await db.destroy();
      const running = forkWorkers(
        workers,
        { DATABASE_URL: config.DATABASE_URL, SMTP_URL: config.SMTP_URL, S3_ENDPOINT: config.S3_ENDPOINT, DEV_MAIL_DIR: config.DEV_MAIL_DIR },
        step,
      );
      cleanups.push(() => running.stop());
      await running.ready;
      step(`Brineline is running at http://localhost:${config.PORT} in ${workers} server processes`);
      return demoSignIns();
    }
    const server = await startServer(config, { db });
    cleanups.push(() => server.close());
    if (dev) {
      // Vite's dev server with HMR; it proxies /api to the Express server above.
      process.env.PORT = String(server.port);
      const vite = await createServer({ configFile: path.join(ROOT_DIR, 'vite.config.ts') });
      await vite.listen();
      cleanups.push(() => vite.close());
      step(`API on ${server.url}; open the Vite dev server at ${vite.resolvedUrls?.local[0] ?? 'http://localhost:5173'}`);
    } else {
      step(`Brineline is running at ${server.url}`);
    }
    demoSignIns();
  } catch (err) {
    console.error(`[brineline] Start-up failed: ${(err as Error).message}`);
    await stopAll(1);
  }
}

function demoSignIns() {
  step('Demo sign-ins:');
  for (const u of DEMO_USERS) step(`  ${u.role.padEnd(9)} ${u.email.padEnd(34)} ${u.password}`);
  step('Press Ctrl-C to stop everything.');
}

void main();
