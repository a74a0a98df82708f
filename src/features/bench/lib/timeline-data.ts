/**
 * A run's records in the shapes the shared timeline (src/components/timeline) draws: messages for
 * the lanes, with retries and GoodCRC links worked out, and VBUS measurements from the packed
 * samples within a point budget (the chart thins each window further with LTTB).
 */
import type { Message } from '../../../../shared/pd/types.ts';
import type { TraceRecord } from '../../../../shared/trace/records.ts';
import { messageDurationUs } from '../../../../shared/trace/wire-time.ts';
import type { LaneMessage } from '../../../components/timeline/message-lanes.tsx';
import type { Measurement } from '../../../components/timeline/trace-series.ts';
import { SAMPLE_FIELDS, type PackedSamples } from './samples.ts';

/** One simulated message with everything the side panel shows. */
export type RunMessage = { t: number; from?: string; hex: string; crcOk: boolean; message: Message };

export function laneMessagesOf(records: readonly TraceRecord[]): { lanes: LaneMessage[]; messages: RunMessage[] } {
  const lanes: LaneMessage[] = [];
  const messages: RunMessage[] = [];
  // Per sender: the message waiting for its GoodCRC, and the last message sent (for retries).
  const awaiting = new Map<string, number>();
  const previous = new Map<string, number>();
  const acknowledged = new Set<number>();
  for (const record of records) {
    if (!('msg' in record) || !record.message) continue;
    const message = record.message as Message;
    const from = record.from ?? 'source';
    const type = message.header.messageType;
    const crcOk = record.crcOk !== false;
    const lane: LaneMessage = {
      t: record.t,
      durationUs: messageDurationUs(record.msg.length / 2),
      from,
      messageType: type,
      messageId: message.header.messageId,
      crcOk,
      hex: record.msg,
    };
    const index = lanes.length;
    if (type === 'GoodCRC') {
      const other = from === 'sink' ? 'source' : 'sink';
      const waiting = awaiting.get(other);
      if (waiting !== undefined && lanes[waiting]?.messageId === lane.messageId) {
        lane.goodCrcFor = waiting;
        acknowledged.add(waiting);
        awaiting.delete(other);
      }
    } else {
      const before = previous.get(from);
      const earlier = before === undefined ? undefined : lanes[before];
      // A retry repeats an unacknowledged message: same MessageID, same bytes (USB PD R3.2 V1.1 §6.7.1, from memory).
      if (before !== undefined && earlier && !acknowledged.has(before) && earlier.messageId === lane.messageId && earlier.hex === lane.hex) lane.retry = true;
      previous.set(from, index);
      if (crcOk) awaiting.set(from, index);
    }
    lanes.push(lane);
    messages.push({ t: record.t, from: record.from, hex: record.msg, crcOk, message });
  }
  return { lanes, messages };
}

/** At most this many measurements go to the chart (a 10-minute run at 1 ms has 600 000). */
const MEASUREMENT_BUDGET = 100_000;

export function measurementsOf(samples: PackedSamples, budget = MEASUREMENT_BUDGET): { source: Measurement[]; sink: Measurement[] } {
  const stride = Math.max(1, Math.ceil(samples.count / budget));
  const source: Measurement[] = [];
  const sink: Measurement[] = [];
  const { data } = samples;
  for (let index = 0; index < samples.count; index += stride) {
    const offset = index * SAMPLE_FIELDS;
    const t = data[offset] ?? 0;
    source.push({ t, mv: data[offset + 1] ?? 0, ma: data[offset + 2] ?? 0 });
    sink.push({ t, mv: data[offset + 3] ?? 0 });
  }
  return { source, sink };
}
