import { describe, expect, it } from 'vitest';
import { decodeRdo } from '../pd/index.ts';
import { checkRequest } from './check-request.ts';
import { batteryPdo, eprAvsApdo, fixedPdo as fixed, paddingPdo, ppsApdo as pps, sprAvsApdo } from './pdo-builders.ts';

const offers = [fixed(5_000, 3_000), fixed(9_000, 2_000), pps(3_300, 11_000, 3_000), batteryPdo(5_000, 12_000, 20_000)];
const rules = (findings: { rule: string }[]) => findings.map((f) => f.rule);
// Raw RDOs by the layouts of USB PD R3.1 V1.8 §6.4.2 (fixed: B19..10 / B9..0 in 10 mA; PPS: B20..9
// in 20 mV, B6..0 in 50 mA; battery: in 250 mW; Capability Mismatch B26) — from memory.
const fixedRdo = (position: number, opMa: number, maxMa: number, mismatch = false) => ((position << 28) | (mismatch ? 1 << 26 : 0) | ((opMa / 10) << 10) | (maxMa / 10)) >>> 0;
const ppsRdo = (position: number, mv: number, ma: number) => ((position << 28) | ((mv / 20) << 9) | (ma / 50)) >>> 0;

describe('checkRequest', () => {
  it('is quiet for requests within the offers', () => {
    expect(checkRequest(decodeRdo(fixedRdo(2, 2_000, 2_000), offers[1]), offers)).toEqual([]);
    expect(checkRequest(decodeRdo(ppsRdo(3, 9_000, 3_000), offers[2]), offers)).toEqual([]);
    // An RDO decoded without the offers is read by the referenced PDO's type.
    expect(checkRequest(decodeRdo(ppsRdo(3, 9_000, 3_000)), offers)).toEqual([]);
  });

  it('request.position for position 0, past the last object, or an empty padding object', () => {
    expect(checkRequest(decodeRdo(fixedRdo(0, 100, 100)), offers)).toMatchObject([{ rule: 'request.position', severity: 'error', object: 0 }]);
    expect(rules(checkRequest(decodeRdo(fixedRdo(5, 100, 100)), offers))).toEqual(['request.position']);
    expect(rules(checkRequest(decodeRdo(fixedRdo(2, 100, 100)), [fixed(5_000, 3_000), paddingPdo()]))).toEqual(['request.position']);
  });

  it('request.exceeds-offer for too much current or power, and a maximum above the offer without Capability Mismatch', () => {
    expect(checkRequest(decodeRdo(fixedRdo(2, 2_500, 2_500)), offers, { t: 7 })).toMatchObject([{ rule: 'request.exceeds-offer', object: 2, t: 7 }]);
    expect(rules(checkRequest(decodeRdo(fixedRdo(2, 2_000, 3_000)), offers))).toEqual(['request.exceeds-offer']);
    expect(checkRequest(decodeRdo(fixedRdo(2, 2_000, 3_000, true)), offers)).toEqual([]);
    expect(rules(checkRequest(decodeRdo(ppsRdo(3, 9_000, 3_500)), offers))).toEqual(['request.exceeds-offer']);
    const battery = ((4 << 28) | (100 << 10) | 100) >>> 0; // 25 W of a 20 W offer
    expect(rules(checkRequest(decodeRdo(battery), offers))).toEqual(['request.exceeds-offer']);
  });

  it('request.out-of-range for a programmable voltage outside the range', () => {
    expect(rules(checkRequest(decodeRdo(ppsRdo(3, 11_020, 1_000)), offers))).toEqual(['request.out-of-range']);
    expect(rules(checkRequest(decodeRdo(ppsRdo(3, 3_200, 1_000)), offers))).toEqual(['request.out-of-range']);
  });

  it('checks AVS requests by voltage range and power', () => {
    const epr = [fixed(5_000, 3_000), eprAvsApdo(15_000, 28_000, 140)];
    const avsRdo = (mv: number, ma: number) => ((2 << 28) | ((mv / 25) << 9) | (ma / 50)) >>> 0;
    expect(checkRequest(decodeRdo(avsRdo(28_000, 5_000), epr[1]), epr)).toEqual([]);
    expect(rules(checkRequest(decodeRdo(avsRdo(30_000, 1_000), epr[1]), epr))).toEqual(['request.out-of-range']);
    const small = [fixed(5_000, 3_000), eprAvsApdo(15_000, 28_000, 100)];
    expect(rules(checkRequest(decodeRdo(avsRdo(20_000, 6_000), small[1]), small))).toEqual(['request.exceeds-offer']); // 120 W of 100 W
    const spr = [fixed(5_000, 3_000), sprAvsApdo(3_000, 2_250)];
    expect(rules(checkRequest(decodeRdo(avsRdo(20_000, 3_000), spr[1]), spr))).toEqual(['request.exceeds-offer']);
  });
  // USB PD R3.2 V1.1 §6.4.2 AVS RDO (Output Voltage in 25 mV units, two lowest bits zero: 100 mV steps)
  // and §6.4.1.3.4 EPR AVS APDO (current at most the lower of 5 A and PDP/V) — from memory.
  it('keeps AVS requests to 100 mV steps and to the lower of 5 A and PDP/V', () => {
    const epr = [fixed(5_000, 3_000), eprAvsApdo(15_000, 48_000, 240)];
    const avsRdo = (mv: number, ma: number) => ((2 << 28) | ((mv / 25) << 9) | (ma / 50)) >>> 0;
    expect(checkRequest(decodeRdo(avsRdo(20_100, 5_000), epr[1]), epr)).toEqual([]);
    expect(rules(checkRequest(decodeRdo(avsRdo(20_050, 1_000), epr[1]), epr))).toEqual(['request.out-of-range']);
    // 240 W at 20 V would be 12 A: the limit is 5 A.
    expect(rules(checkRequest(decodeRdo(avsRdo(20_000, 5_050), epr[1]), epr))).toEqual(['request.exceeds-offer']);
  });
});
