/**
 * Reader/writer for the data objects laid out in layouts-other.ts (BIST, Alert, Battery_Status,
 * Get_Country_Info, Enter_USB, EPR_Mode, Source_Info, Revision, VDM headers, the VDOs of Discover
 * Identity and Discover SVIDs responses), and `raw` objects.
 */
import { keptReserved, rawWord } from './guards.ts';
import { hex32 } from './hex.ts';
import { decodeFields, encodeFields } from './layout.ts';
import { otherLayout, VDM_STRUCTURED_LAYOUT, VDM_UNSTRUCTURED_LAYOUT } from './layouts-other.ts';
import { reservedMask } from './layout.ts';
import { MAX_VBUS_VOLTAGE_MV, VBUS_CURRENT_MA } from './layouts-vdo.ts';
import type { OtherObject } from './types.ts';

/** Cable and VPD VDOs also carry their limits as numbers (read-only: encoding reads the coded fields). */
function addCableLimits(object: OtherObject, raw: number): void {
  if (object.kind === 'passive-cable' || object.kind === 'active-cable-1') {
    object.maxVbusVoltageMv = MAX_VBUS_VOLTAGE_MV[(raw >>> 9) & 3]!;
    // 00b is the USB Type-C default current on an active cable and reserved on a passive one: no number is said.
    object.vbusCurrentMa = VBUS_CURRENT_MA[(raw >>> 5) & 3] ?? null;
  } else if (object.kind === 'vpd') {
    object.maxVbusVoltageMv = MAX_VBUS_VOLTAGE_MV[(raw >>> 15) & 3]!;
    object.chargeThroughCurrentMa = raw & 0x4000 ? 5_000 : 3_000;
  }
}

/** Decodes `raw` as an object of `kind` (`raw` for an unknown kind). Never throws. */
export function decodeOtherObject(kind: string, raw: number): OtherObject {
  raw >>>= 0;
  const layout = otherLayout(kind, raw);
  const object: OtherObject = { kind: layout ? kind : 'raw', raw: hex32(raw) };
  if (layout) {
    decodeFields(raw, layout, object);
    addCableLimits(object, raw);
  }
  return object;
}

/** Encodes an object of a layout kind (or `raw`), keeping reserved bits of `raw`. Throws RangeError. */
export function encodeOtherObject(object: OtherObject): number {
  if (object.kind === 'raw') return rawWord(object.raw, 'raw');
  const layout = object.kind === 'vdm-header' ? (object.structured === true ? VDM_STRUCTURED_LAYOUT : VDM_UNSTRUCTURED_LAYOUT) : otherLayout(object.kind, 0);
  if (!layout) throw new RangeError(`kind: "${object.kind}" is not a data object kind of this message`);
  return (encodeFields(object, layout) | keptReserved(object.raw, reservedMask(layout))) >>> 0;
}
