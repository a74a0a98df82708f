/**
 * The pool's task: reads a stored trace as a stream and runs the engine's analyser over it, off
 * the request thread. Progress (bytes read of the total) goes to the main thread through the
 * MessagePort that came with the task, at most every `progressEveryMs`.
 */
import { createReadStream } from 'node:fs';
import { stat, writeFile } from 'node:fs/promises';
import type { MessagePort } from 'node:worker_threads';
import { createReader, createTraceSession, type AnalyserOptions, type Analysis, type TraceFormat, type TraceRecord } from '../../shared/trace/index.ts';
import { summaryOf, timelineChunks, withoutDecodedMessages, type AnalysisSummary, type ChunkKind } from '../../shared/trace/views.ts';
import type { Result } from '../../shared/core/result.ts';
import { deflateJson, storedFileBytes } from './deflated-json.ts';
import { createMessageChunkWriter, type MessageChunksWritten } from './message-chunks.ts';

export interface AnalyseFileTask {
  path: string;
  /** The reader to use; default: detected from the content. */
  format?: TraceFormat;
  port?: MessagePort;
  progressEveryMs?: number;
}

/** A task's listener for every message as it is read (not sent across threads: used inside the worker). */
type OnMessage = NonNullable<AnalyserOptions['onMessage']>;

export interface AnalysisProgress {
  bytesRead: number;
  totalBytes: number;
}

/** One finding or contract as a row: its place in the list, its time, and the item as JSON. */
export interface StoredItem {
  index: number;
  t: number | null;
  severity: string | null;
  rule: string | null;
  body: string;
}

export interface StoredChunk {
  kind: ChunkKind;
  level: number;
  seq: number;
  firstIndex: number;
  startUs: number;
  endUs: number;
  count: number;
  body: string;
}

/** What the request thread keeps of an analysis: small values and JSON text, never the object graph. */
export interface StoredParts {
  summary: AnalysisSummary;
  findings: StoredItem[];
  contracts: StoredItem[];
  chunks: StoredChunk[];
  /** Every message, in compressed chunks, in the task's `messagesTo` file (message-chunks.ts). */
  messages: MessageChunksWritten;
  /** Bytes of the stored analysis file. */
  storedBytes: number;
}

export type AnalyseFileResult = Result<{ analysis: Analysis; bytesRead: number }>;

const CHUNK_BYTES = 256 * 1024;

export async function analyseFile(task: AnalyseFileTask, onMessage?: OnMessage): Promise<AnalyseFileResult> {
  const totalBytes = (await stat(task.path)).size;
  const session = createTraceSession({ format: task.format ?? 'auto', ...(onMessage ? { onMessage } : {}) });
  const everyMs = task.progressEveryMs ?? 100;
  let lastPostMs = 0;
  const post = (bytesRead: number) => task.port?.postMessage({ bytesRead, totalBytes } satisfies AnalysisProgress);
  // UTF-8 decoding in the stream keeps multi-byte characters whole across chunk boundaries.
  const stream = createReadStream(task.path, { encoding: 'utf8', highWaterMark: CHUNK_BYTES });
  try {
    for await (const chunk of stream) {
      session.push(chunk as string);
      const now = Date.now();
      if (now - lastPostMs >= everyMs) {
        lastPostMs = now;
        post(stream.bytesRead);
      }
    }
  } catch (cause) {
    return { ok: false, error: { code: 'trace.unreadable', message: `the stored file could not be read (${cause instanceof Error ? cause.message : String(cause)})` } };
  }
  const result = session.finish();
  post(totalBytes);
  task.port?.close();
  if (!result.ok) {
    const { code, message, line } = result.error;
    return { ok: false, error: line === undefined ? { code, message } : { code, message, line } };
  }
  return { ok: true, analysis: result.analysis, bytesRead: totalBytes };
}

export interface AnalyseAndStoreTask extends AnalyseFileTask {
  /**
   * A new file to write the stored analysis to (deflated-json.ts): a temporary name in the trace
   * store's incoming folder, which the caller then keeps in the store (server/storage).
   */
  storeTo: string;
  /** A new file for every message of the trace, in compressed chunks written as the analysis reads them. */
  messagesTo: string;
}

