/**
 * The sink's policy engine as a pure step, after USB PD R3.2 V1.1 §8.3.3.3 (Sink Port state
 * diagrams): PE_SNK_Startup, _Discovery, _Wait_for_Capabilities, _Evaluate_Capability,
 * _Select_Capability, _Transition_Sink, _Ready, _Get_Source_Cap, _Hard_Reset,
 * _Transition_to_default, _Soft_Reset, _Send_Soft_Reset; EPR mode entry, keep-alive and exit
 * (§8.3.3.26.1 PE_SNK_Send_EPR_Mode_Entry, _EPR_Mode_Entry_Wait_For_Response, _EPR_Keep_Alive,
 * _Send_EPR_Mode_Exit); the answers and swaps of §8.3.3.4–.20 from the sink's side.
 */
import type { Contract } from '../core/contract.ts';
import { countersFor } from '../core/timers.ts';
import { EXTENDED_CONTROL_TYPES } from '../pd/extended-data.ts';
import { decodeSourcePdo } from '../pd/source-pdo.ts';
import type { SourcePdo } from '../pd/types.ts';
import { chooseRequest } from '../rules/choose-request.ts';
import { SPR_MAX_VOLTAGE_MV } from '../rules/pdo-facts.ts';
import type { ChosenRequest, SinkPolicy } from '../rules/sink-policy.ts';
import { eprModeAction, eprModeObject, eprModeOf, isEcdb, minRevision, type PeEffect, type PeEvent } from './pe-types.ts';
import { statusBytes } from './port-answers.ts';
import type { ActionName } from './scenario.ts';
import { answerSwap, awaitAnswer, swapStep as sharedSwapStep, type SwapAnswer, type SwapExits } from './swap-pe.ts';
import { bytesToWords, type MessageType, type Revision } from './wire.ts';

export interface SinkContext {
  cableMa: number;
  ownRevision: Revision;
  /** The decoded offers when the runner already has them for these words (a memo, same result). */
  decodeOffers?(words: readonly number[]): SourcePdo[] | undefined;
  /** EPR capable with this operational PDP (W), or null. */
  eprPdpW?: number | null;
  /** The sink's Sink_Capabilities objects. */
  sinkCaps?: readonly number[];
  swapAnswer?: SwapAnswer;
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
  /** The offers' words as received (EPR_Request copies one). */
  words: readonly number[];
  /** A Source_Capabilities arrived since attach (kept across Hard Resets). */
  pdConnected: boolean;
  eprMode: boolean;
  /** EPR entry was tried since the last Hard Reset (not tried again after Enter_Failed). */
  eprTried: boolean;
  vconnSource: boolean;
  pending: readonly ActionName[];
}

export function initialSinkPe(revision: Revision, policy: SinkPolicy): SinkPe {
  return {
    state: 'idle',
    revision,
    hardResetCounter: 0,
    vbusPresent: false,
    contract: null,
    requested: null,
    policy,
    policyDirty: false,
    pdos: [],
    words: [],
    pdConnected: false,
    eprMode: false,
    eprTried: false,
    vconnSource: false,
    pending: [],
  };
}

type Step = [SinkPe, PeEffect[]];
const APDO = new Set(['pps', 'epr-avs', 'spr-avs']);
const NONE: readonly ActionName[] = [];

function send(effects: PeEffect[], type: MessageType, objects: readonly number[] = [], initiate = false): void {
  effects.push(initiate ? { kind: 'send', type, objects, initiate: true } : { kind: 'send', type, objects });
}

function waitForCaps(pe: SinkPe, effects: PeEffect[]): Step {
  effects.push({ kind: 'start-timer', name: 'tSinkWaitCap' });
  return [{ ...pe, state: 'PE_SNK_Wait_for_Capabilities' }, effects];
}

const stopAll: PeEffect[] = [
  { kind: 'stop-timer', name: 'tSenderResponse' },
  { kind: 'stop-timer', name: 'tPSTransition' },
  { kind: 'stop-timer', name: 'tPSTransitionEpr' },
  { kind: 'stop-timer', name: 'tSinkWaitCap' },
  { kind: 'stop-timer', name: 'tPPSRequest' },
  { kind: 'stop-timer', name: 'tSinkRequest' },
  { kind: 'stop-timer', name: 'tSinkEPRKeepAlive' },
  { kind: 'stop-timer', name: 'tEnterEPR' },
];

