/**
 * Encodes a message (the decoded form, `raw` fields optional) to wire bytes: header, data
 * objects or extended header and data block, little-endian; a CRC-32 is appended when the input
 * has `crc` (the given value when `crc.ok` is false — a deliberately corrupted message — else the
 * computed one). Fields win over `raw`; reserved bits found in `raw` are kept.
 * Never throws: bad input gives `encode.range` / `encode.input` with the field's path.
 */
import { fail, type Result } from '../core/result.ts';
import { crc32 } from './crc32.ts';
import { chunkDataBytes, chunkObjectCount, MAX_CHUNK_BYTES, MAX_EXTENDED_BYTES } from './decode-extended.ts';
import { encodeDataBlock, hasDataBlock } from './extended-data.ts';
import { encodeExtendedHeader, encodeHeader, type HeaderFields } from './header.ts';
import { messageTypeCode } from './message-types.ts';
import { encodeOtherObject } from './other-objects.ts';
import { encodeRdo } from './rdo.ts';
import { encodeSinkPdo } from './sink-pdo.ts';
import { encodeSourcePdo } from './source-pdo.ts';
import type { DataObject, ExtendedHeader, Message, OtherObject, Rdo, SinkPdo, SourcePdo } from './types.ts';

/** A data object whose `raw` may be left out. */
export type DataObjectInput = DataObject extends infer T ? (T extends { raw: string } ? Omit<T, 'raw'> & { raw?: string } : T) : never;

export interface MessageInput {
  sop?: Message['sop'];
  header: Omit<HeaderFields, 'numDataObjects'> & { numDataObjects?: number };
  extendedHeader?: Partial<Omit<ExtendedHeader, 'raw'>> & { raw?: string };
  objects?: DataObjectInput[];
  payload?: string;
  data?: Record<string, unknown>;
  crc?: { value?: string; ok?: boolean };
}

const RDO_KINDS = new Set(['rdo', 'rdo-fixed', 'rdo-variable', 'rdo-battery', 'rdo-pps', 'rdo-avs']);
const PDO_KINDS = new Set(['fixed', 'variable', 'battery', 'pps', 'epr-avs', 'spr-avs']);

export function encodeMessage(message: MessageInput): Result<{ bytes: Uint8Array }> {
  if (typeof message !== 'object' || message === null) return fail('encode.input', 'message: expected an object with a header');
  if (typeof message.header !== 'object' || message.header === null) return fail('encode.input', 'header: expected an object with messageType, messageId and specRevision');
  try {
    return { ok: true, bytes: encode(message) };
  } catch (error) {
    const text = error instanceof Error ? error.message : String(error);
    return fail(error instanceof RangeError ? 'encode.range' : 'encode.input', text);
  }
}

function encode(message: MessageInput): Uint8Array {
  const h = message.header;
  const known = messageTypeCode(h.messageType);
  const extended = h.extended ?? known?.category === 'extended';
  const objects = message.objects ?? [];
  if (!Array.isArray(objects)) throw new TypeError('objects: expected a list');
  let body: Uint8Array;
  if (extended) {
    body = encodeExtended(message, objects);
  } else {
    if (known?.category === 'control' && objects.length > 0) throw new RangeError(`objects: ${h.messageType} is a control message and carries no data objects`);
    if (known?.category === 'data' && objects.length === 0) throw new RangeError(`objects: ${h.messageType} is a data message and needs at least one data object`);
    if (objects.length > 7) throw new RangeError(`objects: ${objects.length} objects, but a message carries at most 7`);
    body = new Uint8Array(2 + 4 * objects.length);
    const view = new DataView(body.buffer);
    const sink = h.messageType === 'Sink_Capabilities';
    for (let i = 0; i < objects.length; i++)
      view.setUint32(
        2 + 4 * i,
        at(`objects[${i}]`, () => encodeObject(objects[i]!, sink)),
        true,
      );
    setHeader(body, { ...h, numDataObjects: objects.length, extended: false });
  }
  if (message.crc === undefined) return body;
  const out = new Uint8Array(body.length + 4);
  out.set(body);
  const value = message.crc.ok === false && message.crc.value !== undefined ? parseInt(message.crc.value, 16) >>> 0 : crc32(body);
  new DataView(out.buffer).setUint32(body.length, value, true);
  return out;
}

