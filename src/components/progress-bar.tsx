import { cn } from '../lib/cn.ts';

export type ProgressBarProps = {
  /** 0…1; omit for an indeterminate bar. */
  fraction?: number;
  label: string;
  className?: string;
};

export function ProgressBar({ fraction, label, className }: ProgressBarProps) {
  const known = fraction !== undefined && Number.isFinite(fraction);
  const percent = known ? Math.round(Math.min(1, Math.max(0, fraction)) * 100) : undefined;
  return (
    <div className={cn('flex items-center gap-3', className)}>
      <div
        role="progressbar"
        aria-label={label}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={percent}
        className="relative h-1.5 flex-1 overflow-hidden rounded-full bg-slate-200 dark:bg-slate-800"
      >
        <div className={cn('h-full rounded-full bg-amber-500 transition-[width] duration-200', !known && 'w-1/3 animate-pulse')} style={known ? { width: `${percent}%` } : undefined} />
      </div>
      {known && <span className="w-10 text-right font-mono text-xs text-slate-500 tabular dark:text-slate-400">{percent}%</span>}
    </div>
  );
}
