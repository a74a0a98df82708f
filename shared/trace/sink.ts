/** Where readers put what they read: the analyser implements it. */
import type { TraceHeader, TraceRecord } from './records.ts';
import type { Result } from '../core/result.ts';

export interface TraceSink {
  push(record: TraceRecord, line?: number): void;
  /** A line that could not be read; the reader carries on with the next. */
  malformed(line: number, reason: string): void;
  header?(header: TraceHeader, line: number): void;
}

/** A streaming reader: chunks of text in, records out to its sink. */
export interface TraceReader {
  push(chunk: string): void;
  /** Flushes the last line; an error only when the input as a whole cannot be read (VCD). */
  end(): Result<object>;
}
