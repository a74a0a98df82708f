import { describe, expect, it } from 'vitest';
import { checkStructure } from './check-structure.ts';
import { batteryPdo, eprAvsApdo, fixedPdo as fixed, paddingPdo, ppsApdo as pps, sprAvsApdo, variablePdo } from './pdo-builders.ts';

const rules = (findings: { rule: string }[]) => findings.map((f) => f.rule);

// USB PD R3.1 V1.8 §6.4.1 Capabilities Message: vSafe5V first; other fixed supplies by rising
// voltage; battery, then variable by rising minimum voltage; APDOs last, PPS by rising maximum
// voltage (from memory). SPR AVS before PPS as the R3.2 V1.1 §6.4.1 order is recalled (from memory).
describe('checkStructure', () => {
  const lawful = [fixed(5_000, 3_000), fixed(9_000, 3_000), fixed(15_000, 3_000), fixed(20_000, 3_250), batteryPdo(5_000, 20_000, 30_000), variablePdo(5_000, 20_000, 2_000), sprAvsApdo(3_000, 2_250)];
  it('is quiet on a lawful, ordered list of every SPR kind', () => {
    expect(checkStructure(lawful)).toEqual([]);
    expect(checkStructure([fixed(5_000, 3_000), pps(3_300, 11_000, 3_000), pps(3_300, 21_000, 3_000)])).toEqual([]);
  });

  it('caps.first-not-vsafe5v when object 1 is not 5 V fixed', () => {
    expect(rules(checkStructure([fixed(9_000, 3_000), fixed(15_000, 3_000)]))).toContain('caps.first-not-vsafe5v');
    expect(rules(checkStructure([pps(3_300, 11_000, 3_000)]))).toContain('caps.first-not-vsafe5v');
    expect(checkStructure([fixed(9_000, 3_000)])[0]).toMatchObject({ object: 1, severity: 'error' });
  });

  it('caps.order for fixed supplies not by rising voltage, and for kinds out of order', () => {
    expect(checkStructure([fixed(5_000, 3_000), fixed(15_000, 3_000), fixed(9_000, 3_000)])).toMatchObject([{ rule: 'caps.order', object: 3 }]);
    expect(rules(checkStructure([fixed(5_000, 3_000), pps(3_300, 11_000, 3_000), fixed(9_000, 3_000)]))).toEqual(['caps.order']);
    expect(rules(checkStructure([fixed(5_000, 3_000), variablePdo(5_000, 20_000, 2_000), batteryPdo(5_000, 20_000, 30_000)]))).toEqual(['caps.order']);
    expect(rules(checkStructure([fixed(5_000, 3_000), pps(3_300, 21_000, 3_000), pps(3_300, 11_000, 3_000)]))).toEqual(['caps.order']);
    expect(rules(checkStructure([fixed(5_000, 3_000), pps(3_300, 11_000, 3_000), sprAvsApdo(3_000, 2_250)]))).toEqual(['caps.order']);
  });

  it('caps.duplicate for two fixed supplies at one voltage', () => {
    expect(checkStructure([fixed(5_000, 3_000), fixed(9_000, 2_000), fixed(9_000, 3_000)])).toMatchObject([{ rule: 'caps.duplicate', object: 3 }]);
    expect(rules(checkStructure([fixed(5_000, 3_000), fixed(9_000, 3_000), variablePdo(9_000, 9_000, 1_000)]))).toEqual([]);
  });

  // USB PD R3.1 V1.8 §6.2.1.1.2: Number of Data Objects is 3 bits, at most 7 (from memory).
  it('caps.too-many-objects above seven SPR objects', () => {
    const eight = [5, 9, 10, 12, 15, 18, 19, 20].map((v) => fixed(v * 1_000, 1_000));
    expect(rules(checkStructure(eight))).toEqual(['caps.too-many-objects']);
    expect(rules(checkStructure(eight.slice(0, 7)))).toEqual([]);
  });

  // USB PD R3.1 V1.8 §6.5.15.1 EPR_Source_Capabilities: SPR PDOs in 1–7, EPR PDOs from 8 (from memory).
  it('caps.epr-position for EPR objects in SPR caps or before position 8, quiet when placed right', () => {
    expect(rules(checkStructure([fixed(5_000, 3_000), fixed(28_000, 5_000)]))).toEqual(['caps.epr-position']);
    expect(rules(checkStructure([fixed(5_000, 3_000), fixed(28_000, 5_000)], { epr: true }))).toEqual(['caps.epr-position']);
    const epr = [fixed(5_000, 3_000), fixed(9_000, 3_000), fixed(15_000, 3_000), fixed(20_000, 5_000), paddingPdo(), paddingPdo(), paddingPdo(), fixed(28_000, 5_000), eprAvsApdo(15_000, 28_000, 140)];
    expect(checkStructure(epr, { epr: true })).toEqual([]);
    const sprAfter7 = [...epr.slice(0, 7), fixed(28_000, 5_000), pps(3_300, 21_000, 3_000)];
    expect(rules(checkStructure(sprAfter7, { epr: true }))).toEqual(['caps.epr-position']);
  });

  it('caps.empty for no objects', () => {
    expect(rules(checkStructure([]))).toEqual(['caps.empty']);
  });
});
