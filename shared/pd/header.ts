/**
 * Message Header (16 bits) and Extended Message Header (16 bits).
 *
 * USB PD R3.2 V1.1 §6.2.1.1 Table 6.1 "Message Header": bit 15 Extended, 14..12 Number of Data
 * Objects, 11..9 MessageID, 8 Port Power Role (SOP) / Cable Plug (SOP'/SOP''), 7..6 Specification
 * Revision (00b 1.0, 01b 2.0, 10b 3.x, 11b Reserved), 5 Port Data Role (SOP) / Reserved
 * (SOP'/SOP''), 4..0 Message Type.
 * §6.2.1.2 Table 6.3 "Extended Message Header": bit 15 Chunked, 14..11 Chunk Number, 10 Request
 * Chunk, 9 Reserved, 8..0 Data Size (bytes).
 */
import { hex16 } from './hex.ts';
import { messageTypeCode, messageTypeName } from './message-types.ts';
import type { ExtendedHeader, MessageCategory, MessageHeader, Sop, SpecRevision } from './types.ts';

export const HEADER_EXTENDED_BIT = 15;
export const HEADER_NDO_SHIFT = 12; // 3 bits
export const HEADER_MESSAGE_ID_SHIFT = 9; // 3 bits
export const HEADER_POWER_ROLE_BIT = 8; // SOP: Port Power Role; SOP'/SOP'': Cable Plug
export const HEADER_REVISION_SHIFT = 6; // 2 bits
export const HEADER_DATA_ROLE_BIT = 5; // SOP only; reserved on SOP'/SOP''
export const HEADER_TYPE_MASK = 0x1f;
/** Bit 5 is reserved in a cable plug's header (SOP'/SOP''). */
export const HEADER_CABLE_RESERVED_MASK = 1 << HEADER_DATA_ROLE_BIT;

export const EXT_CHUNKED_BIT = 15;
export const EXT_CHUNK_NUMBER_SHIFT = 11; // 4 bits
export const EXT_REQUEST_CHUNK_BIT = 10;
/** Bit 9 of the Extended Message Header is reserved (R3.2 V1.1 Table 6.3). */
export const EXT_RESERVED_MASK = 1 << 9;
export const EXT_DATA_SIZE_MASK = 0x1ff;

const REVISIONS: readonly SpecRevision[] = ['1.0', '2.0', '3.0', 'reserved'];

/** The fields `encodeHeader` needs: a MessageHeader whose `raw` and `category` are optional. */
export interface HeaderFields {
  messageType: string;
  numDataObjects: number;
  messageId: number;
  specRevision: SpecRevision;
  extended?: boolean;
  category?: MessageCategory;
  powerRole?: 'source' | 'sink';
  dataRole?: 'dfp' | 'ufp';
  cablePlug?: boolean;
  /** Only read for `Reserved`, whose code comes from here. */
  raw?: string;
}

export function isCableSop(sop: Sop): boolean {
  return sop !== 'SOP';
}

/** Decodes a 16-bit Message Header sent on `sop`. Never throws. */
export function decodeHeader(raw: number, sop: Sop): MessageHeader {
  const extended = (raw & 0x8000) !== 0;
  const numDataObjects = (raw >> HEADER_NDO_SHIFT) & 7;
  const category: MessageCategory = extended ? 'extended' : numDataObjects === 0 ? 'control' : 'data';
  const messageType = messageTypeName(category, raw & HEADER_TYPE_MASK);
  const messageId = (raw >> HEADER_MESSAGE_ID_SHIFT) & 7;
  const specRevision = REVISIONS[(raw >> HEADER_REVISION_SHIFT) & 3]!;
  // Two literals (not one plus optional keys) keep the key order of objects.md and one object shape per form.
  if (isCableSop(sop)) {
    return { raw: hex16(raw), messageType, category, numDataObjects, messageId, specRevision, cablePlug: (raw & 0x100) !== 0, extended };
  }
  return {
    raw: hex16(raw),
    messageType,
    category,
    numDataObjects,
    messageId,
    specRevision,
    powerRole: raw & 0x100 ? 'source' : 'sink',
    dataRole: raw & 0x20 ? 'dfp' : 'ufp',
    extended,
  };
}

/**
 * Encodes a Message Header. Throws RangeError on a field out of range or an unknown type name
 * (callers with user input go through `encodeMessage`, which turns it into a Result).
 */
export function encodeHeader(h: HeaderFields): number {
  let code: number;
  const known = messageTypeCode(h.messageType);
  if (known) code = known.code;
  else if (h.messageType === 'Reserved' && h.raw !== undefined) code = parseInt(h.raw, 16) & HEADER_TYPE_MASK;
  else throw new RangeError(`messageType: "${h.messageType}" is not a message type of the specification`);
  const extended = h.extended ?? known?.category === 'extended';
  const n = h.numDataObjects;
  if (!Number.isInteger(n) || n < 0 || n > 7) throw new RangeError(`numDataObjects: ${n} is not 0–7`);
  const id = h.messageId;
  if (!Number.isInteger(id) || id < 0 || id > 7) throw new RangeError(`messageId: ${id} is not 0–7`);
  const rev = REVISIONS.indexOf(h.specRevision);
  if (rev < 0) throw new RangeError(`specRevision: "${h.specRevision}" is not 1.0, 2.0, 3.0 or reserved`);
  let raw = (extended ? 0x8000 : 0) | (n << HEADER_NDO_SHIFT) | (id << HEADER_MESSAGE_ID_SHIFT) | (rev << HEADER_REVISION_SHIFT) | code;
  if (h.cablePlug !== undefined) {
    if (h.cablePlug) raw |= 0x100;
    // A reserved bit 5 seen on decode survives the round trip.
    if (h.raw !== undefined) raw |= parseInt(h.raw, 16) & HEADER_CABLE_RESERVED_MASK;
  } else {
    if (h.powerRole === 'source') raw |= 0x100;
    if (h.dataRole === 'dfp') raw |= 0x20;
  }
  return raw;
}

export function decodeExtendedHeader(raw: number): ExtendedHeader {
  return {
    raw: hex16(raw),
    chunked: (raw & 0x8000) !== 0,
    chunkNumber: (raw >> EXT_CHUNK_NUMBER_SHIFT) & 0xf,
    requestChunk: (raw & 0x400) !== 0,
    dataSize: raw & EXT_DATA_SIZE_MASK,
  };
}

/** Throws RangeError on a field out of range. Keeps a reserved bit 9 found in `raw`. */
export function encodeExtendedHeader(e: Omit<ExtendedHeader, 'raw'> & { raw?: string }): number {
  if (!Number.isInteger(e.chunkNumber) || e.chunkNumber < 0 || e.chunkNumber > 15) throw new RangeError(`chunkNumber: ${e.chunkNumber} is not 0–15`);
  if (!Number.isInteger(e.dataSize) || e.dataSize < 0 || e.dataSize > EXT_DATA_SIZE_MASK) throw new RangeError(`dataSize: ${e.dataSize} is not 0–511 bytes`);
  const reserved = e.raw === undefined ? 0 : parseInt(e.raw, 16) & EXT_RESERVED_MASK;
  return (e.chunked ? 0x8000 : 0) | (e.chunkNumber << EXT_CHUNK_NUMBER_SHIFT) | (e.requestChunk ? 0x400 : 0) | reserved | e.dataSize;
}