/** New offers stop the sink's timers, except those of a transition or an EPR entry in progress. */
const stopOnOffers = stopAll.filter((e) => e.kind === 'stop-timer' && e.name !== 'tPSTransition' && e.name !== 'tPSTransitionEpr' && e.name !== 'tEnterEPR');

function hardReset(pe: SinkPe, effects: PeEffect[], why: string): Step {
  const counters = countersFor(pe.revision);
  effects.push(...stopAll);
  if (pe.hardResetCounter > counters.nHardResetCount) {
    // §8.3.3.3.8 (from memory): with the Hard Resets spent, a sink that had a PD connection takes
    // ErrorRecovery (USB Type-C R2.3 §4.5.2.2.2); one that never had one stays at default power.
    if (pe.pdConnected) {
      effects.push({ kind: 'note', text: `sink: ${why}, and HardResetCounter > nHardResetCount → ErrorRecovery` }, { kind: 'contract', contract: null }, { kind: 'error-recovery' });
      return [{ ...pe, state: 'ErrorRecovery', contract: null, requested: null, eprMode: false }, effects];
    }
    effects.push({ kind: 'note', text: `sink: ${why}, but HardResetCounter > nHardResetCount: no more Hard Resets` });
    return [{ ...pe, state: 'PE_SNK_Wait_for_Capabilities' }, effects];
  }
  effects.push({ kind: 'note', text: `sink: ${why} → Hard Reset` }, { kind: 'hard-reset' });
  return toDefault({ ...pe, hardResetCounter: pe.hardResetCounter + 1 }, effects);
}

/** §8.3.3.3.9 PE_SNK_Transition_to_default, then Startup and Discovery (wait for vSafe5V). */
function toDefault(pe: SinkPe, effects: PeEffect[]): Step {
  effects.push({ kind: 'contract', contract: null }, { kind: 'sink-mode', mode: 'standby' }, { kind: 'protocol-reset' });
  return [{ ...pe, state: 'PE_SNK_Discovery', contract: null, requested: null, eprMode: false, eprTried: false, pending: NONE }, effects];
}

const EPR_MAX_POWER: SinkPolicy = Object.freeze({ kind: 'max-power', eprModeCapable: true });
const eprCapablePolicies = new WeakMap<SinkPolicy, SinkPolicy>();

function policyFor(pe: SinkPe, context: SinkContext): SinkPolicy {
  if (!context.eprPdpW) return pe.policy;
  // An EPR capable sink says so in every RDO (§6.4.2 EPR Mode Capable). Before EPR mode, a policy that
  // names an EPR voltage takes the most SPR power meanwhile (common practice), so a sink that cannot
  // enter EPR mode still gets what SPR gives.
  const eprVoltage = (pe.policy.kind === 'fixed' || pe.policy.kind === 'avs') && pe.policy.voltageMv > SPR_MAX_VOLTAGE_MV;
  if (eprVoltage && !pe.eprMode) return EPR_MAX_POWER;
  // One object per policy, so the choice memo below recognises it run after run.
  let capable = eprCapablePolicies.get(pe.policy);
  if (!capable) {
    capable = Object.freeze({ ...pe.policy, eprModeCapable: true });
    eprCapablePolicies.set(pe.policy, capable);
  }
  return capable;
}

const choices = new WeakMap<readonly SourcePdo[], WeakMap<SinkPolicy, Map<number, ChosenRequest>>>();
/**
 * `chooseRequest`, memoised by the offers array and the policy object (runs of one scenario share
 * both) and the cable and mode: a pure function asked the same question in every run. The answer
 * is frozen, since runs share it.
 */
function choose(offers: readonly SourcePdo[], policy: SinkPolicy, cableMa: number, epr: boolean): ChosenRequest {
  let byPolicy = choices.get(offers);
  if (!byPolicy) {
    byPolicy = new WeakMap();
    choices.set(offers, byPolicy);
  }
  let byOptions = byPolicy.get(policy);
  if (!byOptions) {
    byOptions = new Map();
    byPolicy.set(policy, byOptions);
  }
  const key = epr ? -cableMa - 1 : cableMa;
  let choice = byOptions.get(key);
  if (!choice) {
    choice = chooseRequest(offers, policy, { cableMa, epr });
    Object.freeze(choice.contract);
    choice = Object.freeze(choice);
    byOptions.set(key, choice);
  }
  return choice;
}

