import { memo, useEffect, useMemo, useRef, useState, type KeyboardEvent } from 'react';
import { cn } from '../../lib/cn.ts';
import { decodeLaneMessage, lastCapsIndex, oneLineDecode } from './decode-lane-message.ts';
import type { LaneMessage } from './message-lanes.tsx';
import { formatTimeUs } from './time-window.ts';

export type MessageListProps = {
  messages: readonly LaneMessage[];
  /** Hide GoodCRC rows (each acknowledged message says so in its state column instead). */
  foldGoodCrc: boolean;
  selectedIndex?: number;
  onSelect(index: number): void;
  heightPx?: number;
  className?: string;
};

const ROW_PX = 36;
const HEADER_PX = 24;
/** Time, Δ, direction, SOP*, MessageID, type, state; the decode goes on a second line under them. */
const COLUMNS = 'grid-cols-[5rem_4.5rem_4rem_2.25rem_1rem_minmax(0,1fr)_5.5rem]';
/** Rows drawn above and below the visible ones, so a fast scroll shows no blank band. */
const OVERSCAN = 8;
const DIRECTION: Record<LaneMessage['from'], string> = { source: 'SRC→SNK', sink: 'SNK→SRC', cable: 'CBL' };

function stateOf(m: LaneMessage, index: number, acknowledged: ReadonlySet<number>, anyGoodCrc: boolean): { text: string; tone: string } {
  if (!m.crcOk) return { text: 'bad CRC', tone: 'text-red-700 dark:text-red-400' };
  if (m.messageType === 'GoodCRC') return { text: 'ack', tone: 'text-slate-400' };
  const retry = m.retry ? 'retry · ' : '';
  if (!anyGoodCrc) return { text: m.retry ? 'retry' : '', tone: 'text-orange-700 dark:text-orange-400' };
  return acknowledged.has(index)
    ? { text: `${retry}GoodCRC`, tone: m.retry ? 'text-orange-700 dark:text-orange-400' : 'text-emerald-700 dark:text-emerald-400' }
    : { text: `${retry}no GoodCRC`, tone: 'text-red-700 dark:text-red-400' };
}

/**
 * Every message as a row: time, time since the row before, direction, SOP*, MessageID, type, a
 * one-line decode and its GoodCRC/retry state. Only the rows in view are in the page (a trace of
 * 100,000 messages draws about 30 rows), and each is decoded when it scrolls into view. The list
 * is one tab stop: ↑/↓ walk it, PgUp/PgDn jump a page, Home/End go to either end.
 */
