import { describe, expect, it } from 'vitest';
import { heldValueAt, linearScale, readingMarks, stepPath } from './step-path.ts';
import type { StepPoint } from './trace-series.ts';

// A 100 px wide, 50 px high plot at (10, 5): 0–10 ms across, 0–10 V up.
const plot = { x: 10, y: 5, width: 100, height: 50 };
const xOf = linearScale([0, 10], [plot.x, plot.x + plot.width]);
const yOf = linearScale([0, 10], [plot.y + plot.height, plot.y]);

describe('step path', () => {
  it('maps a domain linearly onto a range, a zero-width domain onto its start', () => {
    expect(xOf(0)).toBe(10);
    expect(xOf(5)).toBe(60);
    expect(yOf(10)).toBe(5);
    expect(linearScale([3, 3], [0, 100])(7)).toBe(0);
  });

  it('holds each reading until the next (horizontal, then vertical) and never slants', () => {
    const points: StepPoint[] = [
      { tMs: 1, value: 5 },
      { tMs: 4, value: 9 },
      { tMs: 6, value: 2 },
    ];
    expect(stepPath(points, xOf, yOf, plot)).toBe('M20 30L50 30L50 10L70 10L70 45');
  });

  it('breaks the line at a gap: the line before ends at its last reading, the next starts anew', () => {
    const points: StepPoint[] = [
      { tMs: 1, value: 5 },
      { tMs: 2, value: 5 },
      { tMs: 5, value: null },
      { tMs: 8, value: 2 },
      { tMs: 9, value: 2 },
    ];
    expect(stepPath(points, xOf, yOf, plot)).toBe('M20 30L30 30L30 30M90 45L100 45L100 45');
  });

  it('clamps readings outside the window to the plot edges, keeping the runs horizontal', () => {
    const points: StepPoint[] = [
      { tMs: -50, value: 12 },
      { tMs: 5, value: -1 },
      { tMs: 40, value: 3 },
    ];
    // Above the top (12 V of 10) is drawn on the top edge, below zero on the bottom edge.
    expect(stepPath(points, xOf, yOf, plot)).toBe('M10 5L60 5L60 55L110 55L110 40');
  });

  it('marks the readings inside the plot only', () => {
    const points: StepPoint[] = [
      { tMs: -1, value: 5 },
      { tMs: 2, value: 5 },
      { tMs: 3, value: null },
      { tMs: 11, value: 5 },
    ];
    expect(readingMarks(points, xOf, yOf, plot)).toEqual([{ x: 30, y: 30 }]);
  });

  it('reads the held value at a time: none before the first reading, in a gap or after the last', () => {
    const points: StepPoint[] = [
      { tMs: 1, value: 5 },
      { tMs: 4, value: 9 },
      { tMs: 5, value: null },
      { tMs: 8, value: 2 },
    ];
    expect(heldValueAt(points, 0.5)).toBeNull();
    expect(heldValueAt(points, 1)).toBe(5);
    expect(heldValueAt(points, 3.99)).toBe(5);
    expect(heldValueAt(points, 4.5)).toBe(9);
    expect(heldValueAt(points, 6)).toBeNull();
    expect(heldValueAt(points, 8)).toBe(2);
    expect(heldValueAt(points, 8.5)).toBeNull();
    expect(heldValueAt([], 1)).toBeNull();
  });
});
