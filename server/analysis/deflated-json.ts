/**
 * JSON stored compressed once and sent as stored. The body is raw DEFLATE (RFC 1951) ended by a
 * sync flush rather than a final block, so it can sit in the middle of a larger response: a gzip
 * member (RFC 1952 §2.3) is built from a header, the compressed prefix (e.g. `{"trace":…,"analysis":`),
 * the stored body, the compressed suffix (`}`) and a trailer whose CRC-32 is combined from the
 * parts' CRCs. No request parses or re-serialises the stored JSON.
 *
 * File layout: 4 bytes `PZJ1`, CRC-32 of the JSON (u32 LE), its length in bytes (u32 LE), the body.
 */
import { Readable } from 'node:stream';
import { constants, crc32, createInflateRaw, deflateRawSync, inflateRaw } from 'node:zlib';
import { promisify } from 'node:util';

const MAGIC = Buffer.from('PZJ1', 'latin1');
const HEADER_BYTES = 12;
/** Browsers decode one gzip member only, so the response is one member (checked in headless Chromium). */
const GZIP_HEADER = Buffer.from([0x1f, 0x8b, 0x08, 0x00, 0, 0, 0, 0, 0x00, 0xff]);

export interface DeflatedJson {
  crc32: number;
  /** UTF-8 bytes of the JSON. */
  length: number;
  body: Buffer;
}

export function deflateJson(json: string): DeflatedJson {
  const bytes = Buffer.from(json, 'utf8');
  return { crc32: crc32(bytes), length: bytes.length, body: deflateRawSync(bytes, { level: 6, finishFlush: constants.Z_SYNC_FLUSH }) };
}

export function storedFileBytes(stored: DeflatedJson): Buffer {
  const header = Buffer.alloc(HEADER_BYTES);
  MAGIC.copy(header, 0);
  header.writeUInt32LE(stored.crc32, 4);
  header.writeUInt32LE(stored.length, 8);
  return Buffer.concat([header, stored.body]);
}

export function parseStoredFile(bytes: Buffer): DeflatedJson {
  if (bytes.length < HEADER_BYTES || !bytes.subarray(0, 4).equals(MAGIC)) throw new Error('not a stored analysis file');
  return { crc32: bytes.readUInt32LE(4), length: bytes.readUInt32LE(8), body: bytes.subarray(HEADER_BYTES) };
}

/**
 * Opens a stored file from a stream (the trace store's): reads its header and answers the body as
 * a stream, without holding the file.
 */
export async function openStoredStream(stream: Readable): Promise<{ crc32: number; length: number; body: Readable }> {
  const chunks = stream[Symbol.asyncIterator]() as AsyncIterator<Buffer>;
  let head = Buffer.alloc(0);
  while (head.length < HEADER_BYTES) {
    const next = await chunks.next();
    if (next.done) break;
    head = Buffer.concat([head, next.value]);
  }
  if (head.length < HEADER_BYTES || !head.subarray(0, 4).equals(MAGIC)) {
    stream.destroy();
    throw new Error('not a stored analysis file');
  }
  const first = head.subarray(HEADER_BYTES);
  async function* rest(): AsyncGenerator<Buffer> {
    if (first.length > 0) yield first;
    for (let next = await chunks.next(); !next.done; next = await chunks.next()) yield next.value;
  }
  return { crc32: head.readUInt32LE(4), length: head.readUInt32LE(8), body: Readable.from(rest(), { objectMode: false }) };
}

// zlib's crc32_combine (GF(2) matrix method): the CRC of A‖B from crc(A), crc(B) and len(B).
function gf2Times(matrix: Uint32Array, vector: number): number {
  let sum = 0;
  for (let i = 0; vector !== 0; i++, vector >>>= 1) if (vector & 1) sum ^= matrix[i]!;
  return sum >>> 0;
}
function gf2Square(square: Uint32Array, matrix: Uint32Array): void {
  for (let n = 0; n < 32; n++) square[n] = gf2Times(matrix, matrix[n]!);
}
export function crc32Combine(crcA: number, crcB: number, lengthB: number): number {
  if (lengthB <= 0) return crcA >>> 0;
  const even = new Uint32Array(32);
  const odd = new Uint32Array(32);
  odd[0] = 0xedb88320; // the CRC-32 polynomial, reflected
  for (let n = 1, row = 1; n < 32; n++, row = (row << 1) >>> 0) odd[n] = row;
  gf2Square(even, odd);
  gf2Square(odd, even);
  let crc = crcA >>> 0;
  let remaining = lengthB;
  for (;;) {
    gf2Square(even, odd);
    if (remaining % 2 === 1) crc = gf2Times(even, crc);
    remaining = Math.floor(remaining / 2);
    if (remaining === 0) break;
    gf2Square(odd, even);
    if (remaining % 2 === 1) crc = gf2Times(odd, crc);
    remaining = Math.floor(remaining / 2);
    if (remaining === 0) break;
  }
  return (crc ^ crcB) >>> 0;
}

/** `prefix + stored JSON + suffix` as one gzip member: the parts to write, in order. */
export function gzipEnvelope(prefix: string, stored: { crc32: number; length: number }, body: Buffer | Readable, suffix: string): (Buffer | Readable)[] {
  const head = Buffer.from(prefix, 'utf8');
  const tail = Buffer.from(suffix, 'utf8');
  let crc = crc32(head);
  crc = crc32Combine(crc, stored.crc32, stored.length);
  crc = crc32Combine(crc, crc32(tail), tail.length);
  const trailer = Buffer.alloc(8);
  trailer.writeUInt32LE(crc >>> 0, 0);
  trailer.writeUInt32LE((head.length + stored.length + tail.length) % 2 ** 32, 4);
  return [GZIP_HEADER, deflateRawSync(head, { finishFlush: constants.Z_SYNC_FLUSH }), body, deflateRawSync(tail), trailer];
}

/** The stored JSON as text (inflated on the thread pool), for the few routes that need the object. */
export async function inflateStoredFile(bytes: Buffer): Promise<string> {
  const { body } = parseStoredFile(bytes);
  const inflated = await promisify(inflateRaw)(body, { finishFlush: constants.Z_SYNC_FLUSH });
  return inflated.toString('utf8');
}

/** An inflating stream of a stored body, for clients that do not take gzip. */
export function inflatingStream(body: Readable): Readable {
  return body.pipe(createInflateRaw({ finishFlush: constants.Z_SYNC_FLUSH }));
}
