import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { decodeWithOffer, oneLineDecode } from '../../../components/timeline/decode-lane-message.ts';
import { MessagePanel } from '../../../components/timeline/message-detail.tsx';
import type { LaneMessage } from '../../../components/timeline/message-lanes.tsx';
import { MessageRows, messageState, type MessageRow } from '../../../components/timeline/message-list.tsx';
import type { MessageRange } from '../../../../shared/api/index.ts';
import { plural } from '../../../lib/plural.ts';
import { traceMessagesQueryOptions, useTraceMessagePages } from '../api/get-trace-messages.ts';

/** Rows read at a time: a screenful is about 11, so a page lasts a long scroll. */
const PAGE_ROWS = 200;

type Listed = LaneMessage & { index: number };

export type TraceMessagesProps = {
  traceId: number;
  /** Rows without GoodCRCs (each row's state says whether it got one). */
  fold: boolean;
  /** A message was chosen (click or ↑/↓): the page moves the chart to it. */
  onSelect(index: number, message: LaneMessage): void;
  /** Select the first row at this time (an arrow clicked on the chart); `key` lets the same time be asked twice. */
  follow?: { tUs: number; key: number } | null;
};

/** One page of rows: its messages (GoodCRCs included) and, per row, the message and the offer before it. */
type PageRows = { rows: { message: Listed; offer: Listed | undefined; acknowledged: boolean | undefined }[]; anyGoodCrc: boolean };

function rowsOf(range: MessageRange, fold: boolean): PageRows {
  const acknowledged = new Set<number>();
  let anyGoodCrc = false;
  for (const m of range.items) {
    if (m.messageType !== 'GoodCRC') continue;
    anyGoodCrc = true;
    if (m.goodCrcFor !== undefined) acknowledged.add(m.goodCrcFor);
  }
  const last = range.items[range.items.length - 1];
  let offer: Listed | undefined = range.capabilities ?? undefined;
  const rows: PageRows['rows'] = [];
  for (const m of range.items) {
    if (!(fold && m.messageType === 'GoodCRC'))
      // The run's last message may have its GoodCRC in the next run: not known yet.
      rows.push({ message: m, offer, acknowledged: acknowledged.has(m.index) ? true : m === last ? undefined : false });
    if (m.messageType === 'Source_Capabilities' && m.crcOk) offer = m;
  }
  return { rows, anyGoodCrc };
}

/**
 * The whole trace's messages as one list (the server sends the rows in view, a page at a time, so
 * a trace of 100,000 messages costs what a screenful does), with the selected one bit by bit
 * under it. Selecting a row, by click or ↑/↓, moves the chart to the message.
 */
export function TraceMessages({ traceId, fold, onSelect, follow }: TraceMessagesProps) {
  const queryClient = useQueryClient();
  const [shown, setShown] = useState({ first: 0, last: 0 });
  const [selectedRow, setSelectedRow] = useState<number | undefined>(undefined);
  // A new fold counts rows differently: start again at the top.
  // biome-ignore lint/correctness/useExhaustiveDependencies: the fold is the trigger
  useEffect(() => setSelectedRow(undefined), [fold]);
  const pageNumbers = useMemo(() => {
    const numbers = new Set<number>();
    for (let page = Math.floor(shown.first / PAGE_ROWS); page <= Math.floor(Math.max(shown.first, shown.last - 1) / PAGE_ROWS); page++) numbers.add(page);
    if (selectedRow !== undefined) numbers.add(Math.floor(selectedRow / PAGE_ROWS));
    return [...numbers].sort((a, b) => a - b);
  }, [shown, selectedRow]);
  const params = useMemo(() => pageNumbers.map((page) => ({ offset: page * PAGE_ROWS, limit: PAGE_ROWS, fold })), [pageNumbers, fold]);
  const results = useTraceMessagePages(traceId, params);
  // The row count stays while the next pages are on their way (it changes only with the fold).
  const total = results.find((r) => r.data)?.data?.total;
  const [count, setCount] = useState(0);
  useEffect(() => {
    if (total !== undefined) setCount(total);
  }, [total]);

  // Each run is turned into rows once (a run is fetched for one fold, so it is the key).
  const rowsCache = useRef(new WeakMap<MessageRange, PageRows>());
  const pages = new Map<number, PageRows>();
  results.forEach((result, at) => {
    const range = result.data;
    if (!range) return;
    let rows = rowsCache.current.get(range);
    if (!rows) {
      rows = rowsOf(range, fold);
      rowsCache.current.set(range, rows);
    }
    pages.set(pageNumbers[at]!, rows);
  });

  const decoded = useRef(new Map<number, string>());
  const entryAt = (row: number) => pages.get(Math.floor(row / PAGE_ROWS))?.rows[row % PAGE_ROWS];
  const rowAt = (row: number): MessageRow | undefined => {
    const page = pages.get(Math.floor(row / PAGE_ROWS));
    const entry = page?.rows[row % PAGE_ROWS];
    if (!page || !entry) return undefined;
    const m = entry.message;
    let line = decoded.current.get(m.index);
    if (line === undefined) {
      line = oneLineDecode(decodeWithOffer(m, entry.offer));
      decoded.current.set(m.index, line);
    }
    const previous = row > 0 ? entryAt(row - 1)?.message : undefined;
    return { index: m.index, message: m, ...(previous ? { previous } : {}), decoded: line, state: messageState(m, entry.acknowledged, page.anyGoodCrc) };
  };

  const selected = selectedRow === undefined ? undefined : entryAt(selectedRow);
  const selectedMessage = selected?.message;
  const told = useRef<number | undefined>(undefined);
  // The chart moves once the chosen row's message is here (a jump with End may wait for its page).
  useEffect(() => {
    if (!selectedMessage || told.current === selectedMessage.index) return;
    told.current = selectedMessage.index;
    onSelect(selectedMessage.index, selectedMessage);
  }, [selectedMessage, onSelect]);

  useEffect(() => {
    if (!follow) return;
    let live = true;
    void queryClient
      .fetchQuery(traceMessagesQueryOptions(traceId, { atUs: follow.tUs, limit: 1, fold }))
      .then((range) => {
        if (!live) return;
        told.current = range.items[0]?.index;
        setSelectedRow(Math.min(range.offset, Math.max(0, range.total - 1)));
      })
      .catch(() => undefined);
    return () => {
      live = false;
    };
  }, [follow, traceId, fold, queryClient]);

  const onRowsShown = useCallback((first: number, last: number) => setShown((current) => (current.first === first && current.last === last ? current : { first, last })), []);
  const detail = useMemo(() => {
    if (!selected) return null;
    const message = decodeWithOffer(selected.message, selected.offer);
    return message ? { t: selected.message.t, from: selected.message.from, hex: selected.message.hex ?? '', crcOk: selected.message.crcOk, message } : null;
  }, [selected]);

  return (
    <div className="flex min-w-0 flex-col gap-3">
      <MessageRows count={count} rowAt={rowAt} selectedRow={selectedRow} onSelectRow={setSelectedRow} onRowsShown={onRowsShown} />
      {detail ? (
        <div className="rounded-md border border-slate-200 p-3 dark:border-slate-800" data-testid="selected-message">
          <MessagePanel selected={detail} onClose={() => setSelectedRow(undefined)} />
        </div>
      ) : (
        <p className="text-xs text-slate-500 dark:text-slate-400">
          {count > 0 ? `${plural(count, 'row')}: the whole timeline, not only the time shown. ` : ''}Select a message (click, or focus the list and use ↑ ↓) to see it bit by bit and move the chart to
          it.
        </p>
      )}
    </div>
  );
}