function programmable(contract: Contract | null | undefined): boolean {
  return contract?.kind === 'pps' || contract?.kind === 'avs';
}

/** §8.3.3.3.4–5 Evaluate_Capability and Select_Capability: the sink policy picks a Request. */
function select(pe: SinkPe, context: SinkContext, effects: PeEffect[]): Step {
  // A revision 2.0 contract has no programmable offers: drop the trailing APDOs (positions stay).
  const firstApdo = pe.pdos.findIndex((pdo) => APDO.has(pdo.kind));
  const offers = pe.revision === '2.0' && firstApdo >= 0 ? pe.pdos.slice(0, Math.max(1, firstApdo)) : pe.pdos;
  const choice = choose(offers, policyFor(pe, context), context.cableMa, pe.eprMode);
  const rdoRaw = choice.rdoRaw >>> 0;
  // In EPR mode every request is an EPR_Request with a copy of the PDO it names (§6.4.9).
  if (pe.eprMode) send(effects, 'EPR_Request', [rdoRaw, pe.words[choice.objectPosition - 1] ?? 0]);
  else send(effects, 'Request', [rdoRaw]);
  return [{ ...pe, state: 'PE_SNK_Select_Capability', requested: { rdoRaw, contract: choice.contract }, policyDirty: false }, effects];
}

/** The sink wants EPR, the source offers it (EPR Mode Capable in its first PDO) and it was not refused. */
function wantsEpr(pe: SinkPe, context: SinkContext): boolean {
  const first = pe.pdos[0];
  return !!context.eprPdpW && !pe.eprMode && !pe.eprTried && pe.contract !== null && pe.revision === '3.0' && first?.kind === 'fixed' && first.eprModeCapable;
}

function enterReady(pe: SinkPe, context: SinkContext, effects: PeEffect[]): Step {
  if (pe.contract?.kind === 'pps') effects.push({ kind: 'start-timer', name: 'tPPSRequest' });
  // §8.3.3.26.1.3: in EPR mode the sink sends EPR_KeepAlive within tSinkEPRKeepAlive while idle.
  if (pe.eprMode) effects.push({ kind: 'start-timer', name: 'tSinkEPRKeepAlive' });
  if (pe.policyDirty) return askForOffers(pe, effects);
  if (wantsEpr(pe, context)) {
    // §8.3.3.26.1.1 PE_SNK_Send_EPR_Mode_Entry: EPR_Mode (Enter) with the sink's operational PDP.
    send(effects, 'EPR_Mode', [eprModeObject(eprModeAction.enter, context.eprPdpW ?? 0)], true);
    effects.push({ kind: 'start-timer', name: 'tEnterEPR' });
    return [{ ...pe, state: 'PE_SNK_Send_EPR_Mode_Entry', eprTried: true }, effects];
  }
  const [next, ...rest] = pe.pending;
  if (next !== undefined) return startAction({ ...pe, state: 'PE_SNK_Ready', pending: rest }, next, effects);
  return [{ ...pe, state: 'PE_SNK_Ready' }, effects];
}

function askForOffers(pe: SinkPe, effects: PeEffect[]): Step {
  effects.push({ kind: 'stop-timer', name: 'tPPSRequest' }, { kind: 'stop-timer', name: 'tSinkEPRKeepAlive' });
  if (pe.eprMode) effects.push({ kind: 'send', type: 'Extended_Control', objects: [], bytes: [EXTENDED_CONTROL_TYPES.EPR_Get_Source_Cap, 0], initiate: true });
  else send(effects, 'Get_Source_Cap', [], true);
  return [{ ...pe, state: 'PE_SNK_Get_Source_Cap' }, effects];
}

