/**
 * The whole app as `npm start` runs it, thrown away afterwards: the client built by Vite for
 * production and served by Express, a fresh database with the demo seed, the mail catcher and the
 * S3 fake. The browser tests' global setup and the browser bench (`scripts/bench-browser.ts`) use it.
 */
import path from 'node:path';
import { build } from 'vite';
import { startTestStack, ROOT, type TestStack } from './stack';
import { loadConfig } from '../../server/config';
import { startServer, type RunningServer } from '../../server/index';
import { createDb } from '../../server/db/knex';
import { seedDemo } from '../../seeds/seed-demo';
import { freePort } from './free-port';

export interface WholeApp {
  stack: TestStack;
  server: RunningServer;
  stop: () => Promise<void>;
}

/** `minify: false` keeps the client's function names (for reading a profile). */
export async function startWholeApp(name: string, { minify = true }: { minify?: boolean } = {}): Promise<WholeApp> {
  const stack = await startTestStack(name);
  // Each run builds into its own folder, so parallel runs never overwrite each other's client.
  const clientDir = path.join(stack.workDir, 'client');
  // Build exactly what ships: vitest sets NODE_ENV=test, which would otherwise bundle React's
  // development build into the client under test.
  const nodeEnv = process.env.NODE_ENV;
  process.env.NODE_ENV = 'production';
  try {
    await build({ configFile: path.join(ROOT, 'vite.config.ts'), logLevel: 'error', mode: 'production', build: { outDir: clientDir, emptyOutDir: true, minify } });
  } finally {
    process.env.NODE_ENV = nodeEnv;
  }
  const port = await freePort();
  const config = loadConfig({ ...stack.env, PORT: String(port), PUBLIC_URL: `http://localhost:${port}` });
  const db = createDb(config.DATABASE_URL);
  await seedDemo(db, { bcryptCost: config.BCRYPT_COST });
  const server = await startServer(config, { db, clientDir });
  return {
    stack,
    server,
    stop: async () => {
      await server.close();
      await stack.stop();
    },
  };
}
