import { cn } from '../../lib/cn.ts';
import { formatTimeUs, segmentStyle, type TimeWindow } from './time-window.ts';

export type StateLaneEntry = { t: number; side: 'source' | 'sink'; state: string };

export type StateLanesProps = {
  entries: readonly StateLaneEntry[];
  window: TimeWindow;
  /** Where the run ends (µs): the last state lasts until then. */
  endUs: number;
  /** Insets (px) that line the lanes up with the chart's plot area. */
  insetLeftPx?: number;
  insetRightPx?: number;
  className?: string;
};

/** Colour by what a state means for power, so a glance finds resets and waits. */
function toneOf(state: string): string {
  if (/Hard_Reset|Error|Soft_Reset/i.test(state)) return 'bg-red-100 text-red-800 ring-red-300 dark:bg-red-500/15 dark:text-red-200 dark:ring-red-500/40';
  if (/_Ready$/.test(state)) return 'bg-emerald-100 text-emerald-800 ring-emerald-300 dark:bg-emerald-500/15 dark:text-emerald-200 dark:ring-emerald-500/40';
  if (/Transition|Select|Negotiate|Wait/i.test(state)) return 'bg-amber-100 text-amber-900 ring-amber-300 dark:bg-amber-400/15 dark:text-amber-200 dark:ring-amber-400/40';
  if (/^PE_/.test(state)) return 'bg-sky-100 text-sky-800 ring-sky-300 dark:bg-sky-500/15 dark:text-sky-200 dark:ring-sky-500/40';
  return 'bg-slate-100 text-slate-600 ring-slate-300 dark:bg-slate-800 dark:text-slate-300 dark:ring-slate-600';
}

function segmentsOf(entries: readonly StateLaneEntry[], side: 'source' | 'sink', endUs: number) {
  const own = entries.filter((entry) => entry.side === side);
  const segments: { fromUs: number; toUs: number; state: string }[] = [];
  own.forEach((entry, index) => {
    const toUs = own[index + 1]?.t ?? endUs;
    // States left in the same microsecond show in the tooltip of the next, not as slivers.
    if (toUs > entry.t || index === own.length - 1) segments.push({ fromUs: entry.t, toUs, state: entry.state });
  });
  return segments;
}

/**
 * The policy engine (and Type-C) state of each side over time, one lane per side, on the same time
 * window as the chart above it.
 */
export function StateLanes({ entries, window, endUs, insetLeftPx = 0, insetRightPx = 0, className }: StateLanesProps) {
  return (
    <div className={cn('flex flex-col gap-1', className)} role="group" aria-label="Policy engine states">
      {(['source', 'sink'] as const).map((side) => (
        <div key={side} className="flex items-center" style={{ paddingRight: insetRightPx }}>
          <span className="shrink-0 pr-2 text-right font-mono text-[10px] text-slate-500 uppercase dark:text-slate-400" style={{ width: insetLeftPx }}>
            {side === 'source' ? 'SRC PE' : 'SNK PE'}
          </span>
          <div className="relative h-6 flex-1 overflow-hidden rounded-sm bg-slate-50 dark:bg-slate-950" data-testid={`state-lane-${side}`}>
            {segmentsOf(entries, side, endUs).map((segment) => {
              const style = segmentStyle(window, segment.fromUs, segment.toUs);
              if (!style) return null;
              return (
                <div
                  key={`${segment.fromUs}-${segment.state}`}
                  className={cn('absolute inset-y-0 overflow-hidden rounded-[3px] px-1 text-[10px] leading-6 whitespace-nowrap ring-1 ring-inset', toneOf(segment.state))}
                  style={style}
                  title={`${segment.state} — from ${formatTimeUs(segment.fromUs)} to ${formatTimeUs(segment.toUs)}`}
                >
                  {segment.state.replace(/^PE_(SRC|SNK)_/, '')}
                </div>
              );
            })}
          </div>
        </div>
      ))}
    </div>
  );
}
