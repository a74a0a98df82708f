import { useMemo } from 'react';
import { cn } from '../../lib/cn.ts';
import { formatTimeUs, packRows, segmentStyle, type TimeWindow } from './time-window.ts';

export type TimerSpanEntry = { name: string; side: 'source' | 'sink'; startUs: number; endUs: number; expired: boolean };

export type TimerSpansProps = {
  timers: readonly TimerSpanEntry[];
  window: TimeWindow;
  insetLeftPx?: number;
  insetRightPx?: number;
  className?: string;
};

const ROW_PX = 16;

/**
 * The protocol timers of each side as spans: solid when stopped in time, striped red when they ran
 * out (an expiry is what drives retries, resets and "no answer" findings).
 */
export function TimerSpans({ timers, window, insetLeftPx = 0, insetRightPx = 0, className }: TimerSpansProps) {
  const sides = useMemo(
    () =>
      (['source', 'sink'] as const).map((side) => {
        const own = timers.filter((timer) => timer.side === side && timer.endUs >= window.startUs && timer.startUs <= window.endUs);
        return { side, own, ...packRows(own) };
      }),
    [timers, window.startUs, window.endUs],
  );
  return (
    <div className={cn('flex flex-col gap-1', className)} role="group" aria-label="Timers">
      {sides.map(({ side, own, rows, rowCount }) => (
        <div key={side} className="flex items-start" style={{ paddingRight: insetRightPx }}>
          <span className="shrink-0 pt-0.5 pr-2 text-right font-mono text-[10px] text-slate-500 uppercase dark:text-slate-400" style={{ width: insetLeftPx }}>
            {side === 'source' ? 'SRC timers' : 'SNK timers'}
          </span>
          <div className="relative flex-1 rounded-sm bg-slate-50 dark:bg-slate-950" style={{ height: Math.max(1, rowCount) * ROW_PX + 2 }} data-testid={`timer-lane-${side}`}>
            {own.map((timer, index) => {
              const style = segmentStyle(window, timer.startUs, timer.endUs);
              if (!style) return null;
              return (
                <div
                  key={`${timer.name}-${timer.startUs}-${index}`}
                  className={cn(
                    'absolute h-[14px] min-w-[2px] overflow-hidden rounded-[3px] px-1 font-mono text-[9px] leading-[14px] whitespace-nowrap ring-1 ring-inset',
                    timer.expired
                      ? 'bg-[repeating-linear-gradient(135deg,var(--color-red-100),var(--color-red-100)_4px,var(--color-red-200)_4px,var(--color-red-200)_8px)] text-red-800 ring-red-400 dark:bg-none dark:bg-red-500/25 dark:text-red-200'
                      : 'bg-violet-100 text-violet-800 ring-violet-300 dark:bg-violet-500/15 dark:text-violet-200 dark:ring-violet-500/40',
                  )}
                  style={{ ...style, top: 1 + (rows[index] ?? 0) * ROW_PX }}
                  title={`${timer.name} (${side}): ${formatTimeUs(timer.endUs - timer.startUs)}, ${timer.expired ? 'ran out' : 'stopped'} — ${formatTimeUs(timer.startUs)} to ${formatTimeUs(timer.endUs)}`}
                  data-expired={timer.expired || undefined}
                >
                  {timer.name}
                </div>
              );
            })}
          </div>
        </div>
      ))}
    </div>
  );
}
