import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { decodeRdo } from '../pd/index.ts';
import type { SourcePdo } from '../pd/types.ts';
import { checkRequest } from './check-request.ts';
import { chooseRequest } from './choose-request.ts';
import { batteryPdo, eprAvsApdo, fixedPdo as fixed, ppsApdo as pps, variablePdo } from './pdo-builders.ts';
import type { SinkPolicy } from './sink-policy.ts';

const sixtyFive = [fixed(5_000, 3_000), fixed(9_000, 3_000), fixed(15_000, 3_000), fixed(20_000, 3_250), pps(3_300, 11_000, 5_000), pps(3_300, 21_000, 3_250)];

// RDO layouts: USB PD R3.1 V1.8 §6.4.2, fixed/variable RDO (Object Position B31..28, Capability
// Mismatch B26, Operating Current B19..10 and Maximum Operating Current B9..0 in 10 mA) and PPS RDO
// (Output Voltage B20..9 in 20 mV, Operating Current B6..0 in 50 mA) — from memory; the raw values
// below are computed by hand from those layouts.
describe('chooseRequest: max-power', () => {
  it('takes the most power through a 3 A cable: 20 V at 3 A', () => {
    const r = chooseRequest(sixtyFive, { kind: 'max-power' });
    // position 4 << 28 | 300 << 10 | 300 = 0x4004b12c
    expect(r).toMatchObject({ rdoRaw: 0x4004_b12c, objectPosition: 4, capabilityMismatch: false, contract: { kind: 'fixed', voltageMv: 20_000, currentMa: 3_000, powerMw: 60_000 } });
  });
  it('takes 20 V at 3.25 A over a 5 A cable', () => {
    expect(chooseRequest(sixtyFive, { kind: 'max-power' }, { cableMa: 5_000 }).contract).toEqual({ kind: 'fixed', objectPosition: 4, voltageMv: 20_000, currentMa: 3_250, powerMw: 65_000 });
  });
  it('on a tie prefers the lower voltage; ignores programmable offers', () => {
    const tie = [fixed(5_000, 3_000), fixed(9_000, 2_000), fixed(15_000, 1_200), pps(3_300, 21_000, 5_000)];
    expect(chooseRequest(tie, { kind: 'max-power' }).objectPosition).toBe(2);
  });
  it('considers variable and battery offers at their minimum voltage', () => {
    const offers = [fixed(5_000, 1_000), variablePdo(9_000, 12_000, 2_000), batteryPdo(5_000, 12_000, 20_000)];
    const r = chooseRequest(offers, { kind: 'max-power' });
    expect(r.contract).toEqual({ kind: 'variable', objectPosition: 2, voltageMv: 9_000, currentMa: 2_000, powerMw: 18_000 });
    const battery = chooseRequest([fixed(5_000, 1_000), batteryPdo(5_000, 12_000, 20_000)], { kind: 'max-power' });
    expect(battery.contract).toEqual({ kind: 'battery', objectPosition: 2, voltageMv: 5_000, currentMa: 3_000, powerMw: 15_000 });
  });
  it('sets the flags the policy gives and EPR Mode Capable for an EPR offer', () => {
    const r = chooseRequest(sixtyFive, { kind: 'max-power', usbCommunicationsCapable: true, noUsbSuspend: true, unchunkedExtendedMessages: true });
    // B25 | B24 | B23 over 0x4004b12c
    expect(r.rdoRaw).toBe((0x4004_b12c | (1 << 25) | (1 << 24) | (1 << 23)) >>> 0);
    const epr = [...sixtyFive.slice(0, 4), fixed(20_000, 5_000), fixed(20_000, 5_000), fixed(20_000, 5_000), fixed(28_000, 5_000), eprAvsApdo(15_000, 28_000, 140)];
    const e = chooseRequest(epr, { kind: 'max-power' }, { cableMa: 5_000, epr: true });
    expect(e.objectPosition).toBe(8);
    expect(e.rdo.eprModeCapable).toBe(true);
    expect(chooseRequest(epr, { kind: 'max-power' }, { cableMa: 5_000 }).objectPosition).toBe(5);
  });
});

