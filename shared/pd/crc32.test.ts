import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import CRC32 from 'crc-32';
import { crc32, crc32Bytes } from './crc32.ts';

describe('crc32', () => {
  it('matches the specification example: GoodCRC header 01 01 → 0x2FC51328, sent 28 13 C5 2F', () => {
    // USB PD R3.2 V1.1 Appendix A (CRC calculation example, GoodCRC message header 0x0101).
    expect(crc32(Uint8Array.of(0x01, 0x01))).toBe(0x2fc5_1328);
    expect([...crc32Bytes(Uint8Array.of(0x01, 0x01))]).toEqual([0x28, 0x13, 0xc5, 0x2f]);
  });

  it('is 0 for no data (init 0xFFFFFFFF, final inversion; same as npm crc-32)', () => {
    expect(crc32(new Uint8Array(0))).toBe(CRC32.buf(new Uint8Array(0)) >>> 0);
  });

  it('agrees with the npm crc-32 package on random data', () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 300 }), (data) => {
        expect(crc32(data)).toBe(CRC32.buf(data) >>> 0);
      }),
      { numRuns: 500 },
    );
  });
});
