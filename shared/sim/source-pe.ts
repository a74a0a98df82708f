/**
 * The source's policy engine as a pure step, after USB PD R3.2 V1.1 §8.3.3.2 (Source Port state
 * diagrams): PE_SRC_Startup, _Send_Capabilities, _Discovery, _Negotiate_Capability,
 * _Transition_Supply, _Ready, _Capability_Response, _Wait_New_Capabilities, _Hard_Reset,
 * _Hard_Reset_Received, _Transition_to_default, _Soft_Reset, _Send_Soft_Reset, _Disabled; the
 * source's cable discovery on SOP' (§8.3.3.24 Discover Identity, PE_SRC_VDM_Identity_Request);
 * EPR mode entry and exit (§8.3.3.26.2 PE_SRC_Evaluate_EPR_Mode_Entry, _EPR_Mode_Discover_Cable,
 * keep-alive); the answers of §8.3.3.4–.19 (Get_* requests, swaps) and the swap state machines
 * (§8.3.3.18 DR_Swap, §8.3.3.19 PR_Swap, §8.3.3.20 VCONN_Swap) from the source's side.
 */
import type { Contract } from '../core/contract.ts';
import { countersFor } from '../core/timers.ts';
import { EXTENDED_CONTROL_TYPES } from '../pd/extended-data.ts';
import { decodeRdo } from '../pd/rdo.ts';
import type { SourcePdo } from '../pd/types.ts';
import { checkRequest } from '../rules/check-request.ts';
import { contractOf } from '../rules/contract-of.ts';
import { cableAllowsEpr, DISCOVER_IDENTITY_REQ, readIdentity, type EMarker } from './cable-identity.ts';
import { eprEnterFailed, eprModeAction, eprModeObject, eprModeOf, isEcdb, type PeEffect, type PeEvent } from './pe-types.ts';
import { ppsStatusBytes, sourceCapsExtendedBytes, statusBytes } from './port-answers.ts';
import type { ActionName } from './scenario.ts';
import { answerSwap, awaitAnswer, swapStep as sharedSwapStep, type SwapAnswer, type SwapExits } from './swap-pe.ts';
import { wordsToBytes, type MessageType, type Revision } from './wire.ts';

export interface Offers {
  words: readonly number[];
  pdos: readonly SourcePdo[];
}

export type { SwapAnswer };

export interface SourceContext {
  /** The offers for what the source knows of the cable (null: no e-marker), SPR or EPR (positions 1–7 then 8…). */
  offers(cable: EMarker | null, epr: boolean): Offers;
  /** The source has EPR objects. */
  eprCapable: boolean;
  /** Some offer needs a 5 A cable or EPR: discover the cable before the first offers. */
  discoverCable: boolean;
  swapAnswer: SwapAnswer;
  /** SPR and EPR PDP (W), for Source_Capabilities_Extended. */
  pdpW(): { spr: number; epr: number };
  /** VBUS now (mV), for PPS_Status. */
  vbusMv(): number;
}

export interface SourcePe {
  /** The spec's state name ('idle' before attach). */
  state: string;
  /** Transition_to_default / power role swap progress. */
  phase: 'off' | 'recover' | 'on' | null;
  revision: Revision;
  capsCounter: number;
  hardResetCounter: number;
  /** A PD connection exists: a Source_Capabilities was acknowledged since attach (kept across Hard Resets). */
  pdConnected: boolean;
  contract: Contract | null;
  accepted: { contract: Contract; voltageMv: number; limitMa: number | null; floorMv?: number } | null;
  eprMode: boolean;
  /** What the source learned of the cable: undefined before it asked, null when nothing answered. */
  cable: EMarker | null | undefined;
  /** The last Request set EPR Mode Capable (§6.4.2). */
  sinkEprCapable: boolean;
  /** The offers last sent (a Request's object position refers to them). */
  offered: Offers | null;
  /** Actions waiting for PE_SRC_Ready. */
  pending: readonly ActionName[];
  /** This port sources VCONN (the source does at attach). */
  vconnSource: boolean;
}

export function initialSourcePe(revision: Revision): SourcePe {
  return {
    state: 'idle',
    phase: null,
    revision,
    capsCounter: 0,
    hardResetCounter: 0,
    pdConnected: false,
    contract: null,
    accepted: null,
    eprMode: false,
    cable: undefined,
    sinkEprCapable: false,
    offered: null,
    pending: [],
    vconnSource: true,
  };
}

