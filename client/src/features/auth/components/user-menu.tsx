import { useState } from 'react';
import { Link, useLocation } from 'react-router';
import type { Me, UnitSystem } from '@shared/api/auth';
import { ROLE_LABELS } from '@shared/api/role-labels';
import { paths } from '@client/config/paths';
import { changeUnitSystem, useSession } from '@client/lib/session';
import { SignOutDialog } from './sign-out-dialog';
import { useDevMailbox } from '@client/lib/dev-mailbox';

const headerButton = 'inline-flex min-h-touch items-center rounded-lg px-3 font-bold hover:bg-hull-soft';

function UnitToggle({ user }: { user: Me }) {
  return (
    <div role="group" aria-label="Units" className="inline-flex overflow-hidden rounded-lg border-2 border-paper/60">
      {(['si', 'us'] as UnitSystem[]).map((u) => (
        <button
          key={u}
          type="button"
          aria-pressed={user.unitSystem === u}
          onClick={() => changeUnitSystem(u)}
          className={`min-h-touch min-w-touch px-2 font-bold ${user.unitSystem === u ? 'bg-paper text-hull' : 'hover:bg-hull-soft'}`}
        >
          {u.toUpperCase()}
        </button>
      ))}
    </div>
  );
}

function Who({ user }: { user: Me }) {
  return (
    <div className="min-w-0 leading-tight" data-testid="current-user">
      <div className="truncate font-bold">{user.name || user.email}</div>
      <div className="truncate text-xs opacity-90">
        {user.organisation.name} · {ROLE_LABELS[user.role]}
      </div>
    </div>
  );
}

/**
 * The signed-in person in the header: name, organisation, role, SI/US, and sign-out. Inline on
 * wide screens; behind one button on a phone, so the sticky header stays one line high.
 */
export function UserMenu() {
  const { user } = useSession();
  const location = useLocation();
  const [signingOut, setSigningOut] = useState(false);
  const [open, setOpen] = useState(false);
  // development servers only: the caught e-mail (an admin's firm's, an engineer's own briefs)
  const devMailbox = useDevMailbox(user?.role === 'admin' || user?.role === 'engineer');

  if (!user) {
    // the sign-in page and the landing page (which has its own big button) need no second sign-in action
    if (location.pathname === paths.signIn || location.pathname === paths.home) return null;
    return (
      <Link to={paths.signIn} className={`${headerButton} border-2 border-paper/60`}>
        Sign in
      </Link>
    );
  }

  const membersLink = user.role === 'admin' && (
    <Link to={paths.members} className={headerButton} onClick={() => setOpen(false)}>
      Members
    </Link>
  );
  const mailLink = devMailbox && (
    <Link to={paths.devMail} className={headerButton} onClick={() => setOpen(false)}>
      Mailbox
    </Link>
  );
  const reviewLink = (user.role === 'engineer' || user.role === 'admin') && (
    <Link to={paths.review} className={headerButton} onClick={() => setOpen(false)}>
      Review
    </Link>
  );
  const signOutButton = (
    <button
      type="button"
      className={`${headerButton} border-2 border-paper/60`}
      onClick={() => {
        setOpen(false);
        setSigningOut(true);
      }}
    >
      Sign out
    </button>
  );

  return (
    <>
      <div className="hidden items-center gap-2 md:flex">
        {reviewLink}
        {membersLink}
        {mailLink}
        <Who user={user} />
        <UnitToggle user={user} />
        {signOutButton}
      </div>
      <div className="relative md:hidden">
        <button
          type="button"
          aria-expanded={open}
          aria-controls="account-panel"
          onClick={() => setOpen((o) => !o)}
          className={`${headerButton} max-w-[9rem] border-2 border-paper/60`}
        >
          <span className="truncate">{user.name || user.email}</span>
          <span aria-hidden="true" className="ml-1">
            {open ? '▴' : '▾'}
          </span>
        </button>
        {open && (
          <div id="account-panel" className="absolute right-0 z-30 mt-2 w-72 max-w-[calc(100vw-1.5rem)] space-y-3 rounded-xl bg-hull p-3 shadow-xl ring-1 ring-paper/30">
            <Who user={user} />
            <UnitToggle user={user} />
            <div className="flex flex-wrap gap-2">
              {reviewLink}
              {membersLink}
              {mailLink}
              {signOutButton}
            </div>
          </div>
        )}
      </div>
      <SignOutDialog open={signingOut} onClose={() => setSigningOut(false)} />
    </>
  );
}
