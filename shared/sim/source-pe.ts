/**
 * The source's policy engine as a pure step, after USB PD R3.2 V1.1 §8.3.3.2 (Source Port state
 * diagrams): PE_SRC_Startup, _Send_Capabilities, _Discovery, _Negotiate_Capability,
 * _Transition_Supply, _Ready, _Capability_Response, _Wait_New_Capabilities, _Hard_Reset,
 * _Hard_Reset_Received, _Transition_to_default, _Soft_Reset, _Send_Soft_Reset, _Disabled.
 */
import type { Contract } from '../core/contract.ts';
import { countersFor } from '../core/timers.ts';
import type { SourcePdo } from '../pd/types.ts';
import { decodeRdo } from '../pd/rdo.ts';
import { checkRequest } from '../rules/check-request.ts';
import { contractOf } from '../rules/contract-of.ts';
import type { PeEffect, PeEvent } from './pe-types.ts';
import type { Revision } from './wire.ts';

export interface SourceContext {
  words: readonly number[];
  pdos: readonly SourcePdo[];
}

export interface SourcePe {
  /** The spec's state name ('idle' before attach). */
  state: string;
  /** Transition_to_default progress: VBUS going off, waiting tSrcRecover, coming back on. */
  phase: 'off' | 'recover' | 'on' | null;
  revision: Revision;
  capsCounter: number;
  hardResetCounter: number;
  /** A PD connection exists: a Source_Capabilities was acknowledged since the last Hard Reset. */
  pdConnected: boolean;
  contract: Contract | null;
  accepted: { contract: Contract; voltageMv: number; limitMa: number | null } | null;
}

export function initialSourcePe(revision: Revision): SourcePe {
  return { state: 'idle', phase: null, revision, capsCounter: 0, hardResetCounter: 0, pdConnected: false, contract: null, accepted: null };
}

type Step = [SourcePe, PeEffect[]];

function sendCaps(pe: SourcePe, context: SourceContext, effects: PeEffect[]): Step {
  effects.push({ kind: 'send', type: 'Source_Capabilities', objects: context.words });
  return [{ ...pe, state: 'PE_SRC_Send_Capabilities', capsCounter: pe.capsCounter + 1 }, effects];
}

function hardReset(pe: SourcePe, effects: PeEffect[], why: string): Step {
  effects.push(
    { kind: 'note', text: `source: ${why} → Hard Reset` },
    { kind: 'stop-timer', name: 'tSenderResponse' },
    { kind: 'stop-timer', name: 'tPPSTimeout' },
    { kind: 'hard-reset' },
    { kind: 'contract', contract: null },
    { kind: 'start-timer', name: 'tPSHardReset' },
  );
  return [{ ...pe, state: 'PE_SRC_Hard_Reset', phase: null, hardResetCounter: pe.hardResetCounter + 1, contract: null, accepted: null }, effects];
}

function softReset(pe: SourcePe, effects: PeEffect[]): Step {
  effects.push({ kind: 'send', type: 'Soft_Reset', objects: [] });
  return [{ ...pe, state: 'PE_SRC_Send_Soft_Reset' }, effects];
}

function enterReady(pe: SourcePe, effects: PeEffect[]): Step {
  if (pe.contract?.kind === 'pps') effects.push({ kind: 'start-timer', name: 'tPPSTimeout' });
  return [{ ...pe, state: 'PE_SRC_Ready' }, effects];
}

/** §8.3.3.2.5 PE_SRC_Negotiate_Capability: the Request must name an offer and stay within it. */
function negotiate(pe: SourcePe, rdoRaw: number, reject: boolean, context: SourceContext, effects: PeEffect[]): Step {
  const position = (rdoRaw >>> 28) & 0b1111;
  const pdo = context.pdos[position - 1];
  const rdo = pdo ? decodeRdo(rdoRaw, pdo) : undefined;
  const valid = pdo !== undefined && rdo !== undefined && !checkRequest(rdo, context.pdos).some((finding) => finding.severity === 'error');
  if (!valid || reject || !pdo || !rdo) {
    effects.push({ kind: 'send', type: 'Reject', objects: [] });
    return [{ ...pe, state: 'PE_SRC_Capability_Response' }, effects];
  }
  const contract = contractOf(rdo, pdo);
  const programmable = rdo.kind === 'rdo-pps' || rdo.kind === 'rdo-avs';
  const accepted = { contract, voltageMv: contract.voltageMv, limitMa: programmable ? contract.currentMa : null };
  effects.push({ kind: 'send', type: 'Accept', objects: [] });
  return [{ ...pe, state: 'PE_SRC_Transition_Accept', accepted }, effects];
}