type Step = [SourcePe, PeEffect[]];
const NONE: readonly ActionName[] = [];

function send(effects: PeEffect[], type: MessageType, objects: readonly number[] = [], initiate = false): void {
  effects.push(initiate ? { kind: 'send', type, objects, initiate: true } : { kind: 'send', type, objects });
}
function sendBytes(effects: PeEffect[], type: MessageType, bytes: readonly number[], initiate = false): void {
  effects.push(initiate ? { kind: 'send', type, objects: [], bytes, initiate: true } : { kind: 'send', type, objects: [], bytes });
}

function sendCaps(pe: SourcePe, context: SourceContext, effects: PeEffect[]): Step {
  const offered = context.offers(pe.cable ?? null, pe.eprMode);
  // In EPR mode the offers go as EPR_Source_Capabilities, an extended message (§6.5.15.1).
  if (pe.eprMode) sendBytes(effects, 'EPR_Source_Capabilities', wordsToBytes(offered.words));
  else send(effects, 'Source_Capabilities', offered.words);
  return [{ ...pe, state: 'PE_SRC_Send_Capabilities', capsCounter: pe.capsCounter + 1, offered }, effects];
}

function startOrDiscover(pe: SourcePe, context: SourceContext, effects: PeEffect[]): Step {
  // §8.3.3.24: as VCONN source the DFP may ask the cable plug before it offers more than 3 A.
  if (context.discoverCable && pe.cable === undefined && pe.revision === '3.0') {
    effects.push({ kind: 'send', type: 'Vendor_Defined', objects: DISCOVER_IDENTITY_REQ, sop: "SOP'" });
    return [{ ...pe, state: 'PE_SRC_VDM_Identity_Request' }, effects];
  }
  return sendCaps(pe, context, effects);
}

const stopAll: PeEffect[] = [
  { kind: 'stop-timer', name: 'tSenderResponse' },
  { kind: 'stop-timer', name: 'tPPSTimeout' },
  { kind: 'stop-timer', name: 'tSourceEPRKeepAlive' },
  { kind: 'stop-timer', name: 'tVDMSenderResponse' },
];

function hardReset(pe: SourcePe, effects: PeEffect[], why: string): Step {
  effects.push({ kind: 'note', text: `source: ${why} → Hard Reset` }, ...stopAll, { kind: 'hard-reset' }, { kind: 'contract', contract: null }, { kind: 'start-timer', name: 'tPSHardReset' });
  return [{ ...pe, state: 'PE_SRC_Hard_Reset', phase: null, hardResetCounter: pe.hardResetCounter + 1, contract: null, accepted: null, eprMode: false, pending: NONE }, effects];
}

function softReset(pe: SourcePe, effects: PeEffect[], initiate = false): Step {
  effects.push({ kind: 'stop-timer', name: 'tPPSTimeout' });
  send(effects, 'Soft_Reset', [], initiate);
  return [{ ...pe, state: 'PE_SRC_Send_Soft_Reset' }, effects];
}

function enterReady(pe: SourcePe, effects: PeEffect[]): Step {
  if (pe.contract?.kind === 'pps') effects.push({ kind: 'start-timer', name: 'tPPSTimeout' });
  // §8.3.3.26.3: in EPR mode the SourceEPRKeepAliveTimer runs while in PE_SRC_Ready.
  if (pe.eprMode) effects.push({ kind: 'start-timer', name: 'tSourceEPRKeepAlive' });
  const ready: SourcePe = { ...pe, state: 'PE_SRC_Ready' };
  const [next, ...rest] = pe.pending;
  if (next !== undefined) return startAction({ ...ready, pending: rest }, next, effects);
  return [ready, effects];
}

type Accepted = NonNullable<SourcePe['accepted']>;

/** What the source makes of one RDO against its offers: null when it must Reject. */
function evaluateRdo(offered: Offers, type: string, rdoRaw: number, copyWord: number | undefined, eprMode: boolean): Accepted | null {
  const position = (rdoRaw >>> 28) & 0b1111;
  const pdo = offered.pdos[position - 1];
  const rdo = pdo ? decodeRdo(rdoRaw, pdo) : undefined;
  // EPR_Request carries a copy of the PDO it names (§6.4.9); in EPR mode only EPR_Request is valid.
  const copyOk = type !== 'EPR_Request' || copyWord === offered.words[position - 1];
  const modeOk = eprMode === (type === 'EPR_Request');
  if (!pdo || !rdo || !copyOk || !modeOk || checkRequest(rdo, offered.pdos).some((finding) => finding.severity === 'error')) return null;
  const contract = contractOf(rdo, pdo);
  // A PPS supply limits its current (§7.1.4.4); AVS does not (§7.1.4.5, from memory).
  const limited = rdo.kind === 'rdo-pps';
  return { contract, voltageMv: contract.voltageMv, limitMa: limited ? contract.currentMa : null, ...(limited && pdo.kind === 'pps' ? { floorMv: pdo.minVoltageMv } : {}) };
}

