import { useEffect, useState } from 'react';
import { useNavigate } from 'react-router';
import { useQueryClient } from '@tanstack/react-query';
import { paths } from '@client/config/paths';
import { signOut } from '@client/lib/session';
import { Button } from '@client/components/ui/button';
import { FormAlert } from '@client/components/ui/form-field';
import { Modal } from './modal';

// The device store (Dexie) is loaded when the dialog needs it, not with every screen.
const pendingChangeCount = async () => (await import('@client/offline/sync-counts')).pendingChangeCount();
const clearDevice = async () => {
  const { db } = await import('@client/offline/db');
  await Promise.all(db.tables.map((t) => t.clear()));
};

/**
 * Asks before signing out. By default the device store is kept (it opens again at the next
 * sign-in); removing it is a separate choice, and unsynced changes are named before they go.
 */
export function SignOutDialog({ open, onClose }: { open: boolean; onClose: () => void }) {
  const [pending, setPending] = useState<number | null>(null);
  const [removeData, setRemoveData] = useState(false);
  const [busy, setBusy] = useState(false);
  const navigate = useNavigate();
  const queryClient = useQueryClient();

  useEffect(() => {
    if (!open) return;
    setRemoveData(false);
    pendingChangeCount()
      .then(setPending)
      .catch(() => setPending(0));
  }, [open]);

  const confirm = async () => {
    setBusy(true);
    if (removeData) await clearDevice();
    await signOut();
    queryClient.clear();
    setBusy(false);
    onClose();
    navigate(paths.signIn);
  };

  const unsynced = pending ?? 0;
  return (
    <Modal open={open} title="Sign out of Brineline?" onClose={onClose}>
      <p>Your surveys stay on this device and open again when you sign in.</p>
      {unsynced > 0 && !removeData && (
        <FormAlert tone="info">
          {unsynced === 1 ? '1 change has' : `${unsynced} changes have`} not reached the server yet. {unsynced === 1 ? 'It stays' : 'They stay'} on
          this device and sync after the next sign-in.
        </FormAlert>
      )}
      <label className="mt-3 flex min-h-touch cursor-pointer items-start gap-3 py-2">
        <input type="checkbox" className="mt-1 size-6 shrink-0" checked={removeData} onChange={(e) => setRemoveData(e.target.checked)} />
        <span>Also remove all surveys and photos from this device (for a shared or lost phone)</span>
      </label>
      {removeData && (
        <FormAlert>
          {unsynced > 0
            ? `This deletes ${unsynced === 1 ? '1 change' : `${unsynced} changes`} that exist nowhere else. They cannot be brought back.`
            : 'Everything on this device has reached the server; it can be downloaded again after signing in.'}
        </FormAlert>
      )}
      <div className="mt-4 flex flex-wrap justify-end gap-2">
        <Button tone="secondary" onClick={onClose} disabled={busy}>
          Cancel
        </Button>
        <Button tone={removeData ? 'danger' : 'primary'} onClick={() => void confirm()} disabled={busy || pending === null}>
          {removeData && unsynced > 0 ? `Delete ${unsynced} unsynced and sign out` : 'Sign out'}
        </Button>
      </div>
    </Modal>
  );
}
