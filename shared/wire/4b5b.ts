/**
 * 4b5b line code of USB PD (R3.2 §5.3, Table 5-1 "4b5b Symbol Encoding Table"): every nibble of
 * the packet after the preamble becomes a 5-bit symbol; six more 5-bit codes are K-codes used in
 * ordered sets and EOP. The table writes a symbol as b4…b0; b0 is transmitted first (§5.3), so the
 * numbers below are the symbol's value with bit 0 = the first bit on the wire.
 */

/** 5-bit symbol of each data nibble 0x0…0xF. */
export const DATA_SYMBOLS: readonly number[] = [0b11110, 0b01001, 0b10100, 0b10101, 0b01010, 0b01011, 0b01110, 0b01111, 0b10010, 0b10011, 0b10110, 0b10111, 0b11010, 0b11011, 0b11100, 0b11101];

/** The K-codes (Table 5-1, lower part). */
export const K_CODES = {
  'Sync-1': 0b11000,
  'Sync-2': 0b10001,
  'Sync-3': 0b00110,
  'RST-1': 0b00111,
  'RST-2': 0b11001,
  EOP: 0b01101,
} as const;

export type KCodeName = keyof typeof K_CODES;

export type Symbol5 = { kind: 'data'; nibble: number } | { kind: 'k'; name: KCodeName } | { kind: 'invalid' };

const DECODE: readonly Symbol5[] = (() => {
  const table: Symbol5[] = Array.from({ length: 32 }, () => ({ kind: 'invalid' }) as Symbol5);
  for (const [nibble, symbol] of DATA_SYMBOLS.entries()) table[symbol] = { kind: 'data', nibble };
  for (const [name, symbol] of Object.entries(K_CODES)) table[symbol] = { kind: 'k', name: name as KCodeName };
  return table;
})();

/** Reads one 5-bit symbol (bit 0 = first on the wire). */
export function decodeSymbol(symbol: number): Symbol5 {
  return DECODE[symbol & 0b11111] ?? { kind: 'invalid' };
}

/** Pushes a 5-bit symbol's bits in wire order (b0 first). */
export function pushSymbolBits(bits: number[], symbol: number): void {
  for (let i = 0; i < 5; i++) bits.push((symbol >> i) & 1);
}

/** Bytes → wire bits, each byte as two symbols, low nibble first (§5.3, §5.6: least significant first). */
export function encode4b5b(bytes: Uint8Array): number[] {
  const bits: number[] = [];
  for (const byte of bytes) {
    pushSymbolBits(bits, DATA_SYMBOLS[byte & 0xf]!);
    pushSymbolBits(bits, DATA_SYMBOLS[byte >> 4]!);
  }
  return bits;
}

/** The 5-bit value at `offset` in a wire-order bit array (bit 0 = first bit), or -1 past the end. */
export function symbolAt(bits: ArrayLike<number>, offset: number): number {
  if (offset + 5 > bits.length) return -1;
  let value = 0;
  for (let i = 0; i < 5; i++) value |= (bits[offset + i]! & 1) << i;
  return value;
}

/**
 * Wire bits → bytes, the inverse of encode4b5b. Stops at a symbol that is not data; returns the
 * bytes and the bit offset where it stopped (an odd trailing nibble is dropped).
 */
export function decode4b5b(bits: ArrayLike<number>, offset = 0): { bytes: Uint8Array; endOffset: number } {
  const out: number[] = [];
  let at = offset;
  for (;;) {
    const lo = decodeSymbol(symbolAt(bits, at));
    const hi = decodeSymbol(symbolAt(bits, at + 5));
    if (symbolAt(bits, at + 5) < 0 || lo.kind !== 'data' || hi.kind !== 'data') break;
    out.push(lo.nibble | (hi.nibble << 4));
    at += 10;
  }
  return { bytes: Uint8Array.from(out), endOffset: at };
}