const verdicts = new WeakMap<Offers, Map<number, Accepted | null>>();
/** A plain SPR Request's verdict, memoised by the offers object and the RDO (the same question every run); frozen, runs share it. */
function evaluateSprRequest(offered: Offers, rdoRaw: number): Accepted | null {
  let byRdo = verdicts.get(offered);
  if (!byRdo) {
    byRdo = new Map();
    verdicts.set(offered, byRdo);
  }
  let verdict = byRdo.get(rdoRaw);
  if (verdict === undefined) {
    verdict = evaluateRdo(offered, 'Request', rdoRaw, undefined, false);
    if (verdict) Object.freeze(Object.freeze(verdict).contract);
    byRdo.set(rdoRaw, verdict);
  }
  return verdict;
}

/** §8.3.3.2.5 PE_SRC_Negotiate_Capability: the Request must name an offer and stay within it. */
function negotiate(pe: SourcePe, event: Extract<PeEvent, { kind: 'message' }>, context: SourceContext, effects: PeEffect[]): Step {
  const rdoRaw = event.objects[0] ?? 0;
  const offered = pe.offered ?? context.offers(pe.cable ?? null, pe.eprMode);
  const accepted = event.type === 'Request' && !pe.eprMode ? evaluateSprRequest(offered, rdoRaw) : evaluateRdo(offered, event.type, rdoRaw, event.objects[1], pe.eprMode);
  const next: SourcePe = { ...pe, sinkEprCapable: ((rdoRaw >>> 22) & 1) === 1 };
  if (!accepted || event.reject) {
    send(effects, 'Reject');
    return [{ ...next, state: 'PE_SRC_Capability_Response' }, effects];
  }
  if (event.wait) {
    send(effects, 'Wait');
    return [{ ...next, state: 'PE_SRC_Capability_Response' }, effects];
  }
  send(effects, 'Accept');
  return [{ ...next, state: 'PE_SRC_Transition_Accept', accepted }, effects];
}

function startAction(pe: SourcePe, action: ActionName, effects: PeEffect[]): Step {
  if (pe.state !== 'PE_SRC_Ready') return [{ ...pe, pending: [...pe.pending, action] }, effects];
  const ask = (type: MessageType, state: string): Step => {
    effects.push({ kind: 'stop-timer', name: 'tPPSTimeout' });
    send(effects, type, [], true);
    return [{ ...pe, state }, effects];
  };
  switch (action) {
    case 'get_source_cap':
      return ask('Get_Source_Cap', 'PE_DR_SRC_Get_Source_Cap');
    case 'get_sink_cap':
      return ask('Get_Sink_Cap', 'PE_SRC_Get_Sink_Cap');
    case 'get_source_cap_extended':
      return ask('Get_Source_Cap_Extended', 'PE_SRC_Get_Source_Cap_Ext');
    case 'get_status':
      return ask('Get_Status', 'PE_SRC_Get_Sink_Status');
    case 'get_pps_status':
      return ask('Get_PPS_Status', 'PE_SRC_Get_PPS_Status');
    case 'dr_swap':
      return ask('DR_Swap', 'PE_DRS_Send_Swap');
    case 'vconn_swap':
      return ask('VCONN_Swap', 'PE_VCS_Send_Swap');
    case 'pr_swap':
      return ask('PR_Swap', 'PE_PRS_SRC_SNK_Send_Swap');
    case 'soft_reset':
      return softReset(pe, effects, true);
    case 'hard_reset':
      return hardReset(pe, effects, 'asked to (action)');
    case 'epr_exit':
      if (!pe.eprMode) return [pe, effects];
      effects.push({ kind: 'stop-timer', name: 'tSourceEPRKeepAlive' });
      send(effects, 'EPR_Mode', [eprModeObject(eprModeAction.exit)], true);
      return [{ ...pe, state: 'PE_SRC_Send_EPR_Mode_Exit' }, effects];
  }
}

