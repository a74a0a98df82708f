import { describe, expect, it } from 'vitest';
import { formatTimeUs, packRows, positionIn, segmentStyle } from './time-window.ts';

describe('time window', () => {
  const window = { startUs: 1_000, endUs: 3_000 };
  it('positions and clamps', () => {
    expect(positionIn(window, 2_000)).toBe(0.5);
    expect(positionIn(window, 0)).toBe(0);
    expect(positionIn(window, 9_000)).toBe(1);
    expect(segmentStyle(window, 1_500, 2_500)).toEqual({ left: '25.000%', width: '50.000%' });
    expect(segmentStyle(window, 0, 500)).toBeNull();
    expect(segmentStyle(window, 2_500, 9_000)).toEqual({ left: '75.000%', width: '25.000%' });
  });

  it('packs overlapping spans into rows', () => {
    const { rows, rowCount } = packRows([
      { startUs: 0, endUs: 10 },
      { startUs: 5, endUs: 15 },
      { startUs: 10, endUs: 20 },
      { startUs: 12, endUs: 13 },
    ]);
    expect(rows).toEqual([0, 1, 0, 2]);
    expect(rowCount).toBe(3);
  });

  it('formats times in the unit that reads best', () => {
    expect(formatTimeUs(950)).toBe('950 µs');
    expect(formatTimeUs(152_000)).toBe('152.00 ms');
    expect(formatTimeUs(2_500_000)).toBe('2.500 s');
  });
});
