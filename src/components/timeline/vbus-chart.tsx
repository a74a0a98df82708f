import { useMemo } from 'react';
import { Brush, CartesianGrid, Line, LineChart, ReferenceArea, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { thin, windowSeries, type Measurement, type SeriesPoint } from './trace-series.ts';
import type { TimeWindow } from './time-window.ts';

/** Plot-area insets (px), so lanes under the chart line up with its time axis. */
export const PLOT_INSET_LEFT_PX = 56;
export const PLOT_INSET_RIGHT_PX = 56;
const AXIS_WIDTH_PX = 48;
const MARGIN = { top: 8, right: PLOT_INSET_RIGHT_PX - AXIS_WIDTH_PX, bottom: 0, left: PLOT_INSET_LEFT_PX - AXIS_WIDTH_PX };

export type ChartPin = { tUs: number; tone: 'error' | 'warning' | 'info'; label: string; selected?: boolean };
export type ChartBand = { startUs: number; endUs: number; minMv: number; maxMv: number };

const PIN_COLOURS: Record<ChartPin['tone'], string> = { error: '#dc2626', warning: '#ea580c', info: '#0284c7' };

export const formatAxisMs = (ms: number) => (Math.abs(ms) >= 1_000 ? `${(ms / 1_000).toFixed(Math.abs(ms) >= 10_000 ? 1 : 2)} s` : `${Number(ms.toFixed(2))} ms`);

export type VbusChartProps = {
  measurements: readonly Measurement[];
  window: TimeWindow;
  /** The end of the trace (µs): the overview's and the brush's range. */
  endUs: number;
  pins: readonly ChartPin[];
  /** Tolerance bands of the contracts (VBUS must stay inside after PS_RDY). */
  bands?: readonly ChartBand[];
  onWindowChange(window: TimeWindow): void;
  dark?: boolean;
  /** Optional second voltage series: VBUS at the sink, after the cable's drop (the Bench's simulations). */
  sinkMeasurements?: readonly Measurement[];
};

type Merged = { tMs: number; v?: number; a?: number; s?: number };

function merge(vbusV: SeriesPoint[], ibusA: SeriesPoint[], sinkV: SeriesPoint[] = []): Merged[] {
  const byTime = new Map<number, Merged>();
  for (const p of vbusV) byTime.set(p.tMs, { tMs: p.tMs, v: p.value });
  for (const p of ibusA) byTime.set(p.tMs, { ...(byTime.get(p.tMs) ?? { tMs: p.tMs }), a: p.value });
  for (const p of sinkV) byTime.set(p.tMs, { ...(byTime.get(p.tMs) ?? { tMs: p.tMs }), s: p.value });
  return [...byTime.values()].sort((x, y) => x.tMs - y.tMs);
}

/**
 * VBUS (V, left axis) and IBUS (A, right axis) over the visible window, with findings as vertical
 * pins and contract tolerance bands; under it a whole-trace overview whose brush sets the window.
 */
export function VbusChart({ measurements, window, endUs, pins, bands = [], onWindowChange, dark = false, sinkMeasurements }: VbusChartProps) {
  const data = useMemo(() => {
    const { vbusV, ibusA } = windowSeries(measurements, window);
    return merge(vbusV, ibusA, sinkMeasurements ? windowSeries(sinkMeasurements, window).vbusV : undefined);
  }, [measurements, window, sinkMeasurements]);
  const overview = useMemo(() => thin(measurements.map((m) => ({ tMs: m.t / 1_000, value: m.mv / 1_000 })), 300), [measurements]);
  const hasCurrent = useMemo(() => measurements.some((m) => m.ma !== undefined), [measurements]);
  const axis = dark ? '#94a3b8' : '#475569';
  const grid = dark ? '#1e293b' : '#e2e8f0';
  const domain: [number, number] = [window.startUs / 1_000, window.endUs / 1_000];
  const visiblePins = pins.filter((p) => p.tUs >= window.startUs && p.tUs <= window.endUs).slice(0, 120);
  const startIndex = Math.max(0, overview.findIndex((p) => p.tMs * 1_000 >= window.startUs));
  const endFound = overview.findIndex((p) => p.tMs * 1_000 >= window.endUs);
  const endIndex = endFound === -1 ? Math.max(0, overview.length - 1) : endFound;

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
      <div className="h-56 w-full" data-testid="vbus-chart">
        <ResponsiveContainer width="100%" height="100%">
          <LineChart data={data} margin={MARGIN} accessibilityLayer={false}>
            <CartesianGrid stroke={grid} strokeDasharray="3 3" />
            <XAxis dataKey="tMs" type="number" domain={domain} allowDataOverflow tickFormatter={formatAxisMs} stroke={axis} fontSize={11} />
            <YAxis yAxisId="v" width={AXIS_WIDTH_PX} stroke={axis} fontSize={11} unit=" V" domain={[0, 'auto']} />
            <YAxis yAxisId="a" width={AXIS_WIDTH_PX} orientation="right" stroke={axis} fontSize={11} unit=" A" domain={[0, 'auto']} hide={!hasCurrent} />
            {bands.map((band) => (
              <ReferenceArea
                key={`${band.startUs}-${band.minMv}`}
                yAxisId="v"
                x1={Math.max(band.startUs, window.startUs) / 1_000}
                x2={Math.min(band.endUs, window.endUs) / 1_000}
                y1={band.minMv / 1_000}
                y2={band.maxMv / 1_000}
                fill="#10b981"
                fillOpacity={0.08}
                ifOverflow="hidden"
              />
            ))}
            <Tooltip
              labelFormatter={(label) => formatAxisMs(Number(label))}
              formatter={(value, name) => [`${Number(value).toFixed(3)} ${name === 'IBUS' ? 'A' : 'V'}`, name]}
              contentStyle={{ fontSize: 12, background: dark ? '#0f172a' : '#fff', borderColor: grid }}
            />
            {visiblePins.map((pin, index) => (
              <ReferenceLine
                key={`${pin.tUs}-${index}`}
                yAxisId="v"
                x={pin.tUs / 1_000}
                stroke={PIN_COLOURS[pin.tone]}
                strokeWidth={pin.selected ? 2.5 : 1}
                strokeDasharray={pin.selected ? undefined : '4 3'}
              />
            ))}
            <Line yAxisId="v" dataKey="v" name="VBUS" stroke="#d97706" dot={false} strokeWidth={1.6} isAnimationActive={false} connectNulls />
            {sinkMeasurements && (
              <Line yAxisId="v" dataKey="s" name="VBUS at sink" stroke="#7c3aed" dot={false} strokeWidth={1.2} strokeDasharray="4 2" isAnimationActive={false} connectNulls />
            )}
            {hasCurrent && <Line yAxisId="a" dataKey="a" name="IBUS" stroke="#0284c7" dot={false} strokeWidth={1.2} isAnimationActive={false} connectNulls />}
          </LineChart>
        </ResponsiveContainer>
      </div>
      <div className="h-12 w-full" data-testid="vbus-overview">
        <ResponsiveContainer width="100%" height="100%">
          <LineChart data={overview} margin={{ ...MARGIN, top: 0 }} accessibilityLayer={false}>
            <XAxis dataKey="tMs" type="number" domain={[0, endUs / 1_000]} hide />
            <YAxis width={AXIS_WIDTH_PX} hide />
            <Line dataKey="value" stroke={axis} dot={false} strokeWidth={1} isAnimationActive={false} />
            <Brush
              dataKey="tMs"
              height={22}
              travellerWidth={8}
              startIndex={startIndex}
              endIndex={Math.max(startIndex, endIndex)}
              tickFormatter={(value) => formatAxisMs(Number(value))}
              stroke="#f59e0b"
              fill={dark ? '#0f172a' : '#fffbeb'}
              onChange={(range) => {
                const from = overview[range.startIndex ?? 0];
                const to = overview[range.endIndex ?? overview.length - 1];
                if (from && to && to.tMs > from.tMs) onWindowChange({ startUs: Math.round(from.tMs * 1_000), endUs: Math.round(to.tMs * 1_000) });
              }}
            />
          </LineChart>
        </ResponsiveContainer>
      </div>
    </div>
  );
}