export function sourceStep(pe: SourcePe, event: PeEvent, context: SourceContext): Step {
  const effects: PeEffect[] = [];
  const counters = countersFor(pe.revision);

  // Hard Reset signalling wins in every state (§8.3.3.2.9 PE_SRC_Hard_Reset_Received).
  if (event.kind === 'hard-reset-received') {
    effects.push(...stopAll, { kind: 'stop-timer', name: 'tNoResponse' }, { kind: 'contract', contract: null }, { kind: 'start-timer', name: 'tPSHardReset' });
    return [{ ...pe, state: 'PE_SRC_Hard_Reset_Received', phase: null, contract: null, accepted: null, eprMode: false, pending: NONE }, effects];
  }
  if (event.kind === 'message' && event.sop === "SOP'") return cableAnswer(pe, event, context, effects);
  if (event.kind === 'message' && event.type === 'Soft_Reset' && pe.state !== 'idle' && pe.phase === null) {
    effects.push(...stopAll);
    send(effects, 'Accept');
    return [{ ...pe, state: 'PE_SRC_Soft_Reset', eprMode: false }, effects];
  }
  // §8.3.3.26.3: any message from the sink restarts the SourceEPRKeepAliveTimer.
  if (pe.eprMode && event.kind === 'message' && pe.state === 'PE_SRC_Ready') effects.push({ kind: 'start-timer', name: 'tSourceEPRKeepAlive' });
  if (event.kind === 'action') return startAction(pe, event.action, effects);
  if (event.kind === 'overload' && pe.contract !== null) return hardReset(pe, effects, 'current limit would pull VBUS below the offer’s minimum voltage');

  switch (pe.state) {
    case 'idle':
    case 'PE_SRC_Startup':
      if (event.kind === 'start') {
        effects.push({ kind: 'protocol-reset' }, { kind: 'start-timer', name: pe.phase === 'on' ? 'tSwapSourceStart' : 'tFirstSourceCap' });
        if (pe.hardResetCounter > 0) effects.push({ kind: 'start-timer', name: 'tNoResponse' });
        return [{ ...pe, state: 'PE_SRC_Startup', capsCounter: 0, phase: null }, effects];
      }
      if (event.kind === 'timer' && (event.name === 'tFirstSourceCap' || event.name === 'tSwapSourceStart')) return startOrDiscover(pe, context, effects);
      break;
    case 'PE_SRC_VDM_Identity_Request':
      if (event.kind === 'sent' && event.sop === "SOP'") {
        effects.push({ kind: 'start-timer', name: 'tVDMSenderResponse' });
        return [pe, effects];
      }
      if ((event.kind === 'failed' && event.sop === "SOP'") || (event.kind === 'timer' && event.name === 'tVDMSenderResponse')) {
        effects.push({ kind: 'note', text: "source: no answer from the cable on SOP' → offers limited to 3 A" });
        return sendCaps({ ...pe, cable: null }, context, effects);
      }
      break;
    case 'PE_SRC_Send_Capabilities':
      if (event.kind === 'sent' && (event.type === 'Source_Capabilities' || event.type === 'EPR_Source_Capabilities')) {
        effects.push({ kind: 'stop-timer', name: 'tNoResponse' }, { kind: 'start-timer', name: 'tSenderResponse' });
        return [{ ...pe, capsCounter: 0, hardResetCounter: 0, pdConnected: true }, effects];
      }
      if (event.kind === 'failed' && (event.type === 'Source_Capabilities' || event.type === 'EPR_Source_Capabilities')) {
        if (pe.contract) return softReset(pe, effects);
        effects.push({ kind: 'start-timer', name: 'tTypeCSendSourceCap' });
        return [{ ...pe, state: 'PE_SRC_Discovery' }, effects];
      }
      if (event.kind === 'message' && (event.type === 'Request' || event.type === 'EPR_Request')) {
        effects.push({ kind: 'stop-timer', name: 'tSenderResponse' });
        return negotiate({ ...pe, revision: event.revision }, event, context, effects);
      }
      if (event.kind === 'timer' && event.name === 'tSenderResponse') return hardReset(pe, effects, 'no Request within tSenderResponse');
      break;
    case 'PE_SRC_Discovery':
      if (event.kind === 'timer' && event.name === 'tTypeCSendSourceCap') {
        if (pe.capsCounter > counters.nCapsCount) {
          effects.push({ kind: 'note', text: `source: CapsCounter > nCapsCount (${counters.nCapsCount}) → PE_SRC_Disabled` });
          return [{ ...pe, state: 'PE_SRC_Disabled' }, effects];
        }
        return sendCaps(pe, context, effects);
      }
      break;
    case 'PE_SRC_Transition_Accept':
      if (event.kind === 'sent' && event.type === 'Accept') {
        effects.push({ kind: 'start-timer', name: 'tSrcTransition' });
        return [{ ...pe, state: 'PE_SRC_Transition_Supply' }, effects];
      }
      if (event.kind === 'failed' || event.kind === 'discarded') return softReset(pe, effects);
      break;
    case 'PE_SRC_Transition_Supply':
      if (event.kind === 'timer' && event.name === 'tSrcTransition' && pe.accepted) {
        const { voltageMv, limitMa, floorMv } = pe.accepted;
        effects.push(floorMv === undefined ? { kind: 'supply', voltageMv, limitMa } : { kind: 'supply', voltageMv, limitMa, floorMv });
        return [pe, effects];
      }
      if (event.kind === 'supply-ready') {
        if (event.withholdPsRdy) {
          effects.push({ kind: 'note', text: 'fault: source withholds PS_RDY' });
          return [pe, effects];
        }
        send(effects, 'PS_RDY');
        return [pe, effects];
      }
      if (event.kind === 'sent' && event.type === 'PS_RDY' && pe.accepted) {
        effects.push({ kind: 'contract', contract: pe.accepted.contract });
        return enterReady({ ...pe, contract: pe.accepted.contract, accepted: null }, effects);
      }
      // A failure during a power transition is a Hard Reset, not a Soft_Reset (§6.8.1).
      if (event.kind === 'failed') return hardReset(pe, effects, 'PS_RDY not acknowledged');
      break;
    case 'PE_SRC_Capability_Response':
      if (event.kind === 'sent' && (event.type === 'Reject' || event.type === 'Wait')) {
        if (pe.contract) return enterReady(pe, effects);
        return [{ ...pe, state: 'PE_SRC_Wait_New_Capabilities' }, effects];
      }
      if (event.kind === 'failed') return softReset(pe, effects);
      break;
    case 'PE_SRC_Wait_New_Capabilities':
      if (event.kind === 'message' && (event.type === 'Request' || event.type === 'EPR_Request')) return negotiate(pe, event, context, effects);
      break;
    case 'PE_SRC_Ready':
      return ready(pe, event, context, effects);
    case 'PE_SRC_Evaluate_EPR_Mode_Entry':
      if (event.kind === 'sent' && event.type === 'EPR_Mode') {
        // §8.3.3.26.2.2 PE_SRC_EPR_Mode_Discover_Cable: ask the cable plug within tEPRSourceCableDiscovery.
        effects.push({ kind: 'send', type: 'Vendor_Defined', objects: DISCOVER_IDENTITY_REQ, sop: "SOP'" }, { kind: 'start-timer', name: 'tEPRSourceCableDiscovery' });
        return [{ ...pe, state: 'PE_SRC_EPR_Mode_Discover_Cable' }, effects];
      }
      if (event.kind === 'failed') return softReset(pe, effects);
      break;
    case 'PE_SRC_EPR_Mode_Discover_Cable':
      if (event.kind === 'sent' && event.sop === "SOP'") {
        effects.push({ kind: 'start-timer', name: 'tVDMSenderResponse' });
        return [pe, effects];
      }
      if ((event.kind === 'failed' && event.sop === "SOP'") || (event.kind === 'timer' && (event.name === 'tVDMSenderResponse' || event.name === 'tEPRSourceCableDiscovery'))) {
        return eprEntryResult({ ...pe, cable: null }, context, effects);
      }
      break;
    case 'PE_SRC_EPR_Mode_Entry_Succeeded':
      if (event.kind === 'sent' && event.type === 'EPR_Mode') return sendCaps({ ...pe, eprMode: true }, context, effects);
      if (event.kind === 'failed') return hardReset(pe, effects, 'Enter_Succeeded not acknowledged');
      break;
    case 'PE_SRC_EPR_Mode_Entry_Failed':
      if (event.kind === 'sent' || event.kind === 'failed') return enterReady(pe, effects);
      break;
    case 'PE_SRC_Send_EPR_Mode_Exit':
      if (event.kind === 'sent' && event.type === 'EPR_Mode') return sendCaps({ ...pe, eprMode: false }, context, effects);
      if (event.kind === 'failed') return softReset(pe, effects);
      break;
    case 'PE_SRC_Soft_Reset':
      if (event.kind === 'sent' && event.type === 'Accept') return sendCaps(pe, context, effects);
      if (event.kind === 'failed') return hardReset(pe, effects, 'Accept of Soft_Reset not acknowledged');
      break;
    case 'PE_SRC_Send_Soft_Reset':
      if (event.kind === 'sent' && event.type === 'Soft_Reset') {
        effects.push({ kind: 'start-timer', name: 'tSenderResponse' });
        return [pe, effects];
      }
      if (event.kind === 'message' && event.type === 'Accept') {
        effects.push({ kind: 'stop-timer', name: 'tSenderResponse' });
        return sendCaps({ ...pe, eprMode: false }, context, effects);
      }
      if (event.kind === 'failed') return hardReset(pe, effects, 'Soft_Reset not acknowledged');
      if (event.kind === 'timer' && event.name === 'tSenderResponse') return hardReset(pe, effects, 'no Accept of Soft_Reset');
      break;
    case 'PE_SRC_Hard_Reset':
    case 'PE_SRC_Hard_Reset_Received':
      if (event.kind === 'timer' && event.name === 'tPSHardReset') {
        // §7.1.5: VBUS to vSafe0V within tSafe0V; power back after tSrcRecover, on within tSrcTurnOn.
        effects.push({ kind: 'protocol-reset' }, { kind: 'supply', voltageMv: 0, limitMa: null });
        return [{ ...pe, state: 'PE_SRC_Transition_to_default', phase: 'off' }, effects];
      }
      break;
    case 'PE_SRC_Transition_to_default':
      if (event.kind === 'supply-ready' && pe.phase === 'off') {
        effects.push({ kind: 'start-timer', name: 'tSrcRecover' });
        return [{ ...pe, phase: 'recover' }, effects];
      }
      if (event.kind === 'timer' && event.name === 'tSrcRecover') {
        effects.push({ kind: 'supply', voltageMv: 5_000, limitMa: null });
        return [{ ...pe, phase: 'on' }, effects];
      }
      if (event.kind === 'supply-ready' && pe.phase === 'on') return sourceStep({ ...pe, state: 'PE_SRC_Startup', phase: null }, { kind: 'start' }, context);
      break;
    default: {
      const swap = swapStep(pe, event, effects);
      if (swap) return swap;
      break;
    }
  }
  // §8.3.3.2.4 NoResponseTimer: after nHardResetCount Hard Resets give up — PE_SRC_Disabled when the
  // partners were never PD connected, ErrorRecovery (USB Type-C R2.3 §4.5.2.2.2) when they were.
  if (event.kind === 'timer' && event.name === 'tNoResponse') {
    if (pe.hardResetCounter > counters.nHardResetCount) {
      if (pe.pdConnected) {
        effects.push({ kind: 'note', text: 'source: NoResponseTimer expired after nHardResetCount Hard Resets of a PD connection → ErrorRecovery' }, { kind: 'error-recovery' });
        return [{ ...pe, state: 'ErrorRecovery' }, effects];
      }
      effects.push({ kind: 'note', text: 'source: NoResponseTimer expired after nHardResetCount Hard Resets → PE_SRC_Disabled' });
      return [{ ...pe, state: 'PE_SRC_Disabled' }, effects];
    }
    return hardReset(pe, effects, 'NoResponseTimer expired');
  }
  return [pe, effects];
}

