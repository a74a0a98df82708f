/**
 * A run's samples in the shape the shared timeline (src/components/timeline) draws: the chart's
 * VBUS/IBUS measurements. Its messages come from `laneMessagesOf` (timeline/lane-messages.ts).
 */
import type { Measurement } from '../../../components/timeline/trace-series.ts';
import { createLTTB } from 'downsample';
import type { TimeWindow } from '../../../components/timeline/time-window.ts';
import { readerOf, type PackedSamples, type SampleReader } from './samples.ts';

const byVoltage = createLTTB<Measurement>({ x: 't', y: 'mv' });
const byCurrent = createLTTB<Measurement>({ x: 't', y: (point) => point.ma ?? 0 });

function measurementsBetween(samples: SampleReader, from: number, to: number, field: 1 | 3, stride = 1): Measurement[] {
  const out: Measurement[] = [];
  const at = (index: number): Measurement => {
    const t = samples.timeOf(index);
    return field === 1 ? { t, mv: samples.valueOf(index, 1), ma: samples.valueOf(index, 2) } : { t, mv: samples.valueOf(index, 3) };
  };
  for (let index = from; index < to; index += stride) out.push(at(index));
  // A stride may step over the last sample; the line must still reach it.
  if (to > from && (to - 1 - from) % stride !== 0) out.push(at(to - 1));
  return out;
}

/** Before LTTB, very long windows are strided to this many points (LTTB is linear, not free). */
const PRE_STRIDE_LIMIT = 50_000;

/** LTTB on the voltage and, where there is one, on the current too; the points either kept, in time order. */
function thinned(samples: SampleReader, from: number, to: number, field: 1 | 3, maxPoints: number): Measurement[] {
  const stride = Math.max(1, Math.floor((to - from) / PRE_STRIDE_LIMIT));
  const points = measurementsBetween(samples, from, to, field, stride);
  if (points.length <= maxPoints) return points;
  const kept = new Set<Measurement>(byVoltage(points, maxPoints) as Measurement[]);
  if (field === 1) for (const point of byCurrent(points, maxPoints) as Measurement[]) kept.add(point);
  return points.filter((point) => kept.has(point));
}

function union(coarse: Measurement[], detail: Measurement[]): Measurement[] {
  const startUs = detail[0]?.t ?? Number.POSITIVE_INFINITY;
  const endUs = detail[detail.length - 1]?.t ?? Number.NEGATIVE_INFINITY;
  return [...coarse.filter((m) => m.t < startUs), ...detail, ...coarse.filter((m) => m.t > endUs)];
}

/**
 * What the chart needs for one window, and no more: the whole run coarsely (the overview and the
 * brush) joined with the window in detail, each thinned with LTTB (the `downsample` package) on voltage and
 * current alike, so a ten-minute run at 1 ms (600 000 samples) charts from about a thousand points.
 */
export function chartMeasurements(packed: PackedSamples, window: TimeWindow, detailPoints = 400, overviewPoints = 150): { source: Measurement[]; sink: Measurement[] } {
  if (packed.count === 0) return { source: [], sink: [] };
  // The samples by index, read from the simulator's steps without expanding them.
  const samples = readerOf(packed);
  // One sample either side of the window, so the lines reach its edges.
  const from = Math.max(0, samples.indexAtOrAfter(window.startUs) - 1);
  const to = Math.min(samples.count, samples.indexAtOrAfter(window.endUs + 1) + 1);
  const whole = from === 0 && to === samples.count;
  const series = (field: 1 | 3) => {
    const detail = thinned(samples, from, to, field, whole ? Math.max(detailPoints, overviewPoints) : detailPoints);
    return whole ? detail : union(thinned(samples, 0, samples.count, field, overviewPoints), detail);
  };
  return { source: series(1), sink: series(3) };
}
