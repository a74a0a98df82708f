import type { ReactNode } from 'react';
import { cn } from '../lib/cn.ts';

export type EmptyStateProps = {
  title: string;
  description?: ReactNode;
  action?: ReactNode;
  className?: string;
};

export function EmptyState({ title, description, action, className }: EmptyStateProps) {
  return (
    <div className={cn('flex flex-col items-center justify-center gap-2 rounded-lg border border-dashed border-slate-300 px-6 py-10 text-center dark:border-slate-700', className)}>
      <svg aria-hidden="true" viewBox="0 0 40 16" className="h-4 w-10 text-slate-400 dark:text-slate-600">
        <path d="M0 8h8l3-6 4 12 4-12 4 12 3-6h14" fill="none" stroke="currentColor" strokeWidth="1.5" />
      </svg>
      <p className="text-sm font-medium text-slate-700 dark:text-slate-200">{title}</p>
      {description && <p className="max-w-md text-xs text-slate-500 dark:text-slate-400">{description}</p>}
      {action && <div className="mt-2">{action}</div>}
    </div>
  );
}
