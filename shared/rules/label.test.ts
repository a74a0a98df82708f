import { describe, expect, it } from 'vitest';
import { checkLabel, parseLabel } from './label.ts';
import { fixedPdo as fixed, ppsApdo as pps } from './pdo-builders.ts';

// Label forms are common practice of adapter labelling (⎓ is the IEC 60417-5031 DC symbol).
describe('parseLabel', () => {
  const entries = (label: string) => {
    const r = parseLabel(label);
    return r.ok ? r.rating : r.error;
  };
  it('reads ⎓, =, space, slash and DC forms with several separators', () => {
    expect(entries('5V⎓3A, 9V⎓3A, 15V⎓3A, 20V⎓3.25A  65W max')).toEqual({
      entries: [
        { minVoltageMv: 5_000, maxVoltageMv: 5_000, currentMa: 3_000 },
        { minVoltageMv: 9_000, maxVoltageMv: 9_000, currentMa: 3_000 },
        { minVoltageMv: 15_000, maxVoltageMv: 15_000, currentMa: 3_000 },
        { minVoltageMv: 20_000, maxVoltageMv: 20_000, currentMa: 3_250 },
      ],
      powerW: 65,
    });
    expect(entries('5V=3A / 9V=2A')).toMatchObject({
      entries: [
        { minVoltageMv: 5_000, currentMa: 3_000 },
        { minVoltageMv: 9_000, currentMa: 2_000 },
      ],
    });
    expect(entries('5V 3A 9V 2.22A')).toMatchObject({ entries: [{ currentMa: 3_000 }, { minVoltageMv: 9_000, currentMa: 2_220 }] });
    expect(entries('Output: 5.0VDC 3.0A; 9,0V 2A')).toMatchObject({
      entries: [
        { minVoltageMv: 5_000, currentMa: 3_000 },
        { minVoltageMv: 9_000, currentMa: 2_000 },
      ],
    });
    expect(entries('5V/9V 3A')).toMatchObject({
      entries: [
        { minVoltageMv: 5_000, currentMa: 3_000 },
        { minVoltageMv: 9_000, currentMa: 3_000 },
      ],
    });
  });
  it('reads programmable ranges with or without "PPS"', () => {
    expect(entries('PPS 3.3-21V⎓3A')).toEqual({ entries: [{ minVoltageMv: 3_300, maxVoltageMv: 21_000, currentMa: 3_000 }] });
    expect(entries('3.3–21V 3A')).toEqual({ entries: [{ minVoltageMv: 3_300, maxVoltageMv: 21_000, currentMa: 3_000 }] });
  });
  it('fails with a field: message error on a label with nothing to read', () => {
    expect(entries('fast charger')).toMatchObject({ code: 'input.label', message: expect.stringMatching(/^label: /) });
  });
});

describe('checkLabel', () => {
  const offers = [fixed(5_000, 3_000), fixed(9_000, 3_000), fixed(15_000, 3_000), fixed(20_000, 3_250), pps(3_300, 21_000, 3_000)];
  it('is quiet when label and offers agree', () => {
    expect(checkLabel(offers, '5V⎓3A 9V⎓3A 15V⎓3A 20V⎓3.25A PPS 3.3-21V⎓3A 65W max', 65)).toEqual([]);
  });
  it('caps.label-mismatch for a labelled voltage not offered, a differing current, a differing wattage', () => {
    expect(checkLabel(offers, '12V⎓3A', 65)).toMatchObject([{ rule: 'caps.label-mismatch', severity: 'warning' }]);
    expect(checkLabel(offers, '20V⎓3A', 65)).toMatchObject([{ rule: 'caps.label-mismatch', object: 4 }]);
    expect(checkLabel(offers, '3.3-16V 3A', 65)).toHaveLength(1);
    expect(checkLabel(offers, '61W', 65)).toMatchObject([{ rule: 'caps.label-mismatch', message: expect.stringContaining('61 W') }]);
    expect(checkLabel(offers, 'no rating', 65)).toMatchObject([{ rule: 'caps.label-mismatch' }]);
  });
});
