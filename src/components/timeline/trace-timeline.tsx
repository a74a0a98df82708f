import { memo, useCallback, useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import { useIsDark } from '../../lib/theme.ts';
import { cn } from '../../lib/cn.ts';
import { visibleSpans } from './clusters.ts';
import { decodeLaneMessage, lastCapsIndex } from './decode-lane-message.ts';
import { chartEventsOf, EventLane, type BusEvent } from './event-lane.tsx';
import { chartPinsOf, FindingPins, type PinnedFinding } from './finding-pins.tsx';
import { MessagePanel } from './message-detail.tsx';
import { MessageLanes, type LaneMessage } from './message-lanes.tsx';
import { MessageList } from './message-list.tsx';
import { formatTimeUs, positionIn, segmentStyle, type TimeWindow } from './time-window.ts';
import { TimelineLegend } from './timeline-legend.tsx';
import { TimelineToolbar } from './timeline-toolbar.tsx';
import { windowAround, type Measurement } from './trace-series.ts';
import { useElementWidth } from './use-element-width.ts';
import { PLOT_INSET_LEFT_PX, PLOT_INSET_RIGHT_PX, VbusChart, type ChartBand } from './vbus-chart.tsx';

export type TimelineSpan = { startUs: number; endUs?: number; label: string };

export type TraceTimelineProps = {
  measurements: readonly Measurement[];
  messages: readonly LaneMessage[];
  findings: readonly PinnedFinding[];
  /** Resets, attach/detach, notes: drawn on the chart and on their own lane. */
  events?: readonly BusEvent[];
  /** Contracts in force, each from its PS_RDY until the next change (or the end). */
  contracts: readonly TimelineSpan[];
  bands?: readonly ChartBand[];
  endUs: number;
  /**
   * Zoom to this time when it changes (the `key` lets the same time be asked for twice); `walk`:
   * a message chosen in a list, shown as one chosen here is (the span kept when it is narrow, no scroll).
   */
  focus?: { tUs: number; key: number; walk?: boolean } | null;
  selectedFinding?: number;
  onSelectFinding?(index: number): void;
  /** The window the timeline opens at (a shared link's zoom). */
  initialWindow?: TimeWindow | null;
  /** Told of every window change (the page keeps it in the URL). */
  onWindowChange?(window: TimeWindow): void;
  /** In place of the list of these messages and its detail (the trace page lists the whole trace from the server). */
  messageAside?(view: { foldGoodCrc: boolean }): ReactNode;
  /** The message (place in `messages`) the lanes highlight, when the caller keeps the selection. */
  selectedMessage?: number;
  /** An arrow on the lanes was clicked; given, the caller keeps the selection. */
  onSelectMessage?(place: number): void;
  className?: string;
};

/** A finding is shown with this much of the trace around it (invented: fits a request/response pair). */
const FOCUS_SPAN_US = 80_000;
/** Walking the message list keeps the window's span, but never wider than this (invented: a few messages on screen). */
const WALK_SPAN_MAX_US = 50_000;
const NO_EVENTS: readonly BusEvent[] = [];
/** A contract box shows its label from this width on (about three characters of the lane's 10 px mono text). */
const LABEL_ROOM_MIN_PX = 24;

/**
 * The trace over time: VBUS and IBUS with a brush to zoom, the events, the contract in force, the
 * messages between source and sink and the findings pinned at their times — all on one time
 * window — and beside it every message as a list with the selected one bit by bit. Memoised: the
 * page around it re-renders as each table's page arrives, which need not redraw the chart.
 */
export const TraceTimeline = memo(function TraceTimeline({
  measurements,
  messages,
  findings,
  events = NO_EVENTS,
  contracts,
  bands,
  endUs,
  focus,
  selectedFinding,
  onSelectFinding,
  initialWindow,
  onWindowChange,
  messageAside,
  selectedMessage: chosenMessage,
  onSelectMessage,
  className,
}: TraceTimelineProps) {
  const end = Math.max(1, endUs);
  const [window, setWindowState] = useState<TimeWindow>(() => (initialWindow ? clampWindow(initialWindow, end) : { startUs: 0, endUs: end }));
  const [foldGoodCrc, setFoldGoodCrc] = useState(true);
  const [selectedMessage, setSelectedMessage] = useState<number | undefined>(undefined);
  const dark = useIsDark();
  const root = useRef<HTMLDivElement>(null);
  const setWindow = useCallback(
    (next: TimeWindow) => {
      setWindowState(next);
      onWindowChange?.(next);
    },
    [onWindowChange],
  );

  /** A message chosen from a list: the window keeps its span when narrow and moves only when the message is near an edge. */
  const walkTo = useCallback(
    (tUs: number) =>
      setWindowState((current) => {
        const span = Math.min(current.endUs - current.startUs, WALK_SPAN_MAX_US);
        const inside = tUs >= current.startUs + span * 0.1 && tUs <= current.endUs - span * 0.1;
        const next = inside && current.endUs - current.startUs <= WALK_SPAN_MAX_US ? current : windowAround(tUs, span, end);
        if (next !== current) onWindowChange?.(next);
        return next;
      }),
    [end, onWindowChange],
  );

  useEffect(() => {
    if (!focus) return;
    if (focus.walk) return walkTo(focus.tUs);
    setWindow(windowAround(focus.tUs, FOCUS_SPAN_US, end));
    root.current?.scrollIntoView?.({ behavior: 'smooth', block: 'start' });
  }, [focus, end, setWindow, walkTo]);

  const pins = useMemo(() => chartPinsOf(findings, selectedFinding), [findings, selectedFinding]);
  const chartEvents = useMemo(() => chartEventsOf(events), [events]);
  const capsBefore = useMemo(() => lastCapsIndex(messages), [messages]);
  const detail = useMemo(() => {
    if (selectedMessage === undefined) return null;
    const m = messages[selectedMessage];
    const message = decodeLaneMessage(messages, capsBefore, selectedMessage);
    return m && message ? { t: m.t, from: m.from, hex: m.hex ?? '', crcOk: m.crcOk, message } : null;
  }, [messages, capsBefore, selectedMessage]);

  const selectMessage = useCallback(
    (index: number) => {
      if (onSelectMessage) return onSelectMessage(index);
      setSelectedMessage(index);
      const m = messages[index];
      if (m) walkTo(m.t);
    },
    [messages, walkTo, onSelectMessage],
  );

  return (
    <div ref={root} className={cn('@container flex scroll-mt-4 flex-col gap-2', className)} data-testid="trace-timeline" data-window={`${window.startUs}-${window.endUs}`}>
      <TimelineToolbar window={window} endUs={end} onWindowChange={setWindow} foldGoodCrc={foldGoodCrc} onFoldGoodCrcChange={setFoldGoodCrc} subject="trace" />
      <div className="grid items-start gap-4 @6xl:grid-cols-[minmax(0,1fr)_34rem]">
        <div className="flex min-w-0 flex-col gap-2">
          <VbusChart measurements={measurements} window={window} endUs={end} pins={pins} events={chartEvents} bands={bands} onWindowChange={setWindow} dark={dark} />
          <EventLane events={chartEvents} window={window} insetLeftPx={PLOT_INSET_LEFT_PX} insetRightPx={PLOT_INSET_RIGHT_PX} />
          <ContractLane contracts={contracts} window={window} endUs={end} />
          <MessageLanes
            messages={messages}
            window={window}
            foldGoodCrc={foldGoodCrc}
            insetLeftPx={PLOT_INSET_LEFT_PX}
            insetRightPx={PLOT_INSET_RIGHT_PX}
            onSelect={selectMessage}
            onZoomTo={setWindow}
            selectedIndex={onSelectMessage ? chosenMessage : selectedMessage}
          />
          <FindingPins
            findings={findings}
            window={window}
            selectedIndex={selectedFinding}
            onSelect={onSelectFinding}
            onZoomTo={setWindow}
            insetLeftPx={PLOT_INSET_LEFT_PX}
            insetRightPx={PLOT_INSET_RIGHT_PX}
          />
          <div style={{ paddingLeft: PLOT_INSET_LEFT_PX }}>
            <TimelineLegend current={measurements.some((m) => m.ma !== undefined)} bands={(bands?.length ?? 0) > 0} faults={chartEvents.some((e) => e.tone === 'fault')} />
          </div>
        </div>
        {messageAside ? (
          messageAside({ foldGoodCrc })
        ) : (
          <div className="flex min-w-0 flex-col gap-3">
            <MessageList messages={messages} foldGoodCrc={foldGoodCrc} selectedIndex={selectedMessage} onSelect={selectMessage} />
            {detail ? (
              <div className="rounded-md border border-slate-200 p-3 dark:border-slate-800" data-testid="selected-message">
                <MessagePanel selected={detail} onClose={() => setSelectedMessage(undefined)} />
              </div>
            ) : (
              <p className="text-xs text-slate-500 dark:text-slate-400">Select a message (click, or focus the list and use ↑ ↓) to see it bit by bit.</p>
            )}
          </div>
        )}
      </div>
    </div>
  );
});

function clampWindow(window: TimeWindow, endUs: number): TimeWindow {
  const startUs = Math.min(Math.max(0, Math.round(window.startUs)), endUs - 1);
  return { startUs, endUs: Math.max(startUs + 1, Math.min(endUs, Math.round(window.endUs))) };
}

function ContractLane({ contracts, window, endUs }: { contracts: readonly TimelineSpan[]; window: TimeWindow; endUs: number }) {
  const [lane, widthPx] = useElementWidth<HTMLDivElement>();
  // One box per two pixels at most: a capture that renegotiates every 500 ms has 10,000 contracts.
  const drawn = useMemo(() => (widthPx > 0 ? visibleSpans(contracts, window, widthPx, endUs) : []), [contracts, window, widthPx, endUs]);
  return (
    <div className="flex items-center" style={{ paddingRight: PLOT_INSET_RIGHT_PX }} role="group" aria-label="Contracts over time">
      <span className="shrink-0 pr-2 text-right font-mono text-[10px] text-slate-500 uppercase dark:text-slate-400" style={{ width: PLOT_INSET_LEFT_PX }}>
        Contract
      </span>
      <div ref={lane} className="relative h-5 flex-1 overflow-hidden rounded-sm bg-slate-50 dark:bg-slate-950">
        {drawn.map(({ span: c, count }, index) => {
          const until = count > 1 ? (drawn[index + 1]?.span.startUs ?? c.endUs ?? endUs) : (c.endUs ?? endUs);
          const style = segmentStyle(window, c.startUs, until);
          if (!style) return null;
          const label = count > 1 ? `${count} contracts` : c.label;
          // Text only in a box with room for a few characters: a day of renegotiation draws hundreds of
          // boxes a few px wide, whose clipped words cost layout and show nothing (the title keeps them).
          const roomPx = (positionIn(window, until) - positionIn(window, c.startUs)) * widthPx;
          return (
            <div
              key={c.startUs}
              className="absolute inset-y-0 overflow-hidden rounded-[3px] bg-emerald-100 px-1 font-mono text-[10px] leading-5 whitespace-nowrap text-emerald-900 ring-1 ring-emerald-300 ring-inset dark:bg-emerald-500/15 dark:text-emerald-200 dark:ring-emerald-500/40"
              style={style}
              title={
                count > 1
                  ? `${count} contracts from ${formatTimeUs(c.startUs)}: zoom in to see each`
                  : `${c.label} from ${formatTimeUs(c.startUs)}${c.endUs === undefined ? '' : ` to ${formatTimeUs(c.endUs)}`}`
              }
            >
              {roomPx >= LABEL_ROOM_MIN_PX ? label : null}
            </div>
          );
        })}
      </div>
    </div>
  );
}
