/**
 * Messages captured with a wrong CRC, reported once the trace shows whether anything was lost.
 * A receiver discards a corrupted message and sends no GoodCRC; the sender retries the same message
 * (USB PD R3.2 V1.1 §5.6.2 CRC, §6.7.2 RetryCounter; from memory). When a later copy with the same
 * MessageID and type arrives intact — or the receiver acknowledged it anyway, having read it right
 * where the capture did not — the fault cost nothing and is a warning; otherwise an error.
 */
import type { Sop } from '../pd/types.ts';
import { seconds } from './format.ts';
import type { Report, SeenMessage } from './seen.ts';

export interface CrcErrors {
  /** Every message on the wire, in order, after the protocol tracker has seen it. */
  onMessage(m: SeenMessage): void;
  /** A reset or the end of the trace: what is still waiting was not recovered. */
  flush(): void;
}

export function createCrcErrors(report: Report): CrcErrors {
  const waiting = new Map<Sop, SeenMessage[]>();

  const say = (m: SeenMessage, recoveredBy: SeenMessage | undefined): void => {
    const what = `The ${m.d.messageType} from the ${m.from} at ${seconds(m.t)} arrived with a wrong CRC, so the receiver had to discard it`;
    if (!recoveredBy) report('decode.crc', `${what}.`, { t: m.t, line: m.line });
    else {
      const how =
        recoveredBy.d.messageType === 'GoodCRC'
          ? `the ${recoveredBy.from} acknowledged it at ${seconds(recoveredBy.t)}, so nothing was lost`
          : recoveredBy.from === m.from
            ? `the retry at ${seconds(recoveredBy.t)} delivered it`
            : `the ${recoveredBy.from} retried its message at ${seconds(recoveredBy.t)}, so nothing was lost`;
      report('decode.crc', `${what}; ${how}.`, { t: m.t, line: m.line, lowerTo: 'warning' });
    }
  };
  const settle = (sop: Sop, by: SeenMessage | undefined): void => {
    for (const m of waiting.get(sop) ?? []) say(m, by);
    waiting.delete(sop);
  };

  return {
    onMessage(m) {
      const list = waiting.get(m.sop);
      const first = list?.[0];
      if (first) {
        const sameMessage = m.d.messageId === first.d.messageId && (m.d.messageType === first.d.messageType || m.d.messageType === 'GoodCRC');
        const retry = m.from === first.from && sameMessage && m.d.messageType !== 'GoodCRC';
        const acknowledged = m.from !== first.from && m.d.messageType === 'GoodCRC' && sameMessage && m.crcOk;
        // A corrupted GoodCRC: the sender, missing it, retries the message it acknowledged (same MessageID).
        const resent = first.d.messageType === 'GoodCRC' && m.from !== first.from && m.d.messageType !== 'GoodCRC' && m.d.messageId === first.d.messageId;
        if (m.crcOk && (retry || acknowledged || resent)) {
          settle(m.sop, m);
          return;
        }
        if (!m.crcOk && retry) {
          list!.push(m);
          return;
        }
        settle(m.sop, undefined);
      }
      if (!m.crcOk) waiting.set(m.sop, [m]);
    },
    flush() {
      for (const sop of [...waiting.keys()]) settle(sop, undefined);
    },
  };
}
