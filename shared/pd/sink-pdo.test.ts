import { describe, expect, it } from 'vitest';
import { decodeSinkPdo, encodeSinkPdo } from './sink-pdo.ts';

// Hand-worked from USB PD R3.2 V1.1 §6.4.1.3 (R3.1 V1.8 Tables 6.17–6.21).
describe('decodeSinkPdo', () => {
  it('fixed 0x1401912c: 5 V / 3 A operational, Higher Capability, USB Communications Capable (Table 6.17)', () => {
    // B28 = 1, B26 = 1; B19..10 = 100 → 5000 mV; B9..0 = 300 → 3000 mA.
    expect(decodeSinkPdo(0x1401_912c)).toEqual({
      kind: 'fixed',
      raw: '0x1401912c',
      voltageMv: 5000,
      operationalCurrentMa: 3000,
      dualRolePower: false,
      higherCapability: true,
      unconstrainedPower: false,
      usbCommunicationsCapable: true,
      dualRoleData: false,
      frSwapRequiredCurrent: 0,
    });
  });
  it('Fast Role Swap required current is B24..23 (Table 6.17)', () => {
    expect(decodeSinkPdo(0x0180_0000)).toMatchObject({ frSwapRequiredCurrent: 3 });
    expect(decodeSinkPdo(0x0080_0000)).toMatchObject({ frSwapRequiredCurrent: 1 });
  });
  it('variable and battery sink forms use operational current / power (Tables 6.18, 6.19)', () => {
    expect(decodeSinkPdo(0x9a41_912c)).toEqual({ kind: 'variable', raw: '0x9a41912c', minVoltageMv: 5000, maxVoltageMv: 21_000, operationalCurrentMa: 3000 });
    expect(decodeSinkPdo(0x5a41_90f0)).toEqual({ kind: 'battery', raw: '0x5a4190f0', minVoltageMv: 5000, maxVoltageMv: 21_000, operationalPowerMw: 60_000 });
  });
  it('a sink PPS APDO has no Power Limited bit (Table 6.20: B27..25 reserved)', () => {
    expect(decodeSinkPdo(0xc8dc_213c)).toMatchObject({ kind: 'pps', powerLimited: false });
  });
  it('round-trips every kind', () => {
    for (const raw of [0x1401_912c, 0x3f9f_ffff, 0x9a41_912c, 0x5a41_90f0, 0xc0dc_213c, 0xd3c0_968c, 0xe004_b0e1, 0x0071_912c]) {
      expect(encodeSinkPdo(decodeSinkPdo(raw))).toBe(raw);
    }
  });
});
