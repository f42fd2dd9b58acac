/**
 * The UTF-8 JSON text of each survey's current document and latest results, by survey id, with the
 * revision each belongs to. Both are immutable for their revision (see readSurveyRaw in server/db/repositories/survey-reads.ts), so a
 * read that finds the same revisions in the database skips reading, sending and converting them:
 * most of a survey read's work. Bounded in bytes; one per app, never shared between databases.
 */
import { LRUCache } from 'lru-cache';

export interface HeldText {
  docRevision?: number;
  doc?: Buffer;
  resultsRevision?: number;
  results?: Buffer;
}

export class SurveyTextCache {
  private readonly entries: LRUCache<string, HeldText>;

  constructor(maxBytes = 64 * 1024 * 1024) {
    this.entries = new LRUCache({ maxSize: maxBytes, sizeCalculation: (e) => 64 + (e.doc?.length ?? 0) + (e.results?.length ?? 0) });
  }

  /** What is held for a survey now; the caller keeps this object, so a later replacement cannot take it away mid-read. */
  hold(id: string): HeldText {
    return this.entries.get(id) ?? {};
  }

  /** Keeps what a read found, unless a newer revision is already held. */
  keep(id: string, found: Required<HeldText>): void {
    const now = this.entries.get(id);
    if (now && ((now.docRevision ?? 0) > found.docRevision || (now.resultsRevision ?? 0) > found.resultsRevision)) return;
    this.entries.set(id, found);
  }
}
