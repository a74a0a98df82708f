import { memo, useMemo } from 'react';
import { cn } from '../../lib/cn.ts';
import { formatTimeUs, positionIn, type TimeWindow } from './time-window.ts';
import { useElementWidth } from './use-element-width.ts';

/** One message on the CC wire, as the lanes need it (a subset of the analysis timeline). */
export type LaneMessage = {
  t: number;
  durationUs: number;
  from: 'source' | 'sink' | 'cable';
  messageType: string;
  messageId: number;
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
  selectedIndex?: number;
  className?: string;
};

/** A label's width in px, estimated from its length (10 px monospace) plus padding and the tick. */
const labelWidthPx = (text: string) => text.length * 6.1 + 16;

/** At most this many arrows are drawn; a wider window asks the user to zoom. */
const DRAW_LIMIT = 1_500;

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
export const MessageLanes = memo(function MessageLanes({ messages, window, foldGoodCrc, insetLeftPx = 0, insetRightPx = 0, onSelect, selectedIndex, className }: MessageLanesProps) {
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
  const drawn = useMemo(() => visible.slice(0, DRAW_LIMIT), [visible]);
  const [lane, widthPx] = useElementWidth<HTMLDivElement>();
  // Labels go in three rows; each sits in the first row where it does not run into the label before
  // it, or is left out (the arrow's tooltip has it).
  const labelRow = useMemo(() => {
    const rows = new Map<number, number>();
    const freeFromPx = [-Infinity, -Infinity, -Infinity];
    for (const index of drawn) {
      const m = messages[index]!;
      const x = positionIn(window, m.t) * widthPx + 12;
      const row = freeFromPx.findIndex((free) => x >= free);
      if (row === -1) continue;
      rows.set(index, row);
      freeFromPx[row] = x + labelWidthPx(m.messageType) + 4;
    }
    return rows;
  }, [drawn, messages, window, widthPx]);

  return (
    <div className={cn('flex items-stretch', className)} style={{ paddingRight: insetRightPx }} role="group" aria-label="Messages between source and sink">
      <div className="flex shrink-0 flex-col justify-between py-1 pr-2 text-right font-mono text-[10px] text-slate-500 uppercase dark:text-slate-400" style={{ width: insetLeftPx }}>
        <span>Source</span>
        <span>Sink</span>
      </div>
      <div ref={lane} className="relative h-24 flex-1 overflow-hidden rounded-sm border-y border-slate-200 bg-slate-50 dark:border-slate-800 dark:bg-slate-950" data-testid="message-lanes">
        <div aria-hidden="true" className="absolute inset-x-0 top-2 border-t border-slate-300 dark:border-slate-700" />
        <div aria-hidden="true" className="absolute inset-x-0 bottom-2 border-t border-slate-300 dark:border-slate-700" />
        {drawn.map((index) => {
          const m = messages[index]!;
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
          const title = `${m.messageType} #${m.messageId} from the ${m.from} at ${formatTimeUs(m.t)}${m.retry ? ' (retry)' : ''}${!m.crcOk ? ' — bad CRC' : ''}${unacked ? ' — no GoodCRC' : foldGoodCrc && acknowledged.has(index) ? ' — acknowledged' : ''}`;
          return (
            <button
              key={index}
              type="button"
              title={title}
              aria-label={title}
              data-message-type={m.messageType}
              onClick={onSelect ? () => onSelect(index) : undefined}
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
              {labelRow.has(index) && (
                <span
                  style={{ top: `${22 + (labelRow.get(index) ?? 0) * 28}%` }}
                  className={cn(
                    'pointer-events-none absolute left-3 -translate-y-1/2 rounded bg-white/85 px-1 font-mono text-[10px] leading-4 whitespace-nowrap text-slate-700 dark:bg-slate-900/85 dark:text-slate-200',
                    goodCrc && 'text-slate-400 dark:text-slate-500',
                  )}
                >
                  {m.messageType}
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
        {visible.length > DRAW_LIMIT && (
          <p className="absolute top-1/2 left-1/2 -translate-x-1/2 -translate-y-1/2 rounded bg-white/90 px-2 py-1 text-xs text-slate-600 shadow-sm dark:bg-slate-900/90 dark:text-slate-300">
            {visible.length} messages in view: zoom in to see each one.
          </p>
        )}
        {visible.length === 0 && <p className="absolute inset-0 flex items-center justify-center text-xs text-slate-400">No messages in this part of the trace.</p>}
      </div>
    </div>
  );
});
