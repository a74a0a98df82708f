import { describe, expect, it } from 'vitest';
import { amps, contractText, millis, seconds, volts } from './format.ts';

describe('format', () => {
  it('writes quantities without trailing zeros', () => {
    expect(volts(9_000)).toBe('9 V');
    expect(volts(8_400)).toBe('8.4 V');
    expect(amps(2_250)).toBe('2.25 A');
    expect(seconds(240_000)).toBe('0.24 s');
    expect(seconds(13_500_000)).toBe('13.5 s');
    expect(millis(41_230)).toBe('41.2 ms');
  });
  it('names a contract', () => {
    expect(contractText({ kind: 'fixed', objectPosition: 2, voltageMv: 9_000, currentMa: 2_000, powerMw: 18_000 })).toBe('9 V 2 A');
    expect(contractText({ kind: 'pps', objectPosition: 4, voltageMv: 8_400, currentMa: 2_500, powerMw: 21_000 })).toBe('PPS 8.4 V 2.5 A');
  });
});
