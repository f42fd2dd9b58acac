/**
 * The engine runs off the request loop, in a pool of worker threads (piscina). A large survey takes
 * the engine seconds; on the loop that would stall every other request of the instance.
 * ENGINE_THREADS sets the pool's size (default: one less than the cores, at least one). Workers load
 * TypeScript through tsx, as the server itself does.
 */
import os from 'node:os';
import { fileURLToPath } from 'node:url';
import { Piscina } from 'piscina';
import type { Survey } from '@shared/schemas/survey';
import type { EngineOutput } from './engine-worker';

let pool: Piscina | undefined;

function enginePool(): Piscina {
  const threads = Number(process.env.ENGINE_THREADS) || Math.max(1, os.availableParallelism() - 1);
  pool ??= new Piscina({
    filename: fileURLToPath(new URL('./engine-worker.ts', import.meta.url)),
    execArgv: ['--import', 'tsx'],
    minThreads: 0,
    maxThreads: threads,
    idleTimeout: 30_000,
    resourceLimits: { maxYoungGenerationSizeMb: 256 },
  });
  return pool;
}

/** The engine's results for a document, computed in a worker thread. */
export function computeInPool(doc: Survey): Promise<EngineOutput> {
  return enginePool().run(doc) as Promise<EngineOutput>;
}

/** Stops the workers (shutdown, end of tests). */
export async function closeEnginePool(): Promise<void> {
  const p = pool;
  pool = undefined;
  await p?.destroy();
}
