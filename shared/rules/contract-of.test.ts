import { describe, expect, it } from 'vitest';
import { decodeRdo } from '../pd/index.ts';
import { contractOf } from './contract-of.ts';
import { batteryPdo, fixedPdo as fixed, ppsApdo as pps, variablePdo } from './pdo-builders.ts';

// The Contract form is docs/cli.md's; RDO layouts as in check-request.test.ts.
describe('contractOf', () => {
  it('fixed: the offer voltage at the operating current', () => {
    expect(contractOf(decodeRdo(0x4004_b12c), fixed(20_000, 3_250))).toEqual({ kind: 'fixed', objectPosition: 4, voltageMv: 20_000, currentMa: 3_000, powerMw: 60_000 });
  });
  it('pps: the requested output voltage', () => {
    expect(contractOf(decodeRdo(0x5003_4832), pps(3_300, 11_000, 3_000))).toEqual({ kind: 'pps', objectPosition: 5, voltageMv: 8_400, currentMa: 2_500, powerMw: 21_000 });
  });
  it('variable at its minimum voltage; battery with the current derived there', () => {
    expect(contractOf(decodeRdo((2 << 28) | (150 << 10) | 150), variablePdo(9_000, 12_000, 2_000))).toMatchObject({ kind: 'variable', voltageMv: 9_000, currentMa: 1_500, powerMw: 13_500 });
    // 60 × 250 mW = 15 W at 5 V = 3 A
    expect(contractOf(decodeRdo((2 << 28) | (60 << 10) | 60), batteryPdo(5_000, 12_000, 20_000))).toEqual({ kind: 'battery', objectPosition: 2, voltageMv: 5_000, currentMa: 3_000, powerMw: 15_000 });
  });
});

describe('contractOf without raw', () => {
  it('encodes an RDO built in code to re-read it by the offer type', () => {
    const rdo = {
      kind: 'rdo' as const,
      raw: '',
      objectPosition: 1,
      operatingCurrentMa: 1_000,
      maxOperatingCurrentMa: 1_000,
      giveBack: false,
      capabilityMismatch: false,
      usbCommunicationsCapable: false,
      noUsbSuspend: false,
      unchunkedExtendedMessages: false,
      eprModeCapable: false,
    };
    expect(contractOf(rdo, fixed(5_000, 3_000))).toEqual({ kind: 'fixed', objectPosition: 1, voltageMv: 5_000, currentMa: 1_000, powerMw: 5_000 });
  });
});
