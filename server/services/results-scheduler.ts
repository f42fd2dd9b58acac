/** Engine results computed after pushes, in the background, coalesced per survey. */
import { ENGINE_VERSION } from '@shared/engine';
import { databaseUrlOf, type Db } from '../db/knex';
import { recomputeStoredInPool } from './engine-pool';

export interface ResultsScheduler {
  /** Recompute this survey's latest revision soon (coalesced: one run for a burst of edits). */
  schedule: (surveyId: string) => void;
  /** Runs everything scheduled now, without waiting for other instances' gaps (tests, shutdown). */
  flush: () => Promise<void>;
}

/**
 * Recomputes results after pushes without holding up the push: each survey is computed at most
 * once per `delayMs`, always at its latest revision, one at a time, so a burst of edits costs one
 * engine run and the API stays responsive under load. The work (read, compute, store) runs in the
 * engine pool's worker threads (`recomputeStoredInPool`).
 *
 * Several instances share the gap through the stored results: an instance told of a survey whose
 * results another stored less than most of a gap ago waits and asks again, so a survey edited
 * through two instances is computed about once per gap, not twice. The stored results are keyed by
 * revision, and the last edit's instance keeps asking until its revision has results.
 */
export function createResultsScheduler(db: Db, onError: (err: unknown) => void, delayMs = 2000): ResultsScheduler {
  const due = new Set<string>();
  let timer: ReturnType<typeof setTimeout> | undefined;
  let running: Promise<void> = Promise.resolve();
  // A little under the gap: this instance's own timer fires a gap after its last run began.
  const sharedGapMs = Math.floor(delayMs * 0.9);
  const run = async (minGapMs: number) => {
    timer = undefined;
    const ids = [...due];
    const url = databaseUrlOf(db);
    due.clear();
    for (const id of ids) {
      try {
        // Read, computed and stored in a worker thread: the request loop only waits.
        const out = await recomputeStoredInPool(url, id, ENGINE_VERSION, minGapMs);
        if (out.waitMs !== undefined) schedule(id);
      } catch (err) {
        onError(err);
      }
    }
  };
  const schedule = (surveyId: string) => {
    due.add(surveyId);
    if (!timer) {
      timer = setTimeout(() => {
        running = running.then(() => run(sharedGapMs));
      }, delayMs);
      timer.unref?.();
    }
  };
  return {
    schedule,
    async flush() {
      clearTimeout(timer);
      running = running.then(() => run(0));
      await running;
    },
  };
}
