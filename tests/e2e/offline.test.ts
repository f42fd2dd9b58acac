/**
 * Offline work in real Chromium: the app and a survey open with no network after a reload, an edit
 * made offline reaches PostgreSQL when the link returns, an edit that collides with a colleague's is
 * shown as a conflict and settled on the device, and a new version of the app waits until the outbox
 * is empty and the user agrees.
 */
import http from 'node:http';
import { randomUUID } from 'node:crypto';
import { describe, expect, inject, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import type { Survey } from '@shared/schemas/survey';
import { DEMO_USERS } from '../../seeds/demo-people';
import { screenshotPath } from '../support/browser';
import { newSurvey, tokenFor } from '../support/surveys';
import { SimDevice } from '../support/sync-device';
import { signIn, startE2eFile } from '../support/e2e';

const baseUrl = inject('baseUrl');
const env = inject('testEnv');
const SURVEYOR = DEMO_USERS.find((u) => u.role === 'surveyor' && u.email.endsWith('skerrow.example'))!;
const ENGINEER = DEMO_USERS.find((u) => u.role === 'engineer')!;

const e2e = startE2eFile({ db: true });

/** A survey made on the server by the engineer's "other device", for this test only. */
async function surveyOnServer(base: string): Promise<{ survey: Survey; shore: SimDevice }> {
  const shore = new SimDevice(base, await tokenFor(env.JWT_SECRET, { ...ENGINEER, id: ENGINEER.id, orgId: ENGINEER.orgId }));
  const survey = newSurvey({ title: `Offline check ${randomUUID().slice(0, 6)}` });
  shore.create(survey);
  await shore.sync();
  return { survey, shore };
}

/** Waits for the service worker to be active, so a reload with no network is served from it. */
async function waitForServiceWorker(page: Page) {
  const state = await page.evaluate(async () => {
    const ready = await Promise.race([
      navigator.serviceWorker.ready.then(() => 'ready'),
      new Promise<string>((r) => setTimeout(() => r('not ready after 30 s'), 30_000)),
    ]);
    const regs = await navigator.serviceWorker.getRegistrations();
    return { ready, registrations: regs.map((r) => ({ scope: r.scope, active: r.active?.state, installing: r.installing?.state, waiting: r.waiting?.state })) };
  });
  expect(state, JSON.stringify(state)).toMatchObject({ ready: 'ready' });
}

const syncState = (page: Page) => page.getByTestId('sync-status').getAttribute('data-state');
const pending = async (page: Page) => Number(await page.getByTestId('sync-status').getAttribute('data-pending'));

async function waitSynced(page: Page) {
  try {
    await expect.poll(() => syncState(page), { timeout: 45_000 }).toBe('synced');
  } catch (err) {
    // Say why the device is not synced: what its panel shows, and what the server holds open.
    const panel = await page.getByTestId('sync-status').innerText().catch(() => '(no sync panel)');
    const open = await e2e.db('survey_conflicts').where({ status: 'open' }).select('survey_id', 'target', 'created_at');
    const rejected = await e2e.db('processed_changes').where({ status: 'rejected' }).select('survey_id', 'reason');
    throw new Error(`Not synced. Panel: ${panel}. Open conflicts: ${JSON.stringify(open)}. Rejected changes: ${JSON.stringify(rejected)}.`, { cause: err });
  }
}

async function serverTitle(id: string): Promise<string> {
  const row = await e2e.db('surveys').where({ id }).first('doc');
  return (row.doc as Survey).title;
}

/** Opens the survey and changes its title in the Ship section (autosaved to the device). */
async function editTitle(page: Page, title: string) {
  const field = page.getByLabel('Survey title');
  await field.waitFor();
  await field.fill(title);
  await field.blur();
  await expect.poll(() => pending(page), { timeout: 10_000 }).toBeGreaterThan(0);
}

describe('working with no network', () => {
  it('opens the app and the survey after an offline reload, and the offline edit reaches PostgreSQL', async () => {
    const { survey } = await surveyOnServer(baseUrl);
    const context = await e2e.browser.newContext({ viewport: { width: 390, height: 844 } });
    const page = await context.newPage();
    try {
      await signIn(page, SURVEYOR);
      await waitForServiceWorker(page);
      await waitSynced(page);
      await page.goto(`${baseUrl}/surveys/${survey.id}`);
      await page.getByTestId('workspace').waitFor();

      await context.setOffline(true);
      await page.reload();
      await page.getByTestId('workspace').waitFor({ timeout: 20_000 });
      await expect(page.getByLabel('Survey title').inputValue()).resolves.toBe(survey.title);
      await expect.poll(() => syncState(page)).toBe('offline');
      // The API is never answered from the cache.
      const apiFromCache = await page.evaluate(() =>
        fetch('/api/health').then(
          (r) => r.status,
          () => 'network error',
        ),
      );
      expect(apiFromCache).toBe('network error');

      await editTitle(page, 'Edited on deck with no signal');
      await expect(page.getByTestId('sync-label').textContent()).resolves.toMatch(/Offline · 1 waiting/);
      await page.screenshot({ path: screenshotPath('offline-edit-waiting') });
      // Closing the phone's browser tab and reopening: the edit is still there.
      await page.reload();
      await page.getByTestId('workspace').waitFor({ timeout: 20_000 });
      await expect(page.getByLabel('Survey title').inputValue()).resolves.toBe('Edited on deck with no signal');
      expect(await serverTitle(survey.id)).toBe(survey.title);

      // The reloaded page may never hear the `online` event: its probe notices the link within a few
      // seconds, long before the retry timer's back-off (16–19 s by then) would.
      await context.setOffline(false);
      const back = Date.now();
      await expect.poll(() => syncState(page), { timeout: 10_000, interval: 250 }).toBe('synced');
      const reconnectS = (Date.now() - back) / 1000;
      console.log(`offline reload: synced ${reconnectS.toFixed(1)} s after the link returned`);
      expect(reconnectS).toBeLessThan(10);
      expect(await serverTitle(survey.id)).toBe('Edited on deck with no signal');
      await expect(page.getByTestId('sync-label').textContent()).resolves.toMatch(/Synced at \d\d:\d\d/);
    } finally {
      await context.close();
    }
  });

  it('shows a clash with a colleague’s edit as a conflict and settles it on the device', async () => {
    const { survey, shore } = await surveyOnServer(baseUrl);
    const context = await e2e.browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    try {
      await signIn(page, SURVEYOR);
      await waitSynced(page);
      await page.goto(`${baseUrl}/surveys/${survey.id}`);
      await page.getByTestId('workspace').waitFor();

      await context.setOffline(true);
      await editTitle(page, 'Title from the deck');
      // Meanwhile ashore, the engineer changes the same field.
      shore.edit(survey.id, { kind: 'set', path: 'title', value: 'Title from the shore' });
      await shore.sync();
      await context.setOffline(false);

      await expect.poll(() => syncState(page), { timeout: 30_000 }).toBe('attention');
      await page.getByTestId('sync-status').locator('summary').click();
      const item = page.getByTestId('conflict').first();
      await item.waitFor();
      await expect(item.getByTestId('conflict-proposed').textContent()).resolves.toContain('Title from the deck');
      await expect(item.getByTestId('conflict-kept').textContent()).resolves.toContain('Title from the shore');
      // Nothing silently overwritten: the server still holds the shore's value until someone chooses.
      expect(await serverTitle(survey.id)).toBe('Title from the shore');
      await page.screenshot({ path: screenshotPath('offline-conflict') });

      await item.getByTestId('conflict-proposed').getByRole('button', { name: 'Keep this' }).click();
      await expect.poll(() => serverTitle(survey.id), { timeout: 30_000 }).toBe('Title from the deck');
      await waitSynced(page);
      const row = await e2e.db('survey_conflicts').where({ survey_id: survey.id }).first('status');
      expect(row.status).toBe('resolved');
      await shore.pull();
      expect(shore.doc(survey.id)?.title).toBe('Title from the deck');
    } finally {
      await context.close();
    }
  });
});

/**
 * A front for the app server that can "deploy" a new service worker (a changed sw.js) and hold
 * pushes back (503), so the test controls when the outbox can empty.
 */
async function startDeployProxy(target: string) {
  const upstream = new URL(target);
  const flags = { deployed: false, holdPushes: false };
  const server = http.createServer((req, res) => {
    if (flags.holdPushes && req.url?.startsWith('/api/sync/push')) {
      res.writeHead(503, { 'content-type': 'application/json' });
      res.end(JSON.stringify({ error: { code: 'service_unavailable', message: 'Held by the test.', requestId: 'test' } }));
      req.resume();
      return;
    }
    if (flags.deployed && req.url?.split('?')[0] === '/sw.js') {
      // Ask for the whole file, so the changed one is what the browser compares.
      delete req.headers['if-none-match'];
      delete req.headers['if-modified-since'];
      // …uncompressed, so "build 2" can be appended (static files are served pre-compressed).
      delete req.headers['accept-encoding'];
    }
    const up = http.request(
      // The Host header stays the proxy's, so the app's same-origin check sees one origin, as in production behind a proxy.
      { host: upstream.hostname, port: upstream.port, method: req.method, path: req.url, headers: req.headers },
      (r) => {
        if (flags.deployed && req.url?.split('?')[0] === '/sw.js' && r.statusCode === 200) {
          const chunks: Buffer[] = [];
          r.on('data', (c: Buffer) => chunks.push(c));
          r.on('end', () => {
            const body = Buffer.concat([...chunks, Buffer.from('\n// build 2\n')]);
            res.writeHead(200, { 'content-type': 'text/javascript', 'cache-control': 'no-cache' });
            res.end(body);
          });
          return;
        }
        res.writeHead(r.statusCode ?? 502, r.headers);
        r.pipe(res);
      },
    );
    up.on('error', () => res.destroy());
    req.pipe(up);
  });
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
  const port = (server.address() as { port: number }).port;
  return {
    url: `http://127.0.0.1:${port}`,
    flags,
    close: async () => {
      server.closeAllConnections();
      await new Promise<void>((r) => server.close(() => r()));
    },
  };
}

describe('a new version deployed during work', () => {
  it('waits until the outbox is empty and the user agrees', async () => {
    const proxy = await startDeployProxy(baseUrl);
    const { survey } = await surveyOnServer(baseUrl);
    let context: BrowserContext | undefined;
    try {
      context = await e2e.browser.newContext({ viewport: { width: 390, height: 844 } });
      const page = await context.newPage();
      await signIn(page, SURVEYOR, undefined, proxy.url);
      await waitForServiceWorker(page);
      await waitSynced(page);
      await page.goto(`${proxy.url}/surveys/${survey.id}`);
      await page.getByTestId('workspace').waitFor();
      await page.evaluate(() => ((window as unknown as { __sameDocument: boolean }).__sameDocument = true));

      proxy.flags.holdPushes = true;
      await editTitle(page, 'Edited while a deploy lands');
      proxy.flags.deployed = true;
      await page.evaluate(async () => {
        const reg = await navigator.serviceWorker.getRegistration();
        await reg?.update();
      });
      const banner = page.getByTestId('update-banner');
      await banner.waitFor({ timeout: 30_000 });
      await expect(banner.textContent()).resolves.toContain('A new version of Brineline is ready');

      // Never forced: the page stays as it is…
      await page.waitForTimeout(1500);
      expect(await page.evaluate(() => (window as unknown as { __sameDocument?: boolean }).__sameDocument)).toBe(true);
      // …and agreeing while a change waits does not reload either: it says why.
      await banner.getByRole('button', { name: 'Update' }).click();
      await page.getByTestId('update-blocked').waitFor({ timeout: 20_000 });
      await expect(page.getByTestId('update-blocked').textContent()).resolves.toMatch(/(1 change is|\d+ changes are) still waiting/);
      expect(await page.evaluate(() => (window as unknown as { __sameDocument?: boolean }).__sameDocument)).toBe(true);
      // the title's edit (an autosave may queue it in more than one change while the push is held)
      expect(await pending(page)).toBeGreaterThan(0);
      await page.screenshot({ path: screenshotPath('offline-update-waits') });

      // The link is back: the change syncs, and now the update goes ahead when asked.
      proxy.flags.holdPushes = false;
      // The reload waits for the held change to sync (the engine may be backing off after the 503s).
      const reloaded = page.waitForEvent('load', { timeout: 60_000 });
      await banner.getByRole('button', { name: 'Update' }).click();
      await reloaded.catch(async (err: unknown) => {
        // Say where it stopped: the banner, the outbox, the sync panel and the service workers.
        const seen = {
          banner: await banner.innerText({ timeout: 1000 }).catch(() => '(no banner)'),
          pending: await pending(page).catch(() => '(unknown)'),
          panel: await page.getByTestId('sync-status').innerText({ timeout: 1000 }).catch(() => '(no sync panel)'),
          workers: await page
            .evaluate(async () => {
              const reg = await navigator.serviceWorker.getRegistration();
              return { installing: reg?.installing?.state, waiting: reg?.waiting?.state, active: reg?.active?.state, controlled: Boolean(navigator.serviceWorker.controller) };
            })
            .catch(() => '(unknown)'),
        };
        throw new Error(`The page did not reload after Update: ${JSON.stringify(seen)}`, { cause: err });
      });
      expect(await page.evaluate(() => (window as unknown as { __sameDocument?: boolean }).__sameDocument)).toBeUndefined();
      expect(await serverTitle(survey.id)).toBe('Edited while a deploy lands');
      const waiting = await page.evaluate(async () => Boolean((await navigator.serviceWorker.getRegistration())?.waiting));
      expect(waiting).toBe(false);
    } finally {
      await context?.close();
      await proxy.close();
    }
  }, 240_000);
});
