/**
 * The chart's axis ticks and domains, computed from the numbers alone (no label is measured in the
 * DOM). Steps are "nice" numbers (1, 2, 2.5, 5 × 10ⁿ).
 */

const NICE_FACTORS = [1, 2, 2.5, 5, 10] as const;

/** The smallest nice step (1, 2, 2.5 or 5 × 10ⁿ) that is at least `rawStep` (> 0). */
export function niceStepAtLeast(rawStep: number): number {
  if (!(rawStep > 0) || !Number.isFinite(rawStep)) return 1;
  const power = 10 ** Math.floor(Math.log10(rawStep));
  // The tiny slack keeps an exact nice value (e.g. 0.3 / 3 = 0.09999…) from jumping a step.
  const factor = NICE_FACTORS.find((f) => f * power >= rawStep * (1 - 1e-9)) ?? 10;
  return factor * power;
}

/** Multiples of `step` rounded to the step's decimals, so 0.1 × 3 prints as 0.3. */
function roundToStep(value: number, step: number): number {
  const decimals = Math.max(0, Math.min(12, -Math.floor(Math.log10(step)) + 2));
  return Number(value.toFixed(decimals));
}

export type ValueTicks = { max: number; ticks: number[] };

/**
 * Ticks from 0 up to at least `maxValue` in exactly `intervals` nice steps. Both value axes of a
 * chart use the same number of intervals, so the right axis' ticks sit on the left axis' grid.
 */
export function zeroBasedTicks(maxValue: number, intervals = 4): ValueTicks {
  const count = Math.max(1, Math.round(intervals));
  const step = niceStepAtLeast(maxValue > 0 ? maxValue / count : 1 / count);
  const ticks = Array.from({ length: count + 1 }, (_, index) => roundToStep(index * step, step));
  return { max: ticks[count]!, ticks };
}

/** The fewest decimals (0–9) that print every multiple of `step` exactly: 0.25 → 2, 20 → 0. */
export function decimalsOfStep(step: number): number {
  for (let decimals = 0; decimals < 9; decimals++) {
    const scaled = step * 10 ** decimals;
    if (Math.abs(scaled - Math.round(scaled)) < 1e-6 * scaled) return decimals;
  }
  return 9;
}

/** Traces and simulations count time in whole microseconds: no tick between two (1 µs, not 0.5; 5 µs, not 2.5). */
function wholeMicroseconds(stepMs: number): number {
  const stepUs = stepMs * 1_000;
  if (stepUs >= 10 || Math.abs(stepUs - Math.round(stepUs)) < 1e-9) return stepMs;
  return stepUs < 1 ? 0.001 : 0.005;
}

/** A time axis: its ticks (ms) and the label of a tick, one unit and one precision for the whole axis. */
export type TimeAxis = { ticks: number[]; stepMs: number; label(ms: number): string };

/**
 * Ticks at nice multiples inside [startMs, endMs], about one per `spacingPx` of `widthPx`, and
 * labels whose unit follows the window (seconds once it reaches 1 s) and whose decimals follow the
 * step, so neighbouring ticks never print alike (21.12 s, 21.14 s rather than 21.1 s twice).
 */
export function timeAxisMs(startMs: number, endMs: number, widthPx: number, spacingPx = 110): TimeAxis {
  const span = endMs - startMs;
  if (!(span > 0) || !Number.isFinite(span)) return { ticks: [startMs], stepMs: 0, label: timeLabeller(startMs, endMs, 1) };
  const target = Math.min(12, Math.max(2, Math.floor(widthPx / spacingPx)));
  const stepMs = wholeMicroseconds(niceStepAtLeast(span / target));
  const ticks: number[] = [];
  for (let index = Math.ceil(startMs / stepMs - 1e-9); index * stepMs <= endMs + stepMs * 1e-9; index++) {
    ticks.push(roundToStep(index * stepMs, stepMs));
    if (ticks.length > 64) break;
  }
  return { ticks, stepMs, label: timeLabeller(startMs, endMs, stepMs) };
}

/** Ticks alone (see `timeAxisMs`). */
export const timeTicksMs = (startMs: number, endMs: number, widthPx: number, spacingPx = 110): number[] => timeAxisMs(startMs, endMs, widthPx, spacingPx).ticks;

function timeLabeller(startMs: number, endMs: number, stepMs: number): (ms: number) => string {
  const seconds = Math.max(Math.abs(startMs), Math.abs(endMs)) >= 1_000;
  const decimals = decimalsOfStep(seconds ? stepMs / 1_000 : stepMs);
  return seconds ? (ms) => `${(ms / 1_000).toFixed(decimals)} s` : (ms) => `${ms.toFixed(decimals)} ms`;
}

/** A reading's time to the microsecond (the traces' resolution), trailing zeros past the ms dropped. */
export function formatExactMs(ms: number): string {
  if (Math.abs(ms) < 1_000) return `${Number(ms.toFixed(3))} ms`;
  const text = (ms / 1_000).toFixed(6).replace(/(\.\d{3}\d*?)0+$/, '$1');
  return `${text} s`;
}

/**
 * Zero-based ticks in 4, 5 or 6 nice steps, whichever reaches `maxValue` with the least room to
 * spare (20.5 V: 0–25 in steps of 5 rather than 0–40 in steps of 10).
 */
export function fittedZeroBasedTicks(maxValue: number): ValueTicks {
  let best = zeroBasedTicks(maxValue, 4);
  for (const intervals of [5, 6]) {
    const candidate = zeroBasedTicks(maxValue, intervals);
    if (candidate.max < best.max - 1e-12) best = candidate;
  }
  return best;
}