function startAction(pe: SinkPe, action: ActionName, effects: PeEffect[]): Step {
  if (pe.state !== 'PE_SNK_Ready') return [{ ...pe, pending: [...pe.pending, action] }, effects];
  const ask = (type: MessageType, state: string): Step => {
    effects.push({ kind: 'stop-timer', name: 'tSinkEPRKeepAlive' });
    send(effects, type, [], true);
    return [{ ...pe, state }, effects];
  };
  switch (action) {
    case 'get_source_cap':
      return askForOffers(pe, effects);
    case 'get_sink_cap':
      return ask('Get_Sink_Cap', 'PE_DR_SNK_Get_Sink_Cap');
    case 'get_source_cap_extended':
      return ask('Get_Source_Cap_Extended', 'PE_SNK_Get_Source_Cap_Ext');
    case 'get_status':
      return ask('Get_Status', 'PE_SNK_Get_Source_Status');
    case 'get_pps_status':
      return ask('Get_PPS_Status', 'PE_SNK_Get_PPS_Status');
    case 'dr_swap':
      return ask('DR_Swap', 'PE_DRS_Send_Swap');
    case 'vconn_swap':
      return ask('VCONN_Swap', 'PE_VCS_Send_Swap');
    case 'pr_swap':
      return ask('PR_Swap', 'PE_PRS_SNK_SRC_Send_Swap');
    case 'soft_reset':
      effects.push({ kind: 'stop-timer', name: 'tPPSRequest' }, { kind: 'stop-timer', name: 'tSinkEPRKeepAlive' });
      send(effects, 'Soft_Reset', [], true);
      return [{ ...pe, state: 'PE_SNK_Send_Soft_Reset' }, effects];
    case 'hard_reset':
      return hardReset(pe, effects, 'asked to (action)');
    case 'epr_exit':
      if (!pe.eprMode) return [pe, effects];
      effects.push({ kind: 'stop-timer', name: 'tSinkEPRKeepAlive' }, { kind: 'stop-timer', name: 'tPPSRequest' });
      send(effects, 'EPR_Mode', [eprModeObject(eprModeAction.exit)], true);
      return [{ ...pe, state: 'PE_SNK_Send_EPR_Mode_Exit' }, effects];
  }
}

function ready(pe: SinkPe, event: PeEvent, context: SinkContext, effects: PeEffect[]): Step {
  if (event.kind === 'timer' && (event.name === 'tPPSRequest' || event.name === 'tSinkRequest') && pe.pdos.length > 0) return select(pe, context, effects);
  if (event.kind === 'timer' && event.name === 'tSinkEPRKeepAlive' && pe.eprMode) {
    effects.push({ kind: 'send', type: 'Extended_Control', objects: [], bytes: [EXTENDED_CONTROL_TYPES.EPR_KeepAlive, 0], initiate: true });
    return [{ ...pe, state: 'PE_SNK_EPR_Keep_Alive' }, effects];
  }
  if (event.kind !== 'message') return [pe, effects];
  switch (event.type) {
    case 'Get_Sink_Cap':
      send(effects, 'Sink_Capabilities', context.sinkCaps ?? []);
      return [pe, effects];
    case 'Get_Status':
      effects.push({ kind: 'send', type: 'Status', objects: [], bytes: statusBytes() });
      return [pe, effects];
    case 'PR_Swap':
    case 'DR_Swap':
    case 'VCONN_Swap':
      return answerSwap(pe, event.type, context.swapAnswer ?? 'reject', 'PE_PRS_SNK_SRC_Accept_Swap', effects);
    case 'Extended_Control':
    case 'Get_Source_Cap':
    case 'Get_Source_Cap_Extended':
    case 'Get_PPS_Status':
    case 'EPR_Mode':
      send(effects, pe.revision === '2.0' ? 'Reject' : 'Not_Supported');
      return [pe, effects];
    case 'Accept':
    case 'Reject':
    case 'Wait':
    case 'PS_RDY':
    case 'Not_Supported':
      effects.push({ kind: 'stop-timer', name: 'tSinkEPRKeepAlive' }, { kind: 'stop-timer', name: 'tPPSRequest' });
      send(effects, 'Soft_Reset');
      return [{ ...pe, state: 'PE_SNK_Send_Soft_Reset' }, effects];
    default:
      if (event.type === 'Alert' || event.type === 'Status' || event.type === 'Vendor_Defined') return [pe, effects];
      send(effects, pe.revision === '2.0' ? 'Reject' : 'Not_Supported');
      return [pe, effects];
  }
}

