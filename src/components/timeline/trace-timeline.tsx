import { useEffect, useMemo, useRef, useState } from 'react';
import { useIsDark } from '../../lib/theme.ts';
import { cn } from '../../lib/cn.ts';
import { FindingPins, type PinnedFinding } from './finding-pins.tsx';
import { MessageLanes, type LaneMessage } from './message-lanes.tsx';
import { TimelineToolbar } from './timeline-toolbar.tsx';
import { formatTimeUs, segmentStyle, type TimeWindow } from './time-window.ts';
import { windowAround, type Measurement } from './trace-series.ts';
import { PLOT_INSET_LEFT_PX, PLOT_INSET_RIGHT_PX, VbusChart, type ChartBand } from './vbus-chart.tsx';

export type TimelineSpan = { startUs: number; endUs?: number; label: string };

export type TraceTimelineProps = {
  measurements: readonly Measurement[];
  messages: readonly LaneMessage[];
  findings: readonly PinnedFinding[];
  /** Contracts in force, each from its PS_RDY until the next change (or the end). */
  contracts: readonly TimelineSpan[];
  bands?: readonly ChartBand[];
  endUs: number;
  /** Zoom to this time when it changes (the `key` lets the same time be asked for twice). */
  focus?: { tUs: number; key: number } | null;
  selectedFinding?: number;
  onSelectFinding?(index: number): void;
  className?: string;
};

/** A finding is shown with this much of the trace around it (invented: fits a request/response pair). */
const FOCUS_SPAN_US = 80_000;

/**
 * The trace over time: VBUS and IBUS with a brush to zoom, the contract in force, the messages
 * between source and sink, and the findings pinned at their times — all on one time window.
 */
export function TraceTimeline({ measurements, messages, findings, contracts, bands, endUs, focus, selectedFinding, onSelectFinding, className }: TraceTimelineProps) {
  const end = Math.max(1, endUs);
  const [window, setWindow] = useState<TimeWindow>({ startUs: 0, endUs: end });
  const [foldGoodCrc, setFoldGoodCrc] = useState(true);
  const [selectedMessage, setSelectedMessage] = useState<number | undefined>(undefined);
  const dark = useIsDark();
  const root = useRef<HTMLDivElement>(null);

  useEffect(() => {
    if (!focus) return;
    setWindow(windowAround(focus.tUs, FOCUS_SPAN_US, end));
    root.current?.scrollIntoView?.({ behavior: 'smooth', block: 'center' });
  }, [focus, end]);

  const pins = useMemo(
    () => findings.flatMap((f, index) => (f.t === undefined ? [] : [{ tUs: f.t, tone: f.severity, label: f.rule, selected: index === selectedFinding }])),
    [findings, selectedFinding],
  );
  const message = selectedMessage === undefined ? undefined : messages[selectedMessage];

  return (
    <div ref={root} className={cn('flex flex-col gap-2', className)} data-testid="trace-timeline" data-window={`${window.startUs}-${window.endUs}`}>
      <TimelineToolbar window={window} endUs={end} onWindowChange={setWindow} foldGoodCrc={foldGoodCrc} onFoldGoodCrcChange={setFoldGoodCrc} subject="trace" />
      <VbusChart measurements={measurements} window={window} endUs={end} pins={pins} bands={bands} onWindowChange={setWindow} dark={dark} />
      <ContractLane contracts={contracts} window={window} endUs={end} />
      <MessageLanes
        messages={messages}
        window={window}
        foldGoodCrc={foldGoodCrc}
        insetLeftPx={PLOT_INSET_LEFT_PX}
        insetRightPx={PLOT_INSET_RIGHT_PX}
        onSelect={setSelectedMessage}
        selectedIndex={selectedMessage}
      />
      <FindingPins findings={findings} window={window} selectedIndex={selectedFinding} onSelect={onSelectFinding} insetLeftPx={PLOT_INSET_LEFT_PX} insetRightPx={PLOT_INSET_RIGHT_PX} />
      {message && (
        <p className="rounded-md bg-slate-100 px-3 py-2 font-mono text-xs text-slate-700 dark:bg-slate-800 dark:text-slate-200" data-testid="selected-message">
          {formatTimeUs(message.t)} · {message.from} · {message.messageType} #{message.messageId}
          {message.retry ? ' · retry' : ''}
          {!message.crcOk ? ' · bad CRC' : ''}
          {message.hex ? ` · ${message.hex.match(/../g)?.join(' ')}` : ''}
        </p>
      )}
    </div>
  );
}

function ContractLane({ contracts, window, endUs }: { contracts: readonly TimelineSpan[]; window: TimeWindow; endUs: number }) {
  return (
    <div className="flex items-center" style={{ paddingRight: PLOT_INSET_RIGHT_PX }} role="group" aria-label="Contracts over time">
      <span className="shrink-0 pr-2 text-right font-mono text-[10px] text-slate-500 uppercase dark:text-slate-400" style={{ width: PLOT_INSET_LEFT_PX }}>
        Contract
      </span>
      <div className="relative h-5 flex-1 overflow-hidden rounded-sm bg-slate-50 dark:bg-slate-950">
        {contracts.map((c) => {
          const style = segmentStyle(window, c.startUs, c.endUs ?? endUs);
          if (!style) return null;
          return (
            <div
              key={c.startUs}
              className="absolute inset-y-0 overflow-hidden rounded-[3px] bg-emerald-100 px-1 font-mono text-[10px] leading-5 whitespace-nowrap text-emerald-900 ring-1 ring-emerald-300 ring-inset dark:bg-emerald-500/15 dark:text-emerald-200 dark:ring-emerald-500/40"
              style={style}
              title={`${c.label} from ${formatTimeUs(c.startUs)}${c.endUs === undefined ? '' : ` to ${formatTimeUs(c.endUs)}`}`}
            >
              {c.label}
            </div>
          );
        })}
      </div>
    </div>
  );
}
