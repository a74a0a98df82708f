/**
 * The swap states both policy engines share (USB PD R3.2 V1.1 §8.3.3.18 DR_Swap, §8.3.3.19 PR_Swap,
 * §8.3.3.20 VCONN_Swap; §6.3.9–6.3.11 the answers): one module, the same steps from either side.
 */
import { describe, expect, it } from 'vitest';
import type { PeEffect } from './pe-types.ts';
import { answerSwap, swapStep, type SwapExits, type SwapPort } from './swap-pe.ts';

type Port = SwapPort & { ready?: boolean; reset?: string };
const exits: SwapExits<Port> = {
  enterReady: (pe, effects) => [{ ...pe, state: 'Ready', ready: true }, effects],
  hardReset: (pe, effects, why) => [{ ...pe, state: 'Hard_Reset', reset: why }, effects],
  prAccepted: (pe, effects) => [{ ...pe, state: 'PR_Transition' }, effects],
};
const port = (state: string, vconnSource: boolean, revision: '2.0' | '3.0' = '3.0'): Port => ({ state, revision, vconnSource });
const sends = (effects: PeEffect[]) => effects.flatMap((e) => (e.kind === 'send' ? [e.type] : []));

describe('answerSwap', () => {
  it.each([
    ['accept', 'DR_Swap', 'PE_DRS_Accept_Swap', ['Accept']],
    ['accept', 'VCONN_Swap', 'PE_VCS_Accept_Swap', ['Accept']],
    ['accept', 'PR_Swap', 'PR_Accept_State', ['Accept']],
    ['reject', 'PR_Swap', 'Ready', ['Reject']],
    ['wait', 'DR_Swap', 'Ready', ['Wait']],
    ['not_supported', 'VCONN_Swap', 'Ready', ['Not_Supported']],
  ] as const)('%s to %s → %s, sends %o', (answer, type, state, sent) => {
    const effects: PeEffect[] = [];
    const [next] = answerSwap(port('Ready', false), type, answer, 'PR_Accept_State', effects);
    expect(next.state).toBe(state);
    expect(sends(effects)).toEqual(sent);
  });

  it('a PD 2.0 port answers Reject where 3.x says Not_Supported (§6.3.16)', () => {
    const effects: PeEffect[] = [];
    answerSwap(port('Ready', false, '2.0'), 'DR_Swap', 'not_supported', 'x', effects);
    expect(sends(effects)).toEqual(['Reject']);
  });
});

describe('the VCONN hand-over (§8.3.3.20)', () => {
  it('the VCONN source waits for the partner’s PS_RDY, then gives VCONN up', () => {
    const [waiting, first] = swapStep(port('PE_VCS_Accept_Swap', true), { kind: 'sent', type: 'Accept' }, [], exits)!;
    expect(waiting.state).toBe('PE_VCS_Wait_For_VCONN');
    expect(first).toContainEqual({ kind: 'start-timer', name: 'tVCONNSourceTimeout' });
    const [done, effects] = swapStep(waiting, { kind: 'message', type: 'PS_RDY', objects: [], revision: '3.0' }, [], exits)!;
    expect(done).toMatchObject({ state: 'Ready', vconnSource: false });
    expect(effects).toContainEqual({ kind: 'vconn-swap' });
  });

  it('the port without VCONN turns it on within tVCONNSourceOn and says PS_RDY', () => {
    const [turning] = swapStep(port('PE_VCS_Send_Swap', false), { kind: 'message', type: 'Accept', objects: [], revision: '3.0' }, [], exits)!;
    expect(turning.state).toBe('PE_VCS_Turn_On_VCONN');
    const [same, effects] = swapStep(turning, { kind: 'timer', name: 'tVCONNSourceOn' }, [], exits)!;
    expect(sends(effects)).toEqual(['PS_RDY']);
    expect(swapStep(same, { kind: 'sent', type: 'PS_RDY' }, [], exits)![0]).toMatchObject({ state: 'Ready', vconnSource: true });
  });

  it('no PS_RDY within tVCONNSourceTimeout is a Hard Reset', () => {
    const [next] = swapStep(port('PE_VCS_Wait_For_VCONN', true), { kind: 'timer', name: 'tVCONNSourceTimeout' }, [], exits)!;
    expect(next.state).toBe('Hard_Reset');
  });
});

describe('our own swap request', () => {
  it('starts tSenderResponse once sent; Reject, Wait, Not_Supported or its expiry go back to Ready', () => {
    const effects: PeEffect[] = [];
    swapStep(port('PE_PRS_SNK_SRC_Send_Swap', false), { kind: 'sent', type: 'PR_Swap' }, effects, exits);
    expect(effects).toEqual([{ kind: 'start-timer', name: 'tSenderResponse' }]);
    for (const type of ['Reject', 'Wait', 'Not_Supported'] as const) {
      expect(swapStep(port('PE_DRS_Send_Swap', false), { kind: 'message', type, objects: [], revision: '3.0' }, [], exits)![0].state).toBe('Ready');
    }
    expect(swapStep(port('PE_DRS_Send_Swap', false), { kind: 'timer', name: 'tSenderResponse' }, [], exits)![0].state).toBe('Ready');
  });

  it('an accepted PR_Swap hands over to the side’s own power transition; an accepted DR_Swap swaps the data role', () => {
    expect(swapStep(port('PE_PRS_SRC_SNK_Send_Swap', true), { kind: 'message', type: 'Accept', objects: [], revision: '3.0' }, [], exits)![0].state).toBe('PR_Transition');
    const [ready, effects] = swapStep(port('PE_DRS_Send_Swap', true), { kind: 'message', type: 'Accept', objects: [], revision: '3.0' }, [], exits)!;
    expect(ready.state).toBe('Ready');
    expect(effects).toContainEqual({ kind: 'data-role-swap' });
  });
});
