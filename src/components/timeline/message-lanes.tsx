import { memo, useMemo } from 'react';
import { cn } from '../../lib/cn.ts';
import { clusterInWindow, type Cluster } from './clusters.ts';
import { formatTimeUs, positionIn, type TimeWindow } from './time-window.ts';
import { useElementWidth } from './use-element-width.ts';

/** One message on the CC wire, as the lanes need it (a subset of the analysis timeline). */
export type LaneMessage = {
  t: number;
  durationUs: number;
  from: 'source' | 'sink' | 'cable';
  messageType: string;
  messageId: number;
  /** SOP* of the message; `SOP` when not given. */
  sop?: string;
  crcOk: boolean;
  retry?: boolean;
  /** For a GoodCRC: the index of the message it acknowledges. */
  goodCrcFor?: number;
  hex?: string;
};

export type MessageLanesProps = {
  messages: readonly LaneMessage[];
  window: TimeWindow;
  /** Hide GoodCRC messages; an acknowledged message then carries a small tick instead. */
  foldGoodCrc: boolean;
  insetLeftPx?: number;
  insetRightPx?: number;
  onSelect?(index: number): void;
  /** A folded burst was clicked: zoom to it. */
  onZoomTo?(window: TimeWindow): void;
  selectedIndex?: number;
  className?: string;
};

/** A label's width in px, estimated from its length (10 px monospace) plus padding and the tick. */
const labelWidthPx = (text: string) => text.length * 6.1 + 16;

/** Arrows closer than this fold into one burst mark with a count (an arrow is 16 px wide). */
const BURST_GAP_PX = 10;

function firstIndexFrom(messages: readonly LaneMessage[], tUs: number): number {
  let low = 0;
  let high = messages.length;
  while (low < high) {
    const mid = (low + high) >>> 1;
    if (messages[mid]!.t < tUs) low = mid + 1;
    else high = mid;
  }
  return low;
}

/**
 * Source and sink as two lanes, each message an arrow from its sender to the receiver at its
 * time; retries dashed, bad CRCs red, a message without GoodCRC marked with a hollow end.
 */
