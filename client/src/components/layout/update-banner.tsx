/** Offers a new version of the app; never installs it on its own. */
import { applyUpdate, dismissUpdate, usePwaState } from '@client/offline/pwa';

export function UpdateBanner() {
  const pwa = usePwaState();
  if (!pwa.updateReady || pwa.dismissed) return null;
  return (
    <div role="status" className="border-b-2 border-sea bg-sea-soft px-3 py-2 text-ink" data-testid="update-banner">
      <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-4 gap-y-2">
        <p className="font-bold">A new version of Brineline is ready</p>
        <button
          type="button"
          className="min-h-touch rounded-lg bg-hull px-4 font-bold text-paper"
          onClick={() => void applyUpdate()}
        >
          Update
        </button>
        <button type="button" className="min-h-touch px-2 underline" onClick={dismissUpdate}>
          Later
        </button>
        {pwa.blockedReason && (
          <p className="w-full text-sm" data-testid="update-blocked">
            {pwa.blockedReason}
          </p>
        )}
      </div>
    </div>
  );
}
