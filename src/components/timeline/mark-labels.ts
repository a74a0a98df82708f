/**
 * Where the chart writes the names of its marks (findings, events) so no two overlap and none runs
 * past the plot: each label, in time order, takes the first row where it clears the previous label
 * of that row; beside its mark on the right, or on the left near the right edge. A label with no
 * room is left out: its mark stays, and the lanes under the chart name it in their tooltips.
 */

export type MarkLabel = { xPx: number; text: string };
export type PlacedLabel = { row: number; anchor: 'start' | 'end'; xPx: number };

/** About the average advance of a character at 10 px in the UI's sans face (common practice: 0.55 em). */
export const LABEL_PX_PER_CHAR_10PX = 5.6;
/** Between a mark and its label, and between two labels of a row. */
const GAP_PX = 4;

export function placeMarkLabels(marks: readonly MarkLabel[], leftPx: number, rightPx: number, rows: number, pxPerChar = LABEL_PX_PER_CHAR_10PX): (PlacedLabel | null)[] {
  const rowEnds = new Array<number>(Math.max(0, rows)).fill(Number.NEGATIVE_INFINITY);
  return marks.map(({ xPx, text }) => {
    const widthPx = text.length * pxPerChar;
    const onRight = xPx + GAP_PX + widthPx <= rightPx;
    const fromPx = onRight ? xPx + GAP_PX : xPx - GAP_PX - widthPx;
    if (fromPx < leftPx) return null;
    const row = rowEnds.findIndex((end) => fromPx >= end + GAP_PX);
    if (row === -1) return null;
    rowEnds[row] = fromPx + widthPx;
    return { row, anchor: onRight ? 'start' : 'end', xPx: onRight ? xPx + GAP_PX : xPx - GAP_PX };
  });
}
