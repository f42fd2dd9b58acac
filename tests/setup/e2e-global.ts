/**
 * Browser tests run against the whole app as `npm start` runs it: the client built by Vite and
 * served by Express, a throwaway database with the demo seed, the mail catcher and the S3 fake.
 */
import path from 'node:path';
import { build } from 'vite';
import type { TestProject } from 'vitest/node';
import { startTestStack, ROOT, type TestStack } from '../support/stack';
import { ensureChromium } from '../support/browser';
import { loadConfig } from '../../server/config';
import { startServer, type RunningServer } from '../../server/index';
import { createDb } from '../../server/db/knex';
import { seedDemo } from '../../seeds/seed-demo';
import { createS3PhotoStorage } from '../../server/storage/photo-store';
import { freePort } from '../support/free-port';

let stack: TestStack | undefined;
let server: RunningServer | undefined;

export async function setup(project: TestProject) {
  ensureChromium();
  stack = await startTestStack('e2e');
  // Each run builds into its own folder, so parallel runs never overwrite each other's client.
  const clientDir = path.join(stack.workDir, 'client');
  // Build exactly what ships: vitest sets NODE_ENV=test, which would otherwise bundle React's
  // development build into the client under test.
  const nodeEnv = process.env.NODE_ENV;
  process.env.NODE_ENV = 'production';
  try {
    await build({ configFile: path.join(ROOT, 'vite.config.ts'), logLevel: 'error', mode: 'production', build: { outDir: clientDir, emptyOutDir: true } });
  } finally {
    process.env.NODE_ENV = nodeEnv;
  }
  const port = await freePort();
  const config = loadConfig({ ...stack.env, PORT: String(port), PUBLIC_URL: `http://localhost:${port}` });
  const db = createDb(config.DATABASE_URL);
  await seedDemo(db, { bcryptCost: config.BCRYPT_COST, photos: createS3PhotoStorage(config) });
  server = await startServer(config, { db, clientDir });
  project.provide('testEnv', { ...stack.env, PUBLIC_URL: server.url });
  project.provide('baseUrl', server.url);
}

export async function teardown() {
  await server?.close();
  await stack?.stop();
}
