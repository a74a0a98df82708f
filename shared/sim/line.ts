/**
 * The CC line of one run: who may transmit when (a packet occupies the line for its length plus
 * tInterFrameGap; a GoodCRC holds the line ahead of other messages), what the faults do to a
 * transmission, and the trace records of what went over the wire.
 */
import { timersPd3 } from '../core/timers.ts';
import type { MessageRecord, TraceRecord } from '../trace/records.ts';
import type { SimClock } from './clock.ts';
import type { EntryBody, Frame, LayerKey, Scheduler } from './entries.ts';
import { faultsFor, isSilent, type FaultBook } from './faults.ts';
import type { PendingTx } from './protocol.ts';
import type { Side } from './types.ts';
import { frameHex, HARD_RESET_DURATION_US, packetDurationUs } from './wire.ts';

export const INTER_FRAME_GAP_US = timersPd3.tInterFrameGap.minUs;

export interface LineHooks {
  /** The layer's transmission in progress: a retry goes out only while it is still pending. */
  pending(layer: LayerKey): PendingTx | null;
  /** The CRCReceiveTimer starts when a transmission's last bit is out. */
  startReceiveTimer(layer: LayerKey, endUs: number): void;
}

export class Line {
  /** The line is free from this time (µs). */
  freeUs = 0;

  constructor(
    private readonly clock: SimClock,
    private readonly schedule: Scheduler,
    private readonly records: TraceRecord[],
    private readonly book: FaultBook,
    private readonly hooks: LineHooks,
  ) {}

  private note(text: string): void {
    this.records.push({ t: this.clock.nowUs, note: text });
  }

  /** Faults apply to SOP traffic between the two ports, selected by the sender's power role. */
  private faulted(frame: Frame): boolean {
    return frame.sop === 'SOP' && frame.from !== 'cable';
  }

  request(frame: Frame, earliestUs: number): void {
    if (frame.type !== 'GoodCRC' && this.faulted(frame)) {
      for (const fault of faultsFor(this.book, ['delay'], frame.from as Side, frame.faultName, this.clock.nowUs)) earliestUs += (fault.delayMs ?? 0) * 1_000;
    }
    this.schedule(earliestUs, { kind: 'tx', frame });
  }

  /** A GoodCRC starts within tTransmit of the message's end and holds the line (§6.6 Time Values). */
  reserveGoodCrc(startUs: number, frame: Frame): number {
    const start = Math.max(startUs, this.freeUs);
    const endUs = start + packetDurationUs(0);
    this.freeUs = endUs + INTER_FRAME_GAP_US;
    this.schedule(start, { kind: 'tx', frame } satisfies EntryBody);
    return endUs;
  }

  transmit(frame: Frame): void {
    const nowUs = this.clock.nowUs;
    const pending = this.hooks.pending(frame.layer);
    if (frame.attempt > 0 && (pending === null || pending.messageId !== frame.messageId || pending.attempts !== frame.attempt)) return;
    if (frame.attempt > 0 && nowUs < this.freeUs) {
      this.schedule(this.freeUs, { kind: 'tx', frame });
      return;
    }
    const endUs = nowUs + packetDurationUs(frame.objects.length);
    if (frame.attempt > 0) this.hooks.startReceiveTimer(frame.layer, endUs);
    const faulted = this.faulted(frame);
    const from = frame.from as Side;
    if (faulted && isSilent(this.book, from, frame.faultName, nowUs)) return;
    this.freeUs = endUs + INTER_FRAME_GAP_US;
    // A dropped message never reaches the partner's port, so the port's trace holds a note, not the message.
    if (faulted && faultsFor(this.book, ['drop'], from, frame.faultName, nowUs).length > 0) {
      this.note(`fault: ${frame.faultName} #${frame.messageId} from ${frame.from} dropped`);
      return;
    }
    const corrupt = faulted && faultsFor(this.book, ['corrupt'], from, frame.faultName, nowUs).length > 0;
    const record: MessageRecord = { t: nowUs, msg: frameHex(frame.header, frame.objects), from: frame.from };
    if (frame.sop !== 'SOP') record.sop = frame.sop;
    if (corrupt) record.crcOk = false;
    this.records.push(record);
    this.schedule(endUs, { kind: 'arrive', frame, corrupt });
  }

  hardReset(port: Side, role: Side): void {
    const nowUs = this.clock.nowUs;
    if (nowUs < this.freeUs) {
      this.schedule(this.freeUs, { kind: 'hard-reset-tx', from: port });
      return;
    }
    if (isSilent(this.book, role, 'Hard_Reset', nowUs)) return;
    this.freeUs = nowUs + HARD_RESET_DURATION_US + INTER_FRAME_GAP_US;
    this.records.push({ t: nowUs, event: 'hard_reset', from: role });
    if (faultsFor(this.book, ['drop'], role, 'Hard_Reset', nowUs).length > 0) this.note(`fault: Hard_Reset from ${role} dropped`);
    else this.schedule(nowUs + HARD_RESET_DURATION_US, { kind: 'hard-reset-arrive', to: port === 'source' ? 'sink' : 'source' });
  }
}
