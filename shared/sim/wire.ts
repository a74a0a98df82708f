/**
 * What the simulator puts on the CC wire: the 16-bit message header, the extended header,
 * wire-order hex, and how long a packet occupies the line. Kept here (bit packing) so the hot path
 * builds a header without allocating a decoded form; shared/pd decodes the result for people.
 *
 * Header layout: USB PD R3.2 V1.1 §6.2.1.1, Table 6.1 "Message Header": b15 Extended, b14..12
 * Number of Data Objects, b11..9 MessageID, b8 Port Power Role (SOP) or Cable Plug (SOP': 1 =
 * from a cable plug), b7..6 Specification Revision (00b 1.0, 01b 2.0, 10b 3.x), b5 Port Data Role
 * (SOP: 1 = DFP; reserved on SOP'), b4..0 type.
 * Extended header: §6.2.1.2, Table 6.3: b15 Chunked, b14..11 Chunk Number, b10 Request Chunk,
 * b8..0 Data Size (bytes of the whole block).
 */
import { CONTROL_TYPES, DATA_TYPES, EXTENDED_TYPES } from '../pd/message-types.ts';
import type { Side } from './types.ts';

/** The message types the simulated ports speak, by category; their codes come from the codec's tables (shared/pd/message-types.ts). */
const CONTROL_SPOKEN = [
  'GoodCRC',
  'Accept',
  'Reject',
  'PS_RDY',
  'Get_Source_Cap',
  'Get_Sink_Cap',
  'DR_Swap',
  'PR_Swap',
  'VCONN_Swap',
  'Wait',
  'Soft_Reset',
  'Not_Supported',
  'Get_Source_Cap_Extended',
  'Get_Status',
  'Get_PPS_Status',
] as const;
const DATA_SPOKEN = ['Source_Capabilities', 'Request', 'Sink_Capabilities', 'Alert', 'EPR_Request', 'EPR_Mode', 'Vendor_Defined'] as const;
const EXTENDED_SPOKEN = ['Source_Capabilities_Extended', 'Status', 'PPS_Status', 'Extended_Control', 'EPR_Source_Capabilities'] as const;

/** Name → 5-bit code from a codec table (index = code); a name the table lacks is a programming error. */
function codesOf<N extends string>(table: readonly (string | undefined)[], names: readonly N[]): Record<N, number> {
  const codes = {} as Record<N, number>;
  for (const name of names) {
    const code = table.indexOf(name);
    if (code < 0) throw new Error(`${name} is not in the codec's message type table`);
    codes[name] = code;
  }
  return codes;
}

export const controlCodes = codesOf(CONTROL_TYPES, CONTROL_SPOKEN);
export const dataCodes = codesOf(DATA_TYPES, DATA_SPOKEN);
export const extendedCodes = codesOf(EXTENDED_TYPES, EXTENDED_SPOKEN);

export type ControlType = keyof typeof controlCodes;
export type DataType = keyof typeof dataCodes;
export type ExtendedType = keyof typeof extendedCodes;
export type MessageType = ControlType | DataType | ExtendedType;

export type Revision = '2.0' | '3.0';
export type Sop = 'SOP' | "SOP'";
/** Who transmits: one of the two ports or the cable plug (on SOP'). */
export type Sender = Side | 'cable';

export function isDataType(type: MessageType): type is DataType {
  return type in dataCodes;
}
export function isExtendedType(type: MessageType): type is ExtendedType {
  return type in extendedCodes;
}

function codeOf(type: MessageType): number {
  return (controlCodes as Record<string, number>)[type] ?? (dataCodes as Record<string, number>)[type] ?? (extendedCodes as Record<string, number>)[type] ?? 0;
}

export interface HeaderBits {
  /** SOP: the sender is the source (Port Power Role); SOP': the sender is the cable plug. */
  roleBit: boolean;
  /** SOP: the sender is the DFP (Port Data Role); always false on SOP'. */
  dfp: boolean;
}

/** Packs a message header. */
export function packHeader(type: MessageType, objectCount: number, messageId: number, bits: HeaderBits, revision: Revision): number {
  const revisionBits = revision === '2.0' ? 0b01 : 0b10;
  return (
    (isExtendedType(type) ? 0x8000 : 0) |
    ((objectCount & 0b111) << 12) |
    ((messageId & 0b111) << 9) |
    ((bits.roleBit ? 1 : 0) << 8) |
    (revisionBits << 6) |
    ((bits.dfp ? 1 : 0) << 5) |
    (codeOf(type) & 0b1_1111)
  );
}

