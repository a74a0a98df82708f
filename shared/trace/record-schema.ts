/**
 * The zod schemas of trace records (docs/trace.md), for the server, the UI and `parley schema
 * trace`. Apart from records.ts so that reading a trace (`parley analyze`, the analysis workers)
 * never loads zod: its schemas cost the command's start more than the readers' whole check.
 */
import { z } from 'zod';
import type { Message } from '../pd/types.ts';
import { CRC_TEXT, HEX_TEXT, type TraceRecord } from './records.ts';

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
