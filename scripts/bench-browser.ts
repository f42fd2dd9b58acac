/**
 * The app where users run it (#18 item 5): headless Debian Chromium (playwright-core) on a 390 px
 * phone screen, the whole app as `npm start` serves it (production build, compressed static files,
 * demo seed), with the CPU throttled 4× through CDP `Emulation.setCPUThrottlingRate` (a mid-range phone).
 *
 * On the 200-space, 2,000-boundary survey, imported through the survey list, it prints:
 * - edit → loads painted: from the last keystroke of a sounding to the first frame after the space's
 *   loads changed (includes the form's 250 ms autosave pause), median and worst of several edits;
 * - the longest main-thread task during an edit (PerformanceObserver `longtask`, from the first
 *   keystroke until 1.5 s after the paint, so the save, the recomputation and the push all count);
 * - opening Loads and opening 3D: from the tap to the first frame showing them;
 * - elements in the document on every screen (the Ship screen and the largest);
 * - the bytes the device pushed for the one-sounding edit.
 * Then, unthrottled: the engine's per-edit path (`computeSurveySummary`) in Chromium on the
 * 4,000-boundary bench vessel (scripts/bench-engine-browser.ts: on the page and through a Web Worker,
 * wall clock and CPU time), and the sign-in page's transferred bytes on a first visit.
 *
 * Run: `npm run bench -- browser` (a few minutes: it builds the client).
 */
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { BrowserContext, CDPSession, Page } from 'playwright-core';
import { launchBrowser } from '../tests/support/browser';
import { startWholeApp } from '../tests/support/whole-app';
import { bigSurvey, elementCount, importSurvey, openContentsOf, SOUNDED_SPACE } from '../tests/support/big-survey';
import { DEMO, section, signIn } from '../tests/support/e2e';
import { benchEngineInChromium } from './bench-engine-browser';

const PHONE = { width: 390, height: 844 };
const THROTTLE = 4;
const EDITS = 7;
/** How long after the paint an edit's work (save, push) still counts towards its longest task. */
const SETTLE_MS = 1500;
const SECTIONS = ['Ship', 'Readings', 'Spaces', 'Contents', 'Boundaries', 'Loads', 'Stability', 'Flooding', '3D', 'Photos'] as const;

declare global {
  interface Window {
    __bench: { longTasks: { start: number; duration: number }[]; keys: number[]; clicks: number[] };
  }
}

/** Recorded in every page from its start: long tasks, keystrokes and taps, on the page's own clock. */
function recorder() {
  window.__bench = { longTasks: [], keys: [], clicks: [] };
  new PerformanceObserver((list) => {
    for (const e of list.getEntries()) window.__bench.longTasks.push({ start: e.startTime, duration: e.duration });
  }).observe({ type: 'longtask', buffered: true });
  addEventListener('keydown', (e) => window.__bench.keys.push(e.timeStamp), true);
  addEventListener('click', (e) => window.__bench.clicks.push(e.timeStamp), true);
}

/**
 * Resolves, on the page's clock, once `selector` matches (and its text is no longer `textWas`, when
 * given) and a frame has been painted after it: a requestAnimationFrame callback runs just before the
 * paint, a task queued from it runs just after.
 */
