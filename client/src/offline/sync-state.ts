/**
 * The sync state as the header shows it, with no dependency on the device store: the engine
 * (./sync.ts, loaded after the first render) publishes its status here, and the outbox and conflict
 * counts come from ./sync-counts.ts, loaded while something shows the state. Keeping this module
 * free of Dexie and zod keeps them out of the JavaScript a first visit needs before the first screen.
 */
import { useSyncExternalStore } from 'react';
import type { OutboxEntry } from './db';
import type { SyncCounts } from './sync-counts';

export type SyncStateName = 'offline' | 'waiting' | 'syncing' | 'synced' | 'attention';

export interface SyncState {
  state: SyncStateName;
  /** Changes on this device the server has not confirmed yet. */
  pending: number;
  lastSyncedAt?: string;
  /** Changes the server refused for good, with its reason. */
  rejected: OutboxEntry[];
  openConflicts: number;
  /** The session ended and could not be renewed: sign in again to sync (nothing is dropped). */
  needsSignIn: boolean;
  /** The last failure, when sync is retrying. */
  error?: string;
  /** When the next automatic attempt is due after a failure. */
  retryAt?: string;
}

export interface EngineStatus {
  running: boolean;
  /** navigator.onLine, or false after the server could not be reached. */
  online: boolean;
  needsSignIn: boolean;
  lastSyncedAt?: string;
  error?: string;
  retryAt?: string;
}

let status: EngineStatus = { running: false, online: typeof navigator === 'undefined' ? true : navigator.onLine, needsSignIn: false };
let counts: SyncCounts | undefined;
const subscribers = new Set<() => void>();

function derive(): SyncState {
  const pending = counts?.pending ?? 0;
  const rejected = counts?.rejected ?? [];
  const openConflicts = counts?.openConflicts ?? 0;
  const state: SyncStateName = status.running
    ? 'syncing'
    : !status.online
      ? 'offline'
      : status.needsSignIn || rejected.length > 0 || openConflicts > 0
        ? 'attention'
        : pending > 0 || status.error
          ? 'waiting'
          : 'synced';
  return {
    state,
    pending,
    lastSyncedAt: status.lastSyncedAt,
    rejected,
    openConflicts,
    needsSignIn: status.needsSignIn,
    error: status.error,
    retryAt: status.retryAt,
  };
}

let snapshot: SyncState = derive();
function publish() {
  snapshot = derive();
  subscribers.forEach((fn) => fn());
}

/** The engine's own status (for ./sync.ts). */
export function getEngineStatus(): EngineStatus {
  return status;
}

/** Called by the sync engine when its status changes. */
export function setEngineStatus(patch: Partial<EngineStatus>): void {
  status = { ...status, ...patch };
  publish();
}

// The counts are read from the device store only while something shows the sync state, like a
// live query held by a mounted component.
let stopCounts: (() => void) | null = null;
let countsGeneration = 0;

function startCounts() {
  const generation = ++countsGeneration;
  void import('./sync-counts').then(({ watchSyncCounts }) => {
    if (generation !== countsGeneration || subscribers.size === 0) return;
    stopCounts = watchSyncCounts((next) => {
      counts = next;
      publish();
    });
  });
}

function stopCountsNow() {
  countsGeneration++;
  stopCounts?.();
  stopCounts = null;
}

function subscribe(fn: () => void): () => void {
  subscribers.add(fn);
  if (subscribers.size === 1 && !stopCounts) startCounts();
  return () => {
    subscribers.delete(fn);
    if (subscribers.size === 0) stopCountsNow();
  };
}
const getSnapshot = () => snapshot;

/** The sync state for the header and anything else that shows it. */
export function useSyncState(): SyncState {
  return useSyncExternalStore(subscribe, getSnapshot, getSnapshot);
}