function ready(pe: SourcePe, event: PeEvent, context: SourceContext, effects: PeEffect[]): Step {
  if (event.kind === 'timer' && event.name === 'tPPSTimeout') return hardReset(pe, effects, 'no Request within tPPSTimeout');
  if (event.kind === 'timer' && event.name === 'tSourceEPRKeepAlive') return hardReset(pe, effects, 'no message from the sink within tSourceEPRKeepAlive in EPR mode');
  if (event.kind !== 'message') return [pe, effects];
  switch (event.type) {
    case 'Request':
    case 'EPR_Request':
      effects.push({ kind: 'stop-timer', name: 'tPPSTimeout' }, { kind: 'stop-timer', name: 'tSourceEPRKeepAlive' });
      return negotiate(pe, event, context, effects);
    case 'Get_Source_Cap':
      effects.push({ kind: 'stop-timer', name: 'tPPSTimeout' }, { kind: 'stop-timer', name: 'tSourceEPRKeepAlive' });
      return sendCaps(pe, context, effects);
    case 'Extended_Control':
      if (isEcdb(event, EXTENDED_CONTROL_TYPES.EPR_KeepAlive) && pe.eprMode) {
        sendBytes(effects, 'Extended_Control', [EXTENDED_CONTROL_TYPES.EPR_KeepAlive_Ack, 0]);
        return [pe, effects];
      }
      if (isEcdb(event, EXTENDED_CONTROL_TYPES.EPR_Get_Source_Cap) && pe.eprMode) {
        effects.push({ kind: 'stop-timer', name: 'tSourceEPRKeepAlive' });
        return sendCaps(pe, context, effects);
      }
      send(effects, 'Not_Supported');
      return [pe, effects];
    case 'EPR_Mode': {
      const { action } = eprModeOf(event.objects[0]);
      if (action === eprModeAction.enter) return evaluateEprEntry(pe, context, effects);
      if (action === eprModeAction.exit && pe.eprMode) {
        // §6.4.10 / §8.3.3.26.4: the sink leaves EPR mode; the source offers SPR again.
        effects.push({ kind: 'stop-timer', name: 'tSourceEPRKeepAlive' });
        return sendCaps({ ...pe, eprMode: false }, context, effects);
      }
      return [pe, effects];
    }
    case 'Get_Sink_Cap':
      // A source-only port does not have sink capabilities (§6.3.8): Not_Supported (R3), Reject (R2.0).
      send(effects, pe.revision === '2.0' ? 'Reject' : 'Not_Supported');
      return [pe, effects];
    case 'Get_Source_Cap_Extended':
      sendBytes(effects, 'Source_Capabilities_Extended', sourceCapsExtendedBytes(context.pdpW().spr, context.pdpW().epr));
      return [pe, effects];
    case 'Get_Status':
      sendBytes(effects, 'Status', statusBytes());
      return [pe, effects];
    case 'Get_PPS_Status':
      if (pe.contract?.kind === 'pps') sendBytes(effects, 'PPS_Status', ppsStatusBytes(pe.contract, context.vbusMv()));
      else send(effects, 'Not_Supported');
      return [pe, effects];
    case 'PR_Swap':
    case 'DR_Swap':
    case 'VCONN_Swap':
      return answerSwap(pe, event.type, context.swapAnswer, 'PE_PRS_SRC_SNK_Accept_Swap', effects);
    case 'Accept':
    case 'Reject':
    case 'Wait':
    case 'PS_RDY':
    case 'Not_Supported':
    case 'GoodCRC':
      // Unexpected in Ready: a protocol error, answered with Soft_Reset (§6.8.1).
      return softReset(pe, effects);
    default:
      // §6.3.16: a message the port does not support gets Not_Supported (R3), Reject (R2.0).
      send(effects, pe.revision === '2.0' ? 'Reject' : 'Not_Supported');
      return [pe, effects];
  }
}

