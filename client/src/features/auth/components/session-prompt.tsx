import { lazy, Suspense, useState } from 'react';
import { useSession } from '@client/lib/session';
import { Button } from '@client/components/ui/button';
import { Modal } from './modal';

// The form (react-hook-form, zod) is loaded when the dialog opens, not with every screen.
const SignInForm = lazy(() => import('./sign-in-form').then((m) => ({ default: m.SignInForm })));

/**
 * When the network is back but the sign-in has ended, say so without blocking the work: a banner,
 * and a sign-in form in a dialog. Nothing on the device is touched.
 */
export function SessionPrompt() {
  const { status, user } = useSession();
  const [open, setOpen] = useState(false);
  if (status !== 'expired' || !user) return null;
  return (
    <div role="status" className="border-b-2 border-caution bg-caution-soft" data-testid="session-expired">
      <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-3 px-3 py-2 sm:px-5">
        <p className="min-w-0 flex-1">
          <strong>Your sign-in has ended.</strong> Your work stays on this device; sign in again to sync it.
        </p>
        <Button onClick={() => setOpen(true)}>Sign in again</Button>
      </div>
      <Modal open={open} title="Sign in again" onClose={() => setOpen(false)}>
        <Suspense fallback={<p className="text-ink-soft">Loading…</p>}>
          <SignInForm defaultEmail={user.email} onSignedIn={() => setOpen(false)} />
        </Suspense>
      </Modal>
    </div>
  );
}
