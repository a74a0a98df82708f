import { describe, expect, it } from 'vitest';
import { fittedZeroBasedTicks, niceStepAtLeast, timeTicksMs, zeroBasedTicks } from './chart-ticks.ts';

// Nice steps of 1, 2, 2.5 and 5 × 10ⁿ: common practice for chart axes.
describe('niceStepAtLeast', () => {
  it('rounds up to 1, 2, 2.5 or 5 times a power of ten', () => {
    expect(niceStepAtLeast(0.7)).toBe(1);
    expect(niceStepAtLeast(1)).toBe(1);
    expect(niceStepAtLeast(1.2)).toBe(2);
    expect(niceStepAtLeast(2.2)).toBe(2.5);
    expect(niceStepAtLeast(3)).toBe(5);
    expect(niceStepAtLeast(6)).toBe(10);
    expect(niceStepAtLeast(4_100)).toBe(5_000);
    expect(niceStepAtLeast(0.3 / 3)).toBeCloseTo(0.1, 12);
  });

  it('falls back to 1 for nothing to divide', () => {
    expect(niceStepAtLeast(0)).toBe(1);
    expect(niceStepAtLeast(Number.NaN)).toBe(1);
  });
});

describe('zeroBasedTicks', () => {
  it('covers 20 V in four steps of 5 V', () => {
    expect(zeroBasedTicks(20.1 - 0.1)).toEqual({ max: 20, ticks: [0, 5, 10, 15, 20] });
    expect(zeroBasedTicks(20.5)).toEqual({ max: 40, ticks: [0, 10, 20, 30, 40] });
    expect(zeroBasedTicks(15.2)).toEqual({ max: 20, ticks: [0, 5, 10, 15, 20] });
  });

  it('prints decimal steps without float noise and keeps the interval count', () => {
    expect(zeroBasedTicks(3.25)).toEqual({ max: 4, ticks: [0, 1, 2, 3, 4] });
    expect(zeroBasedTicks(0.3, 3)).toEqual({ max: 0.3, ticks: [0, 0.1, 0.2, 0.3] });
    expect(zeroBasedTicks(0)).toEqual({ max: 1, ticks: [0, 0.25, 0.5, 0.75, 1] });
  });
});

describe('timeTicksMs', () => {
  it('puts about one tick per 110 px at nice times inside the window', () => {
    // 20 s over 1,100 px: ten ticks wanted, a 2 s step.
    expect(timeTicksMs(0, 20_000, 1_100)).toEqual([0, 2_000, 4_000, 6_000, 8_000, 10_000, 12_000, 14_000, 16_000, 18_000, 20_000]);
    expect(timeTicksMs(12.3, 13.1, 440)).toEqual([12.4, 12.6, 12.8, 13]);
    expect(timeTicksMs(0.01, 0.04, 220)).toEqual([0.02, 0.04]);
  });

  it('keeps at least two and at most twelve ticks', () => {
    expect(timeTicksMs(0, 10, 50).length).toBeGreaterThanOrEqual(2);
    expect(timeTicksMs(0, 1_000, 10_000).length).toBeLessThanOrEqual(13);
    expect(timeTicksMs(5, 5, 800)).toEqual([5]);
  });
});

describe('fittedZeroBasedTicks', () => {
  it('picks 4, 5 or 6 steps, whichever spares the least room', () => {
    expect(fittedZeroBasedTicks(21)).toEqual({ max: 25, ticks: [0, 5, 10, 15, 20, 25] });
    expect(fittedZeroBasedTicks(15.75)).toEqual({ max: 20, ticks: [0, 5, 10, 15, 20] });
    expect(fittedZeroBasedTicks(5.25)).toEqual({ max: 6, ticks: [0, 1, 2, 3, 4, 5, 6] });
  });
});
