/**
 * Reads of surveys, conflicts and the outbox on the device, reactive through `useLiveQuery`. Dexie
 * only — no zod, no edit logic — so a screen that only lists surveys stays light. Writes are in
 * ./survey-store.ts (which re-exports these too).
 */
import { useLiveQuery } from 'dexie-react-hooks';
import { db, type LocalConflict, type LocalSurvey, type OutboxEntry } from './db';

/** Lists every survey on this device, most recently changed first. Undefined while loading. */
export function useLocalSurveys(): LocalSurvey[] | undefined {
  return useLiveQuery(() => db.surveys.orderBy('updatedAt').reverse().toArray(), []);
}

/** One survey on this device: undefined while loading, null when this device does not have it. */
export function useLocalSurvey(id: string | undefined): LocalSurvey | null | undefined {
  return useLiveQuery(async () => (id ? ((await db.surveys.get(id)) ?? null) : null), [id]);
}

export function getLocalSurvey(id: string): Promise<LocalSurvey | undefined> {
  return db.surveys.get(id);
}

/** Open conflicts of a survey, oldest first. */
export function useConflicts(surveyId: string | undefined): LocalConflict[] | undefined {
  return useLiveQuery(
    async () =>
      surveyId
        ? (await db.conflicts.where({ surveyId, status: 'open' }).toArray()).sort((a, b) => a.createdAt.localeCompare(b.createdAt))
        : [],
    [surveyId],
  );
}

/** Every open conflict on this device. */
export function useAllOpenConflicts(): LocalConflict[] | undefined {
  return useLiveQuery(() => db.conflicts.where('status').equals('open').toArray(), []);
}

/** Changes waiting for the server. */
export function usePendingCount(surveyId?: string): number | undefined {
  return useLiveQuery(
    () =>
      surveyId
        ? db.outbox.where({ surveyId, state: 'pending' }).count()
        : db.outbox.where('state').equals('pending').count(),
    [surveyId],
  );
}

/** The "Send for review" of a survey waiting in the outbox (or refused by the server), if any: the latest. */
export function useQueuedSubmit(surveyId: string): OutboxEntry | undefined | null {
  return useLiveQuery(
    async () => (await db.outbox.where('surveyId').equals(surveyId).filter((e) => e.op.kind === 'submit').sortBy('seq')).pop() ?? null,
    [surveyId],
  );
}

/** Changes the server refused, with its reason. */
export function useRejectedChanges(): OutboxEntry[] | undefined {
  return useLiveQuery(() => db.outbox.where('state').equals('rejected').toArray(), []);
}

/** Removes a refused change from the list once the user has read it. */
export async function dismissRejectedChange(seq: number): Promise<void> {
  await db.transaction('rw', db.outbox, async () => {
    const e = await db.outbox.get(seq);
    if (e?.state === 'rejected') await db.outbox.delete(seq);
  });
}