/** §8.3.3.26.2.1 PE_SRC_Evaluate_EPR_Mode_Entry: Enter_Acknowledged, or Enter_Failed with its reason. */
function evaluateEprEntry(pe: SourcePe, context: SourceContext, effects: PeEffect[]): Step {
  effects.push({ kind: 'stop-timer', name: 'tPPSTimeout' });
  const reason = !context.eprCapable ? eprEnterFailed.pdo : !pe.sinkEprCapable ? eprEnterFailed.rdo : null;
  if (reason !== null) {
    send(effects, 'EPR_Mode', [eprModeObject(eprModeAction.enterFailed, reason)]);
    return [{ ...pe, state: 'PE_SRC_EPR_Mode_Entry_Failed' }, effects];
  }
  send(effects, 'EPR_Mode', [eprModeObject(eprModeAction.enterAcknowledged)]);
  return [{ ...pe, state: 'PE_SRC_Evaluate_EPR_Mode_Entry' }, effects];
}

function eprEntryResult(pe: SourcePe, _context: SourceContext, effects: PeEffect[]): Step {
  effects.push({ kind: 'stop-timer', name: 'tEPRSourceCableDiscovery' }, { kind: 'stop-timer', name: 'tVDMSenderResponse' });
  if (cableAllowsEpr(pe.cable ?? null)) {
    send(effects, 'EPR_Mode', [eprModeObject(eprModeAction.enterSucceeded)]);
    return [{ ...pe, state: 'PE_SRC_EPR_Mode_Entry_Succeeded' }, effects];
  }
  effects.push({ kind: 'note', text: 'source: the cable is not a 50 V, 5 A EPR cable → Enter_Failed' });
  send(effects, 'EPR_Mode', [eprModeObject(eprModeAction.enterFailed, eprEnterFailed.cable)]);
  return [{ ...pe, state: 'PE_SRC_EPR_Mode_Entry_Failed' }, effects];
}

