import { describe, expect, it } from 'vitest';
import { chartSeries, overviewSeries } from './chart-series.ts';

function packed(count: number, spikeAt: number) {
  const data = new Int32Array(count * 4);
  for (let index = 0; index < count; index += 1) {
    data.set([index * 1_000, 20_000, index === spikeAt ? 5_000 : 1_000, 19_800], index * 4);
  }
  return { data, count };
}

describe('chart series', () => {
  it('thins a long run to the point budget and keeps a one-sample current spike', () => {
    const samples = packed(100_000, 54_321);
    const series = chartSeries(samples, { startUs: 0, endUs: 100_000_000 }, 500);
    expect(series.vbusV.length).toBeLessThanOrEqual(500);
    expect(series.ibusA.length).toBeLessThanOrEqual(500);
    expect(Math.max(...series.ibusA.map((point) => point.value))).toBe(5);
    expect(series.vbusV[0]).toEqual({ tMs: 0, value: 20 });
  });

  it('shows a window with a sample either side', () => {
    const samples = packed(1_000, -1);
    const series = chartSeries(samples, { startUs: 10_000, endUs: 20_000 });
    expect(series.vbusV[0]?.tMs).toBe(9);
    expect(series.vbusV.at(-1)?.tMs).toBe(21);
    expect(series.sinkVbusV[0]?.value).toBe(19.8);
  });

  it('gives a coarse overview that ends at the last sample', () => {
    const overview = overviewSeries(packed(1_001, -1), 100);
    expect(overview.length).toBeLessThanOrEqual(102);
    expect(overview.at(-1)?.tMs).toBe(1_000);
    expect(overviewSeries({ data: new Int32Array(0), count: 0 })).toEqual([]);
  });
});
