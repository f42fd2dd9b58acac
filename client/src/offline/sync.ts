/**
 * The sync engine: drains the outbox to the server and pulls what changed, on start, when the
 * link comes back (the `online` event, or a cheap probe every few seconds while offline), when the
 * app becomes visible again, every 30 s and on demand. Failures back off
 * exponentially; a 401 that the token refresh cannot fix pauses sync with "sign in to sync" and
 * keeps the outbox; a change the server refuses for good is marked and shown while the rest go on.
 */
import {
  MAX_PUSH_CHANGES,
  PullEnvelopeSchema,
  PushResponseSchema,
  UpsertOpSchema,
  type Conflict,
  type PushResponse,
  type SurveyChange,
} from '@shared/schemas/sync';
import type { Survey } from '@shared/schemas/survey';
import { findEntity } from '@shared/sync/apply';
import { ApiError, OfflineError, api, currentAccessToken, jsonBody } from '@client/lib/api-client';
import { rememberedUserId } from '@client/lib/identity';
import { db, getMeta, META, setMeta, type OutboxEntry } from './db';
import { mergeServerSurveys, rebaseLocalSurvey, replayUnsavedEdits, subscribeLocalChanges } from './survey-store';
import { storeReviewNotes } from './review-notes';
import { sendPendingReplies } from './replies';
import { getEngineStatus, setEngineStatus } from './sync-state';

export { useSyncState, type SyncState, type SyncStateName } from './sync-state';
export { pendingChangeCount } from './sync-counts';

const PUSH_BATCH = Math.min(200, MAX_PUSH_CHANGES);
const INTERVAL_MS = 30_000;
const LOCAL_CHANGE_DELAY_MS = 1_500;
const BACKOFF_MIN_MS = 2_000;
const BACKOFF_MAX_MS = 5 * 60_000;
/** While offline, how often a cheap request checks whether the link is back (the `online` event may never come). */
export const PROBE_INTERVAL_MS = 2_500;

const setStatus = setEngineStatus;

let inFlight: Promise<void> | null = null;
let again = false;
let failures = 0;
let retryTimer: ReturnType<typeof setTimeout> | undefined;
let localTimer: ReturnType<typeof setTimeout> | undefined;
let probeTimer: ReturnType<typeof setTimeout> | undefined;
/** When a probe last reached the server: navigator.onLine can stay false after the link returns. */
let reachedAt = 0;

const toChange = (e: OutboxEntry): SurveyChange => ({
  id: e.id,
  deviceId: e.deviceId,
  seq: e.seq!,
  surveyId: e.surveyId,
  baseRevision: e.baseRevision,
  createdAt: e.createdAt,
  op: e.op,
});

/** Keeps conflicts from the server, except one this device has resolved and the server has not heard of yet. */
async function storeConflicts(conflicts: Conflict[]): Promise<void> {
  if (conflicts.length === 0) return;
  await db.transaction('rw', db.conflicts, async () => {
    for (const c of conflicts) {
      const local = await db.conflicts.get(c.id);
      if (local?.resolving === 1 && c.status === 'open') continue;
      await db.conflicts.put({ ...c, resolving: 0 });
    }
  });
}

/**
 * A `patch` the server refused (the place it changes may be gone there: deleted on another device)
 * is sent again as an upsert of the whole entity as this device has it, with a new id, so the merge
 * can keep it as a conflict instead of losing it. False when this device no longer has the entity.
 */
async function requeueWhole(e: OutboxEntry): Promise<boolean> {
  if (e.op.kind !== 'patch') return false;
  const { collection, entityId, path } = e.op;
  const doc: Survey | undefined = (await db.surveys.get(e.surveyId))?.doc;
  const entity = doc && findEntity(doc, collection, entityId);
  await db.outbox.delete(e.seq!);
  if (!entity) return false;
  const op = UpsertOpSchema.parse({ kind: 'upsert', collection, entity, fields: [path[0]] });
  await db.outbox.add({ id: crypto.randomUUID(), deviceId: e.deviceId, userId: e.userId, surveyId: e.surveyId, baseRevision: e.baseRevision, createdAt: e.createdAt, op, state: 'pending' });
  return true;
}

