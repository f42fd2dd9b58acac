/**
 * Installing a new version of the app. The service worker is registered with `registerType:
 * 'prompt'`: a new version waits until the user agrees, and even then the page is not reloaded while
 * edits wait in the outbox or a form has unsaved input — the reload would be harmless for the
 * outbox (it lives in IndexedDB) but would throw away a half-typed form and interrupt a sync.
 */
import { useSyncExternalStore } from 'react';

// The outbox count, the sync engine and the service-worker helper are loaded when first needed, so
// the update banner adds neither Dexie nor zod to the first screen's JavaScript.
const pendingChangeCount = async () => (await import('./sync-counts')).pendingChangeCount();
const syncNow = async () => (await import('./sync')).syncNow();

const UPDATE_CHECK_MS = 60 * 60_000;

interface PwaState {
  /** A new version is installed and waiting. */
  updateReady: boolean;
  /** The app shell is cached: it opens with no network. */
  offlineReady: boolean;
  /** Why the update cannot be applied right now, if it cannot. */
  blockedReason: string | null;
  dismissed: boolean;
}

let state: PwaState = { updateReady: false, offlineReady: false, blockedReason: null, dismissed: false };
const subs = new Set<() => void>();
function set(patch: Partial<PwaState>) {
  state = { ...state, ...patch };
  subs.forEach((fn) => fn());
}

const dirtyForms = new Set<string>();

/** Forms call this with true while they hold unsaved input, and false when saved or discarded. */
export function setFormDirty(flag: boolean, formKey = 'form'): void {
  if (flag) dirtyForms.add(formKey);
  else dirtyForms.delete(formKey);
  if (state.blockedReason && dirtyForms.size === 0) void refreshBlock();
}

export function isAnyFormDirty(): boolean {
  return dirtyForms.size > 0;
}

let updateSW: ((reload?: boolean) => Promise<void>) | null = null;
let registration: ServiceWorkerRegistration | undefined;

async function whyNotNow(): Promise<string | null> {
  const pending = await pendingChangeCount();
  if (pending > 0) {
    return `${pending} change${pending === 1 ? ' is' : 's are'} still waiting to reach the server. The update can be installed once they have synced.`;
  }
  if (dirtyForms.size > 0) return 'A form has unsaved input. Save or cancel it first, then update.';
  return null;
}

async function refreshBlock(): Promise<void> {
  set({ blockedReason: await whyNotNow() });
}

/** Registers the service worker (production builds). Safe to call once at start-up. */
export function registerPwa(): void {
  if (typeof navigator === 'undefined' || !('serviceWorker' in navigator)) return;
  void import('virtual:pwa-register').then(({ registerSW }) => {
    updateSW = registerSW({
      immediate: true,
      onNeedRefresh: () => set({ updateReady: true, dismissed: false }),
      onOfflineReady: () => set({ offlineReady: true }),
      onRegisteredSW: (_url, reg) => {
        registration = reg;
        if (reg) setInterval(() => void reg.update().catch(() => undefined), UPDATE_CHECK_MS);
      },
    });
  });
}

/** Looks for a new version now (also done every hour). */
export async function checkForUpdate(): Promise<void> {
  await registration?.update().catch(() => undefined);
}

/**
 * Installs the waiting version and reloads, if nothing would be lost; otherwise says why not (and
 * starts a sync so the outbox can empty). Returns whether the update went ahead.
 */
export async function applyUpdate(): Promise<boolean> {
  if (!state.updateReady || !updateSW) return false;
  let reason = await whyNotNow();
  if (reason && (await pendingChangeCount()) > 0) {
    await syncNow();
    reason = await whyNotNow();
  }
  set({ blockedReason: reason });
  if (reason) return false;
  await updateSW(true);
  return true;
}

export function dismissUpdate(): void {
  set({ dismissed: true });
}

export function usePwaState(): PwaState {
  return useSyncExternalStore(
    (fn) => {
      subs.add(fn);
      return () => subs.delete(fn);
    },
    () => state,
    () => state,
  );
}
