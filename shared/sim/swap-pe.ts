/**
 * The swap states both policy engines share, after USB PD R3.2 V1.1 §8.3.3.18 (DR_Swap), §8.3.3.19
 * (PR_Swap: the request and its answer) and §8.3.3.20 (VCONN_Swap), with §6.3.9–6.3.11: answering a
 * partner's swap request, waiting for the answer to our own, and the VCONN hand-over. The power
 * transition of a PR_Swap differs by direction (§7.3.9) and stays in source-pe.ts and sink-pe.ts,
 * which pass it in as `prAccepted`.
 */
import type { PeEffect, PeEvent } from './pe-types.ts';
import type { MessageType, Revision } from './wire.ts';

export type SwapAnswer = 'accept' | 'reject' | 'wait' | 'not_supported';

/** What the swap states need of either policy engine's state. */
export interface SwapPort {
  state: string;
  revision: Revision;
  /** This port sources VCONN now (at attach the source does, §4.5.2.2 of USB Type-C R2.3, from memory). */
  vconnSource: boolean;
}

type Step<P> = [P, PeEffect[]];

/** The two ways out that belong to each side: back to its Ready state, or a Hard Reset. */
export interface SwapExits<P> {
  enterReady(pe: P, effects: PeEffect[]): Step<P>;
  hardReset(pe: P, effects: PeEffect[], why: string): Step<P>;
  /** Our PR_Swap was accepted: the side's own power transition starts (§7.3.9). */
  prAccepted(pe: P, effects: PeEffect[]): Step<P>;
}

const SEND_SWAP_STATES = new Set(['PE_DRS_Send_Swap', 'PE_VCS_Send_Swap', 'PE_PRS_SRC_SNK_Send_Swap', 'PE_PRS_SNK_SRC_Send_Swap']);

/** The partner asked for a swap (§6.3.9–6.3.11): per `behaviour.swapAnswer`; Not_Supported is Reject in R2.0. */
export function answerSwap<P extends SwapPort>(pe: P, type: MessageType, answer: SwapAnswer, prAcceptState: string, effects: PeEffect[]): Step<P> {
  const send = (t: MessageType) => effects.push({ kind: 'send', type: t, objects: [] });
  if (answer === 'not_supported') send(pe.revision === '2.0' ? 'Reject' : 'Not_Supported');
  else if (answer === 'reject') send('Reject');
  else if (answer === 'wait') send('Wait');
  else {
    send('Accept');
    const state = type === 'PR_Swap' ? prAcceptState : type === 'DR_Swap' ? 'PE_DRS_Accept_Swap' : 'PE_VCS_Accept_Swap';
    return [{ ...pe, state }, effects];
  }
  return [pe, effects];
}

/** §8.3.3.20: after both agreed, the port without VCONN turns it on and says PS_RDY; the VCONN source waits for that. */
function vconnHandOver<P extends SwapPort>(pe: P, effects: PeEffect[]): Step<P> {
  if (pe.vconnSource) {
    effects.push({ kind: 'start-timer', name: 'tVCONNSourceTimeout' });
    return [{ ...pe, state: 'PE_VCS_Wait_For_VCONN' }, effects];
  }
  effects.push({ kind: 'start-timer', name: 'tVCONNSourceOn' });
  return [{ ...pe, state: 'PE_VCS_Turn_On_VCONN' }, effects];
}

/** One step of the shared swap states; null when `pe` is in none of them or the event means nothing there. */
export function swapStep<P extends SwapPort>(pe: P, event: PeEvent, effects: PeEffect[], exits: SwapExits<P>): Step<P> | null {
  if (SEND_SWAP_STATES.has(pe.state)) return swapAnswered(pe, event, effects, exits);
  switch (pe.state) {
    case 'PE_DRS_Accept_Swap':
      // Each port changes its own data role once the Accept has gone over (§6.3.9).
      if (event.kind === 'sent' && event.type === 'Accept') {
        effects.push({ kind: 'data-role-swap' });
        return exits.enterReady(pe, effects);
      }
      return null;
    case 'PE_VCS_Accept_Swap':
      if (event.kind === 'sent' && event.type === 'Accept') return vconnHandOver(pe, effects);
      return null;
    case 'PE_VCS_Turn_On_VCONN':
      if (event.kind === 'timer' && event.name === 'tVCONNSourceOn') {
        effects.push({ kind: 'send', type: 'PS_RDY', objects: [] });
        return [pe, effects];
      }
      if (event.kind === 'sent' && event.type === 'PS_RDY') {
        effects.push({ kind: 'vconn-swap' });
        return exits.enterReady({ ...pe, vconnSource: true }, effects);
      }
      return null;
    case 'PE_VCS_Wait_For_VCONN':
      if (event.kind === 'message' && event.type === 'PS_RDY') {
        effects.push({ kind: 'stop-timer', name: 'tVCONNSourceTimeout' }, { kind: 'vconn-swap' });
        return exits.enterReady({ ...pe, vconnSource: false }, effects);
      }
      if (event.kind === 'timer' && event.name === 'tVCONNSourceTimeout') return exits.hardReset(pe, effects, 'no PS_RDY within tVCONNSourceTimeout after VCONN_Swap');
      return null;
  }
  return null;
}

/**
 * A request of ours that wants an answer (Get_Sink_Cap, Get_Status, …, §8.3.3.4–.17): whatever the
 * answer, or none within tSenderResponse, back to Ready.
 */
export function awaitAnswer<P extends SwapPort>(pe: P, event: PeEvent, effects: PeEffect[], exits: SwapExits<P>): Step<P> | null {
  if (event.kind === 'sent') {
    effects.push({ kind: 'start-timer', name: 'tSenderResponse' });
    return [pe, effects];
  }
  if ((event.kind === 'timer' && event.name === 'tSenderResponse') || event.kind === 'failed' || (event.kind === 'message' && event.type !== 'GoodCRC')) {
    effects.push({ kind: 'stop-timer', name: 'tSenderResponse' });
    return exits.enterReady(pe, effects);
  }
  return null;
}

/** Our swap request was answered, or not (SenderResponseTimer, §6.6.2). */
function swapAnswered<P extends SwapPort>(pe: P, event: PeEvent, effects: PeEffect[], exits: SwapExits<P>): Step<P> | null {
  if (event.kind === 'sent') {
    effects.push({ kind: 'start-timer', name: 'tSenderResponse' });
    return [pe, effects];
  }
  const back = () => {
    effects.push({ kind: 'stop-timer', name: 'tSenderResponse' });
    return exits.enterReady(pe, effects);
  };
  if ((event.kind === 'timer' && event.name === 'tSenderResponse') || event.kind === 'failed') return back();
  if (event.kind !== 'message') return null;
  if (event.type === 'Accept') {
    effects.push({ kind: 'stop-timer', name: 'tSenderResponse' });
    if (pe.state === 'PE_DRS_Send_Swap') {
      effects.push({ kind: 'data-role-swap' });
      return exits.enterReady(pe, effects);
    }
    if (pe.state === 'PE_VCS_Send_Swap') return vconnHandOver(pe, effects);
    return exits.prAccepted(pe, effects);
  }
  if (event.type === 'Reject' || event.type === 'Wait' || event.type === 'Not_Supported') return back();
  return null;
}