/** The cable plug's answer on SOP' (a Discover Identity ACK), wherever the source asked. */
function cableAnswer(pe: SourcePe, event: Extract<PeEvent, { kind: 'message' }>, context: SourceContext, effects: PeEffect[]): Step {
  if (event.type !== 'Vendor_Defined') return [pe, effects];
  const cable = readIdentity(event.objects);
  effects.push({ kind: 'stop-timer', name: 'tVDMSenderResponse' });
  if (pe.state === 'PE_SRC_VDM_Identity_Request') return sendCaps({ ...pe, cable }, context, effects);
  if (pe.state === 'PE_SRC_EPR_Mode_Discover_Cable') return eprEntryResult({ ...pe, cable }, context, effects);
  return [{ ...pe, cable }, effects];
}

/** §7.3.9: our PR_Swap was accepted; the initial source turns its supply off after tSrcTransition. */
function prAccepted(pe: SourcePe, effects: PeEffect[]): Step {
  effects.push({ kind: 'start-timer', name: 'tSrcTransition' });
  return [{ ...pe, state: 'PE_PRS_SRC_SNK_Transition_to_off' }, effects];
}

/** The source's exits for the shared swap states (swap-pe.ts). */
const EXITS: SwapExits<SourcePe> = { enterReady, hardReset, prAccepted };

