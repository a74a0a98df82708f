/**
 * The protocol layer of both ports, as a capture shows it: GoodCRC, retries and MessageIDs,
 * kept apart per SOP* (USB PD R3.2 V1.1 §6.7.1 MessageIDCounter and §6.7.2 RetryCounter are per
 * SOP*; from memory).
 * - Every message but GoodCRC is acknowledged by a GoodCRC carrying its MessageID (§6.2.1.3,
 *   §6.3.1), within tReceive after its EOP (§6.6.1 CRCReceiveTimer; Time Values table).
 * - Without that GoodCRC the sender retries the same message (same MessageID and content) up to
 *   nRetryCount times (§6.7.2; 2 in R3.x, 3 in R2.0, Counter Values table).
 * - A new message carries the sender's next MessageID (modulo 8); Soft_Reset, Hard Reset and a
 *   new attach set the counters to zero (§6.7.1; from memory).
 * Logs that do not record GoodCRC at all are common (firmware prints what it handles), so
 * missing-GoodCRC findings are held back until the trace shows a first GoodCRC on that SOP*.
 */
import { countersFor, timersFor } from '../core/timers.ts';
import type { Sop } from '../pd/types.ts';
import { millis, seconds } from './format.ts';
import type { TraceSide } from './records.ts';
import type { FindingExtra, Report, SeenMessage } from './seen.ts';

/** What a message was to the protocol layer. */
export type Delivery = 'new' | 'retry' | 'goodcrc' | 'ignored';

interface SopState {
  pending: SeenMessage | undefined;
  retries: number;
  reported: boolean;
  /** The last message each side sent that the receiver took. */
  last: Partial<Record<TraceSide, SeenMessage>>;
  goodCrcSeen: boolean;
  /** A GoodCRC since the last Hard Reset: before one, a source offering to a silent partner is normal. */
  partnerAnswered: boolean;
  held: [string, FindingExtra][];
}

const HELD_LIMIT = 1_000;
/**
 * A retry follows its original within tReceive + tRetry (about 1.3 ms, Time Values table); the
 * window is wider for logs with coarse clocks, and far below the 100 ms a port waits before it
 * repeats a message on purpose (tTypeCSendSourceCap, tSinkRequest) — common practice.
 */
const RETRY_WINDOW_US = 10_000;

export interface ProtocolTracker {
  onMessage(m: SeenMessage): Delivery;
  /** The message still waiting for a GoodCRC past tReceive at `t` (a Hard Reset's likely cause). */
  unacknowledged(t: number): SeenMessage | undefined;
  /** Hard Reset, attach, detach: everything (or, for Cable Reset, SOP'/SOP'' only) starts over. */
  reset(t: number, which: 'all' | 'cable'): void;
  finish(tEndUs: number): void;
  goodCrcSeen(): boolean;
  /** The ports' protocol layers started again without a reset on the wire (after a PR_Swap): any next MessageID is lawful. */
  forgetIds(sop: Sop): void;
}

/**
 * A retry is the same message again from the same sender (§6.7.2): same MessageID and content. A
 * corrupted copy cannot be compared byte for byte, so there the MessageID and type must agree — a
 * Soft_Reset after the last retry (§6.8.1) is then a new message, never one more copy.
 */
function isRetryOf(p: SeenMessage, m: SeenMessage): boolean {
  if (p.from !== m.from || p.d.messageId !== m.d.messageId) return false;
  return p.crcOk && m.crcOk ? p.d.hex === m.d.hex : p.d.messageType === m.d.messageType;
}

