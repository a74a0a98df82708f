/**
 * Chart-ready series from a trace's measurements: the points inside the visible window, thinned
 * with LTTB (the `downsample` package) so a trace with a million VBUS readings draws as fast as one
 * with a hundred. Voltage and current are thinned on their own so a current spike survives where
 * the voltage is flat. Times go in µs, out in ms (the chart's axis unit).
 */
import { createLTTB } from 'downsample';
import type { TimeWindow } from './time-window.ts';

export type Measurement = { t: number; mv: number; ma?: number };
export type SeriesPoint = { tMs: number; value: number };
export type VbusSeries = { vbusV: SeriesPoint[]; ibusA: SeriesPoint[] };

const lttb = createLTTB<SeriesPoint>({ x: 'tMs', y: 'value' });

/** Index of the first measurement at or after `tUs` (measurements are in time order). */
export function firstAtOrAfter(measurements: readonly Measurement[], tUs: number): number {
  let low = 0;
  let high = measurements.length;
  while (low < high) {
    const mid = (low + high) >>> 1;
    if (measurements[mid]!.t < tUs) low = mid + 1;
    else high = mid;
  }
  return low;
}

export function thin(points: SeriesPoint[], maxPoints: number): SeriesPoint[] {
  return points.length > maxPoints ? (lttb(points, maxPoints) as SeriesPoint[]) : points;
}

/** The window's VBUS (V) and IBUS (A), one point either side so lines reach the edges. */
export function windowSeries(measurements: readonly Measurement[], window: TimeWindow, maxPoints = 800): VbusSeries {
  const from = Math.max(0, firstAtOrAfter(measurements, window.startUs) - 1);
  const to = Math.min(measurements.length, firstAtOrAfter(measurements, window.endUs + 1) + 1);
  const vbusV: SeriesPoint[] = [];
  const ibusA: SeriesPoint[] = [];
  for (let index = from; index < to; index++) {
    const m = measurements[index]!;
    vbusV.push({ tMs: m.t / 1_000, value: m.mv / 1_000 });
    if (m.ma !== undefined) ibusA.push({ tMs: m.t / 1_000, value: m.ma / 1_000 });
  }
  return { vbusV: thin(vbusV, maxPoints), ibusA: thin(ibusA, maxPoints) };
}

/** A zoom window of `spanUs` centred on `tUs`, kept inside [0, endUs]. */
export function windowAround(tUs: number, spanUs: number, endUs: number): TimeWindow {
  const span = Math.min(Math.max(1, spanUs), Math.max(1, endUs));
  const startUs = Math.min(Math.max(0, tUs - span / 2), Math.max(0, endUs - span));
  return { startUs: Math.round(startUs), endUs: Math.round(startUs + span) };
}

/** The window `factor` times as wide (below 1: narrower), around its centre. */
export function zoomWindow(window: TimeWindow, factor: number, endUs: number): TimeWindow {
  const centre = (window.startUs + window.endUs) / 2;
  return windowAround(centre, (window.endUs - window.startUs) * factor, endUs);
}
