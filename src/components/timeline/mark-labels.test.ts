import { describe, expect, it } from 'vitest';
import { placeMarkLabels } from './mark-labels.ts';

// 10 px per character keeps the arithmetic readable.
const place = (marks: { xPx: number; text: string }[], rows = 2) => placeMarkLabels(marks, 0, 400, rows, 10);

describe('placeMarkLabels', () => {
  it('writes a label to the right of its mark, or to the left near the right edge', () => {
    expect(place([{ xPx: 100, text: 'Hard Reset' }])).toEqual([{ row: 0, anchor: 'start', xPx: 104 }]);
    expect(place([{ xPx: 350, text: 'Hard Reset' }])).toEqual([{ row: 0, anchor: 'end', xPx: 346 }]);
  });

  it('moves a label that would overlap the previous one to the next row, and leaves it out when no row has room', () => {
    const placed = place([
      { xPx: 10, text: 'Wrong CRC' },
      { xPx: 40, text: 'Message not acknowledged' },
      { xPx: 60, text: 'Hard Reset' },
      { xPx: 200, text: 'Soft_Reset' },
    ]);
    expect(placed.map((p) => p?.row ?? null)).toEqual([0, 1, null, 0]);
    // Drawn labels never overlap within a row.
    expect(placed[3]!.xPx).toBeGreaterThan(14 + 90);
  });

  it('never starts a label left of the plot', () => {
    expect(placeMarkLabels([{ xPx: 20, text: 'a label far too long for the plot' }], 0, 100, 2, 10)).toEqual([null]);
  });
});