export function createProtocolTracker(report: Report): ProtocolTracker {
  const states = new Map<Sop, SopState>();
  const state = (sop: Sop): SopState => {
    let s = states.get(sop);
    if (!s) {
      s = { pending: undefined, retries: 0, reported: false, last: {}, goodCrcSeen: false, partnerAnswered: false, held: [] };
      states.set(sop, s);
    }
    return s;
  };

  const missing = (s: SopState, message: string, extra: FindingExtra): void => {
    if (s.goodCrcSeen) report('protocol.missing-goodcrc', message, extra);
    else if (s.held.length < HELD_LIMIT) s.held.push([message, extra]);
  };

  /** The pending message is left behind without a GoodCRC (the next message, a reset, the end). */
  const close = (s: SopState, nowUs: number): void => {
    const p = s.pending;
    s.pending = undefined;
    if (!p || s.reported) return;
    const { tReceive } = timersFor(p.d.revision);
    if (nowUs - p.endUs <= tReceive.maxUs) return;
    // A corrupted copy gets no GoodCRC by design (§5.6.2): the CRC finding already says why.
    if (!p.crcOk) return;
    // Before any GoodCRC since attach or Hard Reset the partner may not speak PD yet: the source keeps
    // offering (§8.3.3.2 PE_SRC_Discovery; §6.8.3 a Hard Reset starts both protocol layers over).
    if (p.d.messageType === 'Source_Capabilities' && !s.partnerAnswered) return;
    const { nRetryCount } = countersFor(p.d.revision);
    const what = `${p.d.messageType} at ${seconds(p.firstUs ?? p.t)}`;
    const text =
      s.retries >= nRetryCount
        ? `The ${p.from} sent its ${what} ${s.retries + 1} times and never got a GoodCRC.`
        : `The ${p.from}'s ${what} got no GoodCRC, and the ${p.from} stopped after ${s.retries} of the ${nRetryCount} retries it owes.`;
    missing(s, text, { t: p.t, line: p.line });
  };

  return {
    onMessage(m) {
      const s = state(m.sop);
      if (m.d.messageType === 'GoodCRC') {
        if (!m.crcOk) return 'ignored';
        if (!s.goodCrcSeen) {
          s.goodCrcSeen = true;
          for (const [text, extra] of s.held) report('protocol.missing-goodcrc', text, extra);
          s.held = [];
        }
        s.partnerAnswered = true;
        const p = s.pending;
        if (!p || p.from === m.from) {
          report('protocol.unexpected', `A GoodCRC from the ${m.from} at ${seconds(m.t)} acknowledged no message.`, { t: m.t, line: m.line });
          return 'goodcrc';
        }
        if (p.d.messageId !== m.d.messageId) {
          report('protocol.message-id', `The ${m.from}'s GoodCRC at ${seconds(m.t)} carries MessageID ${m.d.messageId}, but the ${p.d.messageType} it answers carries ${p.d.messageId}.`, {
            t: m.t,
            line: m.line,
          });
        }
        const { tReceive } = timersFor(p.d.revision);
        const waitedUs = m.endUs - p.endUs;
        if (waitedUs > tReceive.maxUs && !s.reported) {
          report(
            'protocol.missing-goodcrc',
            `The GoodCRC for the ${p.from}'s ${p.d.messageType} at ${seconds(p.t)} ended ${millis(waitedUs)} after it, later than tReceive (${millis(tReceive.maxUs)}) allows.`,
            { t: m.t, line: m.line, ref: tReceive.ref },
          );
        }
        p.ackEndUs = m.endUs;
        m.acks = p;
        s.pending = undefined;
        s.retries = 0;
        s.reported = false;
        return 'goodcrc';
      }

      const p = s.pending;
      if (p && m.t - p.endUs <= RETRY_WINDOW_US && isRetryOf(p, m)) {
        s.retries++;
        const { nRetryCount, ref } = countersFor(m.d.revision);
        if (s.retries > nRetryCount && !s.reported) {
          s.reported = true;
          missing(s, `The ${m.from} sent its ${m.d.messageType} at ${seconds(p.firstUs ?? p.t)} ${s.retries + 1} times: more retries than nRetryCount (${nRetryCount}) allows.`, {
            t: m.t,
            line: m.line,
            ref,
          });
        }
        m.firstUs = p.firstUs ?? p.t;
        s.pending = m;
        return m.crcOk && !p.crcOk ? deliver(s, m) : 'retry';
      }
      if (p && !s.reported && p.from === m.from && p.crcOk && m.crcOk && m.d.messageId === ((p.d.messageId + 1) & 7)) {
        // Neither a GoodCRC nor tReceive's end came before it: the sender moved on instead of waiting to retry (§6.7.2, §6.6.1).
        const { tReceive } = timersFor(p.d.revision);
        const gapUs = m.t - p.endUs;
        if (gapUs < tReceive.minUs) {
          s.reported = true;
          missing(
            s,
            `The ${m.from} sent ${m.d.messageType} with the next MessageID ${m.d.messageId} at ${seconds(m.t)}, ${millis(gapUs)} after its ${p.d.messageType} ended with no GoodCRC; it must wait tReceive (${millis(tReceive.minUs)}–${millis(tReceive.maxUs)}) for the GoodCRC and otherwise retry the ${p.d.messageType}.`,
            { t: m.t, line: m.line, ref: tReceive.ref },
          );
        }
      }
      close(s, m.t);
      s.retries = 0;
      s.reported = false;
      s.pending = m;
      if (!m.crcOk) return 'ignored';
      return deliver(s, m);
    },
    unacknowledged(t) {
      for (const s of states.values()) {
        const p = s.pending;
        if (p && t - p.endUs > timersFor(p.d.revision).tReceive.maxUs) return p;
      }
      return undefined;
    },
    reset(t, which) {
      for (const [sop, s] of states) {
        if (which === 'cable' && sop === 'SOP') continue;
        close(s, t);
        s.partnerAnswered = false;
        s.last = {};
        s.retries = 0;
        s.reported = false;
      }
    },
    finish(tEndUs) {
      for (const s of states.values()) {
        close(s, tEndUs);
        s.held = [];
      }
    },
    goodCrcSeen: () => [...states.values()].some((s) => s.goodCrcSeen),
    forgetIds(sop) {
      const s = states.get(sop);
      if (s) s.last = {};
    },
  };

  /**
   * MessageID bookkeeping for a message the receiver takes (§6.7.1). After a message that got no
   * GoodCRC the sender may keep its MessageID or move on (a transmission error), so both pass.
   */
  function deliver(s: SopState, m: SeenMessage): Delivery {
    const id = m.d.messageId;
    if (m.d.messageType === 'Soft_Reset') s.last = {};
    const last = s.last[m.from];
    s.last[m.from] = m;
    if (last === undefined) return 'new';
    const lastId = last.d.messageId;
    const next = (lastId + 1) & 7;
    if (id === lastId) {
      // The same message again right after its GoodCRC: the sender missed that GoodCRC and retried.
      if (last.d.hex === m.d.hex && (last.ackEndUs === undefined || m.t - last.endUs <= RETRY_WINDOW_US)) return last.ackEndUs === undefined ? 'new' : 'retry';
      if (last.ackEndUs === undefined) return 'new';
      report('protocol.message-id', `The ${m.from}'s ${m.d.messageType} at ${seconds(m.t)} repeats MessageID ${id} of the ${last.d.messageType} at ${seconds(last.t)} without being a retry of it.`, {
        t: m.t,
        line: m.line,
      });
    } else if (id !== next) {
      report('protocol.message-id', `The ${m.from}'s ${m.d.messageType} at ${seconds(m.t)} carries MessageID ${id}; after ${lastId} the next is ${next}.`, { t: m.t, line: m.line });
    }
    return 'new';
  }
}
