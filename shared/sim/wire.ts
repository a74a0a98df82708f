/**
 * What the simulator puts on the CC wire: the 16-bit message header, wire-order hex, and how long a
 * packet occupies the line. Kept here (a dozen lines of bit packing) so the hot path builds a
 * header without allocating a decoded form; shared/pd decodes the result for people.
 *
 * Header layout: USB PD R3.2 V1.1 §6.2.1.1, Table 6.1 "Message Header": b15 Extended, b14..12
 * Number of Data Objects, b11..9 MessageID, b8 Port Power Role (SOP: 1 = Source), b7..6
 * Specification Revision (00b 1.0, 01b 2.0, 10b 3.x), b5 Port Data Role (1 = DFP), b4..0 type.
 */
import type { Side } from './types.ts';

/** Control message codes: USB PD R3.2 V1.1 §6.3, Table 6.5 "Control Message Types". */
export const controlCodes = {
  GoodCRC: 0x01,
  Accept: 0x03,
  Reject: 0x04,
  PS_RDY: 0x06,
  Get_Source_Cap: 0x07,
  Wait: 0x0c,
  Soft_Reset: 0x0d,
  Not_Supported: 0x10,
} as const;

/** Data message codes: USB PD R3.2 V1.1 §6.4, Table 6.6 "Data Message Types". */
export const dataCodes = {
  Source_Capabilities: 0x01,
  Request: 0x02,
} as const;

export type ControlType = keyof typeof controlCodes;
export type DataType = keyof typeof dataCodes;
export type MessageType = ControlType | DataType;

export type Revision = '2.0' | '3.0';

export function isDataType(type: MessageType): type is DataType {
  return type === 'Source_Capabilities' || type === 'Request';
}

/** Packs a SOP message header (no extended messages in the simulator). */
export function packHeader(type: MessageType, objectCount: number, messageId: number, from: Side, revision: Revision): number {
  const code = isDataType(type) ? dataCodes[type] : controlCodes[type];
  const revisionBits = revision === '2.0' ? 0b01 : 0b10;
  const source = from === 'source';
  return (
    ((objectCount & 0b111) << 12) |
    ((messageId & 0b111) << 9) |
    ((source ? 1 : 0) << 8) |
    (revisionBits << 6) |
    ((source ? 1 : 0) << 5) |
    (code & 0b1_1111)
  );
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
  objects.forEach((word, index) => view.setUint32(2 + 4 * index, word >>> 0, true));
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
