import type { ReactNode } from 'react';
import { cn } from '../lib/cn.ts';

/** Severity tones match the engine's finding severities; the rest are for states and roles. */
export type BadgeTone = 'error' | 'warning' | 'info' | 'success' | 'neutral' | 'accent';

const tones: Record<BadgeTone, string> = {
  error: 'bg-red-50 text-red-700 ring-red-600/25 dark:bg-red-500/10 dark:text-red-300 dark:ring-red-400/30',
  warning: 'bg-orange-50 text-orange-800 ring-orange-600/25 dark:bg-orange-500/10 dark:text-orange-300 dark:ring-orange-400/30',
  info: 'bg-sky-50 text-sky-700 ring-sky-600/25 dark:bg-sky-500/10 dark:text-sky-300 dark:ring-sky-400/30',
  success: 'bg-emerald-50 text-emerald-700 ring-emerald-600/25 dark:bg-emerald-500/10 dark:text-emerald-300 dark:ring-emerald-400/30',
  neutral: 'bg-slate-100 text-slate-700 ring-slate-500/20 dark:bg-slate-800 dark:text-slate-300 dark:ring-slate-600/40',
  accent: 'bg-amber-50 text-amber-800 ring-amber-600/30 dark:bg-amber-400/10 dark:text-amber-300 dark:ring-amber-400/30',
};

const dots: Record<BadgeTone, string> = {
  error: 'bg-red-500',
  warning: 'bg-orange-500',
  info: 'bg-sky-500',
  success: 'bg-emerald-500',
  neutral: 'bg-slate-400',
  accent: 'bg-amber-500',
};

export type BadgeProps = {
  tone?: BadgeTone;
  children: ReactNode;
  /** A leading dot, so the tone does not rely on colour alone next to similar badges. */
  dot?: boolean;
  mono?: boolean;
  className?: string;
  title?: string;
};

export function Badge({ tone = 'neutral', children, dot, mono, className, title }: BadgeProps) {
  return (
    <span
      title={title}
      className={cn('inline-flex items-center gap-1.5 rounded px-1.5 py-0.5 text-[11px] leading-4 font-medium ring-1 ring-inset whitespace-nowrap', mono && 'font-mono', tones[tone], className)}
    >
      {dot && <span aria-hidden="true" className={cn('size-1.5 rounded-full', dots[tone])} />}
      {children}
    </span>
  );
}

/** A finding severity as a badge with its word, never colour alone. */
export function SeverityBadge({ severity }: { severity: 'error' | 'warning' | 'info' }) {
  return (
    <Badge tone={severity} dot>
      {severity}
    </Badge>
  );
}
