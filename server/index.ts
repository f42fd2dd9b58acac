/**
 * Production entry: reads the environment, connects to DATABASE_URL, runs pending migrations and
 * listens; with WORKERS > 1, in that many processes (server/cluster.ts). `npm start` (scripts/start.ts) wraps the same `startServer` with its own local services.
 */
import http from 'node:http';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { pino } from 'pino';
import { closeEnginePool } from './services/engine-pool';
import { createApp } from './app';
import { loadConfig, type Config } from './config';
import { createDb, type Db } from './db/knex';
import { migrateLatest } from './db/migrate';
import { forkWorkers, isServerWorker, workersWanted } from './cluster';

export const ROOT_DIR = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

export interface RunningServer {
  url: string;
  port: number;
  db: Db;
  close: () => Promise<void>;
}

export async function startServer(config: Config, opts: { clientDir?: string; db?: Db } = {}): Promise<RunningServer> {
  const logger = pino({ level: config.LOG_LEVEL, base: { app: 'brineline' } });
  const db = opts.db ?? createDb(config.DATABASE_URL);
  const app = createApp({ db, config, logger, clientDir: opts.clientDir ?? path.join(ROOT_DIR, 'dist', 'client') });
  const server = http.createServer(app);
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(config.PORT, '0.0.0.0', () => resolve());
  });
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : config.PORT;
  return {
    url: `http://localhost:${port}`,
    port,
    db,
    close: async () => {
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await db.destroy();
      await closeEnginePool();
    },
  };
}

const invokedDirectly = process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url);
if (invokedDirectly) {
  const config = loadConfig();
  if (isServerWorker()) {
    // Forked by a primary (below or scripts/start.ts) that has run the migrations already.
    await serveUntilSignalled(await startServer(config));
  } else {
    const db = createDb(config.DATABASE_URL);
    await migrateLatest(db);
    const workers = workersWanted();
    if (workers > 1) {
      await db.destroy();
      const running = forkWorkers(workers, {}, (msg) => console.log(`[brineline] ${msg}`));
      // Listen for the stop before the workers are up: a SIGTERM while one is still starting must
      // stop them all, not kill this process and leave them behind.
      let stopping = false;
      const shutdown = () => {
        stopping = true;
        void running.stop().then(() => process.exit(0));
      };
      process.on('SIGINT', shutdown);
      process.on('SIGTERM', shutdown);
      try {
        await running.ready;
        console.log(`Brineline listening on ${config.publicUrl} (${workers} worker processes)`);
      } catch (err) {
        // a worker stopped on our own signal before it listened is no failure: the shutdown exits
        if (!stopping) throw err;
      }
    } else {
      const running = await startServer(config, { db });
      console.log(`Brineline listening on ${running.url}`);
      await serveUntilSignalled(running);
    }
  }
}

/** Closes the server and exits on SIGINT / SIGTERM (once, however many signals come). */
async function serveUntilSignalled(running: RunningServer): Promise<void> {
  let closing = false;
  const shutdown = () => {
    if (closing) return;
    closing = true;
    void running.close().then(() => process.exit(0));
  };
  process.on('SIGINT', shutdown);
  process.on('SIGTERM', shutdown);
}
