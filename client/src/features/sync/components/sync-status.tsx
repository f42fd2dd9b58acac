/**
 * The sync state in the header, always visible: offline / changes waiting (n) / syncing / synced
 * at HH:MM / needs attention. Opening it shows what needs attention (refused changes, conflicts,
 * sign-in), lets the user sync now, and shows the device storage.
 */
import { lazy, Suspense } from 'react';
import { Link } from 'react-router';
import { paths } from '@client/config/paths';
import { useSyncState, type SyncState } from '@client/offline/sync-state';
import { useSession } from '@client/lib/session';
import { describeOp } from '@client/offline/describe';
import { StorageStatus } from './storage-status';

// The header is on every screen: what needs the device store or the sync engine (Dexie, zod) is
// loaded when used, not with the first screen.
const ConflictList = lazy(() => import('./conflict-list').then((m) => ({ default: m.ConflictList })));
const syncNow = () => import('@client/offline/sync').then((m) => m.syncNow());
const dismissRejectedChange = (seq: number) => import('@client/offline/local-surveys').then((m) => m.dismissRejectedChange(seq));

const hhmm = (iso?: string) =>
  iso ? new Date(iso).toLocaleTimeString([], { hour: '2-digit', minute: '2-digit', hour12: false }) : undefined;

function label(s: SyncState): { text: string; tone: string; icon: string } {
  switch (s.state) {
    case 'offline':
      return { text: s.pending > 0 ? `Offline · ${s.pending} waiting` : 'Offline', tone: 'bg-hull-soft text-paper', icon: '○' };
    case 'waiting':
      return { text: `${s.pending} change${s.pending === 1 ? '' : 's'} waiting`, tone: 'bg-caution-soft text-ink', icon: '◔' };
    case 'syncing':
      return { text: 'Syncing…', tone: 'bg-sea-soft text-ink', icon: '↻' };
    case 'synced':
      return { text: s.lastSyncedAt ? `Synced at ${hhmm(s.lastSyncedAt)}` : 'Up to date', tone: 'bg-ok-soft text-ink', icon: '✓' };
    case 'attention':
      return {
        text: s.needsSignIn ? 'Sign in to sync' : 'Needs attention',
        tone: 'bg-danger-soft text-ink',
        icon: '!',
      };
  }
}

export function SyncStatus() {
  const s = useSyncState();
  const { user } = useSession();
  // a visitor who is not signed in and has nothing on this device has nothing to sync
  if (!user && s.pending === 0) return null;
  const l = label(s);
  return (
    <details className="relative" data-testid="sync-status" data-state={s.state} data-pending={s.pending}>
      <summary
        className={`flex min-h-touch cursor-pointer list-none items-center gap-1.5 whitespace-nowrap rounded-full px-3 text-sm font-bold ${l.tone}`}
        aria-label={`Sync: ${l.text}`}
      >
        <span aria-hidden="true">{l.icon}</span>
        <span data-testid="sync-label">{l.text}</span>
      </summary>
      <div className="absolute right-0 z-30 mt-2 w-80 max-w-[calc(100vw-1.5rem)] rounded-lg border border-line bg-card p-3 text-sm text-ink shadow-lg">
        <p>
          {s.pending > 0
            ? `${s.pending} change${s.pending === 1 ? '' : 's'} kept on this device, not yet on the server.`
            : 'Every change on this device has reached the server.'}
        </p>
        {s.lastSyncedAt && <p className="text-ink-soft">Last synced at {hhmm(s.lastSyncedAt)}.</p>}
        {s.state === 'offline' && <p className="mt-1 text-ink-soft">No connection to the server. Keep working: changes sync when a link appears.</p>}
        {s.error && (
          <p className="mt-1 text-danger" role="status">
            Sync failed: {s.error} {s.retryAt ? `Retrying at ${hhmm(s.retryAt)}.` : ''}
          </p>
        )}
        {s.needsSignIn && (
          <p className="mt-2">
            Your session has ended. <Link to={paths.signIn} className="font-bold underline">Sign in</Link> to sync — nothing on this device is lost.
          </p>
        )}
        {s.openConflicts > 0 && (
          <div className="max-h-[60vh] overflow-y-auto" data-testid="sync-conflicts">
            <Suspense fallback={null}>
              <ConflictList />
            </Suspense>
          </div>
        )}
        {s.rejected.length > 0 && (
          <div className="mt-2">
            <p className="font-bold">The server refused {s.rejected.length === 1 ? 'this change' : 'these changes'}:</p>
            <ul className="mt-1 space-y-1" data-testid="sync-rejected">
              {s.rejected.map((r) => (
                <li key={r.seq} className="rounded border border-danger bg-danger-soft p-2">
                  <p>{describeOp(r.op)}</p>
                  <p className="text-ink-soft">{r.reason}</p>
                  <button type="button" className="mt-1 min-h-touch px-1 underline" onClick={() => void dismissRejectedChange(r.seq!)}>
                    Dismiss
                  </button>
                </li>
              ))}
            </ul>
          </div>
        )}
        <button
          type="button"
          onClick={() => void syncNow()}
          className="mt-3 min-h-touch w-full rounded-lg bg-hull px-3 font-bold text-paper"
          disabled={s.state === 'syncing'}
        >
          Sync now
        </button>
        <StorageStatus />
      </div>
    </details>
  );
}
