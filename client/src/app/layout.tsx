import { Outlet } from 'react-router';
import { AppHeader } from '@client/components/layout/app-header';
import { SyncStatus } from '@client/features/sync/components/sync-status';
import { UpdateBanner } from '@client/components/layout/update-banner';
import { UserMenu } from '@client/features/auth/components/user-menu';
import { SessionPrompt } from '@client/features/auth/components/session-prompt';
import { RouteFocus } from './route-focus';

const MAIN_ID = 'page';

export function AppLayout() {
  return (
    <div className="flex min-h-dvh flex-col">
      <a
        href={`#${MAIN_ID}`}
        className="sr-only z-50 rounded-lg bg-card px-4 py-2 font-bold text-hull focus:not-sr-only focus:absolute focus:left-2 focus:top-2"
      >
        Skip to content
      </a>
      <RouteFocus mainId={MAIN_ID} />
      <AppHeader>
        <SyncStatus />
        <UserMenu />
      </AppHeader>
      <SessionPrompt />
      <UpdateBanner />
      <div className="flex-1 focus:outline-none" id={MAIN_ID} tabIndex={-1}>
        <Outlet />
      </div>
    </div>
  );
}
