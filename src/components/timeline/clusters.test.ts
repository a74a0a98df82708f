import { describe, expect, it } from 'vitest';
import { clusterInWindow, firstIndexAtOrAfter, indexRange, visibleSpans } from './clusters.ts';

const at = (times: number[]) => times.map((t) => ({ t }));
const tOf = (item: { t: number }) => item.t;

describe('clusters', () => {
  it('folds items closer than the pixel gap and keeps distant ones apart', () => {
    // 1000 px over 1 ms: 4 px = 4 µs.
    const items = at([0, 1, 3, 10, 11, 500, 999]);
    const clusters = clusterInWindow(items, indexRange(0, items.length), tOf, { startUs: 0, endUs: 1_000 }, 1_000, 4);
    expect(clusters).toEqual([
      { startUs: 0, endUs: 3, first: 0, count: 3 },
      { startUs: 10, endUs: 11, first: 3, count: 2 },
      { startUs: 500, endUs: 500, first: 5, count: 1 },
      { startUs: 999, endUs: 999, first: 6, count: 1 },
    ]);
  });

  it('draws at most one mark per gap: 10,000 findings on 1,000 px give at most 250 marks', () => {
    const items = at(Array.from({ length: 10_000 }, (_, i) => i * 100));
    const clusters = clusterInWindow(items, indexRange(0, items.length), tOf, { startUs: 0, endUs: 1_000_000 }, 1_000, 4);
    expect(clusters.length).toBeLessThanOrEqual(250);
    expect(clusters.reduce((sum, c) => sum + c.count, 0)).toBe(10_000);
  });

  it('leaves out items outside the window', () => {
    const items = at([0, 50, 100]);
    expect(clusterInWindow(items, indexRange(0, 3), tOf, { startUs: 40, endUs: 60 }, 100, 4).map((c) => c.first)).toEqual([1]);
  });

  it('finds the first item at or after a time', () => {
    const items = at([0, 10, 10, 20]);
    expect(firstIndexAtOrAfter(items, 10, tOf)).toBe(1);
    expect(firstIndexAtOrAfter(items, 21, tOf)).toBe(4);
  });

  it('merges contract spans narrower than two pixels', () => {
    const spans = Array.from({ length: 10_000 }, (_, i) => ({ startUs: i * 500_000, endUs: (i + 1) * 500_000 }));
    const drawn = visibleSpans(spans, { startUs: 0, endUs: 5_000_000_000 }, 1_000, 5_000_000_000);
    expect(drawn.length).toBeLessThanOrEqual(500);
    expect(drawn.reduce((sum, d) => sum + d.count, 0)).toBe(10_000);
    expect(visibleSpans(spans, { startUs: 0, endUs: 2_000_000 }, 1_000, 5_000_000_000).length).toBe(5);
  });
});
