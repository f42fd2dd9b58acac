/**
 * Device storage: ask the browser to keep our data (persistent storage is not evicted under
 * pressure), report how much is used, and turn a full disk into a message the surveyor can act on.
 */
import { useEffect, useState, useSyncExternalStore } from 'react';

export interface StorageInfo {
  persisted: boolean | null;
  usageBytes: number | null;
  quotaBytes: number | null;
}

/** Asks once for persistent storage; resolves whether the data is protected from eviction. */
export async function requestPersistentStorage(): Promise<boolean | null> {
  if (typeof navigator === 'undefined' || !navigator.storage?.persist) return null;
  try {
    if (await navigator.storage.persisted()) return true;
    return await navigator.storage.persist();
  } catch {
    return null;
  }
}

export async function readStorageInfo(): Promise<StorageInfo> {
  const s = typeof navigator === 'undefined' ? undefined : navigator.storage;
  const [persisted, estimate] = await Promise.all([
    s?.persisted ? s.persisted().catch(() => null) : Promise.resolve(null),
    s?.estimate ? s.estimate().catch(() => null) : Promise.resolve(null),
  ]);
  return { persisted, usageBytes: estimate?.usage ?? null, quotaBytes: estimate?.quota ?? null };
}

/** True for the errors IndexedDB raises when the device has no room left. */
export function isQuotaError(err: unknown): boolean {
  const e = err as { name?: string; inner?: { name?: string } } | null;
  return e?.name === 'QuotaExceededError' || e?.inner?.name === 'QuotaExceededError';
}

export const QUOTA_MESSAGE =
  'This device is out of storage space, so the last change was not saved. Free some space (old photos, other apps) and try again; everything saved before is still here.';

/**
 * What the surveyor is told when the store write failed but the edit is held in its note
 * (./unsaved-edits.ts): it is not lost, but not in the device store either until it goes in.
 */
export function heldEditMessage(err: unknown): string {
  const why = isQuotaError(err)
    ? 'this device is out of storage space; free some (old photos, other apps)'
    : `the device store refused the write: ${err instanceof Error ? err.message : String(err)}`;
  return `Your edit is held on this device but NOT yet stored (${why}). It goes in with your next edit, or when the app next starts on this device; do not clear this browser's data.`;
}

let storageError: string | null = null;
const subs = new Set<() => void>();

/**
 * Records a failed write for the storage panel; returns the message to show beside the form.
 * `held`: the edit is kept in its note for a later write (see heldEditMessage).
 */
export function reportStorageError(err: unknown, held = false): string {
  const message = held
    ? heldEditMessage(err)
    : isQuotaError(err)
      ? QUOTA_MESSAGE
      : `The change could not be saved on this device: ${err instanceof Error ? err.message : String(err)}`;
  storageError = message;
  subs.forEach((fn) => fn());
  return message;
}

export function clearStorageError(): void {
  storageError = null;
  subs.forEach((fn) => fn());
}

export function useStorageError(): string | null {
  return useSyncExternalStore(
    (fn) => {
      subs.add(fn);
      return () => subs.delete(fn);
    },
    () => storageError,
    () => storageError,
  );
}

/** Storage figures, refreshed when asked. */
export function useStorageInfo(): { info: StorageInfo | null; refresh: () => void } {
  const [info, setInfo] = useState<StorageInfo | null>(null);
  const [tick, setTick] = useState(0);
  useEffect(() => {
    let live = true;
    void readStorageInfo().then((i) => live && setInfo(i));
    return () => {
      live = false;
    };
  }, [tick]);
  return { info, refresh: () => setTick((t) => t + 1) };
}

export function formatBytes(n: number): string {
  if (n < 1024) return `${n} B`;
  const units = ['KB', 'MB', 'GB', 'TB'];
  let v = n / 1024;
  let i = 0;
  while (v >= 1024 && i < units.length - 1) {
    v /= 1024;
    i++;
  }
  return `${v.toFixed(v < 10 ? 1 : 0)} ${units[i]}`;
}
