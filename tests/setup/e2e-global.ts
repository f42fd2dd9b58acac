/**
 * Browser tests run against the whole app as `npm start` runs it: the client built by Vite and
 * served by Express, a throwaway database with the demo seed, the mail catcher and the S3 fake.
 */
import type { TestProject } from 'vitest/node';
import { ensureChromium } from '../support/browser';
import { startWholeApp, type WholeApp } from '../support/whole-app';

let app: WholeApp | undefined;

export async function setup(project: TestProject) {
  ensureChromium();
  app = await startWholeApp('e2e');
  project.provide('testEnv', { ...app.stack.env, PUBLIC_URL: app.server.url });
  project.provide('baseUrl', app.server.url);
}

export async function teardown() {
  await app?.stop();
}
