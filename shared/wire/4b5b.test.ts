import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { DATA_SYMBOLS, K_CODES, decode4b5b, decodeSymbol, encode4b5b, symbolAt } from './4b5b.ts';

describe('4b5b symbol table', () => {
  it('codes each nibble as the specification lists it', () => {
    // USB PD R3.2 V1.1 §5.3, "4b5b Symbol Encoding Table" (written b4…b0; table number from memory, values looked up).
    const table = ['11110', '01001', '10100', '10101', '01010', '01011', '01110', '01111', '10010', '10011', '10110', '10111', '11010', '11011', '11100', '11101'];
    expect(DATA_SYMBOLS.map((s) => s.toString(2).padStart(5, '0'))).toEqual(table);
  });

  it('has the six K-codes', () => {
    // USB PD R3.2 V1.1 §5.3, same table, K-code rows.
    expect(K_CODES).toEqual({ 'Sync-1': 0b11000, 'Sync-2': 0b10001, 'Sync-3': 0b00110, 'RST-1': 0b00111, 'RST-2': 0b11001, EOP: 0b01101 });
  });

  it('sends b0 first: Sync-1 (11000) goes out as 0,0,0,1,1', () => {
    // USB PD R3.2 V1.1 §5.3: bits of a symbol are transmitted least significant first.
    const bits = [0, 0, 0, 1, 1];
    expect(symbolAt(bits, 0)).toBe(K_CODES['Sync-1']);
  });

  it('sends the low nibble of a byte first', () => {
    // Byte 0x41: nibble 1 (01001) then nibble 4 (01010), each b0 first.
    expect(encode4b5b(Uint8Array.of(0x41))).toEqual([1, 0, 0, 1, 0, 0, 1, 0, 1, 0]);
  });

  it('reads the 10 unused 5-bit values as invalid', () => {
    const invalid = [0b00000, 0b00001, 0b00010, 0b00011, 0b00100, 0b00101, 0b01000, 0b01100, 0b10000, 0b11111];
    for (const value of invalid) expect(decodeSymbol(value)).toEqual({ kind: 'invalid' });
    expect(decodeSymbol(0b01101)).toEqual({ kind: 'k', name: 'EOP' });
    expect(decodeSymbol(0b11110)).toEqual({ kind: 'data', nibble: 0 });
  });

  it('round-trips any bytes and stops at the first non-data symbol', () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 64 }), (bytes) => {
        const bits = [...encode4b5b(bytes), 1, 0, 1, 1, 0]; // EOP follows
        const { bytes: back, endOffset } = decode4b5b(bits);
        expect([...back]).toEqual([...bytes]);
        expect(endOffset).toBe(bytes.length * 10);
      }),
    );
  });
});