/** Returns whether a refused patch was queued again whole (to send at once). */
async function applyPushResponse(sent: OutboxEntry[], res: PushResponse): Promise<boolean> {
  let requeued = false;
  const bySeq = new Map(sent.map((e) => [e.id, e.seq!]));
  const byId = new Map(sent.map((e) => [e.id, e]));
  const refused = new Set<string>();
  await db.transaction('rw', db.outbox, db.surveys, async () => {
    for (const r of res.results) {
      const seq = bySeq.get(r.changeId);
      if (seq === undefined) continue;
      const wasRefused = r.status === 'rejected' || (r.status === 'duplicate' && r.firstStatus === 'rejected');
      if (wasRefused && (await requeueWhole(byId.get(r.changeId)!))) {
        requeued = true;
        continue;
      }
      if (r.status === 'rejected') {
        await db.outbox.update(seq, { state: 'rejected', reason: r.reason ?? 'The server refused this change.' });
        refused.add(r.surveyId);
      } else {
        await db.outbox.delete(seq);
      }
    }
  });
  await storeConflicts(res.conflicts);
  for (const surveyId of refused) await rebaseLocalSurvey(surveyId);
  return requeued;
}

async function pushAll(): Promise<void> {
  let size = PUSH_BATCH;
  for (;;) {
    // Only the signed-in person's own edits (and those queued before authors were kept): another
    // person's wait for them, since the server takes a device id only from its owner.
    const me = rememberedUserId();
    const pending = await db.outbox.where('state').equals('pending').sortBy('seq');
    const batch = pending.filter((e) => !me || !e.userId || e.userId === me).slice(0, size);
    if (batch.length === 0) return;
    let body: unknown;
    try {
      body = await api<unknown>('/api/sync/push', { method: 'POST', ...jsonBody({ changes: batch.map(toChange) }) });
    } catch (err) {
      // Too big for one request (photos' captions, huge polygons…): send fewer at a time; one change
      // too big on its own is refused for good and shown, so it cannot block the rest.
      if (err instanceof ApiError && err.status === 413) {
        if (batch.length > 1) {
          size = Math.max(1, Math.floor(batch.length / 2));
          continue;
        }
        await db.outbox.update(batch[0].seq!, { state: 'rejected', reason: 'This change is too large to send to the server.' });
        await rebaseLocalSurvey(batch[0].surveyId);
        continue;
      }
      throw err;
    }
    const requeued = await applyPushResponse(batch, PushResponseSchema.parse(body));
    if (batch.length < size && !requeued) return;
  }
}

async function pullAll(): Promise<void> {
  for (let page = 0; page < 1000; page++) {
    const cursor = (await getMeta<string>(META.pullCursor)) ?? '0';
    // each survey's document is checked in mergeServerSurveys, against the device's own copy
    const body = PullEnvelopeSchema.parse(await api<unknown>(`/api/sync/pull?cursor=${encodeURIComponent(cursor)}`));
    await mergeServerSurveys(body.surveys);
    await storeConflicts(body.conflicts);
    await storeReviewNotes(body.extras.review);
    await setMeta(META.pullCursor, body.cursor);
    window.dispatchEvent(new CustomEvent('brineline:pulled', { detail: body }));
    if (!body.hasMore) return;
  }
}

function scheduleRetry(): void {
  clearTimeout(retryTimer);
  const base = Math.min(BACKOFF_MAX_MS, BACKOFF_MIN_MS * 2 ** Math.min(failures, 10));
  const delay = base / 2 + Math.random() * (base / 2);
  failures += 1;
  setStatus({ retryAt: new Date(Date.now() + delay).toISOString() });
  retryTimer = setTimeout(() => void syncNow(), delay);
}

/**
 * Is the server reachable? One small GET with no body worth reading, never from a cache. A page
 * reloaded while offline may never get the `online` event when the link returns, and the retry
 * timer backs off to minutes, so while offline this runs every PROBE_INTERVAL_MS instead.
 */
async function probe(): Promise<boolean> {
  try {
    // Any answer at all means the link is back (the service worker never answers /api/).
    await fetch('/api/health', { method: 'GET', cache: 'no-store', credentials: 'omit' });
    return true;
  } catch {
    return false;
  }
}

