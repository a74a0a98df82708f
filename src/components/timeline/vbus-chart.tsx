import { memo, useDeferredValue, useMemo } from 'react';
import type { ChartBand, ChartEvent, ChartPin } from './chart-marks.ts';
import { fittedZeroBasedTicks, timeAxisMs, zeroBasedTicks } from './chart-ticks.ts';
import { HoverReadout, type ReadoutSeries } from './hover-readout.tsx';
import { OverviewBrush } from './overview-brush.tsx';
import { PlotMarks } from './plot-marks.tsx';
import { linearScale, readingMarks, stepPath, type PlotArea } from './step-path.ts';
import { thin, windowSteps, type Measurement, type StepPoint } from './trace-series.ts';
import type { TimeWindow } from './time-window.ts';
import { useElementWidth } from './use-element-width.ts';

export { clusterName, EVENT_COLOURS, PIN_COLOURS, type ChartBand, type ChartEvent, type ChartPin } from './chart-marks.ts';

/** Plot-area insets (px), so lanes under the chart line up with its time axis. */
export const PLOT_INSET_LEFT_PX = 56;
export const PLOT_INSET_RIGHT_PX = 56;
const CHART_HEIGHT_PX = 224;
const PLOT_TOP_PX = 8;
/** Below the plot: tick marks and the time labels. */
const TIME_AXIS_HEIGHT_PX = 30;
const TICK_PX = 6;
/** Between a tick mark and its label. */
const TICK_LABEL_GAP_PX = 2;
/** Head room above the highest value, so a line at the top does not sit on the frame. */
const HEADROOM = 1.05;
/** Each reading gets a dot while there is at least this much room per reading. */
const DOT_ROOM_PX = 8;
const VBUS_COLOUR = '#d97706';
const SINK_VBUS_COLOUR = '#7c3aed';
const IBUS_COLOUR = '#0284c7';

export type VbusChartProps = {
  measurements: readonly Measurement[];
  window: TimeWindow;
  /** The end of the trace (µs): the overview's and the brush's range. */
  endUs: number;
  pins: readonly ChartPin[];
  /** Events drawn across the plot with their label. */
  events?: readonly ChartEvent[];
  /** Tolerance bands of the contracts (VBUS must stay inside after PS_RDY). */
  bands?: readonly ChartBand[];
  onWindowChange(window: TimeWindow): void;
  dark?: boolean;
  /** Optional second voltage series: VBUS at the sink, after the cable's drop (the Bench's simulations). */
  sinkMeasurements?: readonly Measurement[];
  /** The whole-trace overview with its zoom brush under the chart (off for a printed report, which cannot zoom). */
  overview?: boolean;
};

const NO_BANDS: readonly ChartBand[] = [];
const NO_EVENTS: readonly ChartEvent[] = [];
const NO_POINTS: StepPoint[] = [];
const CHART_WIDTH_OPTIONS = { firstAtOnce: true };

/** Points per series: about one per three px of plot width, in steps of 50 (LTTB keeps the peaks, and a VBUS trace is mostly flat steps). */
function pointBudget(plotWidthPx: number): number {
  return Math.min(400, Math.max(100, Math.round(plotWidthPx / 150) * 50));
}

const valueLabel = (unit: string) => (value: number) => `${Number(value.toFixed(3))} ${unit}`;
const voltLabel = valueLabel('V');
const ampLabel = valueLabel('A');
const byTime = <T extends { tUs: number }>(items: readonly T[]) => [...items].sort((a, b) => a.tUs - b.tUs);

type AxesProps = {
  plot: PlotArea;
  colour: string;
  time: { ticks: readonly number[]; label(ms: number): string; xOf(ms: number): number };
  volts: { ticks: readonly number[]; yOf(value: number): number };
  amps?: { ticks: readonly number[]; yOf(value: number): number };
};

