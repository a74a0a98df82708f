import { describe, expect, it } from 'vitest';
import { checkPowerRules, powerRulesFor } from './power-rules.ts';
import { eprAvsApdo, fixedPdo as fixed } from './pdo-builders.ts';

const rules = (findings: { rule: string }[]) => findings.map((f) => f.rule);

// Every expectation here: USB PD R3.1 V1.8 §10.2.3, Table 10-2 "SPR Normative Voltages and
// Currents" and Table 10-3 "EPR Normative Voltages and Currents" (from memory; R3.2 V1.1 keeps them).
describe('powerRulesFor', () => {
  it('≤ 15 W: 5 V at PDP/5', () => {
    expect(powerRulesFor(10).fixed).toEqual([{ voltageMv: 5_000, currentMa: 2_000 }]);
    expect(powerRulesFor(15).fixed).toEqual([{ voltageMv: 5_000, currentMa: 3_000 }]);
  });
  it('15–27 W: 5 V 3 A and 9 V at PDP/9 (rounded down to 10 mA)', () => {
    expect(powerRulesFor(20).fixed).toEqual([
      { voltageMv: 5_000, currentMa: 3_000 },
      { voltageMv: 9_000, currentMa: 2_220 },
    ]);
    expect(powerRulesFor(27).fixed).toEqual([
      { voltageMv: 5_000, currentMa: 3_000 },
      { voltageMv: 9_000, currentMa: 3_000 },
    ]);
  });
  it('27–45 W: adds 15 V at PDP/15', () => {
    expect(powerRulesFor(45).fixed).toEqual([
      { voltageMv: 5_000, currentMa: 3_000 },
      { voltageMv: 9_000, currentMa: 3_000 },
      { voltageMv: 15_000, currentMa: 3_000 },
    ]);
    expect(powerRulesFor(30).fixed.at(-1)).toEqual({ voltageMv: 15_000, currentMa: 2_000 });
  });
  it('45–60 W: adds 20 V at PDP/20', () => {
    expect(powerRulesFor(60).fixed.map((r) => r.voltageMv)).toEqual([5_000, 9_000, 15_000, 20_000]);
    expect(powerRulesFor(60).fixed.at(-1)).toEqual({ voltageMv: 20_000, currentMa: 3_000 });
    expect(powerRulesFor(65).fixed.at(-1)).toEqual({ voltageMv: 20_000, currentMa: 3_250 });
  });
  it('60–100 W: 20 V at PDP/20, above 3 A only over a 5 A cable', () => {
    expect(powerRulesFor(100).fixed.at(-1)).toEqual({ voltageMv: 20_000, currentMa: 5_000 });
    expect(powerRulesFor(100, { cableMa: 3_000 }).fixed.at(-1)).toEqual({ voltageMv: 20_000, currentMa: 3_000 });
    expect(powerRulesFor(140).fixed.at(-1)).toEqual({ voltageMv: 20_000, currentMa: 5_000 }); // SPR part of an EPR source
  });
  it('EPR: 28 V, 36 V, 48 V by band and the AVS range', () => {
    expect(powerRulesFor(140, { epr: true })).toMatchObject({ avs: { minVoltageMv: 15_000, maxVoltageMv: 28_000 } });
    expect(powerRulesFor(140, { epr: true }).fixed.at(-1)).toEqual({ voltageMv: 28_000, currentMa: 5_000 });
    expect(powerRulesFor(180, { epr: true }).fixed.slice(-2)).toEqual([
      { voltageMv: 28_000, currentMa: 5_000 },
      { voltageMv: 36_000, currentMa: 5_000 },
    ]);
    expect(powerRulesFor(240, { epr: true }).fixed.slice(-3)).toEqual([
      { voltageMv: 28_000, currentMa: 5_000 },
      { voltageMv: 36_000, currentMa: 5_000 },
      { voltageMv: 48_000, currentMa: 5_000 },
    ]);
    expect(powerRulesFor(240, { epr: true }).avs).toEqual({ minVoltageMv: 15_000, maxVoltageMv: 48_000 });
    expect(powerRulesFor(120, { epr: true }).fixed.at(-1)).toEqual({ voltageMv: 28_000, currentMa: 4_280 });
  });
});

describe('checkPowerRules', () => {
  const sixtyFive = [fixed(5_000, 3_000), fixed(9_000, 3_000), fixed(15_000, 3_000), fixed(20_000, 3_250)];
  it('is quiet for a lawful 65 W set', () => {
    expect(checkPowerRules(sixtyFive, 65)).toEqual([]);
  });
  it('caps.power-rules-missing without 9 V at 45 W (the vector.md example)', () => {
    expect(checkPowerRules([fixed(5_000, 3_000), fixed(15_000, 3_000)], 45)).toMatchObject([{ rule: 'caps.power-rules-missing', severity: 'error' }]);
  });
  it('caps.power-rules-current at 65 W with 20 V at 3 A', () => {
    const low = [...sixtyFive.slice(0, 3), fixed(20_000, 3_000)];
    expect(checkPowerRules(low, 65)).toMatchObject([{ rule: 'caps.power-rules-current', object: 4 }]);
  });
  it('accepts the 10 mA rounding of PDP/V (20 W offers 9 V at 2.22 A)', () => {
    expect(checkPowerRules([fixed(5_000, 3_000), fixed(9_000, 2_220)], 20)).toEqual([]);
    expect(rules(checkPowerRules([fixed(5_000, 3_000), fixed(9_000, 2_210)], 20))).toEqual(['caps.power-rules-current']);
  });
  it('EPR 140 W needs 28 V and an AVS range', () => {
    const spr = [fixed(5_000, 3_000), fixed(9_000, 3_000), fixed(15_000, 3_000), fixed(20_000, 5_000)];
    expect(checkPowerRules([...spr, fixed(28_000, 5_000), eprAvsApdo(15_000, 28_000, 140)], 140, { epr: true })).toEqual([]);
    expect(rules(checkPowerRules([...spr, eprAvsApdo(15_000, 28_000, 140)], 140, { epr: true }))).toEqual(['caps.power-rules-missing']);
    expect(rules(checkPowerRules([...spr, fixed(28_000, 5_000)], 140, { epr: true }))).toEqual(['caps.power-rules-missing']);
  });
});