export function sourceStep(pe: SourcePe, event: PeEvent, context: SourceContext): Step {
  const effects: PeEffect[] = [];
  const counters = countersFor(pe.revision);

  // Hard Reset signalling wins in every state (§8.3.3.2.9 PE_SRC_Hard_Reset_Received).
  if (event.kind === 'hard-reset-received') {
    effects.push(
      { kind: 'stop-timer', name: 'tSenderResponse' },
      { kind: 'stop-timer', name: 'tPPSTimeout' },
      { kind: 'stop-timer', name: 'tNoResponse' },
      { kind: 'contract', contract: null },
      { kind: 'start-timer', name: 'tPSHardReset' },
    );
    return [{ ...pe, state: 'PE_SRC_Hard_Reset_Received', phase: null, contract: null, accepted: null }, effects];
  }
  if (event.kind === 'message' && event.type === 'Soft_Reset' && pe.state !== 'idle' && pe.phase === null) {
    effects.push({ kind: 'stop-timer', name: 'tSenderResponse' }, { kind: 'stop-timer', name: 'tPPSTimeout' }, { kind: 'send', type: 'Accept', objects: [] });
    return [{ ...pe, state: 'PE_SRC_Soft_Reset' }, effects];
  }

  switch (pe.state) {
    case 'idle':
    case 'PE_SRC_Startup':
      if (event.kind === 'start') {
        effects.push({ kind: 'protocol-reset' }, { kind: 'start-timer', name: 'tFirstSourceCap' });
        if (pe.hardResetCounter > 0) effects.push({ kind: 'start-timer', name: 'tNoResponse' });
        return [{ ...pe, state: 'PE_SRC_Startup', capsCounter: 0, phase: null }, effects];
      }
      if (event.kind === 'timer' && event.name === 'tFirstSourceCap') return sendCaps(pe, context, effects);
      break;
    case 'PE_SRC_Send_Capabilities':
      if (event.kind === 'sent' && event.type === 'Source_Capabilities') {
        effects.push({ kind: 'stop-timer', name: 'tNoResponse' }, { kind: 'start-timer', name: 'tSenderResponse' });
        return [{ ...pe, capsCounter: 0, hardResetCounter: 0, pdConnected: true }, effects];
      }
      if (event.kind === 'failed' && event.type === 'Source_Capabilities') {
        if (pe.contract) return softReset(pe, effects);
        effects.push({ kind: 'start-timer', name: 'tTypeCSendSourceCap' });
        return [{ ...pe, state: 'PE_SRC_Discovery' }, effects];
      }
      if (event.kind === 'message' && event.type === 'Request') {
        effects.push({ kind: 'stop-timer', name: 'tSenderResponse' });
        return negotiate({ ...pe, revision: event.revision }, event.objects[0] ?? 0, event.reject === true, context, effects);
      }
      if (event.kind === 'timer' && event.name === 'tSenderResponse') return hardReset(pe, effects, 'no Request within tSenderResponse');
      if (event.kind === 'timer' && event.name === 'tNoResponse') break;
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
        effects.push({ kind: 'supply', voltageMv: pe.accepted.voltageMv, limitMa: pe.accepted.limitMa });
        return [pe, effects];
      }
      if (event.kind === 'supply-ready') {
        if (event.withholdPsRdy) {
          effects.push({ kind: 'note', text: 'fault: source withholds PS_RDY' });
          return [pe, effects];
        }
        effects.push({ kind: 'send', type: 'PS_RDY', objects: [] });
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
      if (event.kind === 'sent' && event.type === 'Reject') {
        if (pe.contract) return enterReady(pe, effects);
        return [{ ...pe, state: 'PE_SRC_Wait_New_Capabilities' }, effects];
      }
      if (event.kind === 'failed') return softReset(pe, effects);
      break;
    case 'PE_SRC_Ready':
      if (event.kind === 'message' && event.type === 'Request') {
        effects.push({ kind: 'stop-timer', name: 'tPPSTimeout' });
        return negotiate(pe, event.objects[0] ?? 0, event.reject === true, context, effects);
      }
      if (event.kind === 'message' && event.type === 'Get_Source_Cap') {
        effects.push({ kind: 'stop-timer', name: 'tPPSTimeout' });
        return sendCaps(pe, context, effects);
      }
      if (event.kind === 'timer' && event.name === 'tPPSTimeout') return hardReset(pe, effects, 'no Request within tPPSTimeout');
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
        return sendCaps(pe, context, effects);
      }
      if (event.kind === 'failed') return hardReset(pe, effects, 'Soft_Reset not acknowledged');
      if (event.kind === 'timer' && event.name === 'tSenderResponse') return hardReset(pe, effects, 'no Accept of Soft_Reset');
      break;
    case 'PE_SRC_Hard_Reset':
    case 'PE_SRC_Hard_Reset_Received':
      if (event.kind === 'timer' && event.name === 'tPSHardReset') {
        // §7.1.5: VBUS to vSafe0V within tSafe0V; power back after tSrcRecover, on within tSrcTurnOn.
        effects.push({ kind: 'protocol-reset' }, { kind: 'supply', voltageMv: 0, limitMa: null });
        return [{ ...pe, state: 'PE_SRC_Transition_to_default', phase: 'off', pdConnected: false }, effects];
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
    default:
      break;
  }
  // §8.3.3.2.4 NoResponseTimer: without a PD connection after nHardResetCount resets, give up.
  if (event.kind === 'timer' && event.name === 'tNoResponse' && !pe.pdConnected) {
    if (pe.hardResetCounter > counters.nHardResetCount) {
      effects.push({ kind: 'note', text: 'source: NoResponseTimer expired after nHardResetCount Hard Resets → PE_SRC_Disabled' });
      return [{ ...pe, state: 'PE_SRC_Disabled' }, effects];
    }
    return hardReset(pe, effects, 'NoResponseTimer expired');
  }
  return [pe, effects];
}