function encodeExtended(message: MessageInput, objects: DataObjectInput[]): Uint8Array {
  const h = message.header;
  const e = message.extendedHeader ?? {};
  const chunked = e.chunked ?? true;
  const chunkNumber = e.chunkNumber ?? 0;
  const requestChunk = e.requestChunk ?? false;
  const block = requestChunk ? new Uint8Array(0) : dataBlock(message, objects, chunkNumber);
  const dataSize = e.dataSize ?? block.length;
  const ext = { chunked, chunkNumber, requestChunk, dataSize, raw: e.raw };
  if (dataSize > MAX_EXTENDED_BYTES) throw new RangeError(`extendedHeader.dataSize: ${dataSize} bytes is more than the 260 an extended message may carry`);
  const expected = chunkDataBytes(ext);
  if (chunked && !requestChunk && block.length > MAX_CHUNK_BYTES) {
    throw new RangeError(`payload: ${block.length} bytes do not fit one chunk (at most ${MAX_CHUNK_BYTES}); split the message with encodeChunks`);
  }
  if (block.length !== expected) throw new RangeError(`payload: ${block.length} bytes given, but chunk ${chunkNumber} of a ${dataSize}-byte block carries ${Math.max(expected, 0)}`);
  const objectCount = chunked ? chunkObjectCount(block.length) : 0;
  const body = new Uint8Array(chunked ? 2 + 4 * objectCount : 4 + block.length);
  body.set(block, 4);
  const extRaw = at('extendedHeader', () => encodeExtendedHeader(ext));
  body[2] = extRaw & 0xff;
  body[3] = extRaw >> 8;
  setHeader(body, { ...h, numDataObjects: objectCount, extended: true });
  return body;
}

/** The data block (or this chunk of it) from objects, data, or payload — in that order. */
function dataBlock(message: MessageInput, objects: DataObjectInput[], chunkNumber: number): Uint8Array {
  const type = message.header.messageType;
  if ((type === 'EPR_Source_Capabilities' || type === 'EPR_Sink_Capabilities') && objects.length > 0) {
    const out = new Uint8Array(4 * objects.length);
    const view = new DataView(out.buffer);
    const sink = type === 'EPR_Sink_Capabilities';
    for (let i = 0; i < objects.length; i++)
      view.setUint32(
        4 * i,
        at(`objects[${i}]`, () => encodeObject(objects[i]!, sink)),
        true,
      );
    return out;
  }
  if (hasDataBlock(type) && message.data !== undefined && chunkNumber === 0) return encodeDataBlock(type, message.data);
  const payload = message.payload ?? '';
  if (typeof payload !== 'string' || !/^([0-9a-f]{2})*$/i.test(payload)) throw new RangeError('payload: expected hex, two digits a byte');
  const out = new Uint8Array(payload.length / 2);
  for (let i = 0; i < out.length; i++) out[i] = parseInt(payload.slice(2 * i, 2 * i + 2), 16);
  return out;
}

function encodeObject(object: DataObjectInput, sink: boolean): number {
  if (typeof object !== 'object' || object === null || typeof object.kind !== 'string') throw new TypeError('kind: expected an object with a kind');
  const kind = object.kind;
  if (RDO_KINDS.has(kind)) return encodeRdo(object as Rdo);
  if (PDO_KINDS.has(kind)) return sink ? encodeSinkPdo(object as SinkPdo) : encodeSourcePdo(object as SourcePdo);
  return encodeOtherObject(object as OtherObject);
}

function setHeader(body: Uint8Array, fields: HeaderFields): void {
  const raw = at('header', () => encodeHeader(fields));
  body[0] = raw & 0xff;
  body[1] = raw >> 8;
}

/** Runs a writer, prefixing the path of the field to any error it throws. */
function at<T>(path: string, write: () => T): T {
  try {
    return write();
  } catch (error) {
    const text = error instanceof Error ? error.message : String(error);
    const Kind = error instanceof RangeError ? RangeError : TypeError;
    throw new Kind(`${path}.${text}`);
  }
}