async function paintedWhen(page: Page, selector: string, textWas: string | null = null): Promise<number> {
  return page.evaluate(
    ([sel, was]) =>
      new Promise<number>((resolve) => {
        const done = () => {
          const el = document.querySelector(sel);
          return el !== null && (was === null || el.textContent !== was);
        };
        const check = () => (done() ? requestAnimationFrame(() => setTimeout(() => resolve(performance.now()), 0)) : requestAnimationFrame(check));
        check();
      }),
    [selector, textWas] as const,
  );
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const ms = (n: number) => `${n.toFixed(0)} ms`;
const verdict = (ok: boolean) => (ok ? 'met' : 'NOT MET');

async function longestTaskBetween(page: Page, from: number, to: number): Promise<number> {
  return page.evaluate(([a, b]) => Math.max(0, ...window.__bench.longTasks.filter((t) => t.start + t.duration >= a && t.start <= b).map((t) => t.duration)), [from, to] as const);
}

/** Edits the sounding of one space `EDITS` times, typing each value key by key as a person would. */
async function benchEdits(page: Page, pushes: number[]): Promise<{ painted: number[]; longest: number[] }> {
  await openContentsOf(page, SOUNDED_SPACE);
  const input = page.locator('input[name="layers.0.reading"]');
  const painted: number[] = [];
  const longest: number[] = [];
  for (let i = 0; i < EDITS; i++) {
    const before = await page.getByTestId('contents-summary').textContent();
    await input.click();
    await page.keyboard.press('ControlOrMeta+a');
    const firstKey = await page.evaluate(() => performance.now());
    pushes.length = 0;
    await page.keyboard.type(`${(3.1 + i * 0.37).toFixed(2)}`, { delay: 90 });
    const lastKey = await page.evaluate(() => window.__bench.keys[window.__bench.keys.length - 1]);
    const at = await paintedWhen(page, '[data-testid=contents-summary]', before);
    await page.waitForTimeout(SETTLE_MS);
    painted.push(at - lastKey);
    longest.push(await longestTaskBetween(page, firstKey, at + SETTLE_MS));
  }
  return { painted, longest };
}

/** From the tap on a section's tab to the first frame with `ready` true. */
async function openSection(page: Page, name: string, ready: string): Promise<number> {
  await section(page, name);
  const tap = await page.evaluate(() => window.__bench.clicks[window.__bench.clicks.length - 1]);
  return (await paintedWhen(page, ready)) - tap;
}

const LOADS_READY = '[data-testid=boundary-results] [data-testid=boundary-row]';
const MODEL_READY = '[data-testid=model-canvas][data-drawn=true]';

/** A first visit to the sign-in page: every byte on the wire for the page's own requests, and the service worker's precache after. */
async function benchSignInBytes(context: BrowserContext, url: string): Promise<string[]> {
  const page = await context.newPage();
  const cdp: CDPSession = await context.newCDPSession(page);
  await cdp.send('Network.enable');
  await cdp.send('Network.setCacheDisabled', { cacheDisabled: true });
  let bytes = 0;
  let requests = 0;
  cdp.on('Network.loadingFinished', (e) => {
    bytes += e.encodedDataLength;
    requests++;
  });
  let swBytes = 0;
  let swRequests = 0;
  context.on('requestfinished', (req) => {
    if (!req.serviceWorker()) return;
    void req.sizes().then((s) => {
      swBytes += s.responseBodySize + s.responseHeadersSize;
      swRequests++;
    });
  });
  await page.goto(`${url}/sign-in`, { timeout: 120_000 });
  await page.getByLabel('E-mail').waitFor({ timeout: 120_000 });
  // a busy host may never see a quiet half second: then the bytes counted by now are the page's
  await page.waitForLoadState('networkidle', { timeout: 30_000 }).catch(() => undefined);
  const pageBytes = bytes;
  const pageRequests = requests;
  // the service worker precaches the app once the page has shown
  await page.waitForTimeout(5000);
  await page.close();
  return [
    `Sign-in page, first visit: ${(pageBytes / 1024).toFixed(1)} KB transferred in ${pageRequests} requests (headers and compressed bodies; goal < 250 KB: ${verdict(pageBytes < 250 * 1024)})`,
    `  then the service worker precaches the app for offline use in the background: ${(swBytes / 1024).toFixed(1)} KB in ${swRequests} requests`,
  ];
}

export async function main(): Promise<void> {
  console.log('Starting the whole app (production build, demo seed)…');
  const app = await startWholeApp('bench-browser');
  const browser = await launchBrowser();
  // each figure is printed as soon as it is measured, so a later failure loses none
  const say = (...l: string[]) => console.log(l.join('\n'));
  try {
    const url = app.server.url;
    const context = await browser.newContext({ viewport: PHONE, deviceScaleFactor: 2, isMobile: true, hasTouch: true });
    // tsx names the functions it compiles with a helper the page lacks; page.evaluate bodies need it there
    await context.addInitScript({ content: 'globalThis.__name = (f) => f;' });
    await context.addInitScript(recorder);
    const page = await context.newPage();
    const pushes: number[] = [];
    page.on('request', (req) => {
      if (req.method() === 'POST' && new URL(req.url()).pathname === '/api/sync/push') pushes.push(req.postDataBuffer()?.length ?? 0);
    });
    await signIn(page, DEMO.surveyor, undefined, url);
    const survey = bigSurvey();
    console.log(`Importing the ${survey.compartments.length}-space, ${survey.boundaries.length}-boundary survey on a ${PHONE.width} px screen…`);
    await importSurvey(page, url, survey);
    // the new survey's first push (the whole document) is not the edit being measured
    await page.getByTestId('survey-sync').filter({ hasText: /^Synced/ }).waitFor({ timeout: 180_000 });
    const cdp = await context.newCDPSession(page);
    await cdp.send('Emulation.setCPUThrottlingRate', { rate: THROTTLE });
    say(`2,000-boundary survey (${survey.compartments.length} spaces), ${PHONE.width} px screen, CPU throttled ${THROTTLE}×:`);

    const edits = await benchEdits(page, pushes);
    await page.getByTestId('survey-sync').filter({ hasText: /^Synced/ }).waitFor({ timeout: 60_000 });
    const pushBytes = [...pushes];
    say(
      `  edit → loads painted (${EDITS} sounding edits, from the last keystroke, incl. the 250 ms autosave pause): median ${ms(median(edits.painted))}, worst ${ms(Math.max(...edits.painted))} (goal < 400 ms: ${verdict(median(edits.painted) < 400)})`,
      `  longest task during an edit: median ${ms(median(edits.longest))}, worst ${ms(Math.max(...edits.longest))} (goal ≤ 100 ms: ${verdict(Math.max(...edits.longest) <= 100)})`,
      `  one-sounding push as the device sent it: ${pushBytes.length ? pushBytes.map((b) => `${b} bytes`).join(', ') : 'none seen'} (goal < 2 KB: ${verdict(pushBytes.length > 0 && Math.max(...pushBytes) < 2048)})`,
    );

    const loads: number[] = [];
    for (let i = 0; i < 3; i++) {
      await section(page, 'Ship');
      await page.waitForTimeout(500);
      loads.push(await openSection(page, 'Loads', LOADS_READY));
    }
    say(`  opening Loads (from Ship, 3 times): ${loads.map(ms).join(', ')} (goal < 500 ms: ${verdict(median(loads) < 500)})`);
    await section(page, 'Ship');
    await page.waitForTimeout(500);
    const model = await openSection(page, '3D', MODEL_READY);
    say(`  opening 3D (first time, its chunk loaded from the server): ${ms(model)}`);

    await cdp.send('Emulation.setCPUThrottlingRate', { rate: 1 });
    const counts: Record<string, number> = {};
    for (const name of SECTIONS) {
      await section(page, name);
      if (name === '3D') await page.locator(MODEL_READY).waitFor({ timeout: 60_000 });
      await page.waitForTimeout(700);
      counts[name] = await elementCount(page);
    }
    const [maxName, maxCount] = Object.entries(counts).sort((a, b) => b[1] - a[1])[0];
    say(
      `  elements on the Ship screen: ${counts.Ship}; the most on any screen: ${maxCount} (${maxName}) (goal < 3,000: ${verdict(maxCount < 3000)})`,
      `  every screen: ${Object.entries(counts).map(([k, v]) => `${k} ${v}`).join(', ')}`,
    );
    await context.close();

    const plain = await browser.newContext();
    say(...(await benchEngineInChromium(browser, plain)));
    await plain.close();
    const fresh = await browser.newContext({ viewport: PHONE, isMobile: true });
    say(...(await benchSignInBytes(fresh, url)));
    await fresh.close();
  } finally {
    await browser.close();
    await app.stop();
  }
}

const invokedDirectly = process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url);
if (invokedDirectly) await main();
