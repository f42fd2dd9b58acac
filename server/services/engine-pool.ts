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
import type { EngineOutput, EngineTask, StoredOutcome } from './engine-worker';

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

/** The engine's results for a document, computed in a worker thread (the document is copied to it). */
export function computeInPool(doc: Survey): Promise<EngineOutput> {
  return enginePool().run({ kind: 'doc', doc } satisfies EngineTask) as Promise<EngineOutput>;
}

/**
 * Computes and stores the results of a stored survey's current revision, if it has none yet for this
 * engine version, entirely in a worker thread (it reads and writes PostgreSQL itself): nothing of
 * the document or its results passes through this thread. With `minGapMs`, it leaves a survey whose
 * results any instance stored less than that long ago, and says how long to wait.
 */
export function recomputeStoredInPool(databaseUrl: string, surveyId: string, engineVersion: string, minGapMs = 0): Promise<StoredOutcome> {
  return enginePool().run({ kind: 'stored', databaseUrl, surveyId, engineVersion, minGapMs } satisfies EngineTask) as Promise<StoredOutcome>;
}

/** Stops the workers (shutdown, end of tests). */
export async function closeEnginePool(): Promise<void> {
  const p = pool;
  pool = undefined;
  await p?.destroy();
}
