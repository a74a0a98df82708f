import type { ReactNode } from 'react';

/** Heading and lead text for the pages in the auth layout. */
export function AuthHeading({ title, children }: { title: string; children?: ReactNode }) {
  return (
    <header className="mb-6">
      <h1 className="text-2xl font-semibold tracking-tight text-slate-900 dark:text-slate-50">{title}</h1>
      {children && <p className="mt-1.5 text-sm text-slate-600 dark:text-slate-400">{children}</p>}
    </header>
  );
}
