/**
 * Starts the real Express app (createApp) on a random port against the test database. Each test
 * file gets its own app and makes its own rows, so files run in parallel without stepping on each other.
 */
import http from 'node:http';
import { inject } from 'vitest';
import { pino, type Logger } from 'pino';
import { createApp, type BrinelineApp } from '../../server/app';
import { loadConfig, type Config } from '../../server/config';
import { createDb, type Db } from '../../server/db/knex';
import type { PhotoStorage } from '../../server/storage/photo-store';

export interface TestApp {
  url: string;
  app: BrinelineApp;
  db: Db;
  config: Config;
  close: () => Promise<void>;
}

export async function startTestApp(overrides: Record<string, string> = {}, opts: { logger?: Logger; storage?: (config: Config) => PhotoStorage } = {}): Promise<TestApp> {
  const config = loadConfig({ ...inject('testEnv'), PORT: '0', ...overrides });
  const db = createDb(config.DATABASE_URL);
  const app = createApp({ db, config, logger: opts.logger ?? pino({ level: process.env.TEST_LOG ?? 'silent' }), storage: opts.storage?.(config) });
  const server = http.createServer(app);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', () => resolve()));
  const addr = server.address();
  const port = typeof addr === 'object' && addr ? addr.port : 0;
  return {
    url: `http://127.0.0.1:${port}`,
    app,
    db,
    config,
    close: async () => {
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await db.destroy();
    },
  };
}