export const MessageList = memo(function MessageList({ messages, foldGoodCrc, selectedIndex, onSelect, heightPx = 420, className }: MessageListProps) {
  const rows = useMemo(() => {
    const out: number[] = [];
    for (let index = 0; index < messages.length; index++) if (!(foldGoodCrc && messages[index]!.messageType === 'GoodCRC')) out.push(index);
    return out;
  }, [messages, foldGoodCrc]);
  const rowOf = useMemo(() => new Map(rows.map((index, row) => [index, row])), [rows]);
  const acknowledged = useMemo(() => {
    const set = new Set<number>();
    for (const m of messages) if (m.goodCrcFor !== undefined) set.add(m.goodCrcFor);
    return set;
  }, [messages]);
  const capsBefore = useMemo(() => lastCapsIndex(messages), [messages]);
  const decodedCache = useRef(new Map<number, string>());
  // biome-ignore lint/correctness/useExhaustiveDependencies: new messages are the trigger that empties the cache
  useEffect(() => decodedCache.current.clear(), [messages]);
  const decodeLine = (index: number) => {
    let line = decodedCache.current.get(index);
    if (line === undefined) {
      line = oneLineDecode(decodeLaneMessage(messages, capsBefore, index));
      decodedCache.current.set(index, line);
    }
    return line;
  };

  const box = useRef<HTMLDivElement>(null);
  const [scrollTopPx, setScrollTopPx] = useState(0);
  const selectedRow = selectedIndex === undefined ? undefined : rowOf.get(selectedIndex);
  // The selected row is kept in view (selected from the chart or by keyboard).
  useEffect(() => {
    const element = box.current;
    if (selectedRow === undefined || !element) return;
    const top = selectedRow * ROW_PX;
    if (top < element.scrollTop) element.scrollTop = top;
    else if (top + ROW_PX > element.scrollTop + element.clientHeight - ROW_PX) element.scrollTop = top + 2 * ROW_PX - element.clientHeight;
  }, [selectedRow]);

  const bodyPx = heightPx - HEADER_PX;
  const firstRow = Math.max(0, Math.floor(scrollTopPx / ROW_PX) - OVERSCAN);
  const lastRow = Math.min(rows.length, Math.ceil((scrollTopPx + bodyPx) / ROW_PX) + OVERSCAN);
  const pageRows = Math.max(1, Math.floor(bodyPx / ROW_PX) - 1);

  const onKeyDown = (event: KeyboardEvent<HTMLDivElement>) => {
    if (rows.length === 0) return;
    const at = selectedRow ?? -1;
    const next =
      event.key === 'ArrowDown'
        ? at + 1
        : event.key === 'ArrowUp'
          ? at - 1
          : event.key === 'PageDown'
            ? at + pageRows
            : event.key === 'PageUp'
              ? at - pageRows
              : event.key === 'Home'
                ? 0
                : event.key === 'End'
                  ? rows.length - 1
                  : null;
    if (next === null) return;
    event.preventDefault();
    onSelect(rows[Math.min(rows.length - 1, Math.max(0, next))]!);
  };

  const optionId = (index: number) => `message-row-${index}`;
  return (
    <div className={cn('flex flex-col overflow-hidden rounded-md border border-slate-200 dark:border-slate-800', className)} data-testid="message-list">
      <div
        className={cn(
          'grid gap-x-2 border-b border-slate-200 bg-slate-50 px-2 font-mono text-[10px] leading-6 text-slate-500 uppercase dark:border-slate-800 dark:bg-slate-900 dark:text-slate-400',
          COLUMNS,
        )}
        style={{ height: HEADER_PX }}
        aria-hidden="true"
      >
        <span>Time</span>
        <span>Δ</span>
        <span>Dir</span>
        <span>SOP*</span>
        <span>ID</span>
        <span>Type · decoded</span>
        <span>State</span>
      </div>
      <div
        ref={box}
        role="listbox"
        tabIndex={0}
        aria-label="Messages"
        aria-activedescendant={selectedIndex === undefined || selectedRow === undefined ? undefined : optionId(selectedIndex)}
        onKeyDown={onKeyDown}
        onScroll={(event) => setScrollTopPx(event.currentTarget.scrollTop)}
        className="relative overflow-y-auto focus-visible:outline-2 focus-visible:-outline-offset-2 focus-visible:outline-amber-500"
        style={{ height: bodyPx }}
      >
        <div style={{ height: rows.length * ROW_PX }} />
        {rows.slice(firstRow, lastRow).map((index, offset) => {
          const row = firstRow + offset;
          const m = messages[index]!;
          const before = row > 0 ? messages[rows[row - 1]!] : undefined;
          const state = stateOf(m, index, acknowledged, acknowledged.size > 0);
          const decoded = decodeLine(index);
          const selected = index === selectedIndex;
          return (
            // biome-ignore lint/a11y/useKeyWithClickEvents: the listbox moves the selection with the arrow keys (aria-activedescendant)
            <div
              key={index}
              id={optionId(index)}
              role="option"
              tabIndex={-1}
              aria-selected={selected}
              aria-label={`${m.messageType} #${m.messageId} from the ${m.from} at ${formatTimeUs(m.t)}`}
              onClick={() => onSelect(index)}
              className={cn(
                'absolute inset-x-0 grid cursor-pointer content-center gap-x-2 border-b border-slate-100 px-2 font-mono text-[11px] leading-4 whitespace-nowrap text-slate-700 dark:border-slate-800/60 hover:bg-slate-50 dark:text-slate-200 dark:hover:bg-slate-800/60',
                selected && 'bg-amber-100 hover:bg-amber-100 dark:bg-amber-400/20 dark:hover:bg-amber-400/20',
                m.messageType === 'GoodCRC' && 'text-slate-400 dark:text-slate-500',
                COLUMNS,
              )}
              style={{ top: row * ROW_PX, height: ROW_PX }}
            >
              <span className="tabular">{formatTimeUs(m.t)}</span>
              <span className="text-slate-500 tabular">{before ? `+${formatTimeUs(m.t - before.t)}` : ''}</span>
              <span className={m.from === 'sink' ? 'text-sky-700 dark:text-sky-400' : m.from === 'source' ? 'text-amber-700 dark:text-amber-400' : 'text-slate-500'}>{DIRECTION[m.from]}</span>
              <span>{m.sop ?? 'SOP'}</span>
              <span className="text-right">{m.messageId}</span>
              <span className="truncate font-medium" title={m.messageType}>
                {m.messageType}
              </span>
              <span className={cn('truncate', state.tone)}>{state.text}</span>
              <span className="col-span-6 col-start-2 truncate text-[10px] text-slate-500 dark:text-slate-400" title={decoded}>
                {decoded}
              </span>
            </div>
          );
        })}
        {rows.length === 0 && <p className="p-4 text-center text-xs text-slate-500">No messages in the time shown.</p>}
      </div>
    </div>
  );
});
