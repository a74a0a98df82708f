import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { hex16, hex32, parseHex, parseWords, toHex } from './hex.ts';

describe('parseHex', () => {
  it('reads hex with or without 0x, spaces, colons', () => {
    for (const text of ['a161 2c91 0108', '0xa1612c910108', 'a1:61:2c:91:01:08', '0xa1 0x61 0x2c 0x91 0x01 0x08', 'A1612C910108']) {
      const r = parseHex(text);
      expect(r.ok && toHex(r.bytes)).toBe('a1612c910108');
    }
  });
  it('fails with the offset of a bad character', () => {
    expect(parseHex('a16z')).toMatchObject({ ok: false, error: { code: 'input.hex', offset: 3 } });
  });
  it('fails on an odd number of digits and on empty input', () => {
    expect(parseHex('a16')).toMatchObject({ ok: false, error: { code: 'input.hex' } });
    expect(parseHex('  ')).toMatchObject({ ok: false, error: { code: 'input.hex', offset: 0 } });
  });
});

describe('parseWords', () => {
  // Wire order is little-endian: USB PD R3.2 V1.1 §6.2.1 (from memory: "least significant byte first").
  it('turns a 16-bit header and 32-bit objects into wire-order bytes', () => {
    const r = parseWords(['0x1082', '0x1304b12c']);
    expect(r.ok && toHex(r.bytes)).toBe('82102cb10413');
  });
  it('accepts one token with spaces or commas', () => {
    const r = parseWords(['61a1 0801912c,0002d12c']);
    expect(r.ok && toHex(r.bytes)).toBe('a1612c9101082cd10200');
  });
  it('fails on a header wider than 16 bits, with the byte offset', () => {
    expect(parseWords(['0x1ffff'])).toMatchObject({ ok: false, error: { code: 'input.words', offset: 0 } });
    expect(parseWords(['0x1082', 'xyz'])).toMatchObject({ ok: false, error: { code: 'input.words', offset: 2 } });
  });
});

describe('hex16/hex32', () => {
  it('pads to 4 and 8 lower-case digits', () => {
    expect(hex16(0x1a)).toBe('0x001a');
    expect(hex32(0xc0dc_213c)).toBe('0xc0dc213c');
    expect(hex32(-1)).toBe('0xffffffff');
  });
});

describe('hex16 / hex32 / toHex (byte table)', () => {
  // The table must give exactly what toString(16) + padStart gave before: decoded output stays identical.
  it('match the arithmetic form on any 32-bit value and any bytes', () => {
    fc.assert(
      fc.property(fc.integer({ min: -(2 ** 31), max: 2 ** 32 - 1 }), (value) => {
        expect(hex32(value)).toBe('0x' + (value >>> 0).toString(16).padStart(8, '0'));
        expect(hex16(value)).toBe('0x' + (value & 0xffff).toString(16).padStart(4, '0'));
      }),
    );
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 40 }), (bytes) => {
        expect(toHex(bytes)).toBe([...bytes].map((b) => b.toString(16).padStart(2, '0')).join(''));
      }),
    );
  });
});