export function sinkStep(pe: SinkPe, event: PeEvent, context: SinkContext): Step {
  const effects: PeEffect[] = [];
  if (event.kind === 'vbus') {
    const next = { ...pe, vbusPresent: event.present };
    if (pe.state === 'idle' || pe.state.startsWith('PE_PRS_')) return [next, effects];
    if (!event.present) {
      effects.push({ kind: 'stop-timer', name: 'tSinkWaitCap' }, { kind: 'stop-timer', name: 'tPPSRequest' }, { kind: 'stop-timer', name: 'tSinkEPRKeepAlive' });
      return [{ ...next, state: 'PE_SNK_Discovery', contract: null, requested: null, eprMode: false }, effects];
    }
    if (pe.state === 'PE_SNK_Discovery') return waitForCaps(next, effects);
    return [next, effects];
  }
  if (event.kind === 'policy') {
    const next = { ...pe, policy: event.policy, policyDirty: true };
    if (pe.state !== 'PE_SNK_Ready') return [next, effects];
    return askForOffers(next, effects);
  }
  if (event.kind === 'action') return startAction(pe, event.action, effects);
  if (event.kind === 'hard-reset-received') {
    effects.push(...stopAll);
    return toDefault(pe, effects);
  }
  if (event.kind === 'message' && event.type === 'Soft_Reset' && pe.state !== 'idle') {
    effects.push(...stopAll);
    send(effects, 'Accept');
    return [{ ...pe, state: 'PE_SNK_Soft_Reset', eprMode: false }, effects];
  }
  const offers = event.kind === 'message' && (event.type === 'Source_Capabilities' || (event.type === 'EPR_Source_Capabilities' && pe.eprMode));
  if (offers && pe.state !== 'idle' && pe.state !== 'PE_SNK_Discovery' && !pe.state.startsWith('PE_PRS_')) {
    // §8.3.3.3.3 / .7: offers arriving while waiting, in Ready, or asked for: evaluate them.
    effects.push(...stopOnOffers);
    const words = event.type === 'EPR_Source_Capabilities' ? bytesToWords(event.bytes ?? []) : event.objects;
    const pdos = context.decodeOffers?.(words) ?? words.map((word) => decodeSourcePdo(word) as SourcePdo);
    // Plain Source_Capabilities in EPR mode means the source left EPR mode (§8.3.3.26.4).
    const eprMode = event.type === 'EPR_Source_Capabilities';
    return select({ ...pe, pdos, words, eprMode, pdConnected: true, revision: minRevision(context.ownRevision, event.revision) }, context, effects);
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
      if (event.kind === 'sent' && (event.type === 'Request' || event.type === 'EPR_Request')) {
        effects.push({ kind: 'start-timer', name: 'tSenderResponse' });
        return [pe, effects];
      }
      if (event.kind === 'failed' && (event.type === 'Request' || event.type === 'EPR_Request')) {
        send(effects, 'Soft_Reset');
        return [{ ...pe, state: 'PE_SNK_Send_Soft_Reset' }, effects];
      }
      if (event.kind === 'message' && event.type === 'Accept') {
        // §8.3.3.3.6: PSTransitionTimer starts on entry to PE_SNK_Transition_Sink, once the Accept has
        // been received and the protocol layer has sent its GoodCRC for it (from memory); in EPR mode
        // it runs for tPSTransition's EPR value (§6.6.4.1).
        effects.push({ kind: 'stop-timer', name: 'tSenderResponse' }, { kind: 'start-timer', name: pe.eprMode ? 'tPSTransitionEpr' : 'tPSTransition', afterGoodCrc: true });
        // §7.2.3: Sink Standby (pSnkStdby) during the transition, except between programmable levels.
        if (!(programmable(pe.contract) && programmable(pe.requested?.contract))) effects.push({ kind: 'sink-mode', mode: 'standby' });
        return [{ ...pe, state: 'PE_SNK_Transition_Sink' }, effects];
      }
      if (event.kind === 'message' && (event.type === 'Reject' || event.type === 'Wait')) {
        effects.push({ kind: 'stop-timer', name: 'tSenderResponse' });
        if (!pe.contract) return waitForCaps({ ...pe, requested: null }, effects);
        // §8.3.3.3.5: with an Explicit Contract, Reject → PE_SNK_Ready on the old contract; only Wait
        // starts the SinkRequestTimer (§8.3.3.3.7): ask again no sooner than tSinkRequest.
        if (event.type === 'Wait') effects.push({ kind: 'start-timer', name: 'tSinkRequest' });
        return enterReady({ ...pe, requested: null }, context, effects);
      }
      if (event.kind === 'timer' && event.name === 'tSenderResponse') return hardReset(pe, effects, 'no answer to Request within tSenderResponse');
      break;
    case 'PE_SNK_Transition_Sink':
      if (event.kind === 'message' && event.type === 'PS_RDY' && pe.requested) {
        const contract = pe.requested.contract;
        effects.push({ kind: 'stop-timer', name: 'tPSTransition' }, { kind: 'stop-timer', name: 'tPSTransitionEpr' }, { kind: 'contract', contract }, { kind: 'sink-mode', mode: 'operating' });
        return enterReady({ ...pe, contract, requested: null, hardResetCounter: 0 }, context, effects);
      }
      if (event.kind === 'timer' && (event.name === 'tPSTransition' || event.name === 'tPSTransitionEpr')) return hardReset(pe, effects, 'no PS_RDY within tPSTransition');
      break;
    case 'PE_SNK_Ready':
      return ready(pe, event, context, effects);
    case 'PE_SNK_Get_Source_Cap':
      if (event.kind === 'sent') {
        effects.push({ kind: 'start-timer', name: 'tSenderResponse' });
        return [pe, effects];
      }
      if ((event.kind === 'timer' && event.name === 'tSenderResponse') || event.kind === 'failed') return enterReady({ ...pe, policyDirty: false }, context, effects);
      if (event.kind === 'message' && (event.type === 'Not_Supported' || event.type === 'Reject')) {
        effects.push({ kind: 'stop-timer', name: 'tSenderResponse' });
        return enterReady({ ...pe, policyDirty: false }, context, effects);
      }
      break;
    case 'PE_SNK_Send_EPR_Mode_Entry':
    case 'PE_SNK_EPR_Mode_Entry_Wait_For_Response':
      if (event.kind === 'sent' && event.type === 'EPR_Mode') {
        effects.push({ kind: 'start-timer', name: 'tSenderResponse' });
        return [pe, effects];
      }
      if (event.kind === 'message' && event.type === 'EPR_Mode') {
        const { action, data } = eprModeOf(event.objects[0]);
        if (action === eprModeAction.enterAcknowledged) {
          effects.push({ kind: 'stop-timer', name: 'tSenderResponse' });
          return [{ ...pe, state: 'PE_SNK_EPR_Mode_Entry_Wait_For_Response' }, effects];
        }
        if (action === eprModeAction.enterSucceeded) {
          effects.push({ kind: 'stop-timer', name: 'tSenderResponse' }, { kind: 'stop-timer', name: 'tEnterEPR' });
          return waitForCaps({ ...pe, eprMode: true }, effects);
        }
        if (action === eprModeAction.enterFailed) {
          effects.push(
            { kind: 'stop-timer', name: 'tSenderResponse' },
            { kind: 'stop-timer', name: 'tEnterEPR' },
            { kind: 'note', text: `sink: EPR mode entry failed (reason ${data}); staying in SPR` },
          );
          return enterReady(pe, context, effects);
        }
      }
      // §8.3.3.26.1.2: SinkEPREnterTimer or SenderResponseTimer expiry → Soft Reset.
      if ((event.kind === 'timer' && (event.name === 'tEnterEPR' || event.name === 'tSenderResponse')) || event.kind === 'failed') {
        effects.push({ kind: 'stop-timer', name: 'tEnterEPR' }, { kind: 'stop-timer', name: 'tSenderResponse' });
        send(effects, 'Soft_Reset');
        return [{ ...pe, state: 'PE_SNK_Send_Soft_Reset' }, effects];
      }
      break;
    case 'PE_SNK_EPR_Keep_Alive':
      if (event.kind === 'sent' && event.type === 'Extended_Control') {
        effects.push({ kind: 'start-timer', name: 'tSenderResponse' });
        return [pe, effects];
      }
      if (isEcdb(event, EXTENDED_CONTROL_TYPES.EPR_KeepAlive_Ack)) {
        effects.push({ kind: 'stop-timer', name: 'tSenderResponse' });
        return enterReady(pe, context, effects);
      }
      if ((event.kind === 'timer' && event.name === 'tSenderResponse') || event.kind === 'failed') return hardReset(pe, effects, 'no EPR_KeepAlive_Ack within tSenderResponse');
      break;
    case 'PE_SNK_Send_EPR_Mode_Exit':
      if (event.kind === 'sent' && event.type === 'EPR_Mode') return waitForCaps({ ...pe, eprMode: false }, effects);
      if (event.kind === 'failed') return hardReset(pe, effects, 'EPR_Mode (Exit) not acknowledged');
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
        return waitForCaps({ ...pe, requested: null, eprMode: false }, effects);
      }
      if (event.kind === 'failed') return hardReset(pe, effects, 'Soft_Reset not acknowledged');
      if (event.kind === 'timer' && event.name === 'tSenderResponse') return hardReset(pe, effects, 'no Accept of Soft_Reset');
      break;
    default: {
      const swap = swapStep(pe, event, context, effects);
      if (swap) return swap;
      break;
    }
  }
  return [pe, effects];
}

