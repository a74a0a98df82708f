import { useMemo } from 'react';
import { ruleTitle } from '../../../shared/rules/catalog.ts';
import { cn } from '../../lib/cn.ts';
import { clusterInWindow } from './clusters.ts';
import { formatTimeUs, positionIn, type TimeWindow } from './time-window.ts';
import { useElementWidth } from './use-element-width.ts';
import type { ChartPin } from './chart-marks.ts';

/** A finding as the timeline pins it; `message` is the finding's own sentence when the page has it. */
export type PinnedFinding = { t?: number; severity: 'error' | 'warning' | 'info'; rule: string; message?: string };

/** The findings with a time as the chart's pins, named in plain words (the rule's title); the rule id rides along. */
export function chartPinsOf(findings: readonly PinnedFinding[], selectedIndex?: number): ChartPin[] {
  return findings.flatMap((f, index) => (f.t === undefined ? [] : [{ tUs: f.t, tone: f.severity, label: ruleTitle(f.rule), rule: f.rule, selected: index === selectedIndex }]));
}

/** "Hard Reset at 21.100 s: the source sent … (info, rule protocol.hard-reset)": the name first, the id last. */
export function pinnedFindingText(finding: PinnedFinding, tUs: number): string {
  const said = finding.message ? `: ${finding.message}` : '';
  return `${ruleTitle(finding.rule)} at ${formatTimeUs(tUs)}${said} (${finding.severity}, rule ${finding.rule})`;
}

export type FindingPinsProps = {
  findings: readonly PinnedFinding[];
  window: TimeWindow;
  selectedIndex?: number;
  onSelect?(index: number): void;
  /** A folded group of findings was clicked: zoom to where they are. */
  onZoomTo?(window: TimeWindow): void;
  insetLeftPx?: number;
  insetRightPx?: number;
};

const TONES: Record<PinnedFinding['severity'], string> = {
  error: 'bg-red-600 ring-red-300 dark:ring-red-900',
  warning: 'bg-orange-500 ring-orange-200 dark:ring-orange-900',
  info: 'bg-sky-500 ring-sky-200 dark:ring-sky-900',
};
const RANK: Record<PinnedFinding['severity'], number> = { error: 0, warning: 1, info: 2 };
/** Pins closer than this fold into one with a count (a diamond is 12 px wide). */
const PIN_GAP_PX = 14;

/**
 * Findings with a time, as pins on the time axis; a click selects the finding. Pins that would
 * overlap fold into one showing how many it holds (its colour is the worst severity among them);
 * a click on it zooms to them.
 */
export function FindingPins({ findings, window, selectedIndex, onSelect, onZoomTo, insetLeftPx = 0, insetRightPx = 0 }: FindingPinsProps) {
  const [lane, widthPx] = useElementWidth<HTMLDivElement>();
  const order = useMemo(
    () =>
      findings
        .map((_, index) => index)
        .filter((index) => findings[index]!.t !== undefined)
        .sort((a, b) => findings[a]!.t! - findings[b]!.t! || a - b),
    [findings],
  );
  const clusters = useMemo(() => clusterInWindow(findings, order, (f) => f.t ?? 0, window, widthPx, PIN_GAP_PX), [findings, order, window, widthPx]);
  const positionOf = useMemo(() => new Map(order.map((index, at) => [index, at])), [order]);
  return (
    <div className="flex items-center" style={{ paddingRight: insetRightPx }} role="group" aria-label="Findings on the timeline">
      <span className="shrink-0 pr-2 text-right font-mono text-[10px] text-slate-500 uppercase dark:text-slate-400" style={{ width: insetLeftPx }}>
        Findings
      </span>
      <div ref={lane} className="relative h-6 flex-1 rounded-sm bg-slate-50 dark:bg-slate-950" data-testid="finding-pins">
        {widthPx > 0 &&
          clusters.map((cluster) => {
            const start = positionOf.get(cluster.first) ?? 0;
            const members = order.slice(start, start + cluster.count);
            const first = findings[cluster.first]!;
            const left = `${(positionIn(window, cluster.startUs) * 100).toFixed(3)}%`;
            if (cluster.count === 1) {
              const label = pinnedFindingText(first, cluster.startUs);
              return (
                <button
                  key={cluster.first}
                  type="button"
                  title={label}
                  aria-label={label}
                  onClick={onSelect ? () => onSelect(cluster.first) : undefined}
                  className={cn(
                    'absolute top-1/2 size-3 -translate-x-1/2 -translate-y-1/2 rotate-45 rounded-[2px] ring-2 focus-visible:outline-2 focus-visible:outline-amber-500',
                    TONES[first.severity],
                    selectedIndex === cluster.first && 'size-4 ring-amber-400',
                  )}
                  style={{ left }}
                />
              );
            }
            const worst = members.reduce((w, index) => (RANK[findings[index]!.severity] < RANK[w] ? findings[index]!.severity : w), first.severity);
            const selected = selectedIndex !== undefined && members.includes(selectedIndex);
            const label = `${cluster.count} findings from ${formatTimeUs(cluster.startUs)} to ${formatTimeUs(cluster.endUs)}: zoom in to see each`;
            const padUs = Math.max(50, (cluster.endUs - cluster.startUs) * 0.1);
            return (
              <button
                key={cluster.first}
                type="button"
                title={label}
                aria-label={label}
                onClick={() => (onZoomTo ? onZoomTo({ startUs: Math.max(0, cluster.startUs - padUs), endUs: cluster.endUs + padUs }) : onSelect?.(cluster.first))}
                className={cn(
                  'absolute top-1/2 h-4 min-w-4 -translate-x-1/2 -translate-y-1/2 rounded-full px-1 font-mono text-[9px] leading-4 font-semibold text-white ring-2 focus-visible:outline-2 focus-visible:outline-amber-500',
                  TONES[worst],
                  selected && 'ring-amber-400',
                )}
                style={{ left }}
              >
                {cluster.count}
              </button>
            );
          })}
      </div>
    </div>
  );
}
