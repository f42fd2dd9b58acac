/**
 * The state of each survey as this server last wrote it in a push. A push of plain edits to a survey
 * found here skips its opening read and goes out as one statement that writes only if the survey is
 * still at that revision, the caller is still an active member and none of its changes was recorded
 * before (the change records' unique keys); otherwise nothing is written, the entry is dropped and
 * the run is done again from a fresh read. The documents are kept as parsed back from the JSON text
 * written, so they are exactly what a read would give.
 */
import { LRUCache } from 'lru-cache';
import type { StartSurvey } from './plan';

/** A survey as stored at a revision: what a run starts from. */
export interface KnownSurveyState extends StartSurvey {
  orgId: string;
}

export class SurveyStateCache {
  private readonly entries: LRUCache<string, KnownSurveyState>;

  /** `maxBytes`: a bound on the documents kept, reckoned as four bytes of memory per byte of their JSON. */
  constructor(maxBytes = 128 * 1024 * 1024) {
    this.entries = new LRUCache({ maxSize: maxBytes });
  }
  get(id: string): KnownSurveyState | undefined {
    return this.entries.get(id);
  }
  set(id: string, state: KnownSurveyState, jsonBytes: number): void {
    this.entries.set(id, state, { size: 1024 + 4 * jsonBytes });
  }
  delete(id: string): void {
    this.entries.delete(id);
  }
}
