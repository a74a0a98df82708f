import { describe, expect, it } from 'vitest';
import { checkCableCurrent } from './cable-current.ts';
import { fixedPdo as fixed, ppsApdo as pps } from './pdo-builders.ts';

// USB Type-C R2.3 §4.9 and §3.x: any cable carries 3 A; above 3 A needs a 5 A electronically marked cable (from memory).
describe('checkCableCurrent', () => {
  const offers = [fixed(5_000, 3_000), fixed(20_000, 5_000), pps(3_300, 21_000, 5_000)];
  it('caps.cable-current (info) for each offer above 3 A with an unknown or 3 A cable', () => {
    expect(checkCableCurrent(offers)).toMatchObject([{ rule: 'caps.cable-current', severity: 'info', object: 2, message: expect.stringContaining('60 W') }, { object: 3 }]);
    expect(checkCableCurrent(offers, 3_000)).toHaveLength(2);
  });
  it('is quiet with a 5 A cable or offers of at most 3 A', () => {
    expect(checkCableCurrent(offers, 5_000)).toEqual([]);
    expect(checkCableCurrent([fixed(5_000, 3_000), fixed(20_000, 3_000)])).toEqual([]);
  });
});
