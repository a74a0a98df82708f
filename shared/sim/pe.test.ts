/** Single steps of the two policy engines (USB PD R3.2 V1.1 §8.3.3.2 and §8.3.3.3). */
import { describe, expect, it } from 'vitest';
import { decodeSourcePdo } from '../pd/index.ts';
import type { SourcePdo } from '../pd/types.ts';
import { initialSinkPe, sinkStep } from './sink-pe.ts';
import { initialSourcePe, sourceStep, type SourceContext } from './source-pe.ts';

const words = [0x0001_912c, 0x0002_d12c];
const offers = { words, pdos: words.map((w) => decodeSourcePdo(w) as SourcePdo) };
const context: SourceContext = { offers: () => offers, eprCapable: false, discoverCable: false, swapAnswer: 'reject', pdpW: () => ({ spr: 27, epr: 0 }), vbusMv: () => 5_000 };

describe('sourceStep', () => {
  it('sends Source_Capabilities after tFirstSourceCap and waits tSenderResponse once acknowledged', () => {
    let [pe, effects] = sourceStep(initialSourcePe('3.0'), { kind: 'start' }, context);
    expect(pe.state).toBe('PE_SRC_Startup');
    expect(effects).toContainEqual({ kind: 'start-timer', name: 'tFirstSourceCap' });
    [pe, effects] = sourceStep(pe, { kind: 'timer', name: 'tFirstSourceCap' }, context);
    expect(effects).toEqual([{ kind: 'send', type: 'Source_Capabilities', objects: words }]);
    [pe, effects] = sourceStep(pe, { kind: 'sent', type: 'Source_Capabilities' }, context);
    expect(effects).toContainEqual({ kind: 'start-timer', name: 'tSenderResponse' });
    // §8.3.3.2.3: SenderResponseTimer timeout → PE_SRC_Hard_Reset.
    [pe, effects] = sourceStep(pe, { kind: 'timer', name: 'tSenderResponse' }, context);
    expect(pe.state).toBe('PE_SRC_Hard_Reset');
    expect(effects).toContainEqual({ kind: 'hard-reset' });
  });

  // §8.3.3.2.5: a Request for an object that is not offered is answered with Reject.
  it('rejects a Request naming an object position that was not offered', () => {
    const ready = { ...initialSourcePe('3.0'), state: 'PE_SRC_Send_Capabilities' };
    const [pe, effects] = sourceStep(ready, { kind: 'message', type: 'Request', objects: [(5 << 28) | (100 << 10) | 100], revision: '3.0' }, context);
    expect(pe.state).toBe('PE_SRC_Capability_Response');
    expect(effects).toContainEqual({ kind: 'send', type: 'Reject', objects: [] });
  });
});

describe('sinkStep', () => {
  it('answers offers with the policy Request and starts SenderResponseTimer once it is acknowledged', () => {
    let [pe, effects] = sinkStep(initialSinkPe('3.0', { kind: 'max-power' }), { kind: 'start' }, { cableMa: 3_000, ownRevision: '3.0' });
    expect(pe.state).toBe('PE_SNK_Wait_for_Capabilities');
    expect(effects).toContainEqual({ kind: 'start-timer', name: 'tSinkWaitCap' });
    [pe, effects] = sinkStep(pe, { kind: 'message', type: 'Source_Capabilities', objects: words, revision: '3.0' }, { cableMa: 3_000, ownRevision: '3.0' });
    // 9 V 3 A at object 2: RDO 2 << 28 | 300 << 10 | 300 (USB PD R3.2 V1.1 §6.4.2, Table 6.21 fixed RDO, 10 mA units).
    expect(effects.at(-1)).toEqual({ kind: 'send', type: 'Request', objects: [(2 << 28) | (300 << 10) | 300] });
    [pe, effects] = sinkStep(pe, { kind: 'sent', type: 'Request' }, { cableMa: 3_000, ownRevision: '3.0' });
    expect(effects).toEqual([{ kind: 'start-timer', name: 'tSenderResponse' }]);
  });

  // §6.5.x / §8.3.3.3: a revision 2.0 partner gets the lower revision; R2.0 has no programmable offers.
  it('negotiates down to revision 2.0 when the source speaks 2.0', () => {
    const [pe] = sinkStep(
      { ...initialSinkPe('3.0', { kind: 'max-power' }), state: 'PE_SNK_Wait_for_Capabilities' },
      { kind: 'message', type: 'Source_Capabilities', objects: words, revision: '2.0' },
      { cableMa: 3_000, ownRevision: '3.0' },
    );
    expect(pe.revision).toBe('2.0');
  });
});
