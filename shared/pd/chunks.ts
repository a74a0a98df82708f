/**
 * Chunking of extended messages (USB PD R3.2 V1.1 §6.2.1.2.1 and §8.3.3.x chunking state
 * machines): a data block longer than 26 bytes (MaxExtendedMsgChunkLen) goes as chunks 0, 1, …
 * each with the whole block's Data Size; the receiver asks for each next chunk with a chunk
 * request and puts the block back together.
 */
import type { Finding } from '../core/finding.ts';
import { fail, type EngineError, type Result } from '../core/result.ts';
import { decodeBlock, MAX_CHUNK_BYTES } from './decode-extended.ts';
import { encodeMessage, type MessageInput } from './encode-message.ts';
import { toHex } from './hex.ts';
import type { Message } from './types.ts';

/**
 * Splits an extended message into its chunks' wire bytes. The block comes from the input as
 * encodeMessage reads it (objects, data or payload); chunk n gets MessageID (messageId + n) mod 8.
 */
export function encodeChunks(message: MessageInput): Result<{ chunks: Uint8Array[] }> {
  // Encode the whole block once as an unchunked message, then cut it.
  const whole = encodeMessage({ ...message, crc: undefined, extendedHeader: { ...message.extendedHeader, chunked: false, chunkNumber: 0, dataSize: undefined, requestChunk: false } });
  if (!whole.ok) return whole;
  const block = whole.bytes.subarray(4);
  const count = Math.max(1, Math.ceil(block.length / MAX_CHUNK_BYTES));
  if (count > 16) return fail('encode.range', `payload: ${block.length} bytes need ${count} chunks, more than the 16 a Chunk Number can count`);
  const chunks: Uint8Array[] = [];
  for (let n = 0; n < count; n++) {
    const part = block.subarray(n * MAX_CHUNK_BYTES, (n + 1) * MAX_CHUNK_BYTES);
    const chunk = encodeMessage({
      sop: message.sop,
      header: { ...message.header, messageId: ((message.header.messageId ?? 0) + n) & 7 },
      extendedHeader: { chunked: true, chunkNumber: n, requestChunk: false, dataSize: block.length },
      payload: toHex(part),
      ...(message.crc ? { crc: {} } : {}),
    });
    if (!chunk.ok) return chunk;
    chunks.push(chunk.bytes);
  }
  return { ok: true, chunks };
}

export type ChunkStep =
  /** Not a chunked extended message, or a chunk request: passed through unchanged. */
  | { state: 'passthrough'; message: Message }
  /** Chunk accepted; `nextChunk` is the one to ask for. */
  | { state: 'pending'; nextChunk: number }
  /** The last chunk arrived: the message with its whole payload, `data` and `objects`. */
  | { state: 'complete'; message: Message; warnings: Finding[] }
  | { state: 'error'; error: EngineError };

export interface ChunkAssembler {
  push(message: Message): ChunkStep;
  reset(): void;
}

/** Puts chunked extended messages back together, one message in progress per SOP* and sender. */
export function createChunkAssembler(): ChunkAssembler {
  const open = new Map<string, { first: Message; parts: string[]; next: number }>();
  return {
    reset: () => open.clear(),
    push(message) {
      const ext = message.extendedHeader;
      if (!message.header.extended || !ext?.chunked || ext.requestChunk) return { state: 'passthrough', message };
      const key = `${message.sop}|${message.header.powerRole ?? String(message.header.cablePlug)}|${message.header.messageType}`;
      let entry = open.get(key);
      if (ext.chunkNumber === 0) {
        entry = { first: message, parts: [], next: 0 };
        open.set(key, entry);
      }
      if (!entry) return { state: 'error', error: { code: 'decode.chunk', message: `chunk ${ext.chunkNumber} of ${message.header.messageType} arrived without chunk 0` } };
      if (ext.chunkNumber !== entry.next || ext.dataSize !== entry.first.extendedHeader?.dataSize) {
        open.delete(key);
        return {
          state: 'error',
          error: {
            code: 'decode.chunk',
            message: `expected chunk ${entry.next} of ${message.header.messageType} (Data Size ${entry.first.extendedHeader?.dataSize}), got chunk ${ext.chunkNumber} (Data Size ${ext.dataSize})`,
          },
        };
      }
      entry.parts.push(message.payload ?? '');
      entry.next++;
      const payload = entry.parts.join('');
      if (payload.length / 2 < ext.dataSize) return { state: 'pending', nextChunk: entry.next };
      open.delete(key);
      const block = new Uint8Array(payload.length / 2);
      for (let i = 0; i < block.length; i++) block[i] = parseInt(payload.slice(2 * i, 2 * i + 2), 16);
      const warnings: Finding[] = [];
      const decoded = decodeBlock(message.header.messageType, block, warnings);
      const whole: Message = { ...entry.first, objects: decoded.objects, payload };
      if (decoded.data) whole.data = decoded.data;
      else delete whole.data;
      return { state: 'complete', message: whole, warnings };
    },
  };
}

export { MAX_CHUNK_BYTES };
