/** Public entry of the trace engine (README.md beside it). */
export { checkRecord, isMessageRecord, isEventRecord, isMeasurementRecord } from './records.ts';
export type { TraceRecord, TraceHeader, MessageRecord, EventRecord, MeasurementRecord, NoteRecord, TraceSide, TraceEventKind, CheckedLine } from './records.ts';
export { createAnalyser, analyseRecords } from './analyser.ts';
export type { Analysis, Analyser, AnalyserOptions } from './analyser.ts';
export type { Timeline, TimelineMessage, TimelineMeasurement, TimelineEvent, TimelineContract } from './timeline.ts';
export { detectFormat, TRACE_FORMATS, type TraceFormat } from './detect-format.ts';
export { createJsonlReader, readJsonlLine } from './jsonl-reader.ts';
export { createTextReader, readTextLine } from './text-reader.ts';
export { createVcdReader } from './vcd-reader.ts';
export { createLineSplitter } from './lines.ts';
export type { TraceReader, TraceSink } from './sink.ts';
export { createTraceSession, analyseTrace, createReader, type TraceSession, type TraceSessionOptions } from './session.ts';
export { messageDurationUs } from './wire-time.ts';
export { contractText, seconds as formatSeconds } from './format.ts';
