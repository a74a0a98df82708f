/**
 * The pool's task: reads a stored trace as a stream and runs the engine's analyser over it, off
 * the request thread. Progress (bytes read of the total) goes to the main thread through the
 * MessagePort that came with the task, at most every `progressEveryMs`.
 */
import { createReadStream } from 'node:fs';
import { stat } from 'node:fs/promises';
import type { MessagePort } from 'node:worker_threads';
import { createReader, createTraceSession, type Analysis, type TraceFormat, type TraceRecord } from '../../shared/trace/index.ts';
import type { Result } from '../../shared/core/result.ts';

export interface AnalyseFileTask {
  path: string;
  /** The reader to use; default: detected from the content. */
  format?: TraceFormat;
  port?: MessagePort;
  progressEveryMs?: number;
}

export interface AnalysisProgress {
  bytesRead: number;
  totalBytes: number;
}

export type AnalyseFileResult = Result<{ analysis: Analysis; bytesRead: number }>;

const CHUNK_BYTES = 256 * 1024;

export async function analyseFile(task: AnalyseFileTask): Promise<AnalyseFileResult> {
  const totalBytes = (await stat(task.path)).size;
  const session = createTraceSession({ format: task.format ?? 'auto' });
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
