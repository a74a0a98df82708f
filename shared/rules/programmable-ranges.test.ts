import { describe, expect, it } from 'vitest';
import { checkProgrammableRanges, isDefinedPpsRange } from './programmable-ranges.ts';
import { eprAvsApdo, fixedPdo as fixed, ppsApdo as pps } from './pdo-builders.ts';

describe('programmable ranges', () => {
  // USB PD R3.0 V2.0 / R3.1 V1.8 §10.2.3.2, SPR PPS voltage ranges table (from memory).
  it.each([
    [3_300, 5_900],
    [3_300, 11_000],
    [3_300, 16_000],
    [3_300, 21_000],
  ])('accepts the R3.0/R3.1 range %i–%i mV', (min, max) => {
    expect(isDefinedPpsRange(min, max)).toBe(true);
    expect(checkProgrammableRanges([fixed(5_000, 3_000), pps(min, max, 3_000)], 65)).toEqual([]);
  });
  // USB PD R3.2 V1.1 §10.2.3.2: minimum raised to 5 V (from memory).
  it.each([
    [5_000, 11_000],
    [5_000, 16_000],
    [5_000, 21_000],
  ])('accepts the R3.2 range %i–%i mV', (min, max) => {
    expect(checkProgrammableRanges([fixed(5_000, 3_000), pps(min, max, 3_000)], 65)).toEqual([]);
  });
  it.each([
    [3_300, 20_000],
    [5_000, 20_000],
    [3_000, 21_000],
    [3_300, 12_000],
    [5_000, 5_900],
  ])('caps.pps-range for %i–%i mV', (min, max) => {
    expect(checkProgrammableRanges([fixed(5_000, 3_000), pps(min, max, 3_000)], 65)).toMatchObject([{ rule: 'caps.pps-range', severity: 'warning', object: 2 }]);
  });
  // USB PD R3.1 V1.8 §10.2.3.3 and Table 10-3: EPR AVS 15 V up to 28/36/48 V by PDP band (from memory).
  it('caps.avs-range for an EPR AVS range other than the band defines', () => {
    expect(checkProgrammableRanges([eprAvsApdo(15_000, 28_000, 140)], 140, { epr: true })).toEqual([]);
    expect(checkProgrammableRanges([eprAvsApdo(15_000, 48_000, 240)], 240, { epr: true })).toEqual([]);
    expect(checkProgrammableRanges([eprAvsApdo(15_000, 36_000, 140)], 140, { epr: true })).toMatchObject([{ rule: 'caps.avs-range' }]);
    expect(checkProgrammableRanges([eprAvsApdo(20_000, 36_000, 180)], 180, { epr: true })).toMatchObject([{ rule: 'caps.avs-range' }]);
  });
});
