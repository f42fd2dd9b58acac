import type { ReactNode } from 'react';

/** The narrow card every account screen sits in. */
export function AuthCard({ title, intro, children }: { title: string; intro?: ReactNode; children: ReactNode }) {
  return (
    <main className="mx-auto w-full max-w-md p-3 sm:p-6">
      <div className="rounded-xl border border-line bg-card p-4 shadow-sm sm:p-6">
        <h1 className="text-2xl">{title}</h1>
        {intro && <div className="mt-2 text-ink-soft">{intro}</div>}
        <div className="mt-4">{children}</div>
      </div>
    </main>
  );
}
