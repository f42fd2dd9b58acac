import { Outlet } from 'react-router';
import { AppHeader } from '@client/components/layout/app-header';

export function AppLayout() {
  return (
    <div className="flex min-h-dvh flex-col">
      <AppHeader />
      <div className="flex-1">
        <Outlet />
      </div>
    </div>
  );
}
