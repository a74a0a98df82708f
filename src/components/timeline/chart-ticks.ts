/**
 * Axis ticks computed by us rather than by the chart library: with a fixed list of ticks (and
 * `interval={0}`) recharts neither measures each label in the DOM to thin them out nor guesses a
 * domain, which was a large share of every draw. Steps are "nice" numbers (1, 2, 2.5, 5 × 10ⁿ).
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

/** Ticks at nice multiples inside [startMs, endMs], about one per `spacingPx` of `widthPx`. */
export function timeTicksMs(startMs: number, endMs: number, widthPx: number, spacingPx = 110): number[] {
  const span = endMs - startMs;
  if (!(span > 0) || !Number.isFinite(span)) return [startMs];
  const target = Math.min(12, Math.max(2, Math.floor(widthPx / spacingPx)));
  const step = niceStepAtLeast(span / target);
  const ticks: number[] = [];
  for (let index = Math.ceil(startMs / step - 1e-9); index * step <= endMs + step * 1e-9; index++) {
    ticks.push(roundToStep(index * step, step));
    if (ticks.length > 64) break;
  }
  return ticks;
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