describe('chooseRequest: fixed', () => {
  it('that voltage at that current', () => {
    const r = chooseRequest(sixtyFive, { kind: 'fixed', voltageMv: 9_000, currentMa: 2_000 });
    // 2 << 28 | 200 << 10 | 200 = 0x200320c8
    expect(r).toMatchObject({ rdoRaw: 0x2003_20c8, capabilityMismatch: false, contract: { voltageMv: 9_000, currentMa: 2_000 } });
  });
  it('offered with less current: the full current with Capability Mismatch, wanted current as the maximum', () => {
    const r = chooseRequest([fixed(5_000, 3_000), fixed(9_000, 2_000)], { kind: 'fixed', voltageMv: 9_000, currentMa: 3_000 });
    expect(r.rdo).toMatchObject({ kind: 'rdo-fixed', objectPosition: 2, capabilityMismatch: true, operatingCurrentMa: 2_000, maxOperatingCurrentMa: 3_000 });
    // 2 << 28 | B26 | 200 << 10 | 300
    expect(r.rdoRaw).toBe(0x2403_212c);
  });
  it('not offered: vSafe5V with Capability Mismatch', () => {
    const r = chooseRequest(sixtyFive, { kind: 'fixed', voltageMv: 12_000, currentMa: 1_500 });
    expect(r).toMatchObject({ objectPosition: 1, capabilityMismatch: true, contract: { voltageMv: 5_000, currentMa: 1_500 } });
  });
});

describe('chooseRequest: pps', () => {
  it('rounds the voltage down to 20 mV and the current down to 50 mA', () => {
    const r = chooseRequest(sixtyFive, { kind: 'pps', voltageMv: 8_413, currentMa: 2_549 });
    // position 5: 8400 mV / 20 = 420, 2500 mA / 50 = 50 → 5 << 28 | 420 << 9 | 50 = 0x50034832
    expect(r).toMatchObject({ rdoRaw: 0x5003_4832, objectPosition: 5, capabilityMismatch: false, contract: { kind: 'pps', voltageMv: 8_400, currentMa: 2_500, powerMw: 21_000 } });
  });
  it('takes the range that holds the voltage, capped by the cable', () => {
    const r = chooseRequest(sixtyFive, { kind: 'pps', voltageMv: 9_000, currentMa: 4_500 });
    expect(r).toMatchObject({ objectPosition: 5, capabilityMismatch: true, contract: { currentMa: 3_000 } });
    expect(chooseRequest(sixtyFive, { kind: 'pps', voltageMv: 9_000, currentMa: 4_500 }, { cableMa: 5_000 })).toMatchObject({ capabilityMismatch: false, contract: { currentMa: 4_500 } });
    expect(chooseRequest(sixtyFive, { kind: 'pps', voltageMv: 16_000, currentMa: 2_000 }).objectPosition).toBe(6);
  });
  it('no range holds the voltage: vSafe5V with Capability Mismatch', () => {
    expect(chooseRequest(sixtyFive, { kind: 'pps', voltageMv: 22_000, currentMa: 1_000 })).toMatchObject({ objectPosition: 1, capabilityMismatch: true });
  });
});

describe('chooseRequest: range', () => {
  it('the lowest voltage in the range with enough power', () => {
    const r = chooseRequest(sixtyFive, { kind: 'range', minVoltageMv: 9_000, maxVoltageMv: 20_000, powerMw: 40_000 });
    // 15 V × 3 A = 45 W ≥ 40 W; 40 W / 15 V = 2.667 A, up to 2.67 A
    expect(r).toMatchObject({ objectPosition: 3, capabilityMismatch: false, contract: { voltageMv: 15_000, currentMa: 2_670 } });
  });
  it('none with enough power: the strongest in range with Capability Mismatch; none in range: vSafe5V', () => {
    expect(chooseRequest(sixtyFive, { kind: 'range', minVoltageMv: 9_000, maxVoltageMv: 20_000, powerMw: 65_000 })).toMatchObject({
      objectPosition: 4,
      capabilityMismatch: true,
      contract: { currentMa: 3_000 },
    });
    expect(chooseRequest(sixtyFive, { kind: 'range', minVoltageMv: 10_000, maxVoltageMv: 12_000, powerMw: 20_000 })).toMatchObject({ objectPosition: 1, capabilityMismatch: true });
  });
});

