/**
 * The VCD reader (docs/trace.md, "VCD"): the wire decoder of shared/wire recovers
 * messages and ordered sets from the CC line's waveform, chunk by chunk; each becomes a record.
 * Direction is left to the analyser (from the message header's power role or cable plug bit).
 */
import { toHex } from '../pd/index.ts';
import { createVcdDecoder, type WireEvent } from '../wire/index.ts';
import type { MessageRecord, TraceRecord } from './records.ts';
import type { TraceReader, TraceSink } from './sink.ts';

export function createVcdReader(sink: TraceSink, options: { signal?: string } = {}): TraceReader {
  const decoder = createVcdDecoder(options);
  const emit = (events: WireEvent[]): void => {
    for (const event of events) {
      // A burst that held no packet is reported (trace.malformed-line, with its VCD line), never dropped.
      if (event.kind === 'unreadable') sink.malformed(event.line, `a burst of ${event.edges} edges over ${event.durationUs} µs at t = ${event.t} µs held no readable packet: ${event.reason}`);
      else sink.push(recordOf(event));
    }
  };
  return {
    push: (chunk) => emit(decoder.push(chunk)),
    end() {
      const done = decoder.end();
      if (!done.ok) return done;
      emit(done.events);
      return { ok: true };
    },
  };
}

export function recordOf(event: Exclude<WireEvent, { kind: 'unreadable' }>): TraceRecord {
  const t = Math.max(0, Math.round(event.t));
  if (event.kind !== 'message') return { t, event: event.kind };
  const crc = (event.crc >>> 0).toString(16).padStart(8, '0');
  const record: MessageRecord = { t, msg: toHex(event.bytes), crc, crcOk: event.crcOk };
  if (event.sop !== 'SOP') record.sop = event.sop;
  return record;
}
