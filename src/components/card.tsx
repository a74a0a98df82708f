import type { HTMLAttributes, ReactNode, Ref } from 'react';
import { cn } from '../lib/cn.ts';

export function Card({ className, ...rest }: HTMLAttributes<HTMLElement> & { ref?: Ref<HTMLElement> }) {
  return <section className={cn('rounded-lg border border-slate-200 bg-white shadow-xs dark:border-slate-800 dark:bg-slate-900', className)} {...rest} />;
}

export type CardHeaderProps = {
  title: ReactNode;
  description?: ReactNode;
  actions?: ReactNode;
  /** Heading level for the title; pages use h1, so cards default to h2. */
  level?: 2 | 3;
};

export function CardHeader({ title, description, actions, level = 2 }: CardHeaderProps) {
  const Heading = level === 2 ? 'h2' : 'h3';
  return (
    <header className="flex flex-wrap items-start justify-between gap-3 border-b border-slate-200 px-5 py-3.5 dark:border-slate-800">
      <div className="min-w-0">
        <Heading className="text-sm font-semibold text-slate-900 dark:text-slate-50">{title}</Heading>
        {description && <p className="mt-0.5 text-xs text-slate-500 dark:text-slate-400">{description}</p>}
      </div>
      {actions && <div className="flex shrink-0 items-center gap-2">{actions}</div>}
    </header>
  );
}

export function CardBody({ className, ...rest }: HTMLAttributes<HTMLDivElement>) {
  return <div className={cn('px-5 py-4', className)} {...rest} />;
}
