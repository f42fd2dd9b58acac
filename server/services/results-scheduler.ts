/** Engine results computed after pushes, in the background, coalesced per survey. */
import { ENGINE_VERSION } from '@shared/engine';
import { databaseUrlOf, type Db } from '../db/knex';
import { recomputeStoredInPool } from './engine-pool';

export interface ResultsScheduler {
  /** Recompute this survey's latest revision soon (coalesced: one run for a burst of edits). */
  schedule: (surveyId: string) => void;
  /** Runs everything scheduled now (tests, shutdown). */
  flush: () => Promise<void>;
}

/**
 * Recomputes results after pushes without holding up the push: each survey is computed at most
 * once per `delayMs`, always at its latest revision, one at a time, so a burst of edits costs one
 * engine run and the API stays responsive under load. The work (read, compute, store) runs in the
 * engine pool's worker threads (`recomputeStoredInPool`). With several instances each may compute
 * a survey it was told about; the stored results are keyed by revision, so the first one stands.
 */
export function createResultsScheduler(db: Db, onError: (err: unknown) => void, delayMs = 2000): ResultsScheduler {
  const due = new Set<string>();
  let timer: ReturnType<typeof setTimeout> | undefined;
  let running: Promise<void> = Promise.resolve();
  const run = async () => {
    timer = undefined;
    const ids = [...due];
    const url = databaseUrlOf(db);
    due.clear();
    for (const id of ids) {
      try {
        // Read, computed and stored in a worker thread: the request loop only waits.
        await recomputeStoredInPool(url, id, ENGINE_VERSION);
      } catch (err) {
        onError(err);
      }
    }
  };
  return {
    schedule(surveyId) {
      due.add(surveyId);
      if (!timer) {
        timer = setTimeout(() => {
          running = running.then(run);
        }, delayMs);
        timer.unref?.();
      }
    },
    async flush() {
      clearTimeout(timer);
      running = running.then(run);
      await running;
    },
  };
}
