import { describe, expect, it } from 'vitest';
import { firstAtOrAfter, windowAround, windowSeries, windowSteps, zoomWindow, type Measurement } from './trace-series.ts';

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

describe('held readings', () => {
  it('keeps each reading as a step and breaks where the log has a gap', () => {
    const readings: Measurement[] = [
      { t: 0, mv: 5_000 },
      { t: 100_000, mv: 9_000 },
      { t: 200_000, mv: 9_000 },
      { t: 300_000, mv: 9_000 },
      // Five seconds without a reading: a gap, not a held 9 V.
      { t: 5_300_000, mv: 5_000 },
      { t: 5_400_000, mv: 5_000 },
    ];
    const series = windowSteps(readings, { startUs: 0, endUs: 6_000_000 });
    expect(series.readings).toBe(6);
    expect(series.vbusV.map((p) => p.value)).toEqual([5, 9, 9, 9, null, 5, 5]);
    expect(series.vbusV[4]!.tMs).toBe(2_800);
  });

  it('takes one reading either side, so a held value reaches into a narrow window', () => {
    const readings: Measurement[] = [
      { t: 20_845_055, mv: 9_030 },
      { t: 21_130_000, mv: 9_000 },
      { t: 21_150_000, mv: 8_640 },
    ];
    const series = windowSteps(readings, { startUs: 21_060_000, endUs: 21_140_000 });
    expect(series.readings).toBe(1);
    expect(series.vbusV.map((p) => p.value)).toEqual([9.03, 9, 8.64]);
  });
});
