import { describe, expect, it } from 'vitest';
import { firstAtOrAfter, windowAround, windowSeries, zoomWindow, type Measurement } from './trace-series.ts';

const ramp: Measurement[] = Array.from({ length: 100_000 }, (_, i) => ({ t: i * 100, mv: 5_000 + (i % 1_000), ma: i === 50_000 ? 9_000 : 1_000 }));

describe('trace series', () => {
  it('finds the first measurement at or after a time', () => {
    expect(firstAtOrAfter(ramp, 0)).toBe(0);
    expect(firstAtOrAfter(ramp, 150)).toBe(2);
    expect(firstAtOrAfter(ramp, 99_999_999)).toBe(ramp.length);
  });

  it('thins a long window to the point budget and keeps a lone current spike (LTTB keeps extremes)', () => {
    const series = windowSeries(ramp, { startUs: 0, endUs: 10_000_000 }, 500);
    expect(series.vbusV.length).toBe(500);
    expect(series.ibusA.length).toBe(500);
    expect(Math.max(...series.ibusA.map((p) => p.value))).toBe(9);
    expect(series.vbusV[0]).toEqual({ tMs: 0, value: 5 });
  });

  it('keeps every point of a short window, plus one either side', () => {
    const series = windowSeries(ramp, { startUs: 1_000, endUs: 2_000 });
    expect(series.vbusV.map((p) => p.tMs)).toEqual(Array.from({ length: 13 }, (_, i) => 0.9 + i * 0.1).map((v) => Number(v.toFixed(1))));
  });

  it('zooms around a time inside the trace', () => {
    expect(windowAround(10, 1_000, 100_000)).toEqual({ startUs: 0, endUs: 1_000 });
    expect(windowAround(99_990, 1_000, 100_000)).toEqual({ startUs: 99_000, endUs: 100_000 });
    expect(zoomWindow({ startUs: 40_000, endUs: 60_000 }, 0.5, 100_000)).toEqual({ startUs: 45_000, endUs: 55_000 });
    expect(zoomWindow({ startUs: 40_000, endUs: 60_000 }, 100, 100_000)).toEqual({ startUs: 0, endUs: 100_000 });
  });
});
