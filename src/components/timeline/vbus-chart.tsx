import { memo, startTransition, useDeferredValue, useEffect, useMemo, useState, type ReactNode } from 'react';
import { Line, LineChart, Tooltip, usePlotArea, XAxis, YAxis } from 'recharts';
import { fittedZeroBasedTicks, formatExactMs, timeAxisMs, zeroBasedTicks } from './chart-ticks.ts';
import { OverviewBrush } from './overview-brush.tsx';
import { clusterInWindow, indexRange, visibleSpans, type Cluster } from './clusters.ts';
import { placeMarkLabels } from './mark-labels.ts';
import { thin, windowSteps, type Measurement, type StepPoint } from './trace-series.ts';
import type { TimeWindow } from './time-window.ts';
import { useElementWidth } from './use-element-width.ts';

/** Plot-area insets (px), so lanes under the chart line up with its time axis. */
export const PLOT_INSET_LEFT_PX = 56;
export const PLOT_INSET_RIGHT_PX = 56;
const AXIS_WIDTH_PX = 48;
const CHART_HEIGHT_PX = 224;
const MARGIN = { top: 8, right: PLOT_INSET_RIGHT_PX - AXIS_WIDTH_PX, bottom: 0, left: PLOT_INSET_LEFT_PX - AXIS_WIDTH_PX };
// Without a current axis its width goes to the margin, so the plot keeps the same insets.
const MARGIN_NO_CURRENT = { ...MARGIN, right: PLOT_INSET_RIGHT_PX };
const ACTIVE_DOT = { r: 3, strokeWidth: 0 };
/** Head room above the highest value, so a line at the top does not sit on the frame. */
const HEADROOM = 1.05;

/** A finding on the chart: `label` names it in plain words (drawn where it fits), `rule` is its id. */
export type ChartPin = { tUs: number; tone: 'error' | 'warning' | 'info'; label: string; rule?: string; selected?: boolean };
export type ChartBand = { startUs: number; endUs: number; minMv: number; maxMv: number };
/** Something that happened on the bus (Hard Reset, attach, an injected fault): a solid line with a label. */
export type ChartEvent = { tUs: number; label: string; tone: 'reset' | 'attach' | 'fault' | 'note' };

export const EVENT_COLOURS: Record<ChartEvent['tone'], string> = { reset: '#be123c', attach: '#15803d', fault: '#a21caf', note: '#64748b' };
/** Marks closer than this on screen fold into one (findings, events). */
const MARK_GAP_PX = 5;
/** Each reading gets a dot while there is at least this much room per reading. */
const DOT_ROOM_PX = 8;
const READING_DOT = { r: 2, strokeWidth: 0, fill: '#d97706' };
const CURRENT_DOT = { r: 1.6, strokeWidth: 0, fill: '#0284c7' };

export const PIN_COLOURS: Record<ChartPin['tone'], string> = { error: '#dc2626', warning: '#ea580c', info: '#0284c7' };

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

/**
 * 1 once `ready`, then one more in each following task up to `stages` (as transitions, so React
 * may slice each part's render). Never goes back: later updates draw every part at once.
 */
function useMountStages(ready: boolean, stages: number): number {
  const [stage, setStage] = useState(0);
  const shown = ready ? Math.max(1, stage) : stage;
  useEffect(() => {
    if (!ready || shown >= stages) return;
    const timer = setTimeout(() => startTransition(() => setStage(shown + 1)), 0);
    return () => clearTimeout(timer);
  }, [ready, shown, stages]);
  return shown;
}

/**
 * Points per series: about one per three px of plot width, in steps of 50 (LTTB keeps the peaks,
 * and a VBUS trace is mostly flat steps). recharts copies and freezes every row into its store on
 * each draw, so rows cost time in proportion.
 */
function pointBudget(plotWidthPx: number): number {
  return Math.min(400, Math.max(100, Math.round(plotWidthPx / 150) * 50));
}

