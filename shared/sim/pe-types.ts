/** Events and effects of the two policy engines (source-pe.ts, sink-pe.ts). */
import type { Contract } from '../core/contract.ts';
import type { TimerName } from '../core/timers.ts';
import type { SinkPolicy } from '../rules/sink-policy.ts';
import type { MessageType, Revision } from './wire.ts';

export type PeEvent =
  /** Type-C attached and VBUS at vSafe5V: the policy engine starts. */
  | { kind: 'start' }
  | { kind: 'message'; type: MessageType | 'other'; objects: readonly number[]; revision: Revision; reject?: boolean }
  /** The protocol layer got the GoodCRC for this message. */
  | { kind: 'sent'; type: MessageType }
  /** nRetryCount retries without a GoodCRC. */
  | { kind: 'failed'; type: MessageType }
  | { kind: 'discarded'; type: MessageType }
  | { kind: 'timer'; name: TimerName }
  | { kind: 'hard-reset-received' }
  /** Source: the supply reached the level last asked for. `withholdPsRdy` is the no-ps-rdy fault. */
  | { kind: 'supply-ready'; withholdPsRdy?: boolean }
  /** Sink: VBUS crossed vSafe5V (present) or vSafe0V (absent). */
  | { kind: 'vbus'; present: boolean }
  /** Sink: the device policy manager changed the policy. */
  | { kind: 'policy'; policy: SinkPolicy };

export type SinkMode = 'off' | 'default' | 'standby' | 'operating';

export type PeEffect =
  | { kind: 'send'; type: MessageType; objects: readonly number[] }
  /**
   * `afterGoodCrc`: the timer starts when this port's GoodCRC for the message just received has
   * been sent (its end on the wire), not when the message itself ended.
   */
  | { kind: 'start-timer'; name: TimerName; afterGoodCrc?: true }
  | { kind: 'stop-timer'; name: TimerName }
  | { kind: 'hard-reset' }
  | { kind: 'protocol-reset' }
  /** Source: drive VBUS to `voltageMv`; `limitMa` is a programmable supply's current limit. */
  | { kind: 'supply'; voltageMv: number; limitMa: number | null }
  | { kind: 'contract'; contract: Contract | null }
  | { kind: 'sink-mode'; mode: SinkMode }
  | { kind: 'note'; text: string };

export function minRevision(a: Revision, b: Revision): Revision {
  return a === '2.0' || b === '2.0' ? '2.0' : '3.0';
}
