import { describe, expect, it } from 'vitest';
import { decodeRdo, encodeRdo } from './rdo.ts';
import { decodeSourcePdo } from './source-pdo.ts';

const fixed = decodeSourcePdo(0x0001_912c);
const pps = decodeSourcePdo(0xc0dc_213c);
const battery = decodeSourcePdo(0x5a41_90f0);
const avs = decodeSourcePdo(0xd3c0_968c);

// Hand-worked from USB PD R3.2 V1.1 §6.4.2 (R3.1 V1.8 Tables 6.22–6.26).
describe('decodeRdo', () => {
  it('0x1304b12c against a fixed PDO: position 1, 3 A / 3 A, USB comms, no suspend (Table 6.23)', () => {
    // B31..28 = 1; B25 = 1; B24 = 1; B19..10 = 300 → 3000 mA; B9..0 = 300 → 3000 mA.
    expect(decodeRdo(0x1304_b12c, fixed)).toEqual({
      kind: 'rdo-fixed',
      raw: '0x1304b12c',
      objectPosition: 1,
      operatingCurrentMa: 3000,
      maxOperatingCurrentMa: 3000,
      giveBack: false,
      capabilityMismatch: false,
      usbCommunicationsCapable: true,
      noUsbSuspend: true,
      unchunkedExtendedMessages: false,
      eprModeCapable: false,
    });
  });
  it('the object position has 4 bits (B31..28): 13 reads as 13', () => {
    expect(decodeRdo(0xd000_0000).objectPosition).toBe(13);
  });
  it('0x60038428 against a PPS APDO: position 6, 9 V in 20 mV units, 2 A in 50 mA units (Table 6.25)', () => {
    // B20..9 = 450 → 9000 mV; B6..0 = 40 → 2000 mA.
    expect(decodeRdo(0x6003_8428, pps)).toMatchObject({ kind: 'rdo-pps', objectPosition: 6, outputVoltageMv: 9000, operatingCurrentMa: 2000 });
  });
  it('an AVS request counts output voltage in 25 mV units (Table 6.26)', () => {
    // B20..9 = 0x3c0 = 960 → 24 000 mV (25 mV units); B6..0 = 100 → 5000 mA.
    expect(decodeRdo(0x8000_0000 | (960 << 9) | 100, avs)).toMatchObject({ kind: 'rdo-avs', objectPosition: 8, outputVoltageMv: 24_000, operatingCurrentMa: 5000 });
  });
  it('a battery request counts power in 250 mW units (Table 6.24)', () => {
    expect(decodeRdo(0x2000_0000 | (240 << 10) | 240, battery)).toMatchObject({ kind: 'rdo-battery', operatingPowerMw: 60_000, maxOperatingPowerMw: 60_000 });
  });
  it('without the referenced PDO the kind is rdo, read as fixed/variable', () => {
    expect(decodeRdo(0x1304_b12c)).toMatchObject({ kind: 'rdo', operatingCurrentMa: 3000, maxOperatingCurrentMa: 3000 });
  });
});

describe('encodeRdo', () => {
  it('inverts decodeRdo for each kind', () => {
    expect(encodeRdo(decodeRdo(0x1304_b12c, fixed))).toBe(0x1304_b12c);
    expect(encodeRdo(decodeRdo(0x6003_8428, pps))).toBe(0x6003_8428);
    expect(encodeRdo(decodeRdo(0x2c03_c0f0, battery))).toBe(0x2c03_c0f0);
    expect(encodeRdo(decodeRdo(0x8007_8064, avs))).toBe(0x8007_8064);
    expect(encodeRdo(decodeRdo(0x1f34_b12c))).toBe(0x1f34_b12c); // with reserved B21..20 kept
  });
  it('guards steps: PPS voltage in 20 mV, current in 50 mA', () => {
    const rdo = decodeRdo(0x6003_8428, pps);
    expect(() => encodeRdo({ ...rdo, outputVoltageMv: 9010 } as never)).toThrow(/outputVoltageMv: 9010 mV is not a multiple of 20 mV/);
    expect(() => encodeRdo({ ...rdo, objectPosition: 16 } as never)).toThrow(/objectPosition/);
  });
});
