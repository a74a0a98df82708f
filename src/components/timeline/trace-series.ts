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

export type StepPoint = { tMs: number; value: number | null };
export type StepSeries = { vbusV: StepPoint[]; ibusA: StepPoint[]; readings: number };

/**
 * A stretch without readings longer than this many times the window's median spacing is a gap in
 * the log, drawn as a break rather than a held value (our own choice: a logger that samples
 * every 250 ms and then says nothing for 3 s has lost the signal, not seen a flat line).
 */
export const GAP_FACTOR = 10;

function medianSpacingUs(times: readonly number[]): number {
  if (times.length < 2) return Infinity;
  const step = Math.max(1, Math.floor((times.length - 1) / 512));
  const spacings: number[] = [];
  for (let index = step; index < times.length; index += step) spacings.push(times[index]! - times[index - step]!);
  spacings.sort((a, b) => a - b);
  return Math.max(1, spacings[spacings.length >> 1]! / step);
}

/** Thins each run between gaps on its own and joins them with a break (a null point). */
function stepsWithGaps(points: SeriesPoint[], maxPoints: number): StepPoint[] {
  if (points.length === 0) return [];
  const gapMs = (medianSpacingUs(points.map((p) => p.tMs * 1_000)) * GAP_FACTOR) / 1_000;
  const runs: SeriesPoint[][] = [[]];
  for (let index = 0; index < points.length; index++) {
    const p = points[index]!;
    const before = points[index - 1];
    if (before && p.tMs - before.tMs > gapMs) runs.push([]);
    runs[runs.length - 1]!.push(p);
  }
  const out: StepPoint[] = [];
  for (const run of runs) {
    if (out.length > 0) out.push({ tMs: (out[out.length - 1]!.tMs + run[0]!.tMs) / 2, value: null });
    out.push(...thin(run, Math.max(2, Math.round((maxPoints * run.length) / points.length))));
  }
  return out;
}

/**
 * The window's readings as held values: each reading holds until the next one (the chart draws
 * steps, so nothing is drawn that was never measured), a break where the log has a gap, and
 * nothing before the first or after the last reading. One reading either side of the window so
 * the held value reaches its edges; `readings` is how many fall inside it.
 */
export function windowSteps(measurements: readonly Measurement[], window: TimeWindow, maxPoints = 800): StepSeries {
  const inside = firstAtOrAfter(measurements, window.startUs);
  const after = firstAtOrAfter(measurements, window.endUs + 1);
  const from = Math.max(0, inside - 1);
  const to = Math.min(measurements.length, after + 1);
  const vbusV: SeriesPoint[] = [];
  const ibusA: SeriesPoint[] = [];
  for (let index = from; index < to; index++) {
    const m = measurements[index]!;
    vbusV.push({ tMs: m.t / 1_000, value: m.mv / 1_000 });
    if (m.ma !== undefined) ibusA.push({ tMs: m.t / 1_000, value: m.ma / 1_000 });
  }
  return { vbusV: stepsWithGaps(vbusV, maxPoints), ibusA: stepsWithGaps(ibusA, maxPoints), readings: after - inside };
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
