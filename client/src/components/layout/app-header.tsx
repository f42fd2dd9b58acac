import type { ReactNode } from 'react';
import { Link } from 'react-router';
import { paths } from '@client/config/paths';

/** The bar at the top of every signed-in screen: product name, then whatever the app adds on the right. */
export function AppHeader({ children }: { children?: ReactNode }) {
  return (
    <header className="sticky top-0 z-20 bg-hull text-paper shadow-md">
      <div className="mx-auto flex min-h-14 max-w-6xl flex-wrap items-center gap-x-4 gap-y-1 px-3 py-1 sm:px-5">
        <Link to={paths.home} className="flex items-center gap-2 rounded py-2 text-xl font-bold tracking-wide no-underline">
          <img src="/favicon.svg" alt="" width={28} height={28} />
          <span data-testid="product-name">Brineline</span>
        </Link>
        <div className="ml-auto flex flex-wrap items-center gap-2 text-sm">{children}</div>
      </div>
    </header>
  );
}
