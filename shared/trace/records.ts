/**
 * Trace records (docs/trace.md): a header line, then message, event, measurement and
 * note records, one a line. `traceRecordSchema` (zod) is the schema for the server, the UI and
 * `parley schema trace`; `checkRecord` is a hand-written check of the same shape for the hot path of
 * the readers (it validates in place and allocates nothing, where zod copies every object).
 * Unknown extra fields are kept and ignored in both.
 */
import { z } from 'zod';
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
const HEX_TEXT = /^(0x)?[0-9a-f]{2}([ :]?[0-9a-f]{2})*$/i;
const CRC_TEXT = /^(0x)?[0-9a-f]{8}$/i;

const time = z.number().int().nonnegative().describe('microseconds from the start, non-decreasing');
const side = z.enum(['source', 'sink', 'cable']);

export const traceHeaderSchema = z.looseObject({
  trace: z.literal(1),
  title: z.string().optional(),
  capturedAt: z.string().optional(),
});

export const messageRecordSchema = z.looseObject({
  t: time,
  msg: z.string().regex(HEX_TEXT, 'wire-order hex of header and objects'),
  from: side.optional(),
  sop: z.enum(['SOP', "SOP'", "SOP''", "SOP'_Debug", "SOP''_Debug"]).optional(),
  crc: z.string().regex(CRC_TEXT, 'eight hex digits').optional(),
  crcOk: z.boolean().optional(),
  // Written by Parley, ignored by readers: only its being an object is checked.
  message: (z.looseObject({}) as unknown as z.ZodType<Message>).optional(),
});

export const eventRecordSchema = z.looseObject({
  t: time,
  event: z.enum(['attach', 'detach', 'hard_reset', 'cable_reset', 'rp']),
  from: side.optional(),
  cc: z.enum(['CC1', 'CC2']).optional(),
  rp: z.enum(['default', '1.5A', '3.0A']).optional(),
});

export const measurementRecordSchema = z.looseObject({
  t: time,
  vbus: z.looseObject({ mv: z.number().int().nonnegative(), ma: z.number().int().optional() }),
});

export const noteRecordSchema = z.looseObject({ t: time, note: z.string() });

export const traceRecordSchema: z.ZodType<TraceRecord> = z.union([messageRecordSchema, eventRecordSchema, measurementRecordSchema, noteRecordSchema]);

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
