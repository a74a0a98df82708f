/**
 * One trace from text chunks to an Analysis: picks the reader (by `format`, or by content when
 * `auto`), feeds the analyser and says when nothing at all could be read (`trace.empty`, an input
 * error). The CLI streams a file through it; the worker and the server pass an upload's text.
 */
import { fail, type Result } from '../core/result.ts';
import { createAnalyser, type Analysis, type AnalyserOptions } from './analyser.ts';
import { detectFormat, type TraceFormat } from './detect-format.ts';
import { createJsonlReader } from './jsonl-reader.ts';
import type { TraceReader, TraceSink } from './sink.ts';
import { createTextReader } from './text-reader.ts';
import { createVcdReader } from './vcd-reader.ts';

export interface TraceSessionOptions extends Omit<AnalyserOptions, 'format'> {
  format?: TraceFormat | 'auto';
  /** VCD: the signal that carries CC (default the first 1-bit wire). */
  signal?: string;
}

export interface TraceSession {
  push(chunk: string): void;
  finish(): Result<{ analysis: Analysis }>;
}

/** Enough of the start of a file to tell the formats apart. */
const HEAD_CHARS = 256;

export function createReader(format: TraceFormat, sink: TraceSink, options: { signal?: string } = {}): TraceReader {
  if (format === 'jsonl') return createJsonlReader(sink);
  if (format === 'text') return createTextReader(sink);
  return createVcdReader(sink, options.signal === undefined ? {} : { signal: options.signal });
}

export function createTraceSession(options: TraceSessionOptions = {}): TraceSession {
  let head = '';
  let started: { reader: TraceReader; analyser: ReturnType<typeof createAnalyser> } | undefined;
  const start = () => {
    const format = options.format === undefined || options.format === 'auto' ? detectFormat(head) : options.format;
    const analyser = createAnalyser({ ...options, format });
    const reader = createReader(format, analyser, options);
    started = { reader, analyser };
    if (head.length > 0) reader.push(head);
    head = '';
    return started;
  };
  // Readers and the analyser return errors as values; this guard only keeps an unforeseen fault in
  // a dependency from escaping as a throw (the worker and the server must get a Result).
  let broken: string | undefined;
  const guarded = (work: () => void): void => {
    if (broken !== undefined) return;
    try {
      work();
    } catch (error) {
      broken = error instanceof Error ? error.message : String(error);
    }
  };
  return {
    push(chunk) {
      guarded(() => {
        if (started) {
          started.reader.push(chunk);
          return;
        }
        head += chunk;
        if (head.trimStart().length >= HEAD_CHARS) start();
      });
    },
    finish() {
      if (broken !== undefined) return fail('trace.internal', `the trace could not be analysed (${broken})`);
      let analysis: Analysis;
      try {
        const { reader, analyser } = started ?? start();
        const end = reader.end();
        if (!end.ok) return fail(end.error.code, end.error.message, end.error);
        analysis = analyser.finish();
      } catch (error) {
        return fail('trace.internal', `the trace could not be analysed (${error instanceof Error ? error.message : String(error)})`);
      }
      if (analysis.records === 0) {
        const unread = analysis.counts.warning;
        return fail(
          'trace.empty',
          unread > 0
            ? `no valid trace record was found (${unread} ${unread === 1 ? 'line' : 'lines'} could not be read, the first on line ${analysis.findings[0]?.line ?? 1})`
            : 'the file holds no trace record (message, event, measurement or note)',
        );
      }
      return { ok: true, analysis };
    },
  };
}

/** A whole trace already in memory, fed through the same streaming path in 64 KiB pieces. */
export function analyseTrace(text: string, options: TraceSessionOptions = {}): Result<{ analysis: Analysis }> {
  const session = createTraceSession(options);
  const piece = 65_536;
  for (let i = 0; i < text.length; i += piece) session.push(text.slice(i, i + piece));
  return session.finish();
}
