import { useMemo, useState } from 'react';
import { busEventsOf, chartEventsOf, EventLane } from '../../../components/timeline/event-lane.tsx';
import { chartPinsOf, FindingPins } from '../../../components/timeline/finding-pins.tsx';
import { laneMessagesOf } from '../../../components/timeline/lane-messages.ts';
import { MessageLanes } from '../../../components/timeline/message-lanes.tsx';
import { StateLanes } from '../../../components/timeline/state-lanes.tsx';
import { formatTimeUs, type TimeWindow } from '../../../components/timeline/time-window.ts';
import { TimelineLegend } from '../../../components/timeline/timeline-legend.tsx';
import type { Measurement } from '../../../components/timeline/trace-series.ts';
import { PLOT_INSET_LEFT_PX, PLOT_INSET_RIGHT_PX, VbusChart } from '../../../components/timeline/vbus-chart.tsx';
import { useIsDark } from '../../../lib/theme.ts';
import type { CounterexampleRun } from '../../../../workers/property.worker.ts';

/** From the start to a little after the last message: the negotiation, not the quiet tail. */
export function timelineWindow(run: CounterexampleRun): TimeWindow {
  const lastUs = Math.max(0, ...run.messages.map((m) => m.t), ...run.events.map((e) => e.t));
  const endUs = lastUs === 0 ? run.endUs : Math.min(run.endUs, Math.ceil((lastUs * 1.25 + 20_000) / 10_000) * 10_000);
  return { startUs: 0, endUs: Math.max(endUs, 1_000) };
}

/** The run's interleaved samples `[tUs, vbusMv, ibusMa, sinkMv, …]` as the chart's readings at the source and at the sink. */
function measurementsOf(samples: readonly number[]): { source: Measurement[]; sink: Measurement[] } {
  const source: Measurement[] = [];
  const sink: Measurement[] = [];
  for (let i = 0; i + 3 < samples.length; i += 4) {
    const t = samples[i]!;
    source.push({ t, mv: samples[i + 1]!, ma: samples[i + 2]! });
    sink.push({ t, mv: samples[i + 3]! });
  }
  return { source, sink };
}

/**
 * The counterexample as a scenario, drawn by the same timeline parts as the trace page and the
 * Bench: VBUS at source and sink and IBUS as held values with the zoom brush, the bus events, the
 * messages, the findings and both policy engines' states on one time axis.
 */
export default function CounterexampleTimeline({ run }: { run: CounterexampleRun }) {
  const dark = useIsDark();
  const [window, setWindow] = useState(() => timelineWindow(run));
  const measurements = useMemo(() => measurementsOf(run.samples), [run]);
  const lanes = useMemo(() => laneMessagesOf(run.messageRecords).lanes, [run]);
  const events = useMemo(() => chartEventsOf(busEventsOf(run.events)), [run]);
  const pins = useMemo(() => chartPinsOf(run.findings), [run]);
  const endUs = Math.max(1, run.endUs);
  const insets = { insetLeftPx: PLOT_INSET_LEFT_PX, insetRightPx: PLOT_INSET_RIGHT_PX };
  return (
    <figure aria-label="Counterexample timeline" className="space-y-2">
      <VbusChart measurements={measurements.source} sinkMeasurements={measurements.sink} window={window} endUs={endUs} pins={pins} events={events} onWindowChange={setWindow} dark={dark} />
      <EventLane events={events} window={window} {...insets} />
      <MessageLanes messages={lanes} window={window} foldGoodCrc={false} onZoomTo={setWindow} {...insets} />
      <FindingPins findings={run.findings} window={window} onZoomTo={setWindow} {...insets} />
      <StateLanes entries={run.lanes} window={window} endUs={endUs} {...insets} />
      <div style={{ paddingLeft: PLOT_INSET_LEFT_PX }}>
        <TimelineLegend sinkVbus faults={events.some((e) => e.tone === 'fault')} />
      </div>
      <figcaption className="text-[11px] text-slate-500 dark:text-slate-400" style={{ paddingLeft: PLOT_INSET_LEFT_PX }}>
        {formatTimeUs(window.startUs)} to {formatTimeUs(window.endUs)} of a {formatTimeUs(run.endUs)} run; drag on the overview to zoom.
      </figcaption>
    </figure>
  );
}