/** The time axis under the plot, volts on the left and (with a current) amps on the right: lines, tick marks and labels. */
function Axes({ plot, colour, time, volts, amps }: AxesProps) {
  const bottom = plot.y + plot.height;
  const right = plot.x + plot.width;
  return (
    <g className="parley-chart-axes" stroke={colour} fill={colour} fontSize={11}>
      <line x1={plot.x} x2={right} y1={bottom} y2={bottom} />
      {time.ticks.map((ms) => {
        const x = time.xOf(ms);
        return (
          <g key={`t${ms}`}>
            <line x1={x} x2={x} y1={bottom} y2={bottom + TICK_PX} />
            <text x={x} y={bottom + TICK_PX + TICK_LABEL_GAP_PX} dy="0.71em" textAnchor="middle" stroke="none" className="parley-axis-tick">
              {time.label(ms)}
            </text>
          </g>
        );
      })}
      <line x1={plot.x} x2={plot.x} y1={plot.y} y2={bottom} />
      {volts.ticks.map((value) => {
        const y = volts.yOf(value);
        return (
          <g key={`v${value}`}>
            <line x1={plot.x - TICK_PX} x2={plot.x} y1={y} y2={y} />
            <text x={plot.x - TICK_PX - TICK_LABEL_GAP_PX} y={y} dy="0.355em" textAnchor="end" stroke="none" className="parley-axis-tick">
              {voltLabel(value)}
            </text>
          </g>
        );
      })}
      {amps && <line x1={right} x2={right} y1={plot.y} y2={bottom} />}
      {amps?.ticks.map((value) => {
        const y = amps.yOf(value);
        return (
          <g key={`a${value}`}>
            <line x1={right} x2={right + TICK_PX} y1={y} y2={y} />
            <text x={right + TICK_PX + TICK_LABEL_GAP_PX} y={y} dy="0.355em" textAnchor="start" stroke="none" className="parley-axis-tick">
              {ampLabel(value)}
            </text>
          </g>
        );
      })}
    </g>
  );
}

/**
 * VBUS (V, left axis) and IBUS (A, right axis) over the visible window, with findings as vertical
 * pins and contract tolerance bands; under it a whole-trace overview whose brush sets the window.
 *
 * Plain SVG drawn from our own scales (issue 17: no main-thread task over 100 ms while a trace page
 * opens): a held-value path per series, a dot per reading while they have room, our own ticks and
 * domains, nothing measured in the DOM. The width comes from a debounced ResizeObserver, about one
 * point per three px is drawn, and it is memoised so a parent's unrelated state (a selected
 * message, a checkbox) does not redraw it. The pointer's read-out is an HTML layer of its own.
 */
