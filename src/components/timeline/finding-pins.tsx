import { cn } from '../../lib/cn.ts';
import { formatTimeUs, positionIn, type TimeWindow } from './time-window.ts';

export type PinnedFinding = { t?: number; severity: 'error' | 'warning' | 'info'; rule: string; message: string };

export type FindingPinsProps = {
  findings: readonly PinnedFinding[];
  window: TimeWindow;
  selectedIndex?: number;
  onSelect?(index: number): void;
  insetLeftPx?: number;
  insetRightPx?: number;
};

const TONES: Record<PinnedFinding['severity'], string> = {
  error: 'bg-red-600 ring-red-300 dark:ring-red-900',
  warning: 'bg-orange-500 ring-orange-200 dark:ring-orange-900',
  info: 'bg-sky-500 ring-sky-200 dark:ring-sky-900',
};

/** Findings with a time, as pins on the time axis; a click selects the finding. */
export function FindingPins({ findings, window, selectedIndex, onSelect, insetLeftPx = 0, insetRightPx = 0 }: FindingPinsProps) {
  return (
    <div className="flex items-center" style={{ paddingRight: insetRightPx }} role="group" aria-label="Findings on the timeline">
      <span className="shrink-0 pr-2 text-right font-mono text-[10px] text-slate-500 uppercase dark:text-slate-400" style={{ width: insetLeftPx }}>
        Findings
      </span>
      <div className="relative h-6 flex-1 rounded-sm bg-slate-50 dark:bg-slate-950" data-testid="finding-pins">
        {findings.map((finding, index) => {
          if (finding.t === undefined || finding.t < window.startUs || finding.t > window.endUs) return null;
          const label = `${finding.severity}: ${finding.rule} at ${formatTimeUs(finding.t)} — ${finding.message}`;
          return (
            <button
              key={index}
              type="button"
              title={label}
              aria-label={label}
              onClick={onSelect ? () => onSelect(index) : undefined}
              className={cn(
                'absolute top-1/2 size-3 -translate-x-1/2 -translate-y-1/2 rotate-45 rounded-[2px] ring-2 focus-visible:outline-2 focus-visible:outline-amber-500',
                TONES[finding.severity],
                selectedIndex === index && 'size-4 ring-amber-400',
              )}
              style={{ left: `${(positionIn(window, finding.t) * 100).toFixed(3)}%` }}
            />
          );
        })}
      </div>
    </div>
  );
}
