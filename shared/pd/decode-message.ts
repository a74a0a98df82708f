/**
 * Decodes one message as sent on the wire: 2-byte header, then 4-byte data objects or an extended
 * header and a data block, all little-endian; optionally the 4-byte CRC-32 after them.
 * USB PD R3.2 V1.1 §6.2 (message format), §6.2.1.2 (extended messages and chunking),
 * §5.6.2 (CRC). Never throws: bad input gives a Failure with a code and a byte offset.
 */
import type { Finding } from '../core/finding.ts';
import { fail, type Result } from '../core/result.ts';
import { crc32 } from './crc32.ts';
import { decodeObjects, type OfferLike } from './decode-objects.ts';
import { decodeExtendedMessage } from './decode-extended.ts';
import { decodeFinding } from './findings.ts';
import { decodeHeader, HEADER_CABLE_RESERVED_MASK, isCableSop } from './header.ts';
import { hex32 } from './hex.ts';
import type { Message, Sop } from './types.ts';

export interface DecodeOptions {
  /** The SOP* the message came on; default `SOP`. */
  sop?: Sop;
  /** The offers in force (a Source_Capabilities' objects) so that a Request's RDO is typed. */
  caps?: readonly OfferLike[];
  /** The last 4 bytes are the CRC-32 (little-endian) and are checked. */
  crc?: boolean;
}

export type DecodeResult = Result<{ message: Message; warnings: Finding[] }>;

export function decodeMessage(bytes: Uint8Array, options: DecodeOptions = {}): DecodeResult {
  try {
    return decode(bytes, options);
  } catch (error) {
    // Not expected: every path above is guarded. Kept so that no input can make the codec throw.
    return fail('decode.internal', `the message could not be decoded (${error instanceof Error ? error.message : String(error)})`);
  }
}

function decode(bytes: Uint8Array, options: DecodeOptions): DecodeResult {
  if (!(bytes instanceof Uint8Array)) return fail('decode.length', 'no bytes were given', { offset: 0 });
  const sop = options.sop ?? 'SOP';
  const warnings: Finding[] = [];
  let body = bytes;
  let crc: Message['crc'];
  if (options.crc) {
    if (bytes.length < 6) return fail('decode.length', `with a CRC the message needs at least 6 bytes (2 header + 4 CRC), but ${bytes.length} were given`, { offset: bytes.length });
    body = bytes.subarray(0, bytes.length - 4);
    const given = (bytes[bytes.length - 4]! | (bytes[bytes.length - 3]! << 8) | (bytes[bytes.length - 2]! << 16) | (bytes[bytes.length - 1]! << 24)) >>> 0;
    const computed = crc32(body);
    crc = { value: hex32(given), ok: given === computed };
    if (!crc.ok) warnings.push(decodeFinding('decode.crc', `The CRC is ${hex32(given)} but the message's bytes give ${hex32(computed)}: the message was corrupted.`));
  }
  if (body.length < 2) return fail('decode.length', `a message needs at least a 2-byte header, but ${body.length} byte${body.length === 1 ? ' was' : 's were'} given`, { offset: body.length });

  const headerRaw = body[0]! | (body[1]! << 8);
  const header = decodeHeader(headerRaw, sop);
  if (header.messageType === 'Reserved') {
    warnings.push(decodeFinding('decode.reserved-type', `Message type code ${headerRaw & 0x1f} is reserved for ${header.category} messages.`));
  }
  if (header.specRevision === 'reserved')
    warnings.push(decodeFinding('decode.reserved-bits', "The header's Specification Revision is 11b, which is reserved.", { ref: 'USB PD R3.2 V1.1 §6.2.1.1.5, Table 6.1' }));
  if (isCableSop(sop) && headerRaw & HEADER_CABLE_RESERVED_MASK) {
    warnings.push(decodeFinding('decode.reserved-bits', `Header bit 5 is reserved on ${sop} but is set.`, { ref: 'USB PD R3.2 V1.1 §6.2.1.1.4, Table 6.1' }));
  }

  let message: Message;
  if (header.extended) {
    const ext = decodeExtendedMessage(body, header, warnings);
    if (!ext.ok) return ext;
    message = { sop, header, extendedHeader: ext.extendedHeader, objects: ext.objects, payload: ext.payload };
    if (ext.data) message.data = ext.data;
  } else {
    const expected = 2 + 4 * header.numDataObjects;
    if (body.length !== expected) {
      return fail(
        'decode.length',
        `the header says ${header.numDataObjects} data object${header.numDataObjects === 1 ? '' : 's'} (${expected} bytes) but ${body.length} bytes were given${options.crc ? ' before the CRC' : ''}`,
        { offset: Math.min(body.length, expected) },
      );
    }
    const words = new Array<number>(header.numDataObjects);
    for (let i = 0, o = 2; i < words.length; i++, o += 4) words[i] = (body[o]! | (body[o + 1]! << 8) | (body[o + 2]! << 16) | (body[o + 3]! << 24)) >>> 0;
    message = { sop, header, objects: decodeObjects(header.messageType, words, options.caps, warnings, sop) };
  }
  if (crc) message.crc = crc;
  return { ok: true, message, warnings };
}
