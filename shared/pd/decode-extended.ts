/**
 * The part of an extended message after its Message Header: the Extended Message Header and the
 * data block (or this chunk of it). USB PD R3.2 V1.1 §6.2.1.2 (Table 6.3), §6.13 (from memory:
 * MaxExtendedMsgLen 260 bytes, MaxExtendedMsgChunkLen 26 bytes).
 * - Chunked: each chunk carries up to 26 bytes of the block, padded with zeros to a whole number
 *   of 4-byte data objects; Number of Data Objects counts the extended header, data and padding.
 *   Data Size is the size of the whole block. A chunk request carries no data (Request Chunk = 1).
 * - Unchunked: the whole block follows the extended header; Number of Data Objects is reserved
 *   (zero) — from memory.
 */
import type { Finding } from '../core/finding.ts';
import { fail, type Result } from '../core/result.ts';
import { decodeObjects } from './decode-objects.ts';
import { decodeDataBlock, hasDataBlock } from './extended-data.ts';
import { decodeFinding } from './findings.ts';
import { decodeExtendedHeader, EXT_RESERVED_MASK } from './header.ts';
import { toHex } from './hex.ts';
import type { DataObject, ExtendedHeader, MessageHeader } from './types.ts';

export const MAX_CHUNK_BYTES = 26;
export const MAX_EXTENDED_BYTES = 260;

/** Bytes of the data block a chunk carries. */
export function chunkDataBytes(ext: Pick<ExtendedHeader, 'chunked' | 'chunkNumber' | 'requestChunk' | 'dataSize'>): number {
  if (!ext.chunked) return ext.dataSize;
  if (ext.requestChunk) return 0;
  return Math.min(MAX_CHUNK_BYTES, ext.dataSize - MAX_CHUNK_BYTES * ext.chunkNumber);
}

/** Number of Data Objects of a chunk carrying `dataBytes` bytes (extended header + data + padding). */
export function chunkObjectCount(dataBytes: number): number {
  return Math.ceil((2 + dataBytes) / 4);
}

export interface ExtendedPart {
  extendedHeader: ExtendedHeader;
  objects: DataObject[];
  payload: string;
  data?: Record<string, unknown>;
}

export function decodeExtendedMessage(body: Uint8Array, header: MessageHeader, warnings: Finding[]): Result<ExtendedPart> {
  if (body.length < 4) return fail('decode.length', `an extended message needs a 2-byte extended header after the header, but ${body.length} bytes were given`, { offset: body.length });
  const extRaw = body[2]! | (body[3]! << 8);
  const ext = decodeExtendedHeader(extRaw);
  if (extRaw & EXT_RESERVED_MASK) warnings.push(decodeFinding('decode.reserved-bits', 'Extended header bit 9 is reserved but is set.', { ref: 'USB PD R3.2 V1.1 §6.2.1.2, Table 6.3' }));
  if (ext.dataSize > MAX_EXTENDED_BYTES) return fail('decode.length', `the extended header's Data Size is ${ext.dataSize} bytes, more than the 260 an extended message may carry`, { offset: 2 });
  const dataBytes = chunkDataBytes(ext);
  if (ext.chunked) {
    if (!ext.requestChunk && dataBytes <= 0) return fail('decode.length', `chunk ${ext.chunkNumber} starts beyond the ${ext.dataSize}-byte data block`, { offset: 2 });
    const objects = chunkObjectCount(dataBytes);
    if (header.numDataObjects !== objects) {
      return fail('decode.length', `a chunk carrying ${dataBytes} data bytes has ${objects} data objects, but the header says ${header.numDataObjects}`, { offset: 0 });
    }
    const expected = 2 + 4 * objects;
    if (body.length !== expected)
      return fail('decode.length', `the header says ${objects} data objects (${expected} bytes) but ${body.length} bytes were given`, { offset: Math.min(body.length, expected) });
    for (let i = 4 + dataBytes; i < body.length; i++) {
      if (body[i] !== 0) {
        warnings.push(decodeFinding('decode.reserved-bits', `The padding after the chunk's data is not zero (byte ${i}).`, { ref: 'USB PD R3.2 V1.1 §6.2.1.2.1 (chunk padding)' }));
        break;
      }
    }
  } else {
    if (header.numDataObjects !== 0)
      warnings.push(
        decodeFinding('decode.reserved-bits', 'Number of Data Objects should be zero in an unchunked extended message (from memory).', { ref: 'USB PD R3.2 V1.1 §6.2.1.1.2 (from memory)' }),
      );
    const expected = 4 + ext.dataSize;
    if (body.length !== expected)
      return fail('decode.length', `the extended header's Data Size is ${ext.dataSize} bytes (${expected} in all) but ${body.length} bytes were given`, { offset: Math.min(body.length, expected) });
  }
  const block = body.subarray(4, 4 + dataBytes);
  const part: ExtendedPart = { extendedHeader: ext, objects: [], payload: toHex(block) };
  const complete = !ext.requestChunk && dataBytes === ext.dataSize;
  if (complete) Object.assign(part, decodeBlock(header.messageType, block, warnings));
  return { ok: true, ...part };
}

/** Reads a complete data block: PDOs of EPR capabilities into `objects`, known blocks into `data`. */
export function decodeBlock(messageType: string, block: Uint8Array, warnings: Finding[]): { objects: DataObject[]; data?: Record<string, unknown> } {
  if (messageType === 'EPR_Source_Capabilities' || messageType === 'EPR_Sink_Capabilities') {
    // SPR (A)PDOs in positions 1–7 (unused ones zero), EPR (A)PDOs from position 8 (§6.5.15.1).
    const count = Math.floor(block.length / 4);
    const words = new Array<number>(count);
    for (let i = 0; i < count; i++) words[i] = (block[4 * i]! | (block[4 * i + 1]! << 8) | (block[4 * i + 2]! << 16) | (block[4 * i + 3]! << 24)) >>> 0;
    const form = messageType === 'EPR_Source_Capabilities' ? 'Source_Capabilities' : 'Sink_Capabilities';
    const objects = decodeObjects(form, words, undefined, warnings);
    for (let i = 0; i < count; i++) if (words[i] === 0) objects[i] = { kind: 'raw', raw: '0x00000000' };
    return { objects };
  }
  if (hasDataBlock(messageType)) {
    const data = decodeDataBlock(messageType, block);
    return data ? { objects: [], data } : { objects: [] };
  }
  return { objects: [] };
}
