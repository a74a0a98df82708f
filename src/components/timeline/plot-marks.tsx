import { useMemo } from 'react';
import { EVENT_COLOURS, markNames, PIN_COLOURS, type ChartBand, type ChartEvent, type ChartPin } from './chart-marks.ts';
import { clusterInWindow, indexRange, visibleSpans } from './clusters.ts';
import type { PlotArea } from './step-path.ts';
import type { TimeWindow } from './time-window.ts';

/** Marks closer than this on screen fold into one (findings, events). */
const MARK_GAP_PX = 5;

type PlotMarksProps = {
  plot: PlotArea;
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

const tOf = (item: { tUs: number }) => item.tUs;

/**
 * The horizontal grid, tolerance bands, events and finding pins, drawn inside the chart's SVG (so
 * they are in an exported picture). Marks closer than a few pixels fold into one (a count beside
 * it), and bands narrower than two pixels merge, so a trace with 10,000 contracts and 2,000
 * findings draws a few hundred shapes, not thousands.
 */
export function PlotMarks({ plot, window, maxV, gridV, gridColour, bands, pins, events, endUs, labelColour }: PlotMarksProps) {
  const widthPx = plot.width;
  const pinClusters = useMemo(() => clusterInWindow(pins, indexRange(0, pins.length), tOf, window, widthPx, MARK_GAP_PX), [pins, window, widthPx]);
  const eventClusters = useMemo(() => clusterInWindow(events, indexRange(0, events.length), tOf, window, widthPx, MARK_GAP_PX * 8), [events, window, widthPx]);
  const drawnBands = useMemo(() => visibleSpans(bands, window, widthPx, endUs), [bands, window, widthPx, endUs]);
  if (plot.width <= 0 || plot.height <= 0) return null;
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
