/**
 * The sink's policy engine as a pure step, after USB PD R3.2 V1.1 §8.3.3.3 (Sink Port state
 * diagrams): PE_SNK_Startup, _Discovery, _Wait_for_Capabilities, _Evaluate_Capability,
 * _Select_Capability, _Transition_Sink, _Ready, _Get_Source_Cap, _Hard_Reset,
 * _Transition_to_default, _Soft_Reset, _Send_Soft_Reset.
 */
import type { Contract } from '../core/contract.ts';
import { countersFor } from '../core/timers.ts';
import type { SourcePdo } from '../pd/types.ts';
import { decodeSourcePdo } from '../pd/source-pdo.ts';
import { chooseRequest } from '../rules/choose-request.ts';
import type { SinkPolicy } from '../rules/sink-policy.ts';
import { minRevision, type PeEffect, type PeEvent } from './pe-types.ts';
import type { Revision } from './wire.ts';

export interface SinkContext {
  cableMa: number;
  ownRevision: Revision;
  /** The decoded offers when the runner already has them for these words (a memo, same result). */
  decodeOffers?(words: readonly number[]): SourcePdo[] | undefined;
}

export interface SinkPe {
  state: string;
  revision: Revision;
  hardResetCounter: number;
  vbusPresent: boolean;
  contract: Contract | null;
  requested: { rdoRaw: number; contract: Contract } | null;
  policy: SinkPolicy;
  /** The policy changed since the last evaluation: ask for the offers again once in Ready. */
  policyDirty: boolean;
  pdos: SourcePdo[];
}

export function initialSinkPe(revision: Revision, policy: SinkPolicy): SinkPe {
  return { state: 'idle', revision, hardResetCounter: 0, vbusPresent: false, contract: null, requested: null, policy, policyDirty: false, pdos: [] };
}

type Step = [SinkPe, PeEffect[]];
const APDO = new Set(['pps', 'epr-avs', 'spr-avs']);

function waitForCaps(pe: SinkPe, effects: PeEffect[]): Step {
  effects.push({ kind: 'start-timer', name: 'tSinkWaitCap' });
  return [{ ...pe, state: 'PE_SNK_Wait_for_Capabilities' }, effects];
}

function hardReset(pe: SinkPe, effects: PeEffect[], why: string): Step {
  const counters = countersFor(pe.revision);
  effects.push(
    { kind: 'stop-timer', name: 'tSenderResponse' },
    { kind: 'stop-timer', name: 'tPSTransition' },
    { kind: 'stop-timer', name: 'tSinkWaitCap' },
    { kind: 'stop-timer', name: 'tPPSRequest' },
    { kind: 'stop-timer', name: 'tSinkRequest' },
  );
  if (pe.hardResetCounter > counters.nHardResetCount) {
    effects.push({ kind: 'note', text: `sink: ${why}, but HardResetCounter > nHardResetCount: no more Hard Resets` });
    return [{ ...pe, state: 'PE_SNK_Wait_for_Capabilities' }, effects];
  }
  effects.push({ kind: 'note', text: `sink: ${why} → Hard Reset` }, { kind: 'hard-reset' });
  return toDefault({ ...pe, hardResetCounter: pe.hardResetCounter + 1 }, effects);
}

/** §8.3.3.3.9 PE_SNK_Transition_to_default, then Startup and Discovery (wait for vSafe5V). */
function toDefault(pe: SinkPe, effects: PeEffect[]): Step {
  effects.push({ kind: 'contract', contract: null }, { kind: 'sink-mode', mode: 'standby' }, { kind: 'protocol-reset' });
  return [{ ...pe, state: 'PE_SNK_Discovery', contract: null, requested: null }, effects];
}

/** §8.3.3.3.4–5 Evaluate_Capability and Select_Capability: the sink policy picks a Request. */
function select(pe: SinkPe, context: SinkContext, effects: PeEffect[]): Step {
  // A revision 2.0 contract has no programmable offers: drop the trailing APDOs (positions stay).
  const firstApdo = pe.pdos.findIndex((pdo) => APDO.has(pdo.kind));
  const offers = pe.revision === '2.0' && firstApdo >= 0 ? pe.pdos.slice(0, Math.max(1, firstApdo)) : pe.pdos;
  const choice = chooseRequest(offers, pe.policy, { cableMa: context.cableMa });
  effects.push({ kind: 'send', type: 'Request', objects: [choice.rdoRaw >>> 0] });
  return [{ ...pe, state: 'PE_SNK_Select_Capability', requested: { rdoRaw: choice.rdoRaw >>> 0, contract: choice.contract }, policyDirty: false }, effects];
}

