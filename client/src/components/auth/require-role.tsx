/**
 * Route guard: only a known person (signed in, or remembered on this device while offline) with
 * one of `roles` sees the screens inside. Used as a layout route in app/router.tsx.
 */
import type { ReactNode } from 'react';
import { Link, Navigate, Outlet, useLocation } from 'react-router';
import type { Role } from '@shared/api/roles';
import { paths } from '@client/config/paths';
import { useSession } from '@client/lib/session';

export function RequireRole({ roles, children }: { roles?: readonly Role[]; children?: ReactNode }) {
  const { status, user } = useSession();
  const location = useLocation();
  if (!user) {
    if (status === 'loading') {
      return (
        <p role="status" className="p-6 text-ink-soft">
          Checking your sign-in…
        </p>
      );
    }
    const next = `${location.pathname}${location.search}`;
    return <Navigate to={`${paths.signIn}?next=${encodeURIComponent(next)}`} replace />;
  }
  if (roles && !roles.includes(user.role)) {
    return (
      <main className="mx-auto max-w-xl p-6">
        <h1 className="text-2xl">Not for your role</h1>
        <p className="mt-2 text-ink-soft">This screen is for {roles.join(' or ')}s of your organisation. Ask your admin if you need it.</p>
        <Link className="mt-4 inline-flex min-h-touch items-center rounded-lg bg-hull px-4 font-bold text-paper" to={paths.home}>
          Back to the start
        </Link>
      </main>
    );
  }
  return children ?? <Outlet />;
}
