import { useId, type ReactNode } from 'react';
import { cn } from '../lib/cn.ts';

export type FieldProps = {
  label: ReactNode;
  /** Shown under the control in red and announced with it. */
  error?: string;
  hint?: ReactNode;
  className?: string;
  /** Hides the label visually while keeping it for screen readers. */
  hideLabel?: boolean;
  children: (control: { id: string; describedBy: string | undefined; invalid: boolean }) => ReactNode;
};

/** Label, control, hint and inline error, wired together with ids for assistive technology. */
export function Field({ label, error, hint, className, hideLabel, children }: FieldProps) {
  const id = useId();
  const hintId = hint ? `${id}-hint` : undefined;
  const errorId = error ? `${id}-error` : undefined;
  const describedBy = [hintId, errorId].filter(Boolean).join(' ') || undefined;
  return (
    <div className={cn('flex flex-col gap-1.5', className)}>
      <label htmlFor={id} className={cn('text-xs font-medium text-slate-700 dark:text-slate-300', hideLabel && 'sr-only')}>
        {label}
      </label>
      {children({ id, describedBy, invalid: Boolean(error) })}
      {hint && !error && (
        <p id={hintId} className="text-xs text-slate-500 dark:text-slate-400">
          {hint}
        </p>
      )}
      {error && (
        <p id={errorId} role="alert" className="text-xs font-medium text-red-600 dark:text-red-400">
          {error}
        </p>
      )}
    </div>
  );
}

export const controlClasses =
  'w-full rounded-md border bg-white px-3 text-sm text-slate-900 shadow-xs placeholder:text-slate-400 ' +
  'focus:border-amber-500 focus:outline-2 focus:outline-offset-0 focus:outline-amber-500/40 ' +
  'disabled:cursor-not-allowed disabled:opacity-60 dark:bg-slate-900 dark:text-slate-100 dark:placeholder:text-slate-500';

export function controlBorder(invalid: boolean): string {
  return invalid ? 'border-red-500 dark:border-red-500' : 'border-slate-300 dark:border-slate-700';
}