type TickProps = { x?: number | string; y?: number | string; textAnchor?: 'start' | 'middle' | 'end' | 'inherit'; fill?: string; payload?: { value: number | string } };

/**
 * Tick labels as plain <text>: recharts' own label component measures every word in the DOM
 * (each a forced layout) to wrap it, which these short labels never need.
 */
function tickRenderer(format: (value: number) => string, dy: string) {
  // A render function recharts calls, not a component of its own.
  return function drawTick({ x, y, textAnchor, fill, payload }: TickProps): ReactNode {
    return (
      <text x={x} y={y} dy={dy} textAnchor={textAnchor} fill={fill} fontSize={11} className="recharts-cartesian-axis-tick-value">
        {format(Number(payload?.value ?? 0))}
      </text>
    );
  };
}
const valueLabel = (unit: string) => (value: number) => `${Number(value.toFixed(3))} ${unit}`;
const voltTick = tickRenderer(valueLabel('V'), '0.355em');
const ampTick = tickRenderer(valueLabel('A'), '0.355em');
const tooltipLabel = (label: unknown) => formatExactMs(Number(label));
const tooltipValue = (value: unknown, name: unknown): [string, string] => [`${Number(value).toFixed(3)} ${name === 'IBUS' ? 'A' : 'V'}`, String(name)];

type PlotMarksProps = {
  window: TimeWindow;
  maxV: number;
  gridV: readonly number[];
  gridColour: string;
  bands: readonly ChartBand[];
  pins: readonly ChartPin[];
  events: readonly ChartEvent[];
  endUs: number;
  labelColour: string;
};

/** Rows of mark names in the plot: two along the top for events, two along the bottom for findings. */
const NAME_ROWS = 2;
const NAME_ROW_PX = 12;

/** Which mark of a folded group names it: a reset before a fault, an attach or a note; an error before a warning. */
const EVENT_RANK: Record<ChartEvent['tone'], number> = { reset: 0, fault: 1, attach: 2, note: 3 };
const PIN_RANK: Record<ChartPin['tone'], number> = { error: 0, warning: 1, info: 2 };
// The two tone sets do not overlap, so the tone alone says which table ranks it.
const rankOf = (item: ChartEvent | ChartPin) => (item.tone in EVENT_RANK ? EVENT_RANK[item.tone as ChartEvent['tone']] : PIN_RANK[item.tone as ChartPin['tone']]);

/** A folded group's name: its most telling member's label and how many more it holds ("Hard Reset +2"). */
export function clusterName<T extends ChartEvent | ChartPin>(cluster: Cluster, items: readonly T[]): { item: T; text: string } {
  let item = items[cluster.first]!;
  for (let index = cluster.first + 1; index < cluster.first + cluster.count; index++) if (rankOf(items[index]!) < rankOf(item)) item = items[index]!;
  return { item, text: cluster.count > 1 ? `${item.label} +${cluster.count - 1}` : item.label };
}

/** The names of folded marks ("Hard Reset +2", after the group's most telling member) placed so none overlap; those without room are left out. */
function markNames<T extends ChartEvent | ChartPin>(
  clusters: readonly Cluster[],
  items: readonly T[],
  xOf: (tUs: number) => number,
  plot: { x: number; y: number; width: number; height: number },
  edge: 'top' | 'bottom',
) {
  const names = clusters.map((cluster) => ({ xPx: xOf(cluster.startUs), ...clusterName(cluster, items), key: cluster.first }));
  const placed = placeMarkLabels(names, plot.x, plot.x + plot.width, NAME_ROWS);
  return names.flatMap((name, index) => {
    const at = placed[index];
    if (!at) return [];
    const y = edge === 'top' ? plot.y + 10 + at.row * NAME_ROW_PX : plot.y + plot.height - 4 - at.row * NAME_ROW_PX;
    return [{ key: name.key, text: name.text, item: name.item, x: at.xPx, y, anchor: at.anchor }];
  });
}

