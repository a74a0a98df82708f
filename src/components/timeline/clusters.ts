/**
 * Folding marks that would sit on top of each other: items closer than `minGapPx` on the screen
 * become one cluster (drawn once, with its count), so a window with thousands of findings or
 * messages draws at most one mark per few pixels, and the marks spread out again on zoom.
 */
import type { TimeWindow } from './time-window.ts';

export type Cluster = {
  /** Time of the first item (µs). */
  startUs: number;
  /** Time of the last item (µs). */
  endUs: number;
  /** Index (into the caller's list) of the first item. */
  first: number;
  /** Number of items folded into this mark. */
  count: number;
};

/** Index of the first item at or after `tUs` in a list sorted by time. */
export function firstIndexAtOrAfter<T>(items: readonly T[], tUs: number, timeOf: (item: T) => number): number {
  let low = 0;
  let high = items.length;
  while (low < high) {
    const mid = (low + high) >>> 1;
    if (timeOf(items[mid]!) < tUs) low = mid + 1;
    else high = mid;
  }
  return low;
}

/**
 * The items of `indices` (in time order) that lie in the window, folded into clusters: an item
 * joins the open cluster while it is within `minGapPx` of the cluster's first item.
 */
export function clusterInWindow<T>(items: readonly T[], indices: Iterable<number>, timeOf: (item: T) => number, window: TimeWindow, widthPx: number, minGapPx: number): Cluster[] {
  const spanUs = Math.max(1, window.endUs - window.startUs);
  const gapUs = widthPx > 0 ? (minGapPx / widthPx) * spanUs : spanUs;
  const out: Cluster[] = [];
  let open: Cluster | undefined;
  for (const index of indices) {
    const tUs = timeOf(items[index]!);
    if (tUs < window.startUs || tUs > window.endUs) continue;
    if (open && tUs - open.startUs < gapUs) {
      open.count++;
      open.endUs = tUs;
      continue;
    }
    open = { startUs: tUs, endUs: tUs, first: index, count: 1 };
    out.push(open);
  }
  return out;
}

/** Indices `from` … `to - 1`, without building an array. */
export function* indexRange(from: number, to: number): Generator<number> {
  for (let index = from; index < to; index++) yield index;
}

/** Merges spans shorter than a pixel into their neighbours' draw: one entry per pixel column at most. */
export function visibleSpans<T extends { startUs: number; endUs?: number }>(
  spans: readonly T[],
  window: TimeWindow,
  widthPx: number,
  endOfTraceUs: number,
  minWidthPx = 2,
): { span: T; count: number }[] {
  const spanUs = Math.max(1, window.endUs - window.startUs);
  const minUs = widthPx > 0 ? (minWidthPx / widthPx) * spanUs : 0;
  const out: { span: T; count: number; endUs: number }[] = [];
  for (const span of spans) {
    const endUs = span.endUs ?? endOfTraceUs;
    if (endUs < window.startUs || span.startUs > window.endUs) continue;
    const last = out[out.length - 1];
    if (last && span.startUs - last.span.startUs < minUs) {
      last.count++;
      last.endUs = endUs;
      continue;
    }
    out.push({ span, count: 1, endUs });
  }
  return out.map(({ span, count }) => ({ span, count }));
}
