/**
 * Range guards for the writers: each turns a field in its unit into the specification's count of
 * units, or throws a RangeError naming the field. `encodeMessage` catches these and returns them
 * as `encode.range` errors with the object's path; the fast writers let them escape (a programming
 * error in the simulator should be loud). No allocation on the good path.
 */

/** `value` (e.g. mV) as a count of `step` (e.g. 50 mV) that fits in `bits`. */
export function units(value: unknown, step: number, bits: number, name: string, unit: string): number {
  if (typeof value !== 'number' || !Number.isInteger(value)) throw new RangeError(`${name}: ${String(value)} is not an integer number of ${unit}`);
  const count = value / step;
  const max = 2 ** bits - 1;
  if (!Number.isInteger(count)) throw new RangeError(`${name}: ${value} ${unit} is not a multiple of ${step} ${unit}`);
  if (count < 0 || count > max) throw new RangeError(`${name}: ${value} ${unit} is outside 0–${max * step} ${unit}`);
  return count;
}

/** A small code field (0…2^bits − 1). */
export function code(value: unknown, bits: number, name: string): number {
  const max = 2 ** bits - 1;
  if (typeof value !== 'number' || !Number.isInteger(value) || value < 0 || value > max) throw new RangeError(`${name}: ${String(value)} is not an integer 0–${max}`);
  return value;
}

/** A bit flag: must be a boolean. */
export function flag(value: unknown, name: string): number {
  if (typeof value !== 'boolean') throw new RangeError(`${name}: ${String(value)} is not true or false`);
  return value ? 1 : 0;
}

/** The reserved bits of an optional `raw` ("0x…") to carry through an encode; 0 without one. */
export function keptReserved(raw: unknown, reservedMask: number): number {
  if (typeof raw !== 'string') return 0;
  const value = parseInt(raw, 16);
  return Number.isNaN(value) ? 0 : (value & reservedMask) >>> 0;
}

/** Parses a `raw` "0x…" of at most 8 hex digits; throws RangeError otherwise. */
export function rawWord(raw: unknown, name: string): number {
  if (typeof raw !== 'string' || !/^(0x)?[0-9a-f]{1,8}$/i.test(raw)) throw new RangeError(`${name}: ${String(raw)} is not a 32-bit hex word like "0x0001912c"`);
  return parseInt(raw, 16) >>> 0;
}
