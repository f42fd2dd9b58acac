import { Outlet } from 'react-router';
import { AppHeader } from '@client/components/layout/app-header';
import { SyncStatus } from '@client/features/sync/components/sync-status';
import { UpdateBanner } from '@client/components/layout/update-banner';
import { UserMenu } from '@client/features/auth/components/user-menu';
import { SessionPrompt } from '@client/features/auth/components/session-prompt';

export function AppLayout() {
  return (
    <div className="flex min-h-dvh flex-col">
      <AppHeader>
        <SyncStatus />
        <UserMenu />
      </AppHeader>
      <SessionPrompt />
      <UpdateBanner />
      <div className="flex-1">
        <Outlet />
      </div>
    </div>
  );
}
