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

/** What a row shows: the message, the one before it (for Δ), its one-line decode and its GoodCRC/retry state. */
export type MessageRow = { index: number; message: LaneMessage; previous?: LaneMessage; decoded: string; state: MessageState };
export type MessageState = { text: string; tone: string };

export type MessageRowsProps = {
  /** Rows in the list (the list is as tall as all of them; only those in view are drawn). */
  count: number;
  /** A row's content, or undefined while it is on its way (drawn as a placeholder). */
  rowAt(row: number): MessageRow | undefined;
  selectedRow?: number;
  onSelectRow(row: number): void;
  /** The rows about to be drawn changed (a paged list reads them). */
  onRowsShown?(firstRow: number, lastRow: number): void;
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

/** A message's GoodCRC/retry state; `acknowledged` undefined while the messages after it are not known yet. */
export function messageState(m: LaneMessage, acknowledged: boolean | undefined, anyGoodCrc: boolean): MessageState {
  if (!m.crcOk) return { text: 'bad CRC', tone: 'text-red-700 dark:text-red-400' };
  if (m.messageType === 'GoodCRC') return { text: 'ack', tone: 'text-slate-400' };
  const retry = m.retry ? 'retry · ' : '';
  if (!anyGoodCrc || acknowledged === undefined) return { text: m.retry ? 'retry' : '', tone: 'text-orange-700 dark:text-orange-400' };
  return acknowledged
    ? { text: `${retry}GoodCRC`, tone: m.retry ? 'text-orange-700 dark:text-orange-400' : 'text-emerald-700 dark:text-emerald-400' }
    : { text: `${retry}no GoodCRC`, tone: 'text-red-700 dark:text-red-400' };
}

/**
 * Every message as a row: time, time since the row before, direction, SOP*, MessageID, type, a
 * one-line decode and its GoodCRC/retry state. Only the rows in view are in the page (a trace of
 * 100,000 messages draws about 30 rows). The list is one tab stop: ↑/↓ walk it, PgUp/PgDn jump a
 * page, Home/End go to either end.
 */
export function MessageRows({ count, rowAt, selectedRow, onSelectRow, onRowsShown, heightPx = 420, className }: MessageRowsProps) {
  const box = useRef<HTMLDivElement>(null);
  const [scrollTopPx, setScrollTopPx] = useState(0);
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
  const lastRow = Math.min(count, Math.ceil((scrollTopPx + bodyPx) / ROW_PX) + OVERSCAN);
  const pageRows = Math.max(1, Math.floor(bodyPx / ROW_PX) - 1);
  useEffect(() => onRowsShown?.(firstRow, lastRow), [onRowsShown, firstRow, lastRow]);

  const onKeyDown = (event: KeyboardEvent<HTMLDivElement>) => {
    if (count === 0) return;
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
                  ? count - 1
                  : null;
    if (next === null) return;
    event.preventDefault();
    onSelectRow(Math.min(count - 1, Math.max(0, next)));
  };

  const optionId = (row: number) => `message-row-${row}`;
  const drawn: number[] = [];
  for (let row = firstRow; row < lastRow; row++) drawn.push(row);
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
        aria-activedescendant={selectedRow === undefined ? undefined : optionId(selectedRow)}
        onKeyDown={onKeyDown}
        onScroll={(event) => setScrollTopPx(event.currentTarget.scrollTop)}
        className="relative overflow-y-auto focus-visible:outline-2 focus-visible:-outline-offset-2 focus-visible:outline-amber-500"
        style={{ height: bodyPx }}
        data-rows={count}
      >
        <div style={{ height: count * ROW_PX }} />
        {drawn.map((row) => {
          const content = rowAt(row);
          if (!content)
            return (
              <div
                key={row}
                id={optionId(row)}
                role="option"
                tabIndex={-1}
                aria-selected={row === selectedRow}
                aria-busy="true"
                className="absolute inset-x-0 px-2 font-mono text-[11px] leading-9 text-slate-400"
                style={{ top: row * ROW_PX, height: ROW_PX }}
              >
                …
              </div>
            );
          const { message: m, previous, decoded, state } = content;
          const selected = row === selectedRow;
          return (
            // biome-ignore lint/a11y/useKeyWithClickEvents: the listbox moves the selection with the arrow keys (aria-activedescendant)
            <div
              key={row}
              id={optionId(row)}
              role="option"
              tabIndex={-1}
              aria-selected={selected}
              aria-label={`${m.messageType} #${m.messageId} from the ${m.from} at ${formatTimeUs(m.t)}`}
              onClick={() => onSelectRow(row)}
              className={cn(
                'absolute inset-x-0 grid cursor-pointer content-center gap-x-2 border-b border-slate-100 px-2 font-mono text-[11px] leading-4 whitespace-nowrap text-slate-700 dark:border-slate-800/60 hover:bg-slate-50 dark:text-slate-200 dark:hover:bg-slate-800/60',
                selected && 'bg-amber-100 hover:bg-amber-100 dark:bg-amber-400/20 dark:hover:bg-amber-400/20',
                m.messageType === 'GoodCRC' && 'text-slate-400 dark:text-slate-500',
                COLUMNS,
              )}
              style={{ top: row * ROW_PX, height: ROW_PX }}
            >
              <span className="tabular">{formatTimeUs(m.t)}</span>
              <span className="text-slate-500 tabular">{previous ? `+${formatTimeUs(m.t - previous.t)}` : ''}</span>
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
        {count === 0 && <p className="p-4 text-center text-xs text-slate-500">No messages in the time shown.</p>}
      </div>
    </div>
  );
}

/** The list over messages held in memory (the Bench, a property's counterexample, a window of a trace); each row is decoded when it scrolls into view. */
export const MessageList = memo(function MessageList({ messages, foldGoodCrc, selectedIndex, onSelect, heightPx, className }: MessageListProps) {
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
  const rowAt = (row: number): MessageRow | undefined => {
    const index = rows[row];
    const m = index === undefined ? undefined : messages[index];
    if (index === undefined || !m) return undefined;
    let decoded = decodedCache.current.get(index);
    if (decoded === undefined) {
      decoded = oneLineDecode(decodeLaneMessage(messages, capsBefore, index));
      decodedCache.current.set(index, decoded);
    }
    const before = row > 0 ? messages[rows[row - 1]!] : undefined;
    return { index, message: m, ...(before ? { previous: before } : {}), decoded, state: messageState(m, acknowledged.has(index), acknowledged.size > 0) };
  };
  return (
    <MessageRows
      count={rows.length}
      rowAt={rowAt}
      selectedRow={selectedIndex === undefined ? undefined : rowOf.get(selectedIndex)}
      onSelectRow={(row) => rows[row] !== undefined && onSelect(rows[row]!)}
      heightPx={heightPx}
      className={className}
    />
  );
});
