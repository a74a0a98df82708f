/** Events and effects of the two policy engines (source-pe.ts, sink-pe.ts). */
import type { Contract } from '../core/contract.ts';
import type { TimerName } from '../core/timers.ts';
import type { SinkPolicy } from '../rules/sink-policy.ts';
import type { ActionName } from './scenario.ts';
import type { Side } from './types.ts';
import type { MessageType, Revision, Sop } from './wire.ts';

export type PeEvent =
  /** Type-C attached and VBUS at vSafe5V (or a power role swap finished): the policy engine starts. */
  | { kind: 'start' }
  /**
   * A message passed up by the protocol layer; an extended one carries its whole data block in
   * `bytes` (chunks already put together). `reject`/`wait` are the faults of the same names.
   */
  | { kind: 'message'; type: MessageType | 'other'; objects: readonly number[]; bytes?: readonly number[]; revision: Revision; sop?: Sop; reject?: boolean; wait?: boolean }
  /** The protocol layer got the GoodCRC for this message (the last chunk, for an extended one). */
  | { kind: 'sent'; type: MessageType; sop?: Sop }
  /** nRetryCount retries without a GoodCRC (or a chunk never asked for). */
  | { kind: 'failed'; type: MessageType; sop?: Sop }
  | { kind: 'discarded'; type: MessageType }
  | { kind: 'timer'; name: TimerName }
  | { kind: 'hard-reset-received' }
  /** Source: the supply reached the level last asked for. `withholdPsRdy` is the no-ps-rdy fault. */
  | { kind: 'supply-ready'; withholdPsRdy?: boolean }
  /** Sink: VBUS crossed vSafe5V (present) or vSafe0V (absent). */
  | { kind: 'vbus'; present: boolean }
  /** Sink: the device policy manager changed the policy. */
  | { kind: 'policy'; policy: SinkPolicy }
  /** Source: a programmable supply's current limit would pull VBUS below the offer's minimum voltage. */
  | { kind: 'overload' }
  /** The device policy manager asks the port to start an exchange (scenario `actions`). */
  | { kind: 'action'; action: ActionName };

export type SinkMode = 'off' | 'default' | 'standby' | 'operating';

export type PeEffect =
  /**
   * `bytes`: an extended message's data block (sent chunked). `sop`: SOP' for the cable plug.
   * `initiate`: the message starts an exchange of this port's own (collision avoidance, §5.7).
   */
  | { kind: 'send'; type: MessageType; objects: readonly number[]; bytes?: readonly number[]; sop?: "SOP'"; initiate?: true }
  /**
   * `afterGoodCrc`: the timer starts when this port's GoodCRC for the message just received has
   * been sent (its end on the wire), not when the message itself ended.
   */
  | { kind: 'start-timer'; name: TimerName; afterGoodCrc?: true }
  | { kind: 'stop-timer'; name: TimerName }
  | { kind: 'hard-reset' }
  | { kind: 'protocol-reset' }
  /**
   * Source: drive VBUS to `voltageMv`; `limitMa` is a programmable supply's current limit and
   * `floorMv` the lowest voltage the limit may pull it to (the offer's minimum).
   */
  | { kind: 'supply'; voltageMv: number; limitMa: number | null; floorMv?: number }
  | { kind: 'contract'; contract: Contract | null }
  | { kind: 'sink-mode'; mode: SinkMode }
  /** USB Type-C R2.3 §4.5.2.2.2 ErrorRecovery: both ports detach and attach again. */
  | { kind: 'error-recovery' }
  /** This port's data role changed (DR_Swap accepted). */
  | { kind: 'data-role-swap' }
  /** The VCONN source changed (VCONN_Swap done). */
  | { kind: 'vconn-swap' }
  /** Power role swap: this port now runs the other role's policy engine. */
  | { kind: 'become'; role: Side }
  | { kind: 'note'; text: string };

export function minRevision(a: Revision, b: Revision): Revision {
  return a === '2.0' || b === '2.0' ? '2.0' : '3.0';
}

/** EPR_Mode data object (USB PD R3.2 V1.1 §6.4.10, Table 6.50): Action b31..24, Data b23..16. */
export const eprModeAction = { enter: 1, enterAcknowledged: 2, enterSucceeded: 3, enterFailed: 4, exit: 5 } as const;
/** Enter_Failed reasons (same table): 1 cable not EPR capable, 3 RDO without EPR Mode Capable, 4 source unable now, 5 PDO without EPR Mode Capable. */
export const eprEnterFailed = { unknown: 0, cable: 1, vconn: 2, rdo: 3, unable: 4, pdo: 5 } as const;

export function eprModeObject(action: number, data = 0): number {
  return (((action & 0xff) << 24) | ((data & 0xff) << 16)) >>> 0;
}
export function eprModeOf(object: number | undefined): { action: number; data: number } {
  const word = object ?? 0;
  return { action: (word >>> 24) & 0xff, data: (word >>> 16) & 0xff };
}

export function isEcdb(event: PeEvent, type: number): boolean {
  return event.kind === 'message' && event.type === 'Extended_Control' && event.bytes?.[0] === type;
}
