/**
 * Screen geometry of the chart's lines, drawn as plain SVG: a held-value line (each reading holds
 * until the next one, a null point breaks the line at a gap in the log), the marks of the readings,
 * and the value held at a given time for the pointer's read-out. Pure functions of points and
 * scales, so the chart costs a few string joins per draw.
 */
import type { StepPoint } from './trace-series.ts';

export type PlotArea = { x: number; y: number; width: number; height: number };

/** A linear map from `domain` onto `range` (a zero-width domain maps everything to the range's start). */
export function linearScale(domain: readonly [number, number], range: readonly [number, number]): (value: number) => number {
  const [fromValue, toValue] = domain;
  const [fromPx, toPx] = range;
  const pxPerUnit = toValue === fromValue ? 0 : (toPx - fromPx) / (toValue - fromValue);
  return (value) => fromPx + (value - fromValue) * pxPerUnit;
}

const clamp = (value: number, low: number, high: number) => Math.min(Math.max(value, low), high);
/** Hundredths of a pixel: finer than any screen, and short in the markup. */
const px = (value: number) => Math.round(value * 100) / 100;

/**
 * The `d` of a held-value line through `points` (time in ms, value or null), clamped to the plot:
 * from each reading a horizontal run to the next reading's time, then a vertical step to its value
 * (every segment horizontal or vertical, so nothing is drawn between readings that was never
 * measured). A null point ends the line at the reading before it; the next reading starts a new
 * one. Clamping to the plot keeps the shape, since a clamped run stays horizontal.
 */
export function stepPath(points: readonly StepPoint[], xOf: (tMs: number) => number, yOf: (value: number) => number, plot: PlotArea): string {
  const right = plot.x + plot.width;
  const bottom = plot.y + plot.height;
  const parts: string[] = [];
  let previousY: number | null = null;
  for (const point of points) {
    if (point.value === null) {
      previousY = null;
      continue;
    }
    const x = px(clamp(xOf(point.tMs), plot.x, right));
    const y = px(clamp(yOf(point.value), plot.y, bottom));
    if (previousY === null) parts.push(`M${x} ${y}`);
    else parts.push(`L${x} ${previousY}L${x} ${y}`);
    previousY = y;
  }
  return parts.join('');
}

/** Where each reading inside the plot is marked (points outside it, which only carry a value in, are left out). */
export function readingMarks(points: readonly StepPoint[], xOf: (tMs: number) => number, yOf: (value: number) => number, plot: PlotArea): { x: number; y: number }[] {
  const out: { x: number; y: number }[] = [];
  for (const point of points) {
    if (point.value === null) continue;
    const x = xOf(point.tMs);
    if (x < plot.x - 0.5 || x > plot.x + plot.width + 0.5) continue;
    out.push({ x: px(x), y: px(clamp(yOf(point.value), plot.y, plot.y + plot.height)) });
  }
  return out;
}

/**
 * The value the line shows at `tMs`: the last reading at or before it, held; null before the first
 * reading, in a gap, or after the last reading (where no line is drawn).
 */
export function heldValueAt(points: readonly StepPoint[], tMs: number): number | null {
  let low = 0;
  let high = points.length;
  while (low < high) {
    const mid = (low + high) >>> 1;
    if (points[mid]!.tMs <= tMs) low = mid + 1;
    else high = mid;
  }
  const at = points[low - 1];
  if (!at || low === points.length) return at && at.tMs === tMs ? at.value : null;
  return at.value;
}
