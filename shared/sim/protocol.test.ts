import { describe, expect, it } from 'vitest';
import { initialProtocol, protocolStep, type ProtocolEffect, type ProtocolState } from './protocol.ts';

const kinds = (effects: ProtocolEffect[]) => effects.map((e) => e.kind);

describe('protocolStep', () => {
  it('numbers messages 0–7 and moves on only when the GoodCRC carries the same MessageID', () => {
    let [state, effects] = protocolStep(initialProtocol, { kind: 'send', type: 'Request', objects: [1] }, 2);
    expect(effects).toEqual([{ kind: 'transmit', type: 'Request', objects: [1], messageId: 0, attempt: 1 }]);
    [state, effects] = protocolStep(state, { kind: 'good-crc', messageId: 3 }, 2);
    expect(effects).toEqual([]);
    [state, effects] = protocolStep(state, { kind: 'good-crc', messageId: 0 }, 2);
    expect(kinds(effects)).toEqual(['stop-crc-timer', 'sent']);
    expect(state.txCounter).toBe(1);
    // USB PD R3.2 V1.1 §6.2.1.1.5 MessageID: a 3-bit rolling counter.
    expect(protocolStep({ ...state, txCounter: 7, pending: null }, { kind: 'send', type: 'Accept', objects: [] }, 2)[1][0]).toMatchObject({ messageId: 7 });
  });

  // USB PD R3.2 V1.1 §6.7.2 and the Counter Values table: nRetryCount = 2 (R3.x), 3 (R2.0).
  it('retries nRetryCount times with the same MessageID, then reports failure', () => {
    for (const nRetryCount of [2, 3]) {
      let [state] = protocolStep(initialProtocol, { kind: 'send', type: 'Source_Capabilities', objects: [] }, nRetryCount);
      const ids: number[] = [];
      for (let i = 0; i < nRetryCount; i++) {
        const [next, effects] = protocolStep(state, { kind: 'crc-timeout' }, nRetryCount);
        state = next;
        expect(effects[0]).toMatchObject({ kind: 'transmit', attempt: i + 2 });
        ids.push((effects[0] as { messageId: number }).messageId);
      }
      expect(ids.every((id) => id === 0)).toBe(true);
      const [after, effects] = protocolStep(state, { kind: 'crc-timeout' }, nRetryCount);
      expect(effects).toEqual([{ kind: 'failed', type: 'Source_Capabilities' }]);
      expect(after.txCounter).toBe(1);
    }
  });

  // §6.7.1.2: a repeated MessageID is a retry — acknowledge it, pass it up once.
  it('acknowledges a duplicate and discards it', () => {
    const [state, first] = protocolStep(initialProtocol, { kind: 'received', type: 'Request', messageId: 4, objects: [] }, 2);
    expect(kinds(first)).toEqual(['good-crc', 'deliver']);
    const [, again] = protocolStep(state, { kind: 'received', type: 'Request', messageId: 4, objects: [] }, 2);
    expect(again).toEqual([{ kind: 'good-crc', messageId: 4 }]);
  });

  // §6.8.1: Soft_Reset resets MessageIDCounter and the stored MessageID; it is sent with MessageID 0.
  it('resets the counters on Soft_Reset, sent or received', () => {
    const busy: ProtocolState = { txCounter: 5, rxStored: 2, pending: null };
    expect(protocolStep(busy, { kind: 'send', type: 'Soft_Reset', objects: [] }, 2)[1]).toEqual([{ kind: 'transmit', type: 'Soft_Reset', objects: [], messageId: 0, attempt: 1 }]);
    const [after] = protocolStep(busy, { kind: 'received', type: 'Soft_Reset', messageId: 0, objects: [] }, 2);
    expect(after).toEqual({ txCounter: 0, rxStored: 0, pending: null });
  });

  it('drops its own message when a new one arrives while it waits for a GoodCRC', () => {
    const [waiting] = protocolStep(initialProtocol, { kind: 'send', type: 'Request', objects: [] }, 2);
    const [state, effects] = protocolStep(waiting, { kind: 'received', type: 'Accept', messageId: 1, objects: [] }, 2);
    expect(kinds(effects)).toEqual(['good-crc', 'stop-crc-timer', 'discarded', 'deliver']);
    expect(state.pending).toBeNull();
  });
});
