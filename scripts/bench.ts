/**
 * `npm run bench`: every benchmark in one run, each printing its own figures.
 * Targets: engine < 10 ms for 4,000 boundaries (Node defaults) and ≥ 5,000× faster than quadrature; API ≥ 1,000 req/s
 * with p99 < 150 ms; initial JavaScript for sign-in and survey list ≤ 170 KB gzipped.
 * `npm run bench -- engine` (or sync, bundle, loop, browser, browser-engine, flags) runs one section. `flags`: the server's heavy
 * paths (scripts/bench-flags.ts) with Node's default young generation and with the semi-space flags. `browser`: the app in headless
 * Chromium at 4× CPU throttle on the 2,000-boundary survey (scripts/bench-browser.ts); `browser-engine`: only its
 * engine part, the engine in Chromium on the page and through a Web Worker (scripts/bench-engine-browser.ts). `loop`: /api/health p99 while the
 * largest allowed survey is recomputed, in the worker pool and (for comparison) on the request loop.
 *
 * The engine runs in child processes: with Node's default young generation (the figure that
 * counts: a phone's browser has no flags), then with --max-semi-space-size=128 for comparison.
 */
import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

function node(args: string[]): void {
  const res = spawnSync(process.execPath, [...args], { cwd: ROOT, stdio: 'inherit' });
  if (res.status !== 0) throw new Error(`${args.join(' ')} exited with ${res.status}`);
}

const sections: Record<string, () => Promise<unknown> | unknown> = {
  engine: () => {
    console.log('-- with Node defaults (the young generation a phone\'s browser also gets):');
    node(['--import', 'tsx', 'scripts/bench-engine.ts']);
    console.log('-- for comparison, with --max-semi-space-size=128 (timing only):');
    node(['--max-semi-space-size=128', '--import', 'tsx', 'scripts/bench-engine.ts', '--timing-only']);
  },
  flags: () => {
    node(['--import', 'tsx', 'scripts/bench-flags.ts']);
    node(['--max-semi-space-size=128', '--min-semi-space-size=64', '--import', 'tsx', 'scripts/bench-flags.ts']);
  },
  flooding: () => {
    console.log('-- with Node defaults:');
    node(['--import', 'tsx', 'scripts/bench-flooding.ts']);
  },
  sync: async () => (await import('./bench-sync')).main(),
  bundle: async () => (await import('./bench-bundle')).main(),
  loop: async () => (await import('./bench-loop')).main(),
  browser: async () => (await import('./bench-browser')).main(),
  'browser-engine': async () => (await import('./bench-engine-browser')).main(),
};

const wanted = process.argv.slice(2).filter((a) => a in sections);
for (const name of wanted.length ? wanted : Object.keys(sections)) {
  console.log(`\n=== ${name} ===`);
  await sections[name]();
}
process.exit(0);
