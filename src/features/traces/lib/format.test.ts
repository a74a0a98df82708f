import { describe, expect, it } from 'vitest';
import { contractLabel, formatBytes, formatPower, formatSeconds } from './format.ts';

describe('trace formatting', () => {
  it('formats sizes, times, contracts and power', () => {
    expect(formatBytes(512)).toBe('512 B');
    expect(formatBytes(1536)).toBe('1.5 KB');
    expect(formatBytes(52_428_800)).toBe('50.0 MB');
    expect(formatSeconds(215_000)).toBe('0.215 s');
    expect(formatSeconds(21_100_000)).toBe('21.1 s');
    expect(formatSeconds(0)).toBe('0 s');
    expect(contractLabel({ kind: 'fixed', voltageMv: 20_000, currentMa: 3_250 })).toBe('20 V 3.25 A');
    expect(contractLabel({ kind: 'pps', voltageMv: 9_000, currentMa: 2_000 })).toBe('PPS 9 V 2 A');
    expect(formatPower(65_000)).toBe('65 W');
  });
});
