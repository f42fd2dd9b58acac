/**
 * Who is using the app, and the access token.
 *
 * - The access token lives only in this module's memory. On load, and whenever the API answers
 *   401, `refreshSession` trades the httpOnly refresh cookie for a new one (one refresh at a time,
 *   across tabs too, so two tabs never spend the same cookie).
 * - The last signed-in person's profile (never a token) is remembered in localStorage, so a
 *   surveyor who opens the app on deck with no network keeps working under their own name.
 * - When the network is back but the refresh is refused, the status becomes `expired`: the app
 *   stays usable and a prompt asks to sign in again. Signing in never clears the device store.
 *
 * Shared by every feature (it lives in lib/, not in features/auth, for that reason).
 */
import { useEffect, useSyncExternalStore, type ReactNode } from 'react';
import type { Me, SessionResponse, UnitSystem } from '@shared/api/auth';
import { api, jsonBody, setTokenSource } from './api-client';
import { setProfileUnitSystem } from './unit-system';
import { parseMe, parseSessionResponse } from './session-body';
import { IDENTITY_KEY } from './identity';

/**
 * Syncs now (the engine is loaded on demand: it is not part of the first screen's JavaScript), and
 * starts the engine if the app did not at load (nobody had signed in on this device: main.tsx).
 */
const syncNow = () =>
  import('@client/offline/sync').then((m) => {
    m.startSync();
    return m.syncNow();
  });

export type SessionStatus =
  /** Checking the refresh cookie (a remembered profile, if any, is already usable). */
  | 'loading'
  /** Signed in with a valid access token. */
  | 'online'
  /** No network: working under the remembered profile. */
  | 'offline'
  /** The network answered but the sign-in has ended: work continues, a prompt asks to sign in. */
  | 'expired'
  | 'signed-out';

export interface Session {
  status: SessionStatus;
  user: Me | null;
}

const PENDING_SIGN_OUT_KEY = 'brineline.pendingSignOut';
const PENDING_UNITS_KEY = 'brineline.pendingUnitSystem';

const storage = {
  get(key: string): string | null {
    try {
      return localStorage.getItem(key);
    } catch {
      return null;
    }
  },
  set(key: string, value: string | null) {
    try {
      if (value === null) localStorage.removeItem(key);
      else localStorage.setItem(key, value);
    } catch {
      /* private mode or full: the session still works for this page */
    }
  },
};

function readIdentity(): Me | null {
  const raw = storage.get(IDENTITY_KEY);
  if (!raw) return null;
  try {
    return parseMe(JSON.parse(raw));
  } catch {
    return null;
  }
}

let accessToken: string | null = null;
let session: Session = { status: 'loading', user: readIdentity() };
const listeners = new Set<() => void>();

function publish(next: Session) {
  session = next;
  setProfileUnitSystem(next.user?.unitSystem ?? null);
  for (const l of listeners) l();
}
setProfileUnitSystem(session.user?.unitSystem ?? null);

function remember(user: Me) {
  storage.set(IDENTITY_KEY, JSON.stringify(user));
}

/** Takes a session the server handed out (sign-in, invitation, refresh). */
export function acceptSession(body: SessionResponse): void {
  const wasOnline = session.status === 'online';
  accessToken = body.accessToken;
  let user = body.user;
  const pendingUnits = storage.get(PENDING_UNITS_KEY);
  if ((pendingUnits === 'si' || pendingUnits === 'us') && pendingUnits !== user.unitSystem) {
    // A unit change made offline wins over the server's older value, and is sent now.
    user = { ...user, unitSystem: pendingUnits };
    void sendUnitSystem(pendingUnits);
  }
  remember(user);
  publish({ status: 'online', user });
  if (!wasOnline) void syncNow();
}

let inFlight: Promise<string | null> | null = null;

/** A fresh access token, or null when the person must sign in again (or there is no network). */
export function refreshSession(): Promise<string | null> {
  inFlight ??= withRefreshLock(doRefresh).finally(() => {
    inFlight = null;
  });
  return inFlight;
}

function withRefreshLock<T>(fn: () => Promise<T>): Promise<T> {
  if (typeof navigator !== 'undefined' && navigator.locks) return navigator.locks.request('brineline-refresh', fn) as Promise<T>;
  return fn();
}

async function doRefresh(): Promise<string | null> {
  const user = session.user;
  let res: Response;
  try {
    res = await fetch('/api/auth/refresh', { method: 'POST', credentials: 'same-origin' });
  } catch {
    accessToken = null;
    publish({ status: user ? 'offline' : 'signed-out', user });
    return null;
  }
  if (res.ok) {
    const parsed = parseSessionResponse(await res.json().catch(() => null));
    if (parsed) {
      acceptSession(parsed);
      return parsed.accessToken;
    }
  }
  accessToken = null;
  if (res.status === 401 || res.status === 403) publish({ status: user ? 'expired' : 'signed-out', user });
  else publish({ status: user ? 'offline' : 'signed-out', user });
  return null;
}

setTokenSource({ get: () => accessToken, refresh: refreshSession });

/** Ends the session on the server and forgets the profile. The device store is left alone. */
export async function signOut(): Promise<void> {
  accessToken = null;
  storage.set(IDENTITY_KEY, null);
  storage.set(PENDING_UNITS_KEY, null);
  publish({ status: 'signed-out', user: null });
  try {
    const res = await fetch('/api/auth/sign-out', { method: 'POST', credentials: 'same-origin' });
    storage.set(PENDING_SIGN_OUT_KEY, res.ok ? null : '1');
  } catch {
    // No network: the cookie is still in the browser. Revoke it before anything else next time.
    storage.set(PENDING_SIGN_OUT_KEY, '1');
  }
}

async function sendUnitSystem(unitSystem: UnitSystem): Promise<void> {
  try {
    await api('/api/me', { method: 'PATCH', ...jsonBody({ unitSystem }) });
    storage.set(PENDING_UNITS_KEY, null);
  } catch {
    storage.set(PENDING_UNITS_KEY, unitSystem);
  }
}

/** Switches SI / US for this person: at once on the device, on the server when it can be reached. */
export function changeUnitSystem(unitSystem: UnitSystem): void {
  if (!session.user) return;
  const user = { ...session.user, unitSystem };
  remember(user);
  storage.set(PENDING_UNITS_KEY, unitSystem);
  publish({ ...session, user });
  void sendUnitSystem(unitSystem);
}

let started = false;
async function start(): Promise<void> {
  if (started) return;
  started = true;
  if (storage.get(PENDING_SIGN_OUT_KEY)) {
    try {
      const res = await fetch('/api/auth/sign-out', { method: 'POST', credentials: 'same-origin' });
      if (res.ok) storage.set(PENDING_SIGN_OUT_KEY, null);
    } catch {
      /* still offline: stay signed out */
    }
    publish({ status: 'signed-out', user: null });
    return;
  }
  // Nobody has signed in on this device (no remembered profile, which every sign-in leaves): there is
  // no refresh cookie to trade, so ask nothing that could only answer 401.
  if (session.user) await refreshSession();
  else publish({ status: 'signed-out', user: null });
  window.addEventListener('online', () => {
    if (session.status === 'offline') void refreshSession();
  });
}

function subscribe(l: () => void) {
  listeners.add(l);
  return () => listeners.delete(l);
}
const snapshot = () => session;

export function useSession(): Session {
  return useSyncExternalStore(subscribe, snapshot, snapshot);
}

/** Starts the session check once the app mounts. */
export function SessionProvider({ children }: { children: ReactNode }) {
  useEffect(() => {
    void start();
  }, []);
  return children;
}
