/**
 * Placing things on a shared time axis: a visible window in µs and the horizontal insets that line
 * the lanes up with the chart's plot area. Used by the Bench-only lanes (state-lanes, timer-spans).
 */
export type TimeWindow = { startUs: number; endUs: number };

/** Fraction 0…1 of the window at `tUs` (clamped). */
export function positionIn(window: TimeWindow, tUs: number): number {
  const span = Math.max(1, window.endUs - window.startUs);
  return Math.min(1, Math.max(0, (tUs - window.startUs) / span));
}

/** A segment's left and width as CSS percentages, or null when it is outside the window. */
export function segmentStyle(window: TimeWindow, fromUs: number, toUs: number): { left: string; width: string } | null {
  if (toUs < window.startUs || fromUs > window.endUs) return null;
  const left = positionIn(window, fromUs);
  const right = positionIn(window, toUs);
  return { left: `${(left * 100).toFixed(3)}%`, width: `${(Math.max(0, right - left) * 100).toFixed(3)}%` };
}

/** Greedy packing of spans into rows so none overlap; returns each span's row. */
export function packRows(spans: readonly { startUs: number; endUs: number }[]): { rows: number[]; rowCount: number } {
  const order = spans.map((_, index) => index).sort((a, b) => spans[a]!.startUs - spans[b]!.startUs);
  const rowEnds: number[] = [];
  const rows = new Array<number>(spans.length).fill(0);
  for (const index of order) {
    const span = spans[index]!;
    let row = rowEnds.findIndex((end) => end <= span.startUs);
    if (row === -1) row = rowEnds.push(span.endUs) - 1;
    else rowEnds[row] = span.endUs;
    rows[index] = row;
  }
  return { rows, rowCount: rowEnds.length };
}

export function formatTimeUs(tUs: number): string {
  if (Math.abs(tUs) >= 1_000_000) return `${(tUs / 1_000_000).toFixed(3)} s`;
  if (Math.abs(tUs) >= 1_000) return `${(tUs / 1_000).toFixed(2)} ms`;
  return `${tUs} µs`;
}
