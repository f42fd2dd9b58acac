import type { ReactNode } from 'react';
import { Link } from 'react-router';
import { paths } from '@client/config/paths';

/**
 * The bar at the top of every screen: product name, then whatever the app adds on the right. One row
 * at any width: on a phone the name is the mark alone (the word stays for screen readers).
 */
export function AppHeader({ children }: { children?: ReactNode }) {
  return (
    <header className="sticky top-0 z-20 bg-hull text-paper shadow-md">
      <div className="mx-auto flex min-h-14 max-w-6xl items-center gap-2 px-3 py-1 sm:gap-4 sm:px-5">
        <Link to={paths.home} className="flex shrink-0 items-center gap-2 rounded py-2 text-xl font-bold tracking-wide no-underline">
          <img src="/favicon.svg" alt="" width={28} height={28} />
          <span data-testid="product-name" className="max-sm:sr-only">Brineline</span>
        </Link>
        <div className="ml-auto flex min-w-0 items-center justify-end gap-2 text-sm">{children}</div>
      </div>
    </header>
  );
}