export const MessageLanes = memo(function MessageLanes({ messages, window, foldGoodCrc, insetLeftPx = 0, insetRightPx = 0, onSelect, onZoomTo, selectedIndex, className }: MessageLanesProps) {
  const acknowledged = useMemo(() => {
    const set = new Set<number>();
    for (const m of messages) if (m.goodCrcFor !== undefined) set.add(m.goodCrcFor);
    return set;
  }, [messages]);
  const hasGoodCrc = acknowledged.size > 0;
  const visible = useMemo(() => {
    const out: number[] = [];
    for (let index = firstIndexFrom(messages, window.startUs); index < messages.length; index++) {
      const m = messages[index]!;
      if (m.t > window.endUs) break;
      if (foldGoodCrc && m.messageType === 'GoodCRC') continue;
      out.push(index);
    }
    return out;
  }, [messages, window.startUs, window.endUs, foldGoodCrc]);
  const [lane, widthPx] = useElementWidth<HTMLDivElement>();
  // Messages closer than a few pixels fold into a burst (drawn once, with its count).
  // GoodCRCs fold among themselves (drawn first, under the messages they answer), so a message is
  // never folded into a burst with its own acknowledgement.
  const clusters = useMemo(() => {
    if (widthPx <= 0) return [];
    const isGoodCrc = (index: number) => messages[index]!.messageType === 'GoodCRC';
    const acks = clusterInWindow(messages, visible.filter(isGoodCrc), (m) => m.t, window, widthPx, BURST_GAP_PX);
    const others = clusterInWindow(
      messages,
      visible.filter((index) => !isGoodCrc(index)),
      (m) => m.t,
      window,
      widthPx,
      BURST_GAP_PX,
    );
    return [...acks, ...others];
  }, [messages, visible, window, widthPx]);
  const bursts = useMemo(() => {
    const map = new Map<number, Cluster>();
    for (const c of clusters) if (c.count > 1) map.set(c.first, c);
    return map;
  }, [clusters]);
  // Labels go in three rows; each sits in the first row where it does not run into the label before
  // it, or is left out (the arrow's tooltip has it). Near the right edge a label goes left of its
  // arrow, so none is cut.
  const labels = useMemo(() => {
    const placed = new Map<number, { row: number; leftSide: boolean }>();
    const freeFromPx = [-Infinity, -Infinity, -Infinity];
    const byTime = [...clusters].sort((a, b) => a.startUs - b.startUs || Number(messages[a.first]!.messageType !== 'GoodCRC') - Number(messages[b.first]!.messageType !== 'GoodCRC'));
    for (const cluster of byTime) {
      const m = messages[cluster.first]!;
      const text = cluster.count > 1 ? `${m.messageType} +${cluster.count - 1}` : m.messageType;
      const width = labelWidthPx(text);
      const arrowX = positionIn(window, m.t) * widthPx;
      const leftSide = arrowX + 12 + width > widthPx;
      const from = leftSide ? arrowX - 12 - width : arrowX + 12;
      const row = freeFromPx.findIndex((free) => from >= free);
      if (row === -1 || from < 0) continue;
      placed.set(cluster.first, { row, leftSide });
      freeFromPx[row] = from + width + 4;
    }
    return placed;
  }, [clusters, messages, window, widthPx]);

  return (
    <div className={cn('flex items-stretch', className)} style={{ paddingRight: insetRightPx }} role="group" aria-label="Messages between source and sink">
      <div className="flex shrink-0 flex-col justify-between py-1 pr-2 text-right font-mono text-[10px] text-slate-500 uppercase dark:text-slate-400" style={{ width: insetLeftPx }}>
        <span>Source</span>
        <span>Sink</span>
      </div>
      <div ref={lane} className="relative h-24 flex-1 overflow-hidden rounded-sm border-y border-slate-200 bg-slate-50 dark:border-slate-800 dark:bg-slate-950" data-testid="message-lanes">
        <div aria-hidden="true" className="absolute inset-x-0 top-2 border-t border-slate-300 dark:border-slate-700" />
        <div aria-hidden="true" className="absolute inset-x-0 bottom-2 border-t border-slate-300 dark:border-slate-700" />
        {clusters.map((cluster) => {
          const index = cluster.first;
          const m = messages[index]!;
          const burst = bursts.get(index);
          const label = labels.get(index);
          const left = `${(positionIn(window, m.t) * 100).toFixed(3)}%`;
          const down = m.from !== 'sink';
          const goodCrc = m.messageType === 'GoodCRC';
          const unacked = hasGoodCrc && !goodCrc && !acknowledged.has(index);
          const tone = !m.crcOk
            ? 'text-red-600 dark:text-red-400'
            : goodCrc
              ? 'text-slate-400 dark:text-slate-600'
              : m.from === 'sink'
                ? 'text-sky-600 dark:text-sky-400'
                : 'text-amber-600 dark:text-amber-400';
          const title = burst
            ? `${burst.count} messages from ${formatTimeUs(burst.startUs)} to ${formatTimeUs(burst.endUs)}, first ${m.messageType} from the ${m.from}: zoom in to see each`
            : `${m.messageType} #${m.messageId} from the ${m.from} at ${formatTimeUs(m.t)}${m.retry ? ' (retry)' : ''}${!m.crcOk ? ' — bad CRC' : ''}${unacked ? ' — no GoodCRC' : foldGoodCrc && acknowledged.has(index) ? ' — acknowledged' : ''}`;
          const padUs = burst ? Math.max(20, (burst.endUs - burst.startUs) * 0.1) : 0;
          const click = burst ? () => onZoomTo?.({ startUs: Math.max(0, burst.startUs - padUs), endUs: burst.endUs + padUs + m.durationUs }) : onSelect ? () => onSelect(index) : undefined;
          return (
            <button
              key={index}
              type="button"
              title={title}
              aria-label={title}
              data-message-type={burst ? undefined : m.messageType}
              data-burst={burst?.count}
              onClick={click}
              className={cn('group absolute top-2 bottom-2 -ml-2 w-4 focus-visible:outline-1 focus-visible:outline-amber-500', tone, selectedIndex === index && 'bg-amber-400/20')}
              style={{ left }}
            >
              <svg viewBox="0 0 16 80" preserveAspectRatio="none" className="h-full w-full overflow-visible" aria-hidden="true">
                <line
                  x1="8"
                  x2="8"
                  y1={down ? 0 : 80}
                  y2={down ? 74 : 6}
                  stroke="currentColor"
                  strokeWidth={goodCrc ? 1 : 1.6}
                  strokeDasharray={m.retry ? '4 3' : undefined}
                  vectorEffect="non-scaling-stroke"
                />
                <path d={down ? 'M4 72 L8 80 L12 72' : 'M4 8 L8 0 L12 8'} fill={unacked ? 'none' : 'currentColor'} stroke="currentColor" strokeWidth="1" vectorEffect="non-scaling-stroke" />
              </svg>
              {burst && (
                <span
                  className="pointer-events-none absolute top-1/2 left-1/2 -translate-x-1/2 -translate-y-1/2 rounded-full bg-slate-700 px-1 font-mono text-[9px] leading-4 text-white dark:bg-slate-300 dark:text-slate-900"
                  aria-hidden="true"
                >
                  {burst.count}
                </span>
              )}
              {label && (
                <span
                  style={{ top: `${22 + label.row * 28}%` }}
                  className={cn(
                    'pointer-events-none absolute -translate-y-1/2 rounded bg-white/85 px-1 font-mono text-[10px] leading-4 whitespace-nowrap text-slate-700 dark:bg-slate-900/85 dark:text-slate-200',
                    label.leftSide ? 'right-3' : 'left-3',
                    goodCrc && 'text-slate-400 dark:text-slate-500',
                  )}
                >
                  {m.messageType}
                  {burst && <span className="text-slate-500"> +{burst.count - 1}</span>}
                  {foldGoodCrc && acknowledged.has(index) && (
                    <span className="ml-0.5 text-emerald-600" aria-hidden="true">
                      ✓
                    </span>
                  )}
                </span>
              )}
            </button>
          );
        })}
        {visible.length === 0 && <p className="absolute inset-0 flex items-center justify-center text-xs text-slate-400">No messages in this part of the trace.</p>}
      </div>
    </div>
  );
});