const byTime = <T extends { tUs: number }>(items: readonly T[]) => [...items].sort((a, b) => a.tUs - b.tUs);
const tOf = (item: { tUs: number }) => item.tUs;

/**
 * The horizontal grid, tolerance bands, events and finding pins, drawn inside the chart's SVG (so
 * they are in an exported picture) from the plot area and our own axis domains. Marks closer than a
 * few pixels fold into one (a count beside it), and bands narrower than two pixels merge, so a
 * trace with 10,000 contracts and 2,000 findings draws a few hundred shapes, not thousands.
 */
function PlotMarks({ window, maxV, gridV, gridColour, bands, pins, events, endUs, labelColour }: PlotMarksProps) {
  const plot = usePlotArea();
  const widthPx = plot?.width ?? 0;
  const pinClusters = useMemo(() => clusterInWindow(pins, indexRange(0, pins.length), tOf, window, widthPx, MARK_GAP_PX), [pins, window, widthPx]);
  const eventClusters = useMemo(() => clusterInWindow(events, indexRange(0, events.length), tOf, window, widthPx, MARK_GAP_PX * 8), [events, window, widthPx]);
  const drawnBands = useMemo(() => visibleSpans(bands, window, widthPx, endUs), [bands, window, widthPx, endUs]);
  if (!plot || plot.width <= 0 || plot.height <= 0) return null;
  const spanUs = Math.max(1, window.endUs - window.startUs);
  const xOf = (tUs: number) => plot.x + ((Math.min(Math.max(tUs, window.startUs), window.endUs) - window.startUs) / spanUs) * plot.width;
  const yOf = (volts: number) => plot.y + plot.height - (Math.min(Math.max(volts, 0), maxV) / maxV) * plot.height;
  const eventNames = new Map(markNames(eventClusters, events, xOf, plot, 'top').map((name) => [name.key, name]));
  return (
    <g className="parley-plot-marks" pointerEvents="none">
      {gridV.map((volts) => (
        <line key={volts} x1={plot.x} x2={plot.x + plot.width} y1={yOf(volts)} y2={yOf(volts)} stroke={gridColour} strokeDasharray="3 3" />
      ))}
      {drawnBands.map(({ span: band }) => {
        const x1 = xOf(band.startUs);
        const top = yOf(band.maxMv / 1_000);
        return (
          <rect key={`${band.startUs}-${band.minMv}`} x={x1} width={Math.max(1, xOf(band.endUs) - x1)} y={top} height={Math.max(0, yOf(band.minMv / 1_000) - top)} fill="#10b981" fillOpacity={0.08} />
        );
      })}
      {pinClusters.map((cluster) => {
        const pin = pins[cluster.first]!;
        const selected = pin.selected || (cluster.count > 1 && pins.slice(cluster.first, cluster.first + cluster.count).some((p) => p.selected));
        return (
          <line
            key={`pin-${cluster.first}`}
            x1={xOf(cluster.startUs)}
            x2={xOf(cluster.startUs)}
            y1={plot.y}
            y2={plot.y + plot.height}
            stroke={PIN_COLOURS[pin.tone]}
            strokeWidth={selected ? 2.5 : 1}
            strokeDasharray={selected ? undefined : '4 3'}
          />
        );
      })}
      {/* Names over the lines: events along the top, findings (in plain words) along the bottom. */}
      {eventClusters.map((cluster) => {
        const name = eventNames.get(cluster.first);
        // A folded group is drawn as its most telling event (a reset before a note).
        const event = (name?.item as ChartEvent | undefined) ?? events[cluster.first]!;
        const x = xOf(cluster.startUs);
        return (
          <g key={`event-${cluster.first}`} data-chart-event={event.label} data-t-us={cluster.startUs}>
            <line x1={x} x2={x} y1={plot.y} y2={plot.y + plot.height} stroke={EVENT_COLOURS[event.tone]} strokeWidth={1.5} />
            {name && (
              <text x={name.x} y={name.y} fontSize={10} textAnchor={name.anchor} fill={EVENT_COLOURS[event.tone]} stroke={labelColour} strokeWidth={3} paintOrder="stroke">
                {name.text}
              </text>
            )}
          </g>
        );
      })}
      {markNames(pinClusters, pins, xOf, plot, 'bottom').map(({ key, text, x, y, anchor, item }) => (
        <text
          key={`pin-name-${key}`}
          x={x}
          y={y}
          fontSize={10}
          textAnchor={anchor}
          fill={PIN_COLOURS[item.tone]}
          stroke={labelColour}
          strokeWidth={3}
          paintOrder="stroke"
          data-finding-rule={item.rule}
        >
          {text}
        </text>
      ))}
    </g>
  );
}

