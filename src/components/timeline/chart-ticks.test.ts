import { describe, expect, it } from 'vitest';
import { decimalsOfStep, fittedZeroBasedTicks, formatExactMs, niceStepAtLeast, timeAxisMs, timeTicksMs, zeroBasedTicks } from './chart-ticks.ts';

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

describe('timeAxisMs labels', () => {
  const labels = (startMs: number, endMs: number, widthPx: number) => {
    const axis = timeAxisMs(startMs, endMs, widthPx);
    return axis.ticks.map(axis.label);
  };

  it('prints each tick of a narrow window at 21.1 s differently (was "21.1 s" five times)', () => {
    // 100 ms over 1,100 px: a 10 ms step needs two decimals of a second.
    expect(labels(21_100, 21_200, 1_100)).toEqual(['21.10 s', '21.11 s', '21.12 s', '21.13 s', '21.14 s', '21.15 s', '21.16 s', '21.17 s', '21.18 s', '21.19 s', '21.20 s']);
    // 2 ms over 440 px: a 0.5 ms step, four decimals.
    expect(labels(21_100, 21_102, 440)).toEqual(['21.1000 s', '21.1005 s', '21.1010 s', '21.1015 s', '21.1020 s']);
    // 10 µs over 800 px: a 2 µs step, to the microsecond.
    expect(labels(21_100, 21_100.01, 800)).toEqual(['21.100000 s', '21.100002 s', '21.100004 s', '21.100006 s', '21.100008 s', '21.100010 s']);
  });

  it('uses milliseconds below a second and seconds once the window reaches one', () => {
    expect(labels(12.3, 13.1, 440)).toEqual(['12.4 ms', '12.6 ms', '12.8 ms', '13.0 ms']);
    expect(labels(0, 400, 440)).toEqual(['0 ms', '100 ms', '200 ms', '300 ms', '400 ms']);
    expect(labels(900, 1_100, 440)).toEqual(['0.90 s', '0.95 s', '1.00 s', '1.05 s', '1.10 s']);
    expect(labels(0, 20_000, 1_100)).toEqual(['0 s', '2 s', '4 s', '6 s', '8 s', '10 s', '12 s', '14 s', '16 s', '18 s', '20 s']);
    // A 2.5 s step keeps one decimal on every tick, so the axis reads in one precision.
    expect(labels(0, 10_000, 440)).toEqual(['0.0 s', '2.5 s', '5.0 s', '7.5 s', '10.0 s']);
  });

  it('never prints two ticks alike, whatever the span and the offset', () => {
    for (const offsetMs of [0, 950, 21_100, 3_600_000]) {
      for (const spanMs of [0.005, 0.03, 0.7, 4, 55, 900, 12_000, 600_000]) {
        for (const widthPx of [300, 800, 1_300]) {
          const printed = labels(offsetMs, offsetMs + spanMs, widthPx);
          expect(new Set(printed).size, `${offsetMs} + ${spanMs} ms over ${widthPx} px: ${printed.join(', ')}`).toBe(printed.length);
          // Readable: at most 13 characters (about 80 px at 11 px) for ticks at least 100 px apart.
          for (const text of printed) expect(text.length).toBeLessThanOrEqual(13);
        }
      }
    }
  });

  it('counts the decimals a step needs', () => {
    expect(decimalsOfStep(20)).toBe(0);
    expect(decimalsOfStep(2.5)).toBe(1);
    expect(decimalsOfStep(0.25)).toBe(2);
    expect(decimalsOfStep(0.000_002)).toBe(6);
  });
});

describe('formatExactMs', () => {
  it('shows a reading to the microsecond', () => {
    expect(formatExactMs(21_100)).toBe('21.100 s');
    expect(formatExactMs(21_100.005)).toBe('21.100005 s');
    expect(formatExactMs(12.345)).toBe('12.345 ms');
  });
});

describe('fittedZeroBasedTicks', () => {
  it('picks 4, 5 or 6 steps, whichever spares the least room', () => {
    expect(fittedZeroBasedTicks(21)).toEqual({ max: 25, ticks: [0, 5, 10, 15, 20, 25] });
    expect(fittedZeroBasedTicks(15.75)).toEqual({ max: 20, ticks: [0, 5, 10, 15, 20] });
    expect(fittedZeroBasedTicks(5.25)).toEqual({ max: 6, ticks: [0, 1, 2, 3, 4, 5, 6] });
  });
});
