import { useMemo } from 'react';
import { clusterInWindow, indexRange } from './clusters.ts';
import { formatTimeUs, positionIn, type TimeWindow } from './time-window.ts';
import { useElementWidth } from './use-element-width.ts';
import { clusterName, EVENT_COLOURS, type ChartEvent } from './chart-marks.ts';

/** A bus event as a trace or a run records it. */
export type BusEvent = { t: number; event: string; from?: string; text?: string; rp?: string };

/** The events and notes among trace records (a simulated run's or a capture's). */
export function busEventsOf(records: readonly object[]): BusEvent[] {
  const out: BusEvent[] = [];
  for (const record of records as readonly { t: number; event?: string; from?: string; note?: string; rp?: string }[]) {
    if (record.event) out.push({ t: record.t, event: record.event, ...(record.from ? { from: record.from } : {}), ...(record.rp ? { rp: record.rp } : {}) });
    else if (record.note !== undefined) out.push({ t: record.t, event: 'note', text: record.note });
  }
  return out;
}

const EVENT_LABELS: Record<string, string> = {
  hard_reset: 'Hard Reset',
  cable_reset: 'Cable Reset',
  attach: 'Attach',
  detach: 'Detach',
};

/** The chart's and the lane's form of the events: a label people read and a tone per kind, in time order. */
export function chartEventsOf(events: readonly BusEvent[]): ChartEvent[] {
  return events
    .map((e): ChartEvent => {
      // The simulator notes each injected fault as "fault: …".
      if (e.event === 'note' && e.text?.startsWith('fault: ')) return { tUs: e.t, label: `Fault: ${e.text.slice(7)}`, tone: 'fault' };
      if (e.event === 'note') return { tUs: e.t, label: e.text ? `Note: ${e.text}` : 'Note', tone: 'note' };
      const base = EVENT_LABELS[e.event] ?? e.event;
      const label = `${base}${e.from ? ` (${e.from})` : ''}${e.rp ? `, Rp ${e.rp}` : ''}`;
      return { tUs: e.t, label, tone: e.event === 'hard_reset' || e.event === 'cable_reset' ? 'reset' : 'attach' };
    })
    .sort((a, b) => a.tUs - b.tUs);
}

const LABEL_PX_PER_CHAR = 6;
const EVENT_GAP_PX = 12;

/**
 * The events (resets, attach and detach, Rp changes, injected faults, notes) on their own lane, each
 * with its label; labels that would run into the one before are left to the tooltip, and marks
 * closer than a few pixels fold into one with a count.
 */
export function EventLane({ events, window, insetLeftPx = 0, insetRightPx = 0 }: { events: readonly ChartEvent[]; window: TimeWindow; insetLeftPx?: number; insetRightPx?: number }) {
  const [lane, widthPx] = useElementWidth<HTMLDivElement>();
  const clusters = useMemo(() => clusterInWindow(events, indexRange(0, events.length), (e) => e.tUs, window, widthPx, EVENT_GAP_PX), [events, window, widthPx]);
  let freeFromPx = -Infinity;
  return (
    <div className="flex items-center" style={{ paddingRight: insetRightPx }} role="group" aria-label="Events on the timeline">
      <span className="shrink-0 pr-2 text-right font-mono text-[10px] text-slate-500 uppercase dark:text-slate-400" style={{ width: insetLeftPx }}>
        Events
      </span>
      <div ref={lane} className="relative h-6 flex-1 overflow-hidden rounded-sm bg-slate-50 dark:bg-slate-950" data-testid="event-lane">
        {widthPx > 0 &&
          clusters.map((cluster, index) => {
            const { item: event, text } = clusterName(cluster, events);
            const x = positionIn(window, cluster.startUs) * widthPx;
            const labelPx = text.length * LABEL_PX_PER_CHAR + 8;
            const leftSide = x + 6 + labelPx > widthPx;
            const from = leftSide ? x - 6 - labelPx : x + 6;
            // Not across the next mark either: a line through a label makes both hard to read.
            const next = clusters[index + 1];
            const nextX = next ? positionIn(window, next.startUs) * widthPx : Number.POSITIVE_INFINITY;
            const showLabel = from >= freeFromPx && from >= 0 && (leftSide || from + labelPx <= nextX - 2);
            if (showLabel) freeFromPx = from + labelPx + 4;
            const title =
              cluster.count > 1
                ? `${cluster.count} events from ${formatTimeUs(cluster.startUs)} to ${formatTimeUs(cluster.endUs)}, among them ${event.label}`
                : `${event.label} at ${formatTimeUs(cluster.startUs)}`;
            return (
              <div key={cluster.first} className="absolute inset-y-0" style={{ left: x }} title={title} data-event={event.label} role="img" aria-label={title}>
                <span className="absolute inset-y-0.5 -ml-px w-0.5 rounded" style={{ background: EVENT_COLOURS[event.tone] }} />
                {showLabel && (
                  <span className="absolute top-1/2 -translate-y-1/2 font-mono text-[10px] whitespace-nowrap" style={{ color: EVENT_COLOURS[event.tone], ...(leftSide ? { right: 6 } : { left: 6 }) }}>
                    {text}
                  </span>
                )}
              </div>
            );
          })}
        {clusters.length === 0 && <span className="absolute inset-0 flex items-center pl-2 text-[10px] text-slate-400">No events in view</span>}
      </div>
    </div>
  );
}