export const VbusChart = memo(function VbusChart(props: VbusChartProps) {
  // A new window or series redraws the chart in a later, interruptible render: the lanes (and the
  // click that asked) go first, and no task carries both.
  const window = useDeferredValue(props.window);
  const measurements = useDeferredValue(props.measurements);
  const sinkMeasurements = useDeferredValue(props.sinkMeasurements);
  const { endUs, pins, events = NO_EVENTS, bands = NO_BANDS, onWindowChange, dark = false } = props;
  // Drawn as soon as its width is known: the page's tables and lists arriving meanwhile would each
  // interrupt (and restart) a transition, leaving the chart for last.
  const [box, widthPx] = useElementWidth<HTMLDivElement>(undefined, CHART_WIDTH_OPTIONS);
  const plotWidthPx = Math.max(0, widthPx - PLOT_INSET_LEFT_PX - PLOT_INSET_RIGHT_PX);
  const measured = plotWidthPx > 0;
  const budget = pointBudget(plotWidthPx);
  const series = useMemo(() => {
    if (!measured) return { vbusV: NO_POINTS, ibusA: NO_POINTS, sinkV: NO_POINTS, readings: 0 };
    const own = windowSteps(measurements, window, budget);
    return { ...own, sinkV: sinkMeasurements ? windowSteps(sinkMeasurements, window, budget).vbusV : NO_POINTS };
  }, [measurements, window, sinkMeasurements, budget, measured]);
  // Each reading marked while they have room; a thinned window shows the line alone.
  const dots = series.readings > 0 && series.readings * DOT_ROOM_PX <= plotWidthPx && series.vbusV.length <= budget;
  const overview = useMemo(
    () =>
      thin(
        measurements.map((m) => ({ tMs: m.t / 1_000, value: m.mv / 1_000 })),
        300,
      ),
    [measurements],
  );
  const hasCurrent = useMemo(() => measurements.some((m) => m.ma !== undefined), [measurements]);
  const visibleBands = useMemo(() => bands.filter((band) => band.endUs >= window.startUs && band.startUs <= window.endUs), [bands, window]);
  const sortedPins = useMemo(() => byTime(pins), [pins]);
  const sortedEvents = useMemo(() => byTime(events), [events]);
  const plot: PlotArea = useMemo(() => ({ x: PLOT_INSET_LEFT_PX, y: PLOT_TOP_PX, width: plotWidthPx, height: CHART_HEIGHT_PX - PLOT_TOP_PX - TIME_AXIS_HEIGHT_PX }), [plotWidthPx]);
  const drawing = useMemo(() => {
    let maxV = 0;
    let maxA = 0;
    for (const p of series.vbusV) maxV = Math.max(maxV, p.value ?? 0);
    for (const p of series.sinkV) maxV = Math.max(maxV, p.value ?? 0);
    for (const p of series.ibusA) maxA = Math.max(maxA, p.value ?? 0);
    for (const band of visibleBands) maxV = Math.max(maxV, band.maxMv / 1_000);
    const volts = fittedZeroBasedTicks(maxV * HEADROOM);
    // As many intervals as the volt axis, so the amp ticks sit on the volt grid.
    const amps = zeroBasedTicks(maxA * HEADROOM, volts.ticks.length - 1);
    const startMs = window.startUs / 1_000;
    const endMs = window.endUs / 1_000;
    const time = timeAxisMs(startMs, endMs, plotWidthPx);
    const bottom = plot.y + plot.height;
    const xOf = linearScale([startMs, endMs], [plot.x, plot.x + plot.width]);
    const yOfV = linearScale([0, volts.max], [bottom, plot.y]);
    const yOfA = linearScale([0, amps.max], [bottom, plot.y]);
    return {
      startMs,
      endMs,
      maxV: volts.max,
      axes: { time: { ticks: time.ticks, label: time.label, xOf }, volts: { ticks: volts.ticks, yOf: yOfV }, amps: { ticks: amps.ticks, yOf: yOfA } },
      vbus: stepPath(series.vbusV, xOf, yOfV, plot),
      sink: stepPath(series.sinkV, xOf, yOfV, plot),
      ibus: stepPath(series.ibusA, xOf, yOfA, plot),
      vbusDots: dots ? readingMarks(series.vbusV, xOf, yOfV, plot) : [],
      ibusDots: dots ? readingMarks(series.ibusA, xOf, yOfA, plot) : [],
      readout: [
        { name: 'VBUS', unit: 'V' as const, colour: VBUS_COLOUR, points: series.vbusV, yOf: yOfV },
        ...(sinkMeasurements ? [{ name: 'VBUS at sink', unit: 'V' as const, colour: SINK_VBUS_COLOUR, points: series.sinkV, yOf: yOfV }] : []),
        ...(hasCurrent ? [{ name: 'IBUS', unit: 'A' as const, colour: IBUS_COLOUR, points: series.ibusA, yOf: yOfA }] : []),
      ] satisfies ReadoutSeries[],
    };
  }, [series, visibleBands, window, plotWidthPx, plot, dots, sinkMeasurements, hasCurrent]);
  const axis = dark ? '#94a3b8' : '#475569';
  const grid = dark ? '#1e293b' : '#e2e8f0';

  if (measurements.length === 0) {
    return (
      <p className="rounded-md border border-dashed border-slate-300 px-4 py-6 text-center text-xs text-slate-500 dark:border-slate-700" data-testid="vbus-chart-empty">
        This trace holds no VBUS measurements.
      </p>
    );
  }

  return (
    <div className="flex flex-col gap-1">
      <div className="flex gap-4 text-[11px] text-slate-600 dark:text-slate-400" style={{ paddingLeft: PLOT_INSET_LEFT_PX }} aria-hidden="true">
        <span className="flex items-center gap-1.5">
          <span className="h-0.5 w-4 bg-amber-600" /> VBUS (V, left)
        </span>
        {sinkMeasurements && (
          <span className="flex items-center gap-1.5">
            <span className="w-4 border-t-2 border-dashed border-violet-600" /> VBUS at the sink, after the cable (V, left)
          </span>
        )}
        {hasCurrent && (
          <span className="flex items-center gap-1.5">
            <span className="h-0.5 w-4 bg-sky-600" /> IBUS (A, right)
          </span>
        )}
        {bands.length > 0 && (
          <span className="flex items-center gap-1.5">
            <span className="h-2.5 w-4 bg-emerald-500/20" /> contract tolerance
          </span>
        )}
        {pins.length > 0 && (
          <span className="flex items-center gap-1.5">
            <span className="h-3 w-0 border-l border-dashed border-red-600" /> finding
          </span>
        )}
      </div>
      {/* data-drawn: the chart is on the page with its lines, axes and marks (tests and bench:ui wait for it). */}
      <div ref={box} className="relative h-56 w-full overflow-hidden" data-testid="vbus-chart" data-drawn={measured || undefined} data-readings={series.readings}>
        {measured && (
          <>
            <svg
              className="parley-chart-surface"
              width={widthPx}
              height={CHART_HEIGHT_PX}
              viewBox={`0 0 ${widthPx} ${CHART_HEIGHT_PX}`}
              role="img"
              aria-label={hasCurrent ? 'VBUS and IBUS over the visible window' : 'VBUS over the visible window'}
            >
              <PlotMarks
                plot={plot}
                window={window}
                maxV={drawing.maxV}
                gridV={drawing.axes.volts.ticks}
                gridColour={grid}
                bands={visibleBands}
                pins={sortedPins}
                events={sortedEvents}
                endUs={endUs}
                labelColour={dark ? '#0f172a' : '#ffffff'}
              />
              <Axes plot={plot} colour={axis} time={drawing.axes.time} volts={drawing.axes.volts} amps={hasCurrent ? drawing.axes.amps : undefined} />
              {hasCurrent && <path className="parley-ibus-line" d={drawing.ibus} fill="none" stroke={IBUS_COLOUR} strokeWidth={1.2} />}
              {sinkMeasurements && <path className="parley-sink-vbus-line" d={drawing.sink} fill="none" stroke={SINK_VBUS_COLOUR} strokeWidth={1.2} strokeDasharray="4 2" />}
              <path className="parley-vbus-line" d={drawing.vbus} fill="none" stroke={VBUS_COLOUR} strokeWidth={1.6} />
              {drawing.ibusDots.map(({ x, y }, index) => (
                // biome-ignore lint/suspicious/noArrayIndexKey: a reading's place is its identity in this window
                <circle key={index} cx={x} cy={y} r={1.6} fill={IBUS_COLOUR} />
              ))}
              {drawing.vbusDots.map(({ x, y }, index) => (
                // biome-ignore lint/suspicious/noArrayIndexKey: a reading's place is its identity in this window
                <circle key={index} cx={x} cy={y} r={2} fill={VBUS_COLOUR} />
              ))}
            </svg>
            <HoverReadout plot={plot} startMs={drawing.startMs} endMs={drawing.endMs} series={drawing.readout} dark={dark} />
          </>
        )}
      </div>
      {props.overview !== false && (
        <OverviewBrush points={overview} endUs={endUs} window={props.window} onWindowChange={onWindowChange} insetLeftPx={PLOT_INSET_LEFT_PX} insetRightPx={PLOT_INSET_RIGHT_PX} dark={dark} />
      )}
    </div>
  );
});
