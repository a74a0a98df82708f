import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { bmcDecode, bmcEncode, estimateUiUs } from './bmc.ts';
import { packetBits, preambleBits } from './packet-bits.ts';
import { crc32Bytes } from '../pd/crc32.ts';

describe('BMC', () => {
  it('changes level at every bit start and in the middle of a 1, then closes the last bit', () => {
    // USB PD R3.2 V1.1 §5.8.1 (Biphase Mark Coding). Bits 0,1,0 with UI 10 µs, line starting low:
    // edges at 0 (0), 10 and 15 (1), 20 (0), 30 closes the last bit and leaves the line high, so it
    // returns low one UI later (40).
    expect(bmcEncode([0, 1, 0], 0, 10)).toEqual({ edgesUs: [0, 10, 15, 20, 30, 40], endUs: 40 });
    // Bit 0 alone: edge 0 raises the line, edge 10 closes the bit and leaves it low: no extra edge.
    expect(bmcEncode([0], 0, 10)).toEqual({ edgesUs: [0, 10], endUs: 10 });
    // Bits 0,0: the closing edge at 20 leaves the line high, so it falls again at 30.
    expect(bmcEncode([0, 0], 0, 10)).toEqual({ edgesUs: [0, 10, 20, 30], endUs: 30 });
  });

  it('has a 64-bit preamble of alternating bits starting with 0 and ending with 1', () => {
    // USB PD R3.2 V1.1 §5.6.1.1 (Preamble).
    const bits = preambleBits();
    expect(bits).toHaveLength(64);
    expect(bits[0]).toBe(0);
    expect(bits[63]).toBe(1);
    expect(bits.every((b, i) => b === (i & 1))).toBe(true);
  });

  it('frames GoodCRC as preamble, SOP, 4 symbols of header, 8 of CRC and EOP', () => {
    // USB PD R3.2 V1.1 §5.6: 64 + 20 + (2 + 4) bytes × 10 + 5 bits.
    expect(packetBits({ sop: 'SOP', bytes: Uint8Array.of(0x41, 0x00) })).toHaveLength(64 + 20 + 60 + 5);
    expect(packetBits({ orderedSet: 'Hard_Reset' })).toHaveLength(84);
    expect([...crc32Bytes(Uint8Array.of(0x01, 0x01))]).toEqual([0x28, 0x13, 0xc5, 0x2f]);
  });

  it('finds the unit interval from the preamble', () => {
    const { edgesUs } = bmcEncode(preambleBits(), 0, 1_000_000 / 300_000);
    expect(estimateUiUs(edgesUs)).toBeCloseTo(3.333, 3);
  });

  it('decodes what it encodes at any rate of 270–330 kbps', () => {
    // fBitRate 270–330 kbps: USB PD R3.2 V1.1 §5.8 BMC common parameters (from memory).
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 0, max: 1 }), { minLength: 1, maxLength: 300 }), fc.integer({ min: 270_000, max: 330_000 }), (bits, bitrate) => {
        const uiUs = 1_000_000 / bitrate;
        const { edgesUs } = bmcEncode(bits, 100, uiUs);
        const decoded = bmcDecode(edgesUs, uiUs);
        expect(decoded.bits.slice(0, bits.length)).toEqual(bits);
        expect(decoded.violations).toBe(0);
        expect(decoded.startsUs[0]).toBe(100);
      }),
    );
  });
});
