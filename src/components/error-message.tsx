import type { ReactNode } from 'react';
import { isApiError } from '../lib/api-client.ts';
import { cn } from '../lib/cn.ts';

/** The words to show for an error: the server's message for API errors, a calm default otherwise. */
export function errorText(error: unknown): string {
  if (isApiError(error)) return error.message;
  if (error instanceof Error && error.name === 'ChunkLoadError') return 'Parley was updated. Reload the page.';
  return 'Something went wrong. Try again, and reload the page if it keeps happening.';
}

export type ErrorMessageProps = {
  title?: string;
  error?: unknown;
  children?: ReactNode;
  action?: ReactNode;
  className?: string;
};

export function ErrorMessage({ title = 'Something went wrong', error, children, action, className }: ErrorMessageProps) {
  return (
    <div
      role="alert"
      className={cn('flex items-start gap-3 rounded-md border border-red-200 bg-red-50 px-4 py-3 text-sm text-red-800 dark:border-red-500/30 dark:bg-red-500/10 dark:text-red-200', className)}
    >
      <svg aria-hidden="true" viewBox="0 0 20 20" className="mt-0.5 size-4 shrink-0 fill-current">
        <path d="M10 1.5 19 17.5H1L10 1.5Zm-.9 6v5h1.8v-5H9.1Zm0 6.5v1.8h1.8V14H9.1Z" />
      </svg>
      <div className="min-w-0 flex-1">
        <p className="font-medium">{title}</p>
        {error !== undefined && <p className="mt-0.5 text-red-700 dark:text-red-300">{errorText(error)}</p>}
        {children}
      </div>
      {action}
    </div>
  );
}