function enterReady(pe: SinkPe, effects: PeEffect[]): Step {
  if (pe.contract?.kind === 'pps') effects.push({ kind: 'start-timer', name: 'tPPSRequest' });
  if (pe.policyDirty) {
    effects.push({ kind: 'send', type: 'Get_Source_Cap', objects: [] });
    return [{ ...pe, state: 'PE_SNK_Get_Source_Cap' }, effects];
  }
  return [{ ...pe, state: 'PE_SNK_Ready' }, effects];
}

export function sinkStep(pe: SinkPe, event: PeEvent, context: SinkContext): Step {
  const effects: PeEffect[] = [];
  if (event.kind === 'vbus') {
    const next = { ...pe, vbusPresent: event.present };
    if (pe.state === 'idle') return [next, effects];
    if (!event.present) {
      effects.push({ kind: 'stop-timer', name: 'tSinkWaitCap' }, { kind: 'stop-timer', name: 'tPPSRequest' });
      return [{ ...next, state: 'PE_SNK_Discovery', contract: null, requested: null }, effects];
    }
    if (pe.state === 'PE_SNK_Discovery') return waitForCaps(next, effects);
    return [next, effects];
  }
  if (event.kind === 'policy') {
    const next = { ...pe, policy: event.policy, policyDirty: true };
    if (pe.state !== 'PE_SNK_Ready') return [next, effects];
    effects.push({ kind: 'stop-timer', name: 'tPPSRequest' }, { kind: 'send', type: 'Get_Source_Cap', objects: [] });
    return [{ ...next, state: 'PE_SNK_Get_Source_Cap' }, effects];
  }
  if (event.kind === 'hard-reset-received') {
    effects.push({ kind: 'stop-timer', name: 'tSenderResponse' }, { kind: 'stop-timer', name: 'tPSTransition' }, { kind: 'stop-timer', name: 'tSinkWaitCap' }, { kind: 'stop-timer', name: 'tPPSRequest' });
    return toDefault(pe, effects);
  }
  if (event.kind === 'message' && event.type === 'Soft_Reset' && pe.state !== 'idle') {
    effects.push({ kind: 'stop-timer', name: 'tSenderResponse' }, { kind: 'stop-timer', name: 'tPPSRequest' }, { kind: 'send', type: 'Accept', objects: [] });
    return [{ ...pe, state: 'PE_SNK_Soft_Reset' }, effects];
  }
  if (event.kind === 'message' && event.type === 'Source_Capabilities' && pe.state !== 'idle' && pe.state !== 'PE_SNK_Discovery') {
    // §8.3.3.3.3 / .7: offers arriving while waiting, in Ready, or asked for: evaluate them.
    effects.push({ kind: 'stop-timer', name: 'tSinkWaitCap' }, { kind: 'stop-timer', name: 'tPPSRequest' }, { kind: 'stop-timer', name: 'tSenderResponse' }, { kind: 'stop-timer', name: 'tSinkRequest' });
    const pdos = context.decodeOffers?.(event.objects) ?? event.objects.map((word) => decodeSourcePdo(word) as SourcePdo);
    return select({ ...pe, pdos, revision: minRevision(context.ownRevision, event.revision) }, context, effects);
  }

  switch (pe.state) {
    case 'idle':
      if (event.kind === 'start') {
        effects.push({ kind: 'protocol-reset' }, { kind: 'sink-mode', mode: 'default' });
        const next = { ...pe, state: 'PE_SNK_Discovery', vbusPresent: true };
        return waitForCaps(next, effects);
      }
      break;
    case 'PE_SNK_Wait_for_Capabilities':
      if (event.kind === 'timer' && event.name === 'tSinkWaitCap') return hardReset(pe, effects, 'no Source_Capabilities within tSinkWaitCap');
      break;
    case 'PE_SNK_Select_Capability':
      if (event.kind === 'sent' && event.type === 'Request') {
        effects.push({ kind: 'start-timer', name: 'tSenderResponse' });
        return [pe, effects];
      }
      if (event.kind === 'failed' && event.type === 'Request') {
        effects.push({ kind: 'send', type: 'Soft_Reset', objects: [] });
        return [{ ...pe, state: 'PE_SNK_Send_Soft_Reset' }, effects];
      }
      if (event.kind === 'message' && event.type === 'Accept') {
        // §8.3.3.3.6: PSTransitionTimer starts on entry to PE_SNK_Transition_Sink, once the Accept has
        // been received and the protocol layer has sent its GoodCRC for it (from memory).
        effects.push({ kind: 'stop-timer', name: 'tSenderResponse' }, { kind: 'start-timer', name: 'tPSTransition', afterGoodCrc: true });
        // §7.2.3: Sink Standby (pSnkStdby) during the transition, except between programmable levels.
        if (!(pe.contract?.kind === 'pps' && pe.requested?.contract.kind === 'pps')) effects.push({ kind: 'sink-mode', mode: 'standby' });
        return [{ ...pe, state: 'PE_SNK_Transition_Sink' }, effects];
      }
      if (event.kind === 'message' && (event.type === 'Reject' || event.type === 'Wait')) {
        effects.push({ kind: 'stop-timer', name: 'tSenderResponse' });
        if (!pe.contract) return waitForCaps({ ...pe, requested: null }, effects);
        // §8.3.3.3.7 SinkRequestTimer: ask again no sooner than tSinkRequest.
        effects.push({ kind: 'start-timer', name: 'tSinkRequest' });
        return enterReady({ ...pe, requested: null }, effects);
      }
      if (event.kind === 'timer' && event.name === 'tSenderResponse') return hardReset(pe, effects, 'no answer to Request within tSenderResponse');
      break;
    case 'PE_SNK_Transition_Sink':
      if (event.kind === 'message' && event.type === 'PS_RDY' && pe.requested) {
        const contract = pe.requested.contract;
        effects.push({ kind: 'stop-timer', name: 'tPSTransition' }, { kind: 'contract', contract }, { kind: 'sink-mode', mode: 'operating' });
        return enterReady({ ...pe, contract, requested: null, hardResetCounter: 0 }, effects);
      }
      if (event.kind === 'timer' && event.name === 'tPSTransition') return hardReset(pe, effects, 'no PS_RDY within tPSTransition');
      break;
    case 'PE_SNK_Ready':
      if (event.kind === 'timer' && (event.name === 'tPPSRequest' || event.name === 'tSinkRequest') && pe.pdos.length > 0) return select(pe, context, effects);
      break;
    case 'PE_SNK_Get_Source_Cap':
      if (event.kind === 'sent' && event.type === 'Get_Source_Cap') {
        effects.push({ kind: 'start-timer', name: 'tSenderResponse' });
        return [pe, effects];
      }
      if ((event.kind === 'timer' && event.name === 'tSenderResponse') || event.kind === 'failed') return enterReady({ ...pe, policyDirty: false }, effects);
      break;
    case 'PE_SNK_Soft_Reset':
      if (event.kind === 'sent' && event.type === 'Accept') return waitForCaps({ ...pe, requested: null }, effects);
      if (event.kind === 'failed') return hardReset(pe, effects, 'Accept of Soft_Reset not acknowledged');
      break;
    case 'PE_SNK_Send_Soft_Reset':
      if (event.kind === 'sent' && event.type === 'Soft_Reset') {
        effects.push({ kind: 'start-timer', name: 'tSenderResponse' });
        return [pe, effects];
      }
      if (event.kind === 'message' && event.type === 'Accept') {
        effects.push({ kind: 'stop-timer', name: 'tSenderResponse' });
        return waitForCaps({ ...pe, requested: null }, effects);
      }
      if (event.kind === 'failed') return hardReset(pe, effects, 'Soft_Reset not acknowledged');
      if (event.kind === 'timer' && event.name === 'tSenderResponse') return hardReset(pe, effects, 'no Accept of Soft_Reset');
      break;
    default:
      break;
  }
  return [pe, effects];
}
