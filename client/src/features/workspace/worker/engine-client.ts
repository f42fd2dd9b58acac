/**
 * The page's engine workers (`engine-worker.ts`, Comlink), started on first need, one per job: the
 * per-edit summary and the flooding forecast each get their own, so a long forecast never holds a big
 * ship's loads back. null where workers are unavailable or that one broke: callers then compute in place.
 */
import { wrap, type Remote } from 'comlink';
import type { EngineApi } from './engine-api';

export interface EngineWorker {
  remote: Remote<EngineApi>;
  /** Rejects when the worker fails to load or dies (its pending answers would otherwise never come). */
  broken: Promise<never>;
}

const workers = new Map<string, EngineWorker | null>();

export function engineWorker(name: 'engine' | 'forecast'): EngineWorker | null {
  const known = workers.get(name);
  if (known !== undefined) return known;
  let made: EngineWorker | null = null;
  try {
    // Vite finds a worker only in this exact form, with literal options (so no `name` from the argument)
    const worker = new Worker(new URL('./engine-worker.ts', import.meta.url), { type: 'module' });
    const broken = new Promise<never>((_, reject) => {
      worker.addEventListener('error', (e) => {
        workers.set(name, null);
        reject(new Error(`${name} worker failed: ${e.message}`));
      });
    });
    broken.catch(() => undefined);
    made = { remote: wrap<EngineApi>(worker), broken };
  } catch {
    made = null;
  }
  workers.set(name, made);
  return made;
}

/** Whether that worker has been found broken since it started. */
export const engineWorkerBroken = (name: 'engine' | 'forecast'): boolean => workers.get(name) === null;
