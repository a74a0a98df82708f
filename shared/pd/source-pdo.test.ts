import { describe, expect, it } from 'vitest';
import { decodeSourcePdo, encodeSourcePdo } from './source-pdo.ts';

// Values worked out by hand from the bit layouts of USB PD R3.2 V1.1 §6.4.1.2 (R3.1 V1.8 Tables
// 6.7, 6.9, 6.11–6.14; R3.2 SPR AVS APDO). Each comment shows the arithmetic.
describe('decodeSourcePdo', () => {
  it('fixed 0x0001912c is 5 V / 3 A (Table 6.9: B19..10 × 50 mV, B9..0 × 10 mA)', () => {
    // (0x0001912c >> 10) & 0x3ff = 100 → 5000 mV; 0x12c = 300 → 3000 mA.
    expect(decodeSourcePdo(0x0001_912c)).toEqual({
      kind: 'fixed',
      raw: '0x0001912c',
      voltageMv: 5000,
      maxCurrentMa: 3000,
      peakCurrent: 0,
      dualRolePower: false,
      usbSuspendSupported: false,
      unconstrainedPower: false,
      usbCommunicationsCapable: false,
      dualRoleData: false,
      unchunkedExtendedMessages: false,
      eprModeCapable: false,
    });
  });
  it('fixed flags sit at B29…B23 and Peak Current at B21..20 (Table 6.9)', () => {
    expect(decodeSourcePdo(0x2000_0000)).toMatchObject({ dualRolePower: true, usbSuspendSupported: false });
    expect(decodeSourcePdo(0x1000_0000)).toMatchObject({ usbSuspendSupported: true });
    expect(decodeSourcePdo(0x0800_0000)).toMatchObject({ unconstrainedPower: true });
    expect(decodeSourcePdo(0x0400_0000)).toMatchObject({ usbCommunicationsCapable: true });
    expect(decodeSourcePdo(0x0200_0000)).toMatchObject({ dualRoleData: true });
    expect(decodeSourcePdo(0x0100_0000)).toMatchObject({ unchunkedExtendedMessages: true });
    expect(decodeSourcePdo(0x0080_0000)).toMatchObject({ eprModeCapable: true });
    expect(decodeSourcePdo(0x0030_0000)).toMatchObject({ peakCurrent: 3 });
  });
  it('type 01b is Battery and 10b Variable (Table 6.7 summary; R3.2 V1.1 per-type tables print them swapped)', () => {
    // 0x9a41912c: B31..30 = 10b; B29..20 = 420 → 21 000 mV; B19..10 = 100 → 5000 mV; 300 → 3000 mA.
    expect(decodeSourcePdo(0x9a41_912c)).toEqual({ kind: 'variable', raw: '0x9a41912c', minVoltageMv: 5000, maxVoltageMv: 21_000, maxCurrentMa: 3000 });
    // 0x5a4190f0: B31..30 = 01b; 0xf0 = 240 × 250 mW = 60 000 mW.
    expect(decodeSourcePdo(0x5a41_90f0)).toEqual({ kind: 'battery', raw: '0x5a4190f0', minVoltageMv: 5000, maxVoltageMv: 21_000, maxPowerMw: 60_000 });
  });
  it('PPS 0xc0dc213c is 3.3–11 V at 3 A (Table 6.13: 100 mV and 50 mA units)', () => {
    // B24..17 = 110 → 11 000 mV; B15..8 = 33 → 3300 mV; B6..0 = 60 → 3000 mA; B27 = 0.
    expect(decodeSourcePdo(0xc0dc_213c)).toEqual({ kind: 'pps', raw: '0xc0dc213c', minVoltageMv: 3300, maxVoltageMv: 11_000, maxCurrentMa: 3000, powerLimited: false });
    expect(decodeSourcePdo(0xc8dc_213c)).toMatchObject({ powerLimited: true });
  });
  it('EPR AVS 0xd3c0968c is 15–48 V, 140 W (Table 6.14: B25..17 max, B15..8 min in 100 mV, B7..0 PDP W)', () => {
    // B29..28 = 01b; B25..17 = 480 → 48 000 mV; B15..8 = 150 → 15 000 mV; B7..0 = 140 W.
    expect(decodeSourcePdo(0xd3c0_968c)).toEqual({ kind: 'epr-avs', raw: '0xd3c0968c', minVoltageMv: 15_000, maxVoltageMv: 48_000, pdpW: 140, peakCurrent: 0 });
  });
  it('SPR AVS 0xe004b0e1 is 3 A at 9–15 V, 2.25 A at 15–20 V (R3.2 V1.1 SPR AVS APDO: B19..10, B9..0 in 10 mA)', () => {
    // B29..28 = 10b; B19..10 = 300 → 3000 mA; B9..0 = 225 → 2250 mA.
    expect(decodeSourcePdo(0xe004_b0e1)).toEqual({ kind: 'spr-avs', raw: '0xe004b0e1', maxCurrent15vMa: 3000, maxCurrent20vMa: 2250, peakCurrent: 0 });
  });
  it('APDO type 11b is reserved and decodes as raw', () => {
    expect(decodeSourcePdo(0xf000_0000)).toEqual({ kind: 'raw', raw: '0xf0000000' });
  });
});

describe('encodeSourcePdo', () => {
  it('inverts decodeSourcePdo for every kind', () => {
    for (const raw of [0x0001_912c, 0x3f3f_ffff, 0x9a41_912c, 0x5a41_90f0, 0xc0dc_213c, 0xc8dc_213c, 0xd3c0_968c, 0xec04_b0e1]) {
      expect(encodeSourcePdo(decodeSourcePdo(raw))).toBe(raw);
    }
  });
  it('keeps reserved bit 22 found in raw (Table 6.9)', () => {
    expect(encodeSourcePdo(decodeSourcePdo(0x0041_912c))).toBe(0x0041_912c);
  });
  it('guards ranges and steps, naming the field', () => {
    const pdo = decodeSourcePdo(0x0001_912c);
    expect(() => encodeSourcePdo({ ...pdo, voltageMv: 5010 } as never)).toThrow(/voltageMv: 5010 mV is not a multiple of 50 mV/);
    expect(() => encodeSourcePdo({ ...pdo, maxCurrentMa: 10_240 } as never)).toThrow(/maxCurrentMa: .* outside 0–10230 mA/);
    expect(() => encodeSourcePdo({ ...pdo, dualRolePower: 1 } as never)).toThrow(/dualRolePower/);
  });
});