export type AnalyseAndStoreResult = Result<{ stored: StoredParts; bytesRead: number }>;

/** The pool's task for uploads: analyse, store, and hand back only the parts (never the object graph). */
export async function analyseAndStore(task: AnalyseAndStoreTask): Promise<AnalyseAndStoreResult> {
  const writer = createMessageChunkWriter(task.messagesTo);
  let result: AnalyseFileResult;
  try {
    result = await analyseFile(task, (message, index) => writer.add(message, index));
  } catch (cause) {
    writer.abandon();
    throw cause;
  }
  if (!result.ok) {
    writer.abandon();
    return result;
  }
  return { ok: true, stored: await storeAnalysis(result.analysis, task.storeTo, writer.finish()), bytesRead: result.bytesRead };
}

/**
 * Writes the analysis without the decoded messages, compressed, and cuts the parts the trace page
 * reads into rows. The summary counts the messages stored in chunks (all of them), not the
 * timeline's first ones, and the trace ends no earlier than its last message.
 */
export async function storeAnalysis(analysis: Analysis, path: string, messages: MessageChunksWritten): Promise<StoredParts> {
  const stored = withoutDecodedMessages(analysis);
  const bytes = storedFileBytes(deflateJson(JSON.stringify(stored)));
  await writeFile(path, bytes, { mode: 0o600, flag: 'wx' });
  const summary = summaryOf(stored);
  return {
    summary: {
      ...summary,
      endUs: Math.max(summary.endUs, messages.lastEndUs),
      timeline: { ...summary.timeline, messages: messages.messages, omitted: { ...summary.timeline.omitted, messages: 0 } },
    },
    messages,
    findings: stored.findings.map((f, index) => ({ index, t: f.t ?? null, severity: f.severity, rule: f.rule, body: JSON.stringify(f) })),
    contracts: stored.contracts.map((c, index) => ({ index, t: c.t, severity: null, rule: null, body: JSON.stringify(c) })),
    chunks: timelineChunks(stored).map(({ items, ...chunk }) => ({ ...chunk, count: items.length, body: JSON.stringify(items) })),
    storedBytes: bytes.length,
  };
}

export interface ReadRecordsTask {
  path: string;
  format: TraceFormat;
  /** Stop with `trace.too-many-records` past this many records. */
  limit: number;
}

export type ReadRecordsResult = Result<{ records: TraceRecord[] }>;

/** Trace record fields of trace.md; anything else a file carries is left out. */
const RECORD_KEYS = ['t', 'msg', 'from', 'sop', 'crc', 'crcOk', 'event', 'cc', 'rp', 'vbus', 'note'] as const;

function plainRecord(record: TraceRecord): TraceRecord {
  const source = record as unknown as Record<string, unknown>;
  const out: Record<string, unknown> = {};
  for (const key of RECORD_KEYS) if (source[key] !== undefined) out[key] = key === 'vbus' ? { ...(source.vbus as object) } : source[key];
  if ('vbus' in out) {
    const { mv, ma } = out.vbus as { mv: number; ma?: number };
    out.vbus = ma === undefined ? { mv } : { mv, ma };
  }
  return out as unknown as TraceRecord;
}

/** The records of a stored trace (for a `trace` vector): malformed lines are left out. */
export async function readRecords(task: ReadRecordsTask): Promise<ReadRecordsResult> {
  const records: TraceRecord[] = [];
  let over = false;
  const reader = createReader(task.format, {
    push(record) {
      if (records.length >= task.limit) over = true;
      else records.push(plainRecord(record));
    },
    malformed() {},
  });
  for await (const chunk of createReadStream(task.path, { encoding: 'utf8', highWaterMark: CHUNK_BYTES })) {
    reader.push(chunk as string);
    if (over) break;
  }
  const end = reader.end();
  if (over) return { ok: false, error: { code: 'trace.too-many-records', message: `the trace holds more than ${task.limit} records, too many for one vector file` } };
  if (!end.ok) return { ok: false, error: { code: end.error.code, message: end.error.message } };
  return { ok: true, records };
}

export default analyseFile;