/** The largest chunk of an extended message's data block: 26 bytes (MaxExtendedMsgChunkLen, §6.13). */
export const MAX_CHUNK_BYTES = 26;

export function packExtendedHeader(chunked: boolean, chunkNumber: number, requestChunk: boolean, dataSize: number): number {
  return ((chunked ? 1 : 0) << 15) | ((chunkNumber & 0xf) << 11) | ((requestChunk ? 1 : 0) << 10) | (dataSize & 0x1ff);
}

export function unpackExtendedHeader(word0: number): { chunked: boolean; chunkNumber: number; requestChunk: boolean; dataSize: number } {
  const header = word0 & 0xffff;
  return { chunked: (header & 0x8000) !== 0, chunkNumber: (header >>> 11) & 0xf, requestChunk: (header & 0x400) !== 0, dataSize: header & 0x1ff };
}

/**
 * The 32-bit objects of an extended message's body as they go on the wire: the extended header,
 * then `bytes`, padded with zeros to a 4-byte boundary (§6.2.1.2.2 Padding).
 */
export function extendedObjects(extendedHeader: number, bytes: readonly number[]): number[] {
  const all = [extendedHeader & 0xff, (extendedHeader >>> 8) & 0xff, ...bytes];
  while (all.length % 4 !== 0) all.push(0);
  const words: number[] = [];
  for (let i = 0; i < all.length; i += 4) words.push((all[i]! | (all[i + 1]! << 8) | (all[i + 2]! << 16) | (all[i + 3]! << 24)) >>> 0);
  return words;
}

/** The data bytes of an extended message body (after the 2-byte extended header), `count` of them. */
export function extendedBytes(objects: readonly number[], count: number): number[] {
  const bytes: number[] = [];
  for (let i = 2; i < 2 + count; i++) bytes.push(((objects[i >>> 2] ?? 0) >>> ((i & 3) * 8)) & 0xff);
  return bytes;
}

/** 32-bit words as little-endian bytes (a PDO list as an extended data block). */
export function wordsToBytes(words: readonly number[]): number[] {
  const bytes: number[] = [];
  for (const word of words) bytes.push(word & 0xff, (word >>> 8) & 0xff, (word >>> 16) & 0xff, (word >>> 24) & 0xff);
  return bytes;
}

export function bytesToWords(bytes: readonly number[]): number[] {
  const words: number[] = [];
  for (let i = 0; i + 3 < bytes.length; i += 4) words.push((bytes[i]! | (bytes[i + 1]! << 8) | (bytes[i + 2]! << 16) | (bytes[i + 3]! << 24)) >>> 0);
  return words;
}

const HEX = Array.from({ length: 256 }, (_, byte) => byte.toString(16).padStart(2, '0'));

/** Wire-order hex (little-endian header, then each 32-bit object little-endian), lower-case. */
export function frameHex(header: number, objects: readonly number[]): string {
  let hex = HEX[header & 0xff]! + HEX[(header >>> 8) & 0xff]!;
  for (const word of objects) {
    hex += HEX[word & 0xff]! + HEX[(word >>> 8) & 0xff]! + HEX[(word >>> 16) & 0xff]! + HEX[(word >>> 24) & 0xff]!;
  }
  return hex;
}

/** Wire-order bytes of the same frame (for the codec's decoder). */
export function frameBytes(header: number, objects: readonly number[]): Uint8Array {
  const bytes = new Uint8Array(2 + 4 * objects.length);
  const view = new DataView(bytes.buffer);
  view.setUint16(0, header, true);
  for (let index = 0; index < objects.length; index++) view.setUint32(2 + 4 * index, objects[index]! >>> 0, true);
  return bytes;
}

/**
 * Packet length on the line at the nominal 300 kbit/s (USB PD R3.2 V1.1 §5.8.1, fBitRate
 * 270–330 kbit/s): preamble 64 bits, SOP* 4 K-codes (20 bits), then 4b5b symbols — header
 * 16 → 20 bits, each object 32 → 40 bits, CRC-32 → 40 bits — and EOP (5 bits) (§5.6, Figure 5.x
 * "USB Power Delivery Packet Format").
 */
export function packetDurationUs(objectCount: number): number {
  const bits = 64 + 20 + 20 + 40 * objectCount + 40 + 5;
  return Math.round((bits * 10) / 3);
}

/** Hard Reset signalling: preamble then the 4 K-codes of the Hard Reset ordered set (§5.6.4). */
export const HARD_RESET_DURATION_US = Math.round(((64 + 20) * 10) / 3);
