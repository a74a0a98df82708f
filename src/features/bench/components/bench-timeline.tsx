import { useMemo, useState } from 'react';
import { Button } from '../../../components/button.tsx';
import { busEventsOf, chartEventsOf, EventLane } from '../../../components/timeline/event-lane.tsx';
import { MessageList } from '../../../components/timeline/message-list.tsx';
import { TimelineLegend } from '../../../components/timeline/timeline-legend.tsx';
import { chartPinsOf, FindingPins } from '../../../components/timeline/finding-pins.tsx';
import { MessageLanes } from '../../../components/timeline/message-lanes.tsx';
import { StateLanes } from '../../../components/timeline/state-lanes.tsx';
import { TimerSpans } from '../../../components/timeline/timer-spans.tsx';
import type { TimeWindow } from '../../../components/timeline/time-window.ts';
import { TimelineToolbar } from '../../../components/timeline/timeline-toolbar.tsx';
import { PLOT_INSET_LEFT_PX, PLOT_INSET_RIGHT_PX, VbusChart } from '../../../components/timeline/vbus-chart.tsx';
import { laneMessagesOf, type RunMessage } from '../../../components/timeline/lane-messages.ts';
import { chartMeasurements } from '../lib/timeline-data.ts';
import type { BenchRun } from '../lib/use-simulation.ts';
import { useStagedReveal } from '../lib/use-staged-reveal.ts';

export type BenchTimelineProps = {
  run: BenchRun;
  window: TimeWindow;
  onWindowChange(window: TimeWindow): void;
  selectedIndex: number | null;
  onSelectMessage(index: number, message: RunMessage): void;
  onSelectFinding?(index: number): void;
  dark: boolean;
};

/**
 * The run on one time axis, from the shared timeline parts: VBUS at source and sink and IBUS with
 * the brush, the messages, the findings, and (Bench only) both policy engines' states and the
 * timers. The window is the page's, so the findings table can bring a time into view.
 */
export function BenchTimeline({ run, window, onWindowChange, selectedIndex, onSelectMessage, onSelectFinding, dark }: BenchTimelineProps) {
  const [foldGoodCrc, setFoldGoodCrc] = useState(false);
  const { lanes, messages } = useMemo(() => laneMessagesOf(run.events), [run]);
  const measurements = useMemo(() => chartMeasurements(run.samples, window), [run, window]);
  const pins = useMemo(() => chartPinsOf(run.findings), [run]);
  const events = useMemo(() => chartEventsOf(busEventsOf(run.events)), [run]);
  const end = Math.max(1, run.endUs);
  const firstContractUs = run.contracts[0]?.t;
  const firstMessageUs = lanes[0]?.t ?? 0;
  // Chart, then messages and findings, then states and timers: one part a task, none of them long.
  const parts = useStagedReveal(run, 4);

  return (
    <div className="flex min-h-[32rem] flex-col gap-2 [contain:layout_style]" data-testid="bench-timeline">
      <TimelineToolbar window={window} endUs={end} onWindowChange={onWindowChange} foldGoodCrc={foldGoodCrc} onFoldGoodCrcChange={setFoldGoodCrc} subject="run">
        {firstContractUs !== undefined && (
          <Button
            size="sm"
            variant="secondary"
            onClick={() => {
              // From the first offer to the PS_RDY that made the contract, with a little room either side.
              const marginUs = Math.max(1_000, Math.round((firstContractUs - firstMessageUs) * 0.05));
              onWindowChange({ startUs: Math.max(0, firstMessageUs - marginUs), endUs: Math.min(end, firstContractUs + 2 * marginUs) });
            }}
          >
            First contract
          </Button>
        )}
      </TimelineToolbar>
      {parts >= 2 && (
        <VbusChart measurements={measurements.source} sinkMeasurements={measurements.sink} window={window} endUs={end} pins={pins} events={events} onWindowChange={onWindowChange} dark={dark} />
      )}
      {parts >= 3 && (
        <>
          <EventLane events={events} window={window} insetLeftPx={PLOT_INSET_LEFT_PX} insetRightPx={PLOT_INSET_RIGHT_PX} />
          <MessageLanes
            messages={lanes}
            window={window}
            foldGoodCrc={foldGoodCrc}
            insetLeftPx={PLOT_INSET_LEFT_PX}
            insetRightPx={PLOT_INSET_RIGHT_PX}
            selectedIndex={selectedIndex ?? undefined}
            onSelect={(index) => {
              const message = messages[index];
              if (message) onSelectMessage(index, message);
            }}
            onZoomTo={onWindowChange}
          />
          <FindingPins findings={run.findings} window={window} onSelect={onSelectFinding} onZoomTo={onWindowChange} insetLeftPx={PLOT_INSET_LEFT_PX} insetRightPx={PLOT_INSET_RIGHT_PX} />
        </>
      )}
      {parts >= 4 && (
        <>
          <StateLanes entries={run.lanes} window={window} endUs={end} insetLeftPx={PLOT_INSET_LEFT_PX} insetRightPx={PLOT_INSET_RIGHT_PX} />
          <TimerSpans timers={run.timers} window={window} insetLeftPx={PLOT_INSET_LEFT_PX} insetRightPx={PLOT_INSET_RIGHT_PX} />
          <div style={{ paddingLeft: PLOT_INSET_LEFT_PX }}>
            <TimelineLegend sinkVbus timers faults={events.some((e) => e.tone === 'fault')} />
          </div>
          <MessageList
            messages={lanes}
            foldGoodCrc={foldGoodCrc}
            selectedIndex={selectedIndex ?? undefined}
            heightPx={300}
            onSelect={(index) => {
              const message = messages[index];
              if (!message) return;
              onSelectMessage(index, message);
              const spanUs = Math.min(window.endUs - window.startUs, 50_000);
              if (message.t < window.startUs || message.t > window.endUs) onWindowChange({ startUs: Math.max(0, message.t - spanUs / 2), endUs: Math.min(end, message.t + spanUs / 2) });
            }}
          />
        </>
      )}
    </div>
  );
}
