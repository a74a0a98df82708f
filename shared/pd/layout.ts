/**
 * Bit layouts: a word described field by field (bits hi…lo, type, unit, the specification's name
 * and table). They drive the bit-field view of the UI, the reserved-bit checks, and the generic
 * reader/writer used for the less common objects (BIST, Alert, VDM header, …). The hot paths
 * (headers, PDOs, RDOs) have hand-written readers that tests check against these layouts.
 */
import { code, flag, units } from './guards.ts';

export type FieldType = 'uint' | 'flag' | 'enum' | 'ascii' | 'const' | 'reserved';

export interface FieldLayout {
  /** Decoded field name (camelCase; `type` for a const tag, `reserved` for reserved bits). */
  name: string;
  hi: number;
  lo: number;
  type: FieldType;
  /** The specification's name of the field. */
  label: string;
  /** uint: the value is count × scale in `unit`. */
  scale?: number;
  unit?: string;
  /** enum: code → name; codes not listed decode to their number. */
  values?: Readonly<Record<number, string>>;
  /** const: the value of the tag bits. */
  value?: number;
  /** flag: the bit is 0 when the field is true (the specification's "0b = supported" fields). */
  inverted?: boolean;
}

export interface WordLayout {
  /** `kind` of the decoded object, or `header` / `extended-header`. */
  kind: string;
  title: string;
  /** Specification revision, section and table. */
  ref: string;
  bits: 16 | 32;
  fields: readonly FieldLayout[];
}

export function fieldMask(f: FieldLayout): number {
  const width = f.hi - f.lo + 1;
  return width >= 32 ? 0xffff_ffff : (((1 << width) - 1) << f.lo) >>> 0;
}

/** Mask of the layout's reserved bits. */
export function reservedMask(layout: WordLayout): number {
  let mask = 0;
  for (const f of layout.fields) if (f.type === 'reserved') mask |= fieldMask(f);
  return mask >>> 0;
}

/** The raw count in a field. */
export function fieldCount(raw: number, f: FieldLayout): number {
  return ((raw >>> 0) & fieldMask(f)) >>> f.lo;
}

/** The decoded value of one field (number in its unit, boolean, enum name or string). */
export function fieldValue(raw: number, f: FieldLayout): number | boolean | string {
  const count = fieldCount(raw, f);
  switch (f.type) {
    case 'flag':
      return f.inverted ? count === 0 : count === 1;
    case 'enum':
      return f.values?.[count] ?? count;
    case 'ascii': {
      let text = '';
      for (let shift = f.hi - 7; shift >= f.lo; shift -= 8) text += String.fromCharCode((raw >>> shift) & 0xff);
      return text;
    }
    default:
      return count * (f.scale ?? 1);
  }
}

/** Reads every named field of a layout into an object (`kind`, `raw` are the caller's). */
export function decodeFields(raw: number, layout: WordLayout, into: Record<string, unknown>): void {
  for (const f of layout.fields) {
    if (f.type === 'reserved' || f.type === 'const') continue;
    into[f.name] = fieldValue(raw, f);
  }
}

/** Writes every field of a layout from an object; throws RangeError naming a bad field. */
export function encodeFields(object: Record<string, unknown>, layout: WordLayout): number {
  let raw = 0;
  for (const f of layout.fields) {
    const width = f.hi - f.lo + 1;
    let count: number;
    switch (f.type) {
      case 'reserved':
        continue;
      case 'const':
        count = f.value ?? 0;
        break;
      case 'flag':
        count = flag(object[f.name], f.name) ^ (f.inverted ? 1 : 0);
        break;
      case 'enum':
        count = enumCount(object[f.name], f, width);
        break;
      case 'ascii':
        count = asciiCount(object[f.name], f, width);
        break;
      default:
        count = units(object[f.name], f.scale ?? 1, width, f.name, f.unit ?? 'units');
    }
    raw |= count << f.lo;
  }
  return raw >>> 0;
}

function enumCount(value: unknown, f: FieldLayout, width: number): number {
  if (typeof value === 'string' && f.values) {
    for (const [key, name] of Object.entries(f.values)) if (name === value) return Number(key);
    throw new RangeError(`${f.name}: "${value}" is not one of ${Object.values(f.values).join(', ')}`);
  }
  return code(value, width, f.name);
}

function asciiCount(value: unknown, f: FieldLayout, width: number): number {
  const chars = width / 8;
  // Any byte is kept (a malformed code still round-trips); people write two letters, e.g. "US".
  if (typeof value !== 'string' || value.length !== chars || !/^[\x00-\xff]*$/.test(value)) throw new RangeError(`${f.name}: ${JSON.stringify(value)} is not ${chars} ASCII characters`);
  let count = 0;
  for (let i = 0; i < chars; i++) count = (count << 8) | value.charCodeAt(i);
  return count >>> 0;
}
