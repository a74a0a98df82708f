import { describe, expect, it } from 'vitest';
import { inferPdpW } from './infer-pdp.ts';
import { eprAvsApdo, fixedPdo as fixed, paddingPdo, ppsApdo as pps } from './pdo-builders.ts';

describe('inferPdpW', () => {
  it('takes the strongest fixed offer in whole watts', () => {
    expect(inferPdpW([fixed(5_000, 3_000), fixed(9_000, 3_000), fixed(15_000, 3_000), fixed(20_000, 3_250)])).toBe(65);
    // 20 W at 9 V is written as 2.22 A (10 mA steps, USB PD R3.1 V1.8 Table 6-9, from memory): 19.98 W → 20 W.
    expect(inferPdpW([fixed(5_000, 3_000), fixed(9_000, 2_220)])).toBe(20);
  });
  // 7.5 W: a 7 W PDP shows as 1.40 A at 5 V, an 8 W one would need 1.60 A (§10.2.1 Power Rules).
  it('never rounds up past what the offer can stand for', () => {
    expect(inferPdpW([fixed(5_000, 1_500)])).toBe(7);
    expect(inferPdpW([fixed(5_000, 3_000), fixed(20_000, 5_000)])).toBe(100);
  });
  it('ignores PPS and padding, and takes an EPR AVS PDP', () => {
    expect(inferPdpW([fixed(5_000, 3_000), pps(3_300, 21_000, 5_000), paddingPdo()])).toBe(15);
    expect(inferPdpW([fixed(5_000, 3_000), fixed(20_000, 5_000), eprAvsApdo(15_000, 28_000, 140)])).toBe(140);
  });
});
