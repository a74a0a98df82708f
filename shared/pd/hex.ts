/**
 * Text ↔ bytes at the codec's edge: hex as people paste it, words as firmware logs print them.
 * Wire order is little-endian (USB PD R3.2 V1.1 §6.2.1: the header and each data object are sent
 * least significant byte first).
 */
import { fail, type Result } from '../core/result.ts';

const HEX_DIGITS = '0123456789abcdef';

/** The two lower-case hex digits of every byte: a table lookup is much cheaper than toString(16) + padStart. */
const BYTE_HEX: readonly string[] = Array.from({ length: 256 }, (_, b) => HEX_DIGITS[b >> 4]! + HEX_DIGITS[b & 0xf]!);

/** Lower-case hex, no separators. */
export function toHex(bytes: Uint8Array): string {
  let out = '';
  for (let i = 0; i < bytes.length; i++) out += BYTE_HEX[bytes[i]!]!;
  return out;
}

/** `0x` + four lower-case hex digits (a header or extended header). */
export function hex16(value: number): string {
  return '0x' + BYTE_HEX[(value >>> 8) & 0xff]! + BYTE_HEX[value & 0xff]!;
}

/** `0x` + eight lower-case hex digits (a data object). */
export function hex32(value: number): string {
  return '0x' + BYTE_HEX[value >>> 24]! + BYTE_HEX[(value >>> 16) & 0xff]! + BYTE_HEX[(value >>> 8) & 0xff]! + BYTE_HEX[value & 0xff]!;
}

/**
 * Hex with or without `0x`, with spaces, colons, commas, dashes or underscores between bytes.
 * A `0x` prefix may open the text or each byte. The offset of an error is a character offset.
 */
export function parseHex(text: string): Result<{ bytes: Uint8Array }> {
  const digits: number[] = [];
  const offsets: number[] = [];
  let i = 0;
  while (i < text.length) {
    const c = text.charCodeAt(i);
    if (c === 0x30 && (text[i + 1] === 'x' || text[i + 1] === 'X')) {
      i += 2;
      continue;
    }
    const v = hexValue(c);
    if (v >= 0) {
      digits.push(v);
      offsets.push(i);
    } else if (!isSeparator(c)) {
      return fail('input.hex', `"${text[i]}" at character ${i + 1} is not a hex digit`, { offset: i });
    }
    i++;
  }
  if (digits.length === 0) return fail('input.hex', 'no hex digits were given', { offset: 0 });
  if (digits.length % 2 !== 0) {
    return fail('input.hex', `odd number of hex digits (${digits.length}): each byte needs two`, { offset: offsets[offsets.length - 1] ?? 0 });
  }
  const bytes = new Uint8Array(digits.length / 2);
  for (let b = 0; b < bytes.length; b++) bytes[b] = (digits[2 * b]! << 4) | digits[2 * b + 1]!;
  return { ok: true, bytes };
}

/**
 * Words as firmware logs print them: a 16-bit header, then 32-bit objects, each a number
 * (hex with `0x`, or hex digits alone). Returned in wire order (little-endian).
 */
export function parseWords(tokens: string[]): Result<{ bytes: Uint8Array }> {
  const words = tokens.flatMap((t) => t.split(/[\s,]+/)).filter((t) => t.length > 0);
  if (words.length === 0) return fail('input.words', 'no words were given: a 16-bit header comes first', { offset: 0 });
  const bytes = new Uint8Array(2 + 4 * (words.length - 1));
  const view = new DataView(bytes.buffer);
  for (let w = 0; w < words.length; w++) {
    const token = words[w]!;
    const digits = token.replace(/^0x/i, '').replace(/_/g, '');
    const limit = w === 0 ? 4 : 8;
    if (!/^[0-9a-f]+$/i.test(digits) || digits.length > limit) {
      const what = w === 0 ? 'the header (16 bits, at most 4 hex digits)' : `object ${w} (32 bits, at most 8 hex digits)`;
      return fail('input.words', `"${token}" is not a valid word for ${what}`, { offset: w === 0 ? 0 : 2 + 4 * (w - 1) });
    }
    const value = parseInt(digits, 16);
    if (w === 0) view.setUint16(0, value, true);
    else view.setUint32(2 + 4 * (w - 1), value, true);
  }
  return { ok: true, bytes };
}

function hexValue(c: number): number {
  if (c >= 0x30 && c <= 0x39) return c - 0x30;
  if (c >= 0x61 && c <= 0x66) return c - 0x57;
  if (c >= 0x41 && c <= 0x46) return c - 0x37;
  return -1;
}

function isSeparator(c: number): boolean {
  // space, tab, CR, LF, ',', '-', ':', '_'
  return c === 0x20 || c === 0x09 || c === 0x0d || c === 0x0a || c === 0x2c || c === 0x2d || c === 0x3a || c === 0x5f;
}
