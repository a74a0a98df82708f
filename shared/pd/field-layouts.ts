/**
 * The builders every layout table (layouts-power.ts, layouts-vdo.ts, layouts-other.ts) writes its
 * fields with: one definition of each field shape, so a table reads as the specification's table
 * does (bits, name, label, unit).
 */
import type { FieldLayout, WordLayout } from './layout.ts';

/** Reserved bits hi…lo (shall be zero). */
export const reservedBits = (hi: number, lo: number): FieldLayout => ({ name: 'reserved', hi, lo, type: 'reserved', label: 'Reserved' });

/** One flag bit; `inverted` where the specification says "0b = supported". */
export const flagBit = (bit: number, name: string, label: string, inverted = false): FieldLayout => ({ name, hi: bit, lo: bit, type: 'flag', label, ...(inverted ? { inverted } : {}) });

/** An unsigned count in bits hi…lo; the value is count × `scale` in `unit`. */
export const uintBits = (hi: number, lo: number, name: string, label: string, scale?: number, unit?: string): FieldLayout => ({
  name,
  hi,
  lo,
  type: 'uint',
  label,
  ...(scale === undefined ? {} : { scale }),
  ...(unit ? { unit } : {}),
});

/** Named codes in bits hi…lo; a code not listed reads as its number. */
export const enumBits = (hi: number, lo: number, name: string, label: string, values: Record<number, string>): FieldLayout => ({ name, hi, lo, type: 'enum', label, values });

/** The tag bits that say which object this is (e.g. 11b = APDO). */
export const typeTag = (hi: number, lo: number, value: number, label: string): FieldLayout => ({ name: 'type', hi, lo, type: 'const', value, label });

/** A 32-bit data object's layout. */
export const word32 = (kind: string, title: string, ref: string, fields: readonly FieldLayout[]): WordLayout => ({ kind, title, ref, bits: 32, fields });