// ---- properties --------------------------------------------------------------------------------
const mv50 = (min: number, max: number) => fc.integer({ min: min / 50, max: max / 50 }).map((n) => n * 50);
const pdoArb: fc.Arbitrary<SourcePdo> = fc.oneof(
  fc.tuple(mv50(3_000, 20_000), fc.integer({ min: 0, max: 500 })).map(([v, i]) => fixed(v, i * 10)),
  fc.tuple(mv50(3_000, 20_000), mv50(0, 5_000), fc.integer({ min: 0, max: 500 })).map(([v, dv, i]) => variablePdo(v, Math.min(v + dv, 20_000), i * 10)),
  fc.tuple(mv50(3_000, 20_000), mv50(0, 5_000), fc.integer({ min: 0, max: 400 })).map(([v, dv, p]) => batteryPdo(v, Math.min(v + dv, 20_000), p * 250)),
  fc.tuple(fc.integer({ min: 33, max: 110 }), fc.integer({ min: 0, max: 100 }), fc.integer({ min: 0, max: 100 })).map(([lo, d, i]) => pps(lo * 100, Math.min(lo + d, 210) * 100, i * 50)),
);
const offersArb = fc.tuple(fc.integer({ min: 0, max: 500 }), fc.array(pdoArb, { maxLength: 6 })).map(([i, rest]) => [fixed(5_000, i * 10), ...rest]);
const policyArb: fc.Arbitrary<SinkPolicy> = fc.oneof(
  fc.constant({ kind: 'max-power' as const }),
  fc.record({ kind: fc.constant('fixed' as const), voltageMv: mv50(3_000, 21_000), currentMa: fc.integer({ min: 0, max: 6_000 }) }),
  fc.record({ kind: fc.constant('pps' as const), voltageMv: fc.integer({ min: 3_000, max: 22_000 }), currentMa: fc.integer({ min: 0, max: 6_000 }) }),
  fc
    .record({ kind: fc.constant('range' as const), minVoltageMv: fc.integer({ min: 3_000, max: 21_000 }), spanMv: fc.integer({ min: 0, max: 15_000 }), powerMw: fc.integer({ min: 0, max: 120_000 }) })
    .map(({ kind, minVoltageMv, spanMv, powerMw }) => ({ kind, minVoltageMv, maxVoltageMv: minVoltageMv + spanMv, powerMw })),
);

describe('chooseRequest properties', () => {
  it('never requests more than the chosen offer allows or the cable carries', () => {
    fc.assert(
      fc.property(offersArb, policyArb, fc.constantFrom(3_000, 5_000), (offers, policy, cableMa) => {
        const r = chooseRequest(offers, policy, { cableMa });
        const offer = offers[r.objectPosition - 1]!;
        expect(offer).toBeDefined();
        expect(checkRequest(r.rdo, offers)).toEqual([]);
        // The RDO we report is the one the raw value decodes to.
        expect(decodeRdo(r.rdoRaw, offer)).toEqual(r.rdo);
        const rdo = r.rdo;
        if (rdo.kind === 'rdo-fixed' || rdo.kind === 'rdo-variable' || rdo.kind === 'rdo-pps') {
          const offerMa = offer.kind === 'fixed' || offer.kind === 'variable' || offer.kind === 'pps' ? offer.maxCurrentMa : 0;
          expect(rdo.operatingCurrentMa).toBeLessThanOrEqual(Math.min(offerMa, cableMa));
        }
        if (rdo.kind === 'rdo-battery' && offer.kind === 'battery') {
          expect(rdo.operatingPowerMw).toBeLessThanOrEqual(offer.maxPowerMw);
          expect(r.contract.currentMa).toBeLessThanOrEqual(cableMa);
        }
        expect(r.contract.currentMa).toBeLessThanOrEqual(cableMa);
      }),
      { numRuns: 500 },
    );
  });
});