/**
 * VBUS (V, left axis) and IBUS (A, right axis) over the visible window, with findings as vertical
 * pins and contract tolerance bands; under it a whole-trace overview whose brush sets the window.
 *
 * Kept cheap to draw (issue: no main-thread task over 50 ms): a fixed width from a debounced
 * ResizeObserver instead of a re-measuring container, our own ticks and domains (recharts measures
 * no label), about one point per three px, no animation, and memoised so a parent's unrelated state
 * (a selected message, a checkbox) does not redraw it.
 */
export const VbusChart = memo(function VbusChart(props: VbusChartProps) {
  // A new window or series redraws the chart in a later, interruptible render: the lanes (and the
  // click that asked) go first, and no task carries both.
  const window = useDeferredValue(props.window);
  const measurements = useDeferredValue(props.measurements);
  const sinkMeasurements = useDeferredValue(props.sinkMeasurements);
  const { endUs, pins, events = NO_EVENTS, bands = NO_BANDS, onWindowChange, dark = false } = props;
  const [box, widthPx] = useElementWidth<HTMLDivElement>();
  const plotWidthPx = Math.max(0, widthPx - PLOT_INSET_LEFT_PX - PLOT_INSET_RIGHT_PX);
  const measured = plotWidthPx > 0;
  // The chart mounts in three tasks (each of recharts' parts registers in its store, and every
  // registration re-runs its selectors): the VBUS line on its axes with the grid and pins, then the
  // sink's VBUS and IBUS with its axis, then the tooltip (nothing to see until a pointer hovers).
  // Our own fixed domains mean a later part adds to the picture without moving the first.
  const stage = useMountStages(measured, 3);
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
  const withCurrent = hasCurrent && stage >= 2;
  const visibleBands = useMemo(() => bands.filter((band) => band.endUs >= window.startUs && band.startUs <= window.endUs), [bands, window]);
  const sortedPins = useMemo(() => byTime(pins), [pins]);
  const sortedEvents = useMemo(() => byTime(events), [events]);
  const axes = useMemo(() => {
    let maxV = 0;
    let maxA = 0;
    for (const p of series.vbusV) maxV = Math.max(maxV, p.value ?? 0);
    for (const p of series.sinkV) maxV = Math.max(maxV, p.value ?? 0);
    for (const p of series.ibusA) maxA = Math.max(maxA, p.value ?? 0);
    for (const band of visibleBands) maxV = Math.max(maxV, band.maxMv / 1_000);
    const volts = fittedZeroBasedTicks(maxV * HEADROOM);
    const amps = zeroBasedTicks(maxA * HEADROOM, volts.ticks.length - 1);
    const startMs = window.startUs / 1_000;
    const endMs = window.endUs / 1_000;
    const time = timeAxisMs(startMs, endMs, plotWidthPx);
    return {
      time: { domain: [startMs, endMs] as [number, number], ticks: time.ticks, tick: tickRenderer(time.label, '0.71em') },
      volts: { domain: [0, volts.max] as [number, number], ticks: volts.ticks },
      amps: { domain: [0, amps.max] as [number, number], ticks: amps.ticks },
    };
  }, [series, visibleBands, window, plotWidthPx]);
  const axis = dark ? '#94a3b8' : '#475569';
  const grid = dark ? '#1e293b' : '#e2e8f0';
  const tooltipStyle = useMemo(() => ({ fontSize: 12, background: dark ? '#0f172a' : '#fff', borderColor: grid }), [dark, grid]);

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
      {/* data-drawn: every part is on (tests wait for it before judging main-thread tasks). */}
      <div ref={box} className="h-56 w-full overflow-hidden" data-testid="vbus-chart" data-drawn={stage >= 3 || undefined} data-readings={series.readings}>
        {measured && (
          <LineChart width={widthPx} height={CHART_HEIGHT_PX} margin={withCurrent ? MARGIN : MARGIN_NO_CURRENT} accessibilityLayer={false}>
            <XAxis dataKey="tMs" type="number" domain={axes.time.domain} ticks={axes.time.ticks} interval={0} niceTicks="none" allowDataOverflow tick={axes.time.tick} stroke={axis} fontSize={11} />
            <YAxis yAxisId="v" width={AXIS_WIDTH_PX} stroke={axis} fontSize={11} domain={axes.volts.domain} ticks={axes.volts.ticks} interval={0} niceTicks="none" allowDataOverflow tick={voltTick} />
            {withCurrent && (
              <YAxis
                yAxisId="a"
                width={AXIS_WIDTH_PX}
                orientation="right"
                stroke={axis}
                fontSize={11}
                domain={axes.amps.domain}
                ticks={axes.amps.ticks}
                interval={0}
                niceTicks="none"
                allowDataOverflow
                tick={ampTick}
              />
            )}
            <PlotMarks
              window={window}
              maxV={axes.volts.domain[1]}
              gridV={axes.volts.ticks}
              gridColour={grid}
              bands={visibleBands}
              pins={sortedPins}
              events={sortedEvents}
              endUs={endUs}
              labelColour={dark ? '#0f172a' : '#ffffff'}
            />
            {stage >= 3 && <Tooltip labelFormatter={tooltipLabel} formatter={tooltipValue} contentStyle={tooltipStyle} isAnimationActive={false} />}
            <Line
              yAxisId="v"
              data={series.vbusV}
              dataKey="value"
              name="VBUS"
              type="stepAfter"
              stroke="#d97706"
              dot={dots ? READING_DOT : false}
              activeDot={ACTIVE_DOT}
              strokeWidth={1.6}
              isAnimationActive={false}
              className="parley-vbus-line"
            />
            {sinkMeasurements && stage >= 2 && (
              <Line
                yAxisId="v"
                data={series.sinkV}
                dataKey="value"
                name="VBUS at sink"
                type="stepAfter"
                stroke="#7c3aed"
                dot={false}
                activeDot={ACTIVE_DOT}
                strokeWidth={1.2}
                strokeDasharray="4 2"
                isAnimationActive={false}
              />
            )}
            {withCurrent && (
              <Line
                yAxisId="a"
                data={series.ibusA}
                dataKey="value"
                name="IBUS"
                type="stepAfter"
                stroke="#0284c7"
                dot={dots ? CURRENT_DOT : false}
                activeDot={ACTIVE_DOT}
                strokeWidth={1.2}
                isAnimationActive={false}
              />
            )}
          </LineChart>
        )}
      </div>
      {props.overview !== false && (
        <OverviewBrush points={overview} endUs={endUs} window={props.window} onWindowChange={onWindowChange} insetLeftPx={PLOT_INSET_LEFT_PX} insetRightPx={PLOT_INSET_RIGHT_PX} dark={dark} />
      )}
    </div>
  );
});
