/**
 * What V8's young-generation flags do for the server (#18 item 6): `npm run bench -- flags` runs this
 * once with Node's defaults and once with the flags `npm start` used to pass
 * (--max-semi-space-size=128 --min-semi-space-size=64), and prints, for the 4,000-boundary bench
 * vessel, the server's heavy paths: the engine's full results in the server's engine pool (a piscina
 * worker thread, as a stored survey's results are computed, results serialised to JSON there), and
 * on the request loop a push's parse and whole-survey validation of the 2,000-boundary survey. Each
 * figure is the median wall time with the process CPU time beside it (a shared host inflates wall
 * clock), after a warm-up.
 * Run: npx tsx scripts/bench-flags.ts
 */
import { resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { computeInPool, closeEnginePool } from '../server/services/engine-pool';
import { UpgradingSurveySchema } from '@shared/schemas/survey';
import { generateVessel } from './bench-engine';

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

async function timed(label: string, runs: number, f: () => unknown): Promise<void> {
  for (let i = 0; i < 3; i++) await f();
  const wall: number[] = [], cpu: number[] = [];
  for (let i = 0; i < runs; i++) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    await f();
    wall.push(performance.now() - t0);
    const c = process.cpuUsage(c0);
    cpu.push((c.user + c.system) / 1000);
  }
  console.log(`  ${label}: median ${median(wall).toFixed(1)} ms wall (fastest ${Math.min(...wall).toFixed(1)} ms), process CPU median ${median(cpu).toFixed(1)} ms, over ${runs} runs`);
}

export async function main(): Promise<void> {
  const flags = process.execArgv.filter((a) => a.includes('semi-space'));
  console.log(`Server paths, ${flags.length ? flags.join(' ') : "Node's default young generation"}:`);
  const vessel = generateVessel();
  await timed('engine pool, full results of 4,000 boundaries as JSON (a stored survey\'s results)', 15, async () => {
    const out = await computeInPool(vessel);
    if (out.error) throw new Error(out.error);
  });
  const body = JSON.stringify({ ...vessel, boundaries: vessel.boundaries.slice(0, 2000) });
  await timed('request loop, parse and validate a 2,000-boundary survey (a push of a new survey)', 15, () => UpgradingSurveySchema.parse(JSON.parse(body)));
  await closeEnginePool();
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) await main();
