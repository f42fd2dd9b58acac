/** How much of the device's storage Brineline uses, whether it is protected, and any failed write. */
import { clearStorageError, formatBytes, useStorageError, useStorageInfo } from '@client/offline/storage';

export function StorageStatus() {
  const { info } = useStorageInfo();
  const error = useStorageError();
  return (
    <div className="mt-3 border-t border-line pt-2 text-ink-soft" data-testid="storage-status">
      <p>
        Storage on this device:{' '}
        {info?.usageBytes != null && info.quotaBytes != null
          ? `${formatBytes(info.usageBytes)} used of ${formatBytes(info.quotaBytes)} available`
          : 'size not reported by this browser'}
        .
      </p>
      <p>
        {info?.persisted
          ? 'Kept safe: the browser will not clear it to make room.'
          : 'Not yet protected: the browser may clear it when space runs low. Installing the app helps.'}
      </p>
      {error && (
        <div className="mt-2 rounded border border-danger bg-danger-soft p-2 text-ink" role="alert">
          <p>{error}</p>
          <button type="button" className="mt-1 min-h-touch px-1 underline" onClick={clearStorageError}>
            Dismiss
          </button>
        </div>
      )}
    </div>
  );
}