function scheduleProbe(): void {
  if (probeTimer !== undefined || !stopper) return;
  probeTimer = setTimeout(() => {
    probeTimer = undefined;
    if (getEngineStatus().online) return;
    if (typeof document !== 'undefined' && document.visibilityState === 'hidden') return scheduleProbe();
    void probe().then((up) => {
      if (up && !getEngineStatus().online) {
        reachedAt = Date.now();
        failures = 0;
        clearTimeout(retryTimer);
        setStatus({ online: true, retryAt: undefined });
        void syncNow();
      } else if (!getEngineStatus().online) scheduleProbe();
    });
  }, PROBE_INTERVAL_MS);
}

function goneOffline(): void {
  setStatus({ online: false });
  scheduleProbe();
}

async function runOnce(): Promise<void> {
  if (!rememberedUserId() && !currentAccessToken()) {
    // Nobody has signed in on this device: nothing of theirs to send, and asking would only be
    // answered 401 (a visitor on the landing or sign-in page makes no request that is refused).
    setStatus({ needsSignIn: true });
    return;
  }
  if (typeof navigator !== 'undefined' && !navigator.onLine && Date.now() - reachedAt > PROBE_INTERVAL_MS * 4) {
    goneOffline();
    return;
  }
  setStatus({ running: true });
  try {
    await pushAll();
    await sendPendingReplies();
    await pullAll();
    const now = new Date().toISOString();
    await setMeta(META.lastSyncedAt, now);
    failures = 0;
    clearTimeout(retryTimer);
    setStatus({ online: true, needsSignIn: false, error: undefined, retryAt: undefined, lastSyncedAt: now });
  } catch (err) {
    if (err instanceof ApiError && err.status === 401) {
      // The refresh already failed inside api-client: wait for a sign-in; the outbox stays as it is.
      setStatus({ online: true, needsSignIn: true, error: undefined, retryAt: undefined });
    } else if (err instanceof OfflineError) {
      setStatus({ error: undefined });
      goneOffline();
      scheduleRetry();
    } else {
      setStatus({ online: true, error: err instanceof Error ? err.message : 'Sync failed.' });
      scheduleRetry();
    }
  } finally {
    setStatus({ running: false });
  }
}

/** Pushes and pulls now; resolves when this round (and any requested meanwhile) is done. */
export function syncNow(): Promise<void> {
  if (inFlight) {
    again = true;
    return inFlight;
  }
  inFlight = (async () => {
    // A request made while a round runs gets a round of its own, even when this one ended in "sign in
    // again": that request may be the sign-in itself, which landed while a round without a session was
    // waiting for its 401 (the app starts syncing on the sign-in page).
    do {
      again = false;
      await runOnce();
    } while (again);
  })().finally(() => {
    inFlight = null;
  });
  return inFlight;
}

let stopper: (() => void) | null = null;

/** Starts automatic sync (idempotent). Returns a function that stops it. */
export function startSync(opts: { intervalMs?: number } = {}): () => void {
  if (stopper) return stopper;
  const onOnline = () => {
    setStatus({ online: true });
    failures = 0;
    void syncNow();
  };
  const onOffline = () => goneOffline();
  const onVisible = () => {
    if (document.visibilityState === 'visible') void syncNow();
  };
  window.addEventListener('online', onOnline);
  window.addEventListener('offline', onOffline);
  document.addEventListener('visibilitychange', onVisible);
  const interval = setInterval(() => void syncNow(), opts.intervalMs ?? INTERVAL_MS);
  const unsubscribe = subscribeLocalChanges(() => {
    clearTimeout(localTimer);
    localTimer = setTimeout(() => void syncNow(), LOCAL_CHANGE_DELAY_MS);
  });
  void getMeta<string>(META.lastSyncedAt).then((t) => {
    if (t && !getEngineStatus().lastSyncedAt) setStatus({ lastSyncedAt: t });
  });
  stopper = () => {
    window.removeEventListener('online', onOnline);
    window.removeEventListener('offline', onOffline);
    document.removeEventListener('visibilitychange', onVisible);
    clearInterval(interval);
    clearTimeout(retryTimer);
    clearTimeout(localTimer);
    clearTimeout(probeTimer);
    probeTimer = undefined;
    unsubscribe();
    stopper = null;
  };
  // Edits a closing page noted but could not store go in first (./unsaved-edits.ts).
  void replayUnsavedEdits()
    .catch(() => 0)
    .then(() => syncNow());
  return stopper;
}
