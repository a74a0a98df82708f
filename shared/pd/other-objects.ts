/**
 * Reader/writer for the data objects laid out in layouts-other.ts (BIST, Alert, Battery_Status,
 * Get_Country_Info, Enter_USB, EPR_Mode, Source_Info, Revision, VDM headers), and `raw` objects.
 */
import { keptReserved, rawWord } from './guards.ts';
import { hex32 } from './hex.ts';
import { decodeFields, encodeFields } from './layout.ts';
import { otherLayout, VDM_STRUCTURED_LAYOUT, VDM_UNSTRUCTURED_LAYOUT } from './layouts-other.ts';
import { reservedMask } from './layout.ts';
import type { OtherObject } from './types.ts';

/** Decodes `raw` as an object of `kind` (`raw` for an unknown kind). Never throws. */
export function decodeOtherObject(kind: string, raw: number): OtherObject {
  raw >>>= 0;
  const layout = otherLayout(kind, raw);
  const object: OtherObject = { kind: layout ? kind : 'raw', raw: hex32(raw) };
  if (layout) decodeFields(raw, layout, object);
  return object;
}

/** Encodes an object of a layout kind (or `raw`), keeping reserved bits of `raw`. Throws RangeError. */
export function encodeOtherObject(object: OtherObject): number {
  if (object.kind === 'raw') return rawWord(object.raw, 'raw');
  const layout =
    object.kind === 'vdm-header'
      ? object.structured === true
        ? VDM_STRUCTURED_LAYOUT
        : VDM_UNSTRUCTURED_LAYOUT
      : otherLayout(object.kind, 0);
  if (!layout) throw new RangeError(`kind: "${object.kind}" is not a data object kind of this message`);
  return (encodeFields(object, layout) | keptReserved(object.raw, reservedMask(layout))) >>> 0;
}
