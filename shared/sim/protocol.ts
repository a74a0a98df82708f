/**
 * The protocol layer of one port as a pure step: MessageID counters, GoodCRC, retries and
 * duplicate discard. Times are the runner's business: it starts the CRCReceiveTimer (tReceive)
 * when a transmission's last bit has gone out and feeds `crc-timeout` back here.
 *
 * USB PD R3.2 V1.1 §6.7.1 MessageIDCounter (0–7, incremented when a GoodCRC arrives or the
 * transmission fails); §6.6.1 CRCReceiveTimer; §6.7.2 Retry Counter (nRetryCount retransmissions
 * with the same MessageID, §6.7 Counter Values table); §6.7.1.2 a received MessageID equal to the
 * stored one is a retry: GoodCRC it and discard it; §6.8.1 a Soft_Reset resets both counters;
 * §6.12.2 a message received while waiting for a GoodCRC makes the transmitter discard its message.
 */
import type { MessageType } from './wire.ts';

export interface PendingTx {
  type: MessageType;
  objects: readonly number[];
  messageId: number;
  /** Transmissions so far (1 = the first, 2 = the first retry, …). */
  attempts: number;
}

export interface ProtocolState {
  /** MessageIDCounter for the next message this port sends. */
  txCounter: number;
  /** MessageID of the last message passed up, or -1 after a reset. */
  rxStored: number;
  pending: PendingTx | null;
}

export type ProtocolEvent =
  | { kind: 'send'; type: MessageType; objects: readonly number[] }
  | { kind: 'received'; type: MessageType | 'other'; messageId: number; objects: readonly number[] }
  | { kind: 'good-crc'; messageId: number }
  | { kind: 'crc-timeout' }
  | { kind: 'reset' };

export type ProtocolEffect =
  | { kind: 'transmit'; type: MessageType; objects: readonly number[]; messageId: number; attempt: number }
  | { kind: 'good-crc'; messageId: number }
  | { kind: 'stop-crc-timer' }
  | { kind: 'deliver'; type: MessageType | 'other'; objects: readonly number[] }
  | { kind: 'sent'; type: MessageType }
  | { kind: 'failed'; type: MessageType }
  | { kind: 'discarded'; type: MessageType };

export const initialProtocol: ProtocolState = { txCounter: 0, rxStored: -1, pending: null };

const next = (id: number) => (id + 1) & 0b111;

export function protocolStep(state: ProtocolState, event: ProtocolEvent, nRetryCount: number): [ProtocolState, ProtocolEffect[]] {
  switch (event.kind) {
    case 'reset':
      return [initialProtocol, state.pending ? [{ kind: 'stop-crc-timer' }] : []];
    case 'send': {
      // A Soft_Reset goes out with MessageID 0: the layer resets before sending it (§6.8.1).
      const base = event.type === 'Soft_Reset' ? initialProtocol : state;
      const pending: PendingTx = { type: event.type, objects: event.objects, messageId: base.txCounter, attempts: 1 };
      const effects: ProtocolEffect[] = state.pending ? [{ kind: 'stop-crc-timer' }] : [];
      effects.push({ kind: 'transmit', type: event.type, objects: event.objects, messageId: pending.messageId, attempt: 1 });
      return [{ ...base, pending }, effects];
    }
    case 'good-crc': {
      const pending = state.pending;
      if (!pending || pending.messageId !== event.messageId) return [state, []];
      return [{ ...state, txCounter: next(state.txCounter), pending: null }, [{ kind: 'stop-crc-timer' }, { kind: 'sent', type: pending.type }]];
    }
    case 'crc-timeout': {
      const pending = state.pending;
      if (!pending) return [state, []];
      if (pending.attempts <= nRetryCount) {
        const retry = { ...pending, attempts: pending.attempts + 1 };
        return [{ ...state, pending: retry }, [{ kind: 'transmit', type: retry.type, objects: retry.objects, messageId: retry.messageId, attempt: retry.attempts }]];
      }
      return [{ ...state, txCounter: next(state.txCounter), pending: null }, [{ kind: 'failed', type: pending.type }]];
    }
    case 'received': {
      const effects: ProtocolEffect[] = [{ kind: 'good-crc', messageId: event.messageId }];
      if (event.type === 'Soft_Reset') {
        if (state.pending) effects.push({ kind: 'stop-crc-timer' }, { kind: 'discarded', type: state.pending.type });
        effects.push({ kind: 'deliver', type: event.type, objects: event.objects });
        return [{ txCounter: 0, rxStored: event.messageId, pending: null }, effects];
      }
      if (event.messageId === state.rxStored) return [state, effects];
      let txCounter = state.txCounter;
      if (state.pending) {
        effects.push({ kind: 'stop-crc-timer' }, { kind: 'discarded', type: state.pending.type });
        txCounter = next(txCounter);
      }
      effects.push({ kind: 'deliver', type: event.type, objects: event.objects });
      return [{ txCounter, rxStored: event.messageId, pending: null }, effects];
    }
  }
}
