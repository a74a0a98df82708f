/**
 * Trace records (docs/trace.md): a header line, then message, event, measurement and
 * note records, one a line. `traceRecordSchema` (zod, record-schema.ts) is the schema for the server,
 * the UI and `parley schema trace`; `checkRecord` is a hand-written check of the same shape for the
 * hot path of the readers (it validates in place and allocates nothing, where zod copies every object).
 * Unknown extra fields are kept and ignored in both.
 */
import type { Message, Sop } from '../pd/types.ts';

export type TraceSide = 'source' | 'sink' | 'cable';
export type TraceEventKind = 'attach' | 'detach' | 'hard_reset' | 'cable_reset' | 'rp';

export interface TraceHeader {
  trace: 1;
  title?: string;
  capturedAt?: string;
  [metadata: string]: unknown;
}

export interface MessageRecord {
  /** Microseconds from the start: when the preamble starts. */
  t: number;
  /** Wire-order hex of header and objects, without CRC. */
  msg: string;
  from?: TraceSide;
  /** Default `SOP`. */
  sop?: Sop;
  /** Eight hex digits, when captured. */
  crc?: string;
  /** Default true; false for a message received with a bad CRC. */
  crcOk?: boolean;
  /** The decoded form, written by Parley; readers decode `msg` and ignore it. */
  message?: Message;
}

export interface EventRecord {
  t: number;
  event: TraceEventKind;
  from?: TraceSide;
  cc?: 'CC1' | 'CC2';
  rp?: 'default' | '1.5A' | '3.0A';
}

export interface MeasurementRecord {
  t: number;
  vbus: { mv: number; ma?: number };
}

export interface NoteRecord {
  t: number;
  note: string;
}

export type TraceRecord = MessageRecord | EventRecord | MeasurementRecord | NoteRecord;

const SIDES: readonly string[] = ['source', 'sink', 'cable'];
const EVENTS: readonly string[] = ['attach', 'detach', 'hard_reset', 'cable_reset', 'rp'];
const SOPS: readonly string[] = ['SOP', "SOP'", "SOP''", "SOP'_Debug", "SOP''_Debug"];
const CCS: readonly string[] = ['CC1', 'CC2'];
const RPS: readonly string[] = ['default', '1.5A', '3.0A'];
/** Hex as trace.md allows it: optional 0x, spaces or colons between bytes. */
export const HEX_TEXT = /^(0x)?[0-9a-f]{2}([ :]?[0-9a-f]{2})*$/i;
export const CRC_TEXT = /^(0x)?[0-9a-f]{8}$/i;

/** What `checkRecord` found: a record, the header line, or why the value is neither. */
export type CheckedLine = { kind: 'record'; record: TraceRecord } | { kind: 'header'; header: TraceHeader } | { kind: 'invalid'; reason: string };

const isObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);
const isInt = (v: unknown): v is number => typeof v === 'number' && Number.isSafeInteger(v);
const oneOf = (v: unknown, allowed: readonly string[]): boolean => v === undefined || (typeof v === 'string' && allowed.includes(v));

/**
 * The shape check of the readers' hot path; agrees with `traceRecordSchema` (a property test holds
 * them together): like the union, the first shape that fits wins. The reason names the field
 * ("t: …") of the first shape whose key the value has.
 */
export function checkRecord(value: unknown): CheckedLine {
  if (!isObject(value)) return { kind: 'invalid', reason: 'a line must hold one JSON object' };
  if (value.trace !== undefined && value.t === undefined) {
    if (value.trace !== 1) return { kind: 'invalid', reason: 'trace: this reader knows trace format 1' };
    return { kind: 'header', header: value as TraceHeader };
  }
  const t = value.t;
  if (!isInt(t) || t < 0) return { kind: 'invalid', reason: 't: an integer number of microseconds (0 or more) is required' };
  let reason: string | undefined;
  for (const shape of SHAPES) {
    if (value[shape.key] === undefined) continue;
    const why = shape.check(value);
    if (why === undefined) return { kind: 'record', record: value as unknown as TraceRecord };
    reason ??= why;
  }
  return { kind: 'invalid', reason: reason ?? 'a record needs msg, event, vbus or note' };
}

type Fields = Record<string, unknown>;

function checkMessage(v: Fields): string | undefined {
  if (typeof v.msg !== 'string' || !HEX_TEXT.test(v.msg)) return 'msg: wire-order hex of header and objects is required';
  if (!oneOf(v.from, SIDES)) return 'from: one of source, sink, cable';
  if (!oneOf(v.sop, SOPS)) return "sop: one of SOP, SOP', SOP''";
  if (v.crc !== undefined && (typeof v.crc !== 'string' || !CRC_TEXT.test(v.crc))) return 'crc: eight hex digits';
  if (v.crcOk !== undefined && typeof v.crcOk !== 'boolean') return 'crcOk: true or false';
  if (v.message !== undefined && !isObject(v.message)) return 'message: the decoded form is an object';
  return undefined;
}

function checkEvent(v: Fields): string | undefined {
  if (!oneOf(v.event, EVENTS)) return 'event: one of attach, detach, hard_reset, cable_reset, rp';
  if (!oneOf(v.from, SIDES)) return 'from: one of source, sink, cable';
  if (!oneOf(v.cc, CCS)) return 'cc: CC1 or CC2';
  if (!oneOf(v.rp, RPS)) return 'rp: one of default, 1.5A, 3.0A';
  return undefined;
}

function checkMeasurement(v: Fields): string | undefined {
  const vbus = v.vbus;
  if (!isObject(vbus) || !isInt(vbus.mv) || vbus.mv < 0) return 'vbus.mv: an integer number of millivolts is required';
  if (vbus.ma !== undefined && !isInt(vbus.ma)) return 'vbus.ma: an integer number of milliamperes';
  return undefined;
}

function checkNote(v: Fields): string | undefined {
  return typeof v.note === 'string' ? undefined : 'note: text is required';
}

/** In the union's order. */
const SHAPES: readonly { key: string; check(v: Fields): string | undefined }[] = [
  { key: 'msg', check: checkMessage },
  { key: 'event', check: checkEvent },
  { key: 'vbus', check: checkMeasurement },
  { key: 'note', check: checkNote },
];

export const isMessageRecord = (r: TraceRecord): r is MessageRecord => 'msg' in r;
export const isEventRecord = (r: TraceRecord): r is EventRecord => 'event' in r;
export const isMeasurementRecord = (r: TraceRecord): r is MeasurementRecord => 'vbus' in r;
