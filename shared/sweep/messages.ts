/**
 * The messages of a simulated run, in wire order, each with what a fault needs to select it: the
 * sender, the type name and its occurrence among that sender's messages of that type (`nth`, as
 * shared/sim/faults.ts counts them). The generator places faults on these.
 */
import { messageTypeName } from '../pd/message-types.ts';
import type { TraceRecord } from '../trace/records.ts';
import type { Side } from '../sim/types.ts';

export interface RunMessage {
  /** 0-based position among the run's messages. */
  index: number;
  /** Preamble start, µs. */
  t: number;
  from: Side;
  messageType: string;
  /** 1-based occurrence of this type from this sender (fault `nth`). */
  nth: number;
  hex: string;
}

/**
 * The message type of a wire-order hex message: the header's 5-bit type, read as Control, Data or
 * Extended (USB PD R3.2 V1.1 §6.2.1.1: Extended bit 15, Number of Data Objects bits 14..12).
 */
export function messageTypeOfHex(hex: string): string {
  const raw = Number.parseInt(hex.slice(0, 2), 16) | (Number.parseInt(hex.slice(2, 4), 16) << 8);
  const extended = (raw & 0x8000) !== 0;
  const objects = (raw >>> 12) & 0b111;
  return messageTypeName(extended ? 'extended' : objects > 0 ? 'data' : 'control', raw & 0x1f);
}

/** The SOP messages that reached the wire (a cable's SOP'/SOP'' traffic and corrupted copies left out). */
export function runMessages(records: readonly TraceRecord[]): RunMessage[] {
  const messages: RunMessage[] = [];
  const seen = new Map<string, number>();
  for (const record of records) {
    if (!('msg' in record) || record.crcOk === false) continue;
    if (record.sop !== undefined && record.sop !== 'SOP') continue;
    if (record.from !== 'source' && record.from !== 'sink') continue;
    const messageType = messageTypeOfHex(record.msg);
    const key = `${record.from}:${messageType}`;
    const nth = (seen.get(key) ?? 0) + 1;
    seen.set(key, nth);
    messages.push({ index: messages.length, t: record.t, from: record.from, messageType, nth, hex: record.msg });
  }
  return messages;
}
