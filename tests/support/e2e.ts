/**
 * What the browser tests share: the demo people, signing in through the form, the workspace's
 * section strip, waiting for an autosave, the service worker taking over, and the survey as the
 * device holds it in IndexedDB, a file's browser and database, and calls to the API for set-up.
 * One copy here, so a change of the sign-in form or a label is made once.
 */
import { afterAll, beforeAll, expect, inject } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import type { z } from 'zod';
import { SurveySchema, type Survey } from '@shared/schemas/survey';
import { DEMO_USERS, type DemoUser } from '../../seeds/demo-people';
import { createDb, type Db } from '../../server/db/knex';
import { launchBrowser, screenshotPath } from './browser';

const demoUser = (email: string): DemoUser => {
  const user = DEMO_USERS.find((u) => u.email === email);
  if (!user) throw new Error(`no demo user ${email}`);
  return user;
};

/** The demo firm's people (seeds/demo-people.ts, as in the README). */
export const DEMO = {
  admin: demoUser('moira.lennox@skerrow.example'),
  engineer: demoUser('tomas.varga@skerrow.example'),
  surveyor: demoUser('ines.achterberg@skerrow.example'),
} as const;

/**
 * Signs in through the form and waits to leave the sign-in page. With `next`, asks the form to
 * return there and goes there if it did not; `baseUrl` is the app's (a test's proxy in front of it).
 */
export async function signIn(page: Page, who: { email: string; password: string }, next?: string, baseUrl: string = inject('baseUrl')): Promise<void> {
  await page.goto(`${baseUrl}/sign-in${next ? `?next=${encodeURIComponent(next)}` : ''}`);
  try {
    await page.getByLabel('E-mail').waitFor({ timeout: 30_000 });
  } catch (err) {
    await page.screenshot({ path: screenshotPath('sign-in-form-missing') });
    throw new Error(`no sign-in form: ${(await page.locator('body').innerText()).slice(0, 500)}`, { cause: err });
  }
  await page.getByLabel('E-mail').fill(who.email);
  await page.getByLabel('Password', { exact: true }).fill(who.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
  if (next && new URL(page.url()).pathname !== new URL(next, baseUrl).pathname) await page.goto(`${baseUrl}${next}`);
}

/**
 * On a survey already sent or reviewed (the browser tests share the demo casualty, which the review
 * test sends and accepts), the forms wait for "Make changes": chooses it, as a surveyor who means to
 * edit does. Call once the workspace shows.
 */
export async function makeChangesIfAsked(page: Page): Promise<void> {
  await page.getByTestId('workspace').waitFor({ timeout: 60_000 });
  const confirm = page.getByTestId('reviewed-guard-confirm');
  if (await confirm.isVisible()) await confirm.click();
}

/** Opens a section of the surveyor's workspace by its tab. */
export async function section(page: Page, name: string): Promise<void> {
  await page.getByRole('navigation', { name: 'Workspace sections' }).getByRole('button', { name, exact: true }).click();
}

/** Waits for the autosave of the form just edited to reach the device store. */
export async function waitSaved(page: Page): Promise<void> {
  await page.waitForTimeout(300);
  await page.getByTestId('save-state').filter({ hasText: 'Saved on this device' }).first().waitFor({ timeout: 10_000 });
}

/** Waits until the service worker holds the app (every chunk precached) and controls the page, as after a first visit. */
export async function offlineReady(page: Page): Promise<void> {
  const ready = await page.evaluate(() =>
    Promise.race([
      navigator.serviceWorker.ready.then(() => 'ready'),
      new Promise<string>((r) => setTimeout(() => r('the app did not register its service worker within 30 s'), 30_000)),
    ]),
  );
  expect(ready).toBe('ready');
  await page.reload();
  await expect.poll(() => page.evaluate(() => navigator.serviceWorker.controller !== null), { timeout: 30_000 }).toBe(true);
}

/** The survey document as this device holds it (IndexedDB, read directly). */
export async function localDoc(page: Page, id: string): Promise<Survey> {
  const doc = await page.evaluate(
    (surveyId) =>
      new Promise<unknown>((resolve, reject) => {
        const open = indexedDB.open('brineline');
        open.onerror = () => reject(open.error);
        open.onsuccess = () => {
          const get = open.result.transaction('surveys').objectStore('surveys').get(surveyId);
          get.onsuccess = () => resolve((get.result as { doc: unknown }).doc);
          get.onerror = () => reject(get.error);
        };
      }),
    id,
  );
  return SurveySchema.parse(doc);
}

/** What a browser test file starts once: a browser and, when asked, a connection to the test database. */
export interface E2eFile {
  readonly browser: Browser;
  readonly db: Db;
}

/**
 * Starts the file's browser (and with `db`, a database connection for rows the test sets up) in
 * `beforeAll` and closes them in `afterAll`. Call at the top of the file; read `browser` and `db`
 * inside tests, once they exist.
 */
export function startE2eFile(opts: { db?: boolean } = {}): E2eFile {
  let browser: Browser | undefined;
  let db: Db | undefined;
  beforeAll(async () => {
    browser = await launchBrowser();
    if (opts.db) db = createDb(inject('testEnv').DATABASE_URL);
  });
  afterAll(async () => {
    await browser?.close();
    await db?.destroy();
  });
  return {
    get browser() {
      if (!browser) throw new Error('the browser starts in beforeAll: use it inside a test');
      return browser;
    },
    get db() {
      if (!db) throw new Error(opts.db ? 'the database connection opens in beforeAll: use it inside a test' : 'startE2eFile was called without { db: true }');
      return db;
    },
  };
}

/**
 * Calls the API as the holder of `token`, as a test's set-up does through the real server; any
 * answer but 2xx throws with its body. The body is unknown: read it through `callAs`.
 */
export async function call(token: string, method: string, path: string, body?: unknown, baseUrl: string = inject('baseUrl')): Promise<unknown> {
  const res = await fetch(`${baseUrl}${path}`, {
    method,
    headers: { authorization: `Bearer ${token}`, ...(body ? { 'content-type': 'application/json' } : {}) },
    body: body ? JSON.stringify(body) : undefined,
  });
  const json: unknown = res.status === 204 ? null : await res.json();
  if (!res.ok) throw new Error(`${method} ${path}: ${res.status} ${JSON.stringify(json)}`);
  return json;
}

/** `call`, with the answer parsed by `schema` (pick the fields a test reads from the shared response schema). */
export async function callAs<S extends z.ZodType>(schema: S, token: string, method: string, path: string, body?: unknown): Promise<z.infer<S>> {
  return schema.parse(await call(token, method, path, body));
}
