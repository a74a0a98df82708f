import type { ReactNode } from 'react';

export type PageHeaderProps = {
  title: string;
  /** A short context line above the title, e.g. "Admin". */
  eyebrow?: string;
  description?: ReactNode;
  actions?: ReactNode;
  /** The browser tab's title before " · Parley" (default: the title). Names the object: "Trace 7 — K65 late PS_RDY". */
  documentTitle?: string;
};

/** The browser tab's title for a page: what it is, then the product (React hoists it into <head>). */
export function DocumentTitle({ title }: { title: string }) {
  return <title>{`${title} · Parley`}</title>;
}

export function PageHeader({ title, eyebrow, description, actions, documentTitle }: PageHeaderProps) {
  return (
    <header className="mb-6 flex flex-wrap items-end justify-between gap-4">
      <DocumentTitle title={documentTitle ?? title} />
      <div className="min-w-0">
        {eyebrow && <p className="mb-1 font-mono text-[11px] font-medium tracking-widest text-amber-700 uppercase dark:text-amber-400">{eyebrow}</p>}
        <h1 className="text-xl font-semibold tracking-tight text-slate-900 dark:text-slate-50">{title}</h1>
        {description && <p className="mt-1 max-w-3xl text-sm text-slate-600 dark:text-slate-400">{description}</p>}
      </div>
      {actions && <div className="flex items-center gap-2">{actions}</div>}
    </header>
  );
}
