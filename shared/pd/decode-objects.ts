/**
 * The data objects of a Data Message, read by the message type (USB PD R3.2 V1.1 §6.4): which
 * object form each position holds, and the reserved-bit and object-position checks.
 */
import type { Finding } from '../core/finding.ts';
import { decodeFinding } from './findings.ts';
import { hex32 } from './hex.ts';
import { reservedMask } from './layout.ts';
import { otherLayout } from './layouts-other.ts';
import { decodeOtherObject } from './other-objects.ts';
import { decodeRdo, RDO_RESERVED_MASKS } from './rdo.ts';
import { decodeSinkPdo, SINK_RESERVED_MASKS } from './sink-pdo.ts';
import { decodeSourcePdo, SOURCE_RESERVED_MASKS } from './source-pdo.ts';
import type { DataObject, Sop } from './types.ts';
import { vdmObjectKinds } from './vdm-objects.ts';

const SINGLE_FORM: Record<string, string> = {
  Battery_Status: 'battery-status',
  Alert: 'alert',
  Get_Country_Info: 'country-code',
  Enter_USB: 'enter-usb',
  EPR_Mode: 'epr-mode',
  Source_Info: 'source-info',
  Revision: 'revision',
};

/** A referenced offer for typing an RDO: any object with a `kind`. */
export type OfferLike = { kind: string };

/** `sop` tells a cable plug's Discover Identity response (SOP'/SOP'') from a port partner's (SOP). */
export function decodeObjects(messageType: string, words: ArrayLike<number>, caps: readonly OfferLike[] | undefined, warnings: Finding[], sop: Sop = 'SOP'): DataObject[] {
  const objects: DataObject[] = new Array(words.length);
  if (messageType === 'Vendor_Defined') {
    const kinds = vdmObjectKinds(words, sop);
    for (let i = 0; i < words.length; i++) {
      const raw = words[i]! >>> 0;
      const kind = kinds[i];
      objects[i] = kind ? other(kind, raw, i + 1, warnings) : { kind: 'raw', raw: hex32(raw) };
    }
    return objects;
  }
  for (let i = 0; i < words.length; i++) {
    const raw = words[i]! >>> 0;
    objects[i] = decodeOne(messageType, i, raw, words, caps, warnings);
  }
  return objects;
}

function decodeOne(type: string, i: number, raw: number, words: ArrayLike<number>, caps: readonly OfferLike[] | undefined, warnings: Finding[]): DataObject {
  const position = i + 1;
  switch (type) {
    case 'Source_Capabilities': {
      const pdo = decodeSourcePdo(raw);
      if (pdo.kind !== 'raw') checkReserved(raw, SOURCE_RESERVED_MASKS[pdo.kind], position, `source ${pdo.kind} PDO`, warnings);
      return pdo;
    }
    case 'Sink_Capabilities': {
      const pdo = decodeSinkPdo(raw);
      if (pdo.kind !== 'raw') checkReserved(raw, SINK_RESERVED_MASKS[pdo.kind], position, `sink ${pdo.kind} PDO`, warnings);
      return pdo;
    }
    case 'Request':
    case 'EPR_Request': {
      if (i > 0) {
        // EPR_Request: the copy of the requested PDO follows the RDO (§6.4.9).
        const pdo = decodeSourcePdo(raw);
        if (pdo.kind !== 'raw') checkReserved(raw, SOURCE_RESERVED_MASKS[pdo.kind], position, `source ${pdo.kind} PDO (copy)`, warnings);
        return pdo;
      }
      return decodeRequestRdo(type, raw, words, caps, warnings);
    }
    case 'BIST':
      return i === 0 ? other('bist', raw, position, warnings) : { kind: 'raw', raw: hex32(raw) };
    default: {
      const kind = SINGLE_FORM[type];
      return kind && i === 0 ? other(kind, raw, position, warnings) : { kind: 'raw', raw: hex32(raw) };
    }
  }
}

function decodeRequestRdo(type: string, raw: number, words: ArrayLike<number>, caps: readonly OfferLike[] | undefined, warnings: Finding[]): DataObject {
  const position = (raw >>> 28) & 0xf;
  const epr = type === 'EPR_Request';
  const maxPosition = epr ? 13 : 7;
  if (position === 0 || position > maxPosition) {
    warnings.push(
      decodeFinding('decode.object-position', `The Request names object position ${position}, which is reserved${epr ? '' : ' outside an EPR_Request (positions 1–7 here)'}.`, { object: 1 }),
    );
  }
  let referenced: OfferLike | undefined;
  if (epr && words.length > 1) referenced = decodeSourcePdo(words[1]! >>> 0);
  else if (caps) referenced = caps[position - 1];
  if (referenced?.kind === 'raw') referenced = undefined;
  const rdo = decodeRdo(raw, referenced);
  if (rdo.kind === 'rdo') {
    const why = caps ? `the offers given have no object at position ${position}` : 'the Source_Capabilities it refers to were not given';
    warnings.push(decodeFinding('decode.rdo-unknown-type', `The request's type is unknown because ${why}; it is shown as a fixed-supply request.`, { object: 1 }));
  }
  const mask = rdo.kind === 'rdo-pps' || rdo.kind === 'rdo-avs' ? RDO_RESERVED_MASKS.programmable : RDO_RESERVED_MASKS.fixed;
  checkReserved(raw, mask, 1, 'RDO', warnings);
  return rdo;
}

function other(kind: string, raw: number, position: number, warnings: Finding[]): DataObject {
  const object = decodeOtherObject(kind, raw);
  const layout = otherLayout(kind, raw);
  if (layout) checkReserved(raw, reservedMask(layout), position, layout.title, warnings);
  return object;
}

function checkReserved(raw: number, mask: number, position: number, what: string, warnings: Finding[]): void {
  const set = (raw & mask) >>> 0;
  if (set !== 0) warnings.push(decodeFinding('decode.reserved-bits', `Object ${position} (${what}) has reserved bits set (${hex32(set)}); they should be zero.`, { object: position }));
}