/** The sink's side of the asks and swaps (§8.3.3.18–20). */
/** §7.3.9: our PR_Swap was accepted; the initial sink waits for the source's supply to go off. */
function prAccepted(pe: SinkPe, effects: PeEffect[]): Step {
  effects.push({ kind: 'start-timer', name: 'tPSSourceOff' });
  return [{ ...pe, state: 'PE_PRS_SNK_SRC_Transition_to_off' }, effects];
}

const exitsByContext = new WeakMap<SinkContext, SwapExits<SinkPe>>();
/** The sink's exits for the shared swap states (swap-pe.ts), one object per context. */
function exitsFor(context: SinkContext): SwapExits<SinkPe> {
  let exits = exitsByContext.get(context);
  if (!exits) {
    exits = { enterReady: (pe, effects) => enterReady(pe, context, effects), hardReset, prAccepted };
    exitsByContext.set(context, exits);
  }
  return exits;
}

/** The swap state machines from the sink's side: the shared states (swap-pe.ts), then the sink's PR_Swap power transition. */
function swapStep(pe: SinkPe, event: PeEvent, context: SinkContext, effects: PeEffect[]): Step | null {
  switch (pe.state) {
    case 'PE_DR_SNK_Get_Sink_Cap':
    case 'PE_SNK_Get_Source_Cap_Ext':
    case 'PE_SNK_Get_Source_Status':
    case 'PE_SNK_Get_PPS_Status':
      return awaitAnswer(pe, event, effects, exitsFor(context));
    case 'PE_PRS_SNK_SRC_Accept_Swap':
      if (event.kind === 'sent' && event.type === 'Accept') return prAccepted(pe, effects);
      break;
    case 'PE_PRS_SNK_SRC_Transition_to_off':
      // §7.3.9: the initial sink waits for the source's PS_RDY (supply off), then turns its own supply on.
      if (event.kind === 'message' && event.type === 'PS_RDY') {
        effects.push({ kind: 'stop-timer', name: 'tPSSourceOff' }, { kind: 'contract', contract: null }, { kind: 'sink-mode', mode: 'off' }, { kind: 'supply', voltageMv: 5_000, limitMa: null });
        return [{ ...pe, state: 'PE_PRS_SNK_SRC_Source_on', contract: null, eprMode: false }, effects];
      }
      if (event.kind === 'timer' && event.name === 'tPSSourceOff') {
        effects.push({ kind: 'note', text: 'sink: no PS_RDY within tPSSourceOff during PR_Swap → ErrorRecovery' }, { kind: 'error-recovery' });
        return [{ ...pe, state: 'ErrorRecovery' }, effects];
      }
      break;
    case 'PE_PRS_SNK_SRC_Source_on':
      if (event.kind === 'supply-ready') {
        send(effects, 'PS_RDY');
        return [pe, effects];
      }
      if (event.kind === 'sent' && event.type === 'PS_RDY') {
        effects.push({ kind: 'become', role: 'source' });
        return [pe, effects];
      }
      break;
    default:
      return sharedSwapStep(pe, event, effects, exitsFor(context));
  }
  return null;
}
