// biome-ignore-all lint/suspicious/noArrayIndexKey: read-only rows rendered whole, never reordered or edited; the position is the identity
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
 * Timers whose running out is the policy engine's answer to a missing message (a failure on the
 * wire or in the partner), after USB PD R3.2 V1.1 §6.6 (from memory). Every other timer expiring
 * is the plan: the SourceCapabilityTimer repeating the offer, tPPSRequest sending the keep-alive,
 * tSrcTransition and tSrcRecover ending a wait, and so on.
 */
const FAULT_ON_EXPIRY: ReadonlySet<string> = new Set(['tSenderResponse', 'tPSTransition', 'tReceive', 'tPPSTimeout', 'tSinkWaitCap', 'tNoResponse', 'tHardResetComplete', 'tChunkSenderResponse']);

export const expiryIsFault = (name: string) => FAULT_ON_EXPIRY.has(name);

/**
 * The protocol timers of each side as spans: solid when stopped in time or when they expired as
 * planned (dotted edge), striped red only when a timer ran out waiting for an answer (what drives
 * retries, resets and "no answer" findings).
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
              const fault = timer.expired && expiryIsFault(timer.name);
              const state = !timer.expired ? 'stopped' : fault ? 'ran out waiting' : 'expired as planned';
              return (
                <div
                  key={`${timer.name}-${timer.startUs}-${index}`}
                  className={cn(
                    'absolute h-[14px] min-w-[2px] overflow-hidden rounded-[3px] px-1 font-mono text-[9px] leading-[14px] whitespace-nowrap ring-1 ring-inset',
                    fault
                      ? 'bg-[repeating-linear-gradient(135deg,var(--color-red-100),var(--color-red-100)_4px,var(--color-red-200)_4px,var(--color-red-200)_8px)] text-red-800 ring-red-400 dark:bg-none dark:bg-red-500/25 dark:text-red-200'
                      : 'bg-violet-100 text-violet-800 ring-violet-300 dark:bg-violet-500/15 dark:text-violet-200 dark:ring-violet-500/40',
                    timer.expired && !fault && 'border-r-2 border-dotted border-violet-500',
                  )}
                  style={{ ...style, top: 1 + (rows[index] ?? 0) * ROW_PX }}
                  title={`${timer.name} (${side}): ${formatTimeUs(timer.endUs - timer.startUs)}, ${state} — ${formatTimeUs(timer.startUs)} to ${formatTimeUs(timer.endUs)}`}
                  data-expired={timer.expired || undefined}
                  data-fault={fault || undefined}
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
