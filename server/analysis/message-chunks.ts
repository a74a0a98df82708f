/**
 * Every message of a trace, stored as the analysis reads it: cut into chunks of `CHUNK_ITEMS`
 * messages (shared/trace/views.ts), each compressed (raw DEFLATE, RFC 1951, as base64 text so
 * SQLite and PostgreSQL keep it in the same text column) the moment it fills, and appended to a
 * spill file, one chunk a line. The analysis thread never holds more than one chunk of messages;
 * the job then reads the file a line at a time into `trace_chunk` rows. A chunk also says how many
 * of its messages are rows of the folded list (not GoodCRC) and where its last good
 * Source_Capabilities is, so the message list pages without opening chunks it skips.
 */
import { closeSync, createReadStream, openSync, writeSync } from 'node:fs';
import { createInterface } from 'node:readline';
import { deflateRawSync, inflateRawSync } from 'node:zlib';
import type { TimelineMessage } from '../../shared/trace/timeline.ts';
import { CHUNK_ITEMS, type StoredTimelineMessage } from '../../shared/trace/views.ts';

/** One message chunk as a `trace_chunk` row (kind `message`, level 0). */
export interface MessageChunkRow {
  kind: 'message';
  level: 0;
  seq: number;
  firstIndex: number;
  startUs: number;
  endUs: number;
  count: number;
  foldedRows: number;
  capsIndex: number | null;
  body: string;
}

/** What the spill file holds once the analysis is over. */
export interface MessageChunksWritten {
  messages: number;
  chunks: number;
  /** Bytes of the chunks' bodies (the stored form). */
  bodyBytes: number;
  /** End of the last message on the wire, µs (0 without messages). */
  lastEndUs: number;
}

export interface MessageChunkWriter {
  add(message: TimelineMessage, index: number): void;
  /** Writes the last, partial chunk and closes the file. */
  finish(): MessageChunksWritten;
  /** Closes the file without writing what is pending (a failed analysis). */
  abandon(): void;
}

/** A chunk's body: base64 of the deflated JSON array of its messages. */
export function encodeMessageChunk(items: readonly StoredTimelineMessage[]): string {
  return deflateRawSync(Buffer.from(JSON.stringify(items), 'utf8'), { level: 9 }).toString('base64');
}

/** A chunk body as items: message chunks are compressed, other kinds (and message chunks of earlier versions) plain JSON. */
export function decodeChunkBody(body: string): unknown[] {
  if (body.startsWith('[')) return JSON.parse(body) as unknown[];
  return JSON.parse(inflateRawSync(Buffer.from(body, 'base64')).toString('utf8')) as unknown[];
}

export function createMessageChunkWriter(path: string): MessageChunkWriter {
  const fd = openSync(path, 'wx', 0o600);
  let open = true;
  let pending: StoredTimelineMessage[] = [];
  let firstIndex = 0;
  let seq = 0;
  let messages = 0;
  let bodyBytes = 0;
  let lastEndUs = 0;
  const flush = () => {
    if (pending.length === 0) return;
    let startUs = Number.POSITIVE_INFINITY;
    let endUs = Number.NEGATIVE_INFINITY;
    let foldedRows = 0;
    let capsIndex: number | null = null;
    pending.forEach((m, offset) => {
      startUs = Math.min(startUs, m.t);
      endUs = Math.max(endUs, m.t + m.durationUs);
      if (m.messageType !== 'GoodCRC') foldedRows++;
      if (m.messageType === 'Source_Capabilities' && m.crcOk) capsIndex = firstIndex + offset;
    });
    const body = encodeMessageChunk(pending);
    bodyBytes += body.length;
    const row: MessageChunkRow = { kind: 'message', level: 0, seq: seq++, firstIndex, startUs, endUs, count: pending.length, foldedRows, capsIndex, body };
    writeSync(fd, `${JSON.stringify(row)}\n`);
    firstIndex += pending.length;
    pending = [];
  };
  return {
    add({ decoded: _decoded, ...message }, index) {
      // The analyser numbers every message in order; a gap would shift every later row.
      if (index !== firstIndex + pending.length) throw new Error(`message ${index} out of order (expected ${firstIndex + pending.length})`);
      pending.push(message);
      messages++;
      lastEndUs = Math.max(lastEndUs, message.t + message.durationUs);
      if (pending.length >= CHUNK_ITEMS) flush();
    },
    finish() {
      flush();
      if (open) closeSync(fd);
      open = false;
      return { messages, chunks: seq, bodyBytes, lastEndUs };
    },
    abandon() {
      pending = [];
      if (open) closeSync(fd);
      open = false;
    },
  };
}

/** The spill file's chunks in order, read a line at a time. */
export async function* readMessageChunks(path: string): AsyncGenerator<MessageChunkRow> {
  const lines = createInterface({ input: createReadStream(path, { encoding: 'utf8' }), crlfDelay: Number.POSITIVE_INFINITY });
  for await (const line of lines) if (line !== '') yield JSON.parse(line) as MessageChunkRow;
}
