/** The outbox and conflict counts behind the sync state, read live from the device store. */
import { liveQuery } from 'dexie';
import { db, type OutboxEntry } from './db';

/** What the device store holds for the sync state (the header shows nothing from it until first read). */
export interface SyncCounts {
  pending: number;
  rejected: OutboxEntry[];
  openConflicts: number;
}

/** Calls `onChange` with the counts now and after every change to them; returns a function that stops. */
export function watchSyncCounts(onChange: (counts: SyncCounts) => void): () => void {
  const subscription = liveQuery(async () => ({
    // Replies to reviewers wait like any edit, and are counted with them.
    pending: (await db.outbox.where('state').equals('pending').count()) + (await db.replies.where('state').equals('pending').count()),
    rejected: await db.outbox.where('state').equals('rejected').toArray(),
    openConflicts: await db.conflicts.where('status').equals('open').count(),
  })).subscribe({ next: onChange, error: () => undefined });
  return () => subscription.unsubscribe();
}

/** How many changes wait in the outbox (for code outside React, e.g. the update prompt). */
export async function pendingChangeCount(): Promise<number> {
  return (await db.outbox.where('state').equals('pending').count()) + (await db.replies.where('state').equals('pending').count());
}