/** The swap state machines from the source's side: the shared states (swap-pe.ts), then the source's PR_Swap power transition. */
function swapStep(pe: SourcePe, event: PeEvent, effects: PeEffect[]): Step | null {
  switch (pe.state) {
    case 'PE_DR_SRC_Get_Source_Cap':
    case 'PE_SRC_Get_Sink_Cap':
    case 'PE_SRC_Get_Source_Cap_Ext':
    case 'PE_SRC_Get_Sink_Status':
    case 'PE_SRC_Get_PPS_Status':
      return awaitAnswer(pe, event, effects, EXITS);
    case 'PE_PRS_SRC_SNK_Accept_Swap':
      if (event.kind === 'sent' && event.type === 'Accept') return prAccepted(pe, effects);
      break;
    case 'PE_PRS_SRC_SNK_Transition_to_off':
      // §7.3.9: the initial source turns its supply off (vSafe0V within tSrcSwapStdby), then says PS_RDY.
      if (event.kind === 'timer' && event.name === 'tSrcTransition') {
        effects.push({ kind: 'stop-timer', name: 'tPPSTimeout' }, { kind: 'supply', voltageMv: 0, limitMa: null });
        return [{ ...pe, phase: 'off' }, effects];
      }
      if (event.kind === 'supply-ready' && pe.phase === 'off') {
        send(effects, 'PS_RDY');
        return [{ ...pe, state: 'PE_PRS_SRC_SNK_Source_off', phase: null }, effects];
      }
      break;
    case 'PE_PRS_SRC_SNK_Source_off':
      // The contract ends with this PS_RDY: the sink drops it when the message arrives.
      if (event.kind === 'sent' && event.type === 'PS_RDY') {
        effects.push({ kind: 'contract', contract: null }, { kind: 'start-timer', name: 'tPSSourceOn' });
        return [{ ...pe, state: 'PE_PRS_SRC_SNK_Wait_Source_on', contract: null, eprMode: false }, effects];
      }
      break;
    case 'PE_PRS_SRC_SNK_Wait_Source_on':
      if (event.kind === 'message' && event.type === 'PS_RDY') {
        effects.push({ kind: 'stop-timer', name: 'tPSSourceOn' }, { kind: 'become', role: 'sink' });
        return [pe, effects];
      }
      if (event.kind === 'timer' && event.name === 'tPSSourceOn') {
        effects.push({ kind: 'note', text: 'source: no PS_RDY from the new source within tPSSourceOn → ErrorRecovery' }, { kind: 'error-recovery' });
        return [{ ...pe, state: 'ErrorRecovery' }, effects];
      }
      break;
    default:
      return sharedSwapStep(pe, event, effects, EXITS);
  }
  return null;
}
