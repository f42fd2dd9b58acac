/**
 * The engine in headless Chromium (#18 item 5): the per-edit path (`computeSurveySummary`) on the
 * 4,000-boundary bench vessel, bundled as the app bundles it (scripts/lib/engine-bundle.ts),
 * unthrottled. What a figure from inside a browser on a shared host is made of:
 * - on the page: the first (cold) run, then the median and fastest wall clock of warm runs, and the
 *   renderer processes' CPU time per warm run (CDP `SystemInfo.getProcessInfo`, all renderer
 *   threads, the collector's included): on a busy host the wall clock counts the time other
 *   processes held the cores, the CPU time does not;
 * - through a Web Worker, as the workspace computes a big survey (`use-survey-summary.ts`): the
 *   round trip from posting the survey to holding the answer, first and warm, beside the engine's
 *   own time inside the worker; the rest is copying (the survey in and the results out, each a
 *   structured clone but for the results' typed-array columns, which are transferred) and messaging;
 *   the copies are timed on their own as well.
 *
 * Run: `npm run bench -- browser-engine` (also part of `npm run bench -- browser`).
 */
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Browser, BrowserContext } from 'playwright-core';
import { launchBrowser } from '../tests/support/browser';
import { generateVessel } from './bench-engine';
import { loadWords, median } from './lib/cpu-clock';
import { engineBundle } from './lib/engine-bundle';

const WARM_RUNS = 40;
const WORKER_RUNS = 20;

interface Engine {
  computeSurveySummary: (s: unknown) => { boundaries: unknown };
}

/** CPU seconds used so far by every renderer process of the browser. */
async function rendererCpuS(browser: Browser): Promise<number> {
  const cdp = await browser.newBrowserCDPSession();
  try {
    const { processInfo } = (await cdp.send('SystemInfo.getProcessInfo')) as { processInfo: { type: string; cpuTime: number }[] };
    return processInfo.filter((p) => p.type === 'renderer').reduce((s, p) => s + p.cpuTime, 0);
  } finally {
    await cdp.detach();
  }
}

const ms = (n: number) => `${n.toFixed(1)} ms`;
const verdict = (ok: boolean) => (ok ? 'met' : 'NOT MET');

/** Lines of figures for the engine in Chromium, measured in a fresh page of `context`. */
export async function benchEngineInChromium(browser: Browser, context: BrowserContext): Promise<string[]> {
  const page = await context.newPage();
  const bundle = await engineBundle();
  await page.addScriptTag({ content: bundle });
  await page.evaluate((json) => {
    (globalThis as unknown as { benchSurvey: unknown }).benchSurvey = JSON.parse(json);
  }, JSON.stringify(generateVessel()));
  const lines = [`Engine in Chromium, computeSurveySummary, 4,000 boundaries, unthrottled (${loadWords()}):`];

  const cold = await page.evaluate(() => {
    const engine = (window as unknown as { BrinelineEngine: Engine }).BrinelineEngine;
    const survey = (globalThis as unknown as { benchSurvey: unknown }).benchSurvey;
    const t: number[] = [];
    for (let i = 0; i < 10; i++) {
      const t0 = performance.now();
      engine.computeSurveySummary(survey);
      t.push(performance.now() - t0);
    }
    return t;
  });
  const cpu0 = await rendererCpuS(browser);
  const warm = await page.evaluate((runs) => {
    const engine = (window as unknown as { BrinelineEngine: Engine }).BrinelineEngine;
    const survey = (globalThis as unknown as { benchSurvey: unknown }).benchSurvey;
    const t: number[] = [];
    for (let i = 0; i < runs; i++) {
      const t0 = performance.now();
      engine.computeSurveySummary(survey);
      t.push(performance.now() - t0);
    }
    return t;
  }, WARM_RUNS);
  const cpuPerRun = ((await rendererCpuS(browser)) - cpu0) * 1000 / WARM_RUNS;
  const wallMedian = median(warm);
  lines.push(
    `  on the page: first run ${ms(cold[0])}, then ${cold.slice(1).map((x) => x.toFixed(0)).join(', ')} ms while the JIT warms up;`,
    `  warm, ${WARM_RUNS} runs: renderer CPU ${ms(cpuPerRun)} per run (mean; goal < 15 ms: ${verdict(cpuPerRun < 15)}); wall clock median ${ms(wallMedian)}, fastest ${ms(Math.min(...warm))}`,
  );

  const viaWorker = await page.evaluate(
    async ([src, runs]) => {
            // the typed-array columns transferred, the rest cloned, as engine-api.ts answers
      const code = `${src}\nonmessage = (e) => { const t0 = performance.now(); const r = BrinelineEngine.computeSurveySummary(e.data); const engineMs = performance.now() - t0; postMessage({ r, engineMs }, Object.values(r.boundaries).filter((c) => ArrayBuffer.isView(c)).map((c) => c.buffer)); };`;
      const worker = new Worker(URL.createObjectURL(new Blob([code], { type: 'text/javascript' })));
      const survey = (globalThis as unknown as { benchSurvey: unknown }).benchSurvey;
      const call = () =>
        new Promise<{ total: number; engine: number }>((resolve) => {
          const t0 = performance.now();
          worker.onmessage = (e: MessageEvent<{ engineMs: number }>) => resolve({ total: performance.now() - t0, engine: e.data.engineMs });
          worker.postMessage(survey);
        });
      const first = await call();
      for (let i = 0; i < 9; i++) await call();
      const warmCalls: { total: number; engine: number }[] = [];
      for (let i = 0; i < runs; i++) warmCalls.push(await call());
      worker.terminate();
      const engine = (window as unknown as { BrinelineEngine: Engine }).BrinelineEngine;
      const results = engine.computeSurveySummary(survey);
      const clone = (x: unknown) => {
        const t: number[] = [];
        for (let i = 0; i < 9; i++) {
          const t0 = performance.now();
          structuredClone(x);
          t.push(performance.now() - t0);
        }
        return t.sort((a, b) => a - b)[4];
      };
      const copied = { ...results, boundaries: Object.fromEntries(Object.entries(results.boundaries as object).filter(([, c]) => !ArrayBuffer.isView(c))) };
      return { first, warmCalls, surveyClone: clone(survey), resultsClone: clone(results), copiedClone: clone(copied) };
    },
    [bundle, WORKER_RUNS] as const,
  );
  await page.close();
  const totals = viaWorker.warmCalls.map((c) => c.total), engines = viaWorker.warmCalls.map((c) => c.engine);
  lines.push(
    `  through a Web Worker as the workspace computes it: first round trip ${ms(viaWorker.first.total)} (engine ${ms(viaWorker.first.engine)} of it); ` +
      `warm, ${WORKER_RUNS} runs: round trip median ${ms(median(totals))}, the engine inside the worker median ${ms(median(engines))}`,
    `  copying, median of 9 on the page: the survey ${ms(viaWorker.surveyClone)} (structured clone, sent on every edit); the results ${ms(viaWorker.resultsClone)} ` +
      `cloned whole, ${ms(viaWorker.copiedClone)} without the typed-array columns (which the worker transfers)`,
  );
  return lines;
}

export async function main(): Promise<void> {
  const browser = await launchBrowser();
  try {
    const context = await browser.newContext();
    console.log((await benchEngineInChromium(browser, context)).join('\n'));
    await context.close();
  } finally {
    await browser.close();
  }
}

const invokedDirectly = process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url);
if (invokedDirectly) await main();
