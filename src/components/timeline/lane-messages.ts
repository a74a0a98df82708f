/**
 * Simulated records (with their decoded messages) as the timeline's message lanes and list show
 * them: retries and GoodCRC links worked out, and each message kept whole for the bit-field view.
 * The Bench and the Properties page's counterexample both draw through this.
 */
import type { Message } from '../../../shared/pd/types.ts';
import type { TraceRecord } from '../../../shared/trace/records.ts';
import { messageDurationUs } from '../../../shared/trace/wire-time.ts';
import type { LaneMessage } from './message-lanes.tsx';

/** One simulated message with everything the side panel shows. */
export type RunMessage = { t: number; from?: string; hex: string; crcOk: boolean; message: Message };

/** Whose message a GoodCRC from `from` on `sop` acknowledges: the other port on SOP; the cable and a port on SOP′/SOP″. */
function acknowledgedSender(sop: string, from: string, awaiting: ReadonlyMap<string, number>): string {
  if (sop === 'SOP') return from === 'sink' ? 'source' : 'sink';
  if (from !== 'cable') return 'cable';
  for (const key of awaiting.keys()) if (key.startsWith(`${sop} `) && key !== `${sop} cable`) return key.slice(sop.length + 1);
  return 'source';
}

export function laneMessagesOf(records: readonly TraceRecord[]): { lanes: LaneMessage[]; messages: RunMessage[] } {
  const lanes: LaneMessage[] = [];
  const messages: RunMessage[] = [];
  // Per SOP and sender: the message waiting for its GoodCRC; per sender, the last message sent (for retries).
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
    // On SOP′ the cable plug and a port acknowledge each other; on SOP the two ports do.
    const sop = record.sop ?? 'SOP';
    const key = `${sop} ${from}`;
    if (type === 'GoodCRC') {
      const other = acknowledgedSender(sop, from, awaiting);
      const waiting = awaiting.get(`${sop} ${other}`);
      if (waiting !== undefined && lanes[waiting]?.messageId === lane.messageId) {
        lane.goodCrcFor = waiting;
        acknowledged.add(waiting);
        awaiting.delete(`${sop} ${other}`);
      }
    } else {
      const before = previous.get(from);
      const earlier = before === undefined ? undefined : lanes[before];
      // A retry repeats an unacknowledged message: same MessageID, same bytes (USB PD R3.2 V1.1 §6.7.1, from memory).
      if (before !== undefined && earlier && !acknowledged.has(before) && earlier.messageId === lane.messageId && earlier.hex === lane.hex) lane.retry = true;
      previous.set(from, index);
      if (crcOk) awaiting.set(key, index);
    }
    lanes.push(lane);
    messages.push({ t: record.t, from: record.from, hex: record.msg, crcOk, message });
  }
  return { lanes, messages };
}
