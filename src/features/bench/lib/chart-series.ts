/**
 * Chart-ready series from the packed samples: the window's samples, thinned with LTTB (the
 * `downsample` package) to a few hundred points per series so a chart of a ten-minute run draws
 * as fast as one of a second. Each series is thinned on its own, so a current spike survives even
 * where the voltage is flat.
 */
import { createLTTB } from 'downsample';
import { firstIndexAtOrAfter, SAMPLE_FIELDS, type PackedSamples } from './samples.ts';

export type ChartPoint = { tMs: number; value: number };
export type ChartSeries = { vbusV: ChartPoint[]; sinkVbusV: ChartPoint[]; ibusA: ChartPoint[] };

const lttb = createLTTB<ChartPoint>({ x: 'tMs', y: 'value' });

/** Before LTTB, very long windows are strided to this many points (LTTB is linear but not free). */
const PRE_STRIDE_LIMIT = 60_000;

function column(samples: PackedSamples, from: number, to: number, field: number, divisor: number, stride: number): ChartPoint[] {
  const points: ChartPoint[] = [];
  const { data } = samples;
  for (let index = from; index < to; index += stride) {
    const offset = index * SAMPLE_FIELDS;
    points.push({ tMs: (data[offset] ?? 0) / 1_000, value: (data[offset + field] ?? 0) / divisor });
  }
  return points;
}

export function chartSeries(samples: PackedSamples, window: { startUs: number; endUs: number }, maxPoints = 600): ChartSeries {
  // One sample either side, so lines reach the edges of the window.
  const from = Math.max(0, firstIndexAtOrAfter(samples, window.startUs) - 1);
  const to = Math.min(samples.count, firstIndexAtOrAfter(samples, window.endUs + 1) + 1);
  const stride = Math.max(1, Math.floor((to - from) / PRE_STRIDE_LIMIT));
  const thin = (points: ChartPoint[]) => (points.length > maxPoints ? (lttb(points, maxPoints) as ChartPoint[]) : points);
  return {
    vbusV: thin(column(samples, from, to, 1, 1_000, stride)),
    ibusA: thin(column(samples, from, to, 2, 1_000, stride)),
    sinkVbusV: thin(column(samples, from, to, 3, 1_000, stride)),
  };
}

/** A coarse whole-run series for the brush's overview. */
export function overviewSeries(samples: PackedSamples, points = 300): ChartPoint[] {
  if (samples.count === 0) return [];
  const stride = Math.max(1, Math.floor(samples.count / points));
  const series = column(samples, 0, samples.count, 1, 1_000, stride);
  const lastOffset = (samples.count - 1) * SAMPLE_FIELDS;
  const last = { tMs: (samples.data[lastOffset] ?? 0) / 1_000, value: (samples.data[lastOffset + 1] ?? 0) / 1_000 };
  if (series[series.length - 1]?.tMs !== last.tMs) series.push(last);
  return series;
}
