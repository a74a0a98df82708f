/**
 * What each port's policy engine believes over time: its contract (or none) and its last state.
 *
 * The one adapter between the sweep and the simulator's output. It reads the state lanes and the
 * trace of `simulate()`: the sink holds a contract from the PS_RDY it accepted (`contracts`) until it
 * enters PE_SNK_Discovery (Hard Reset, VBUS gone); the source holds the contract of the Request it
 * accepted from entering PE_SRC_Ready out of PE_SRC_Transition_Supply (its PS_RDY acknowledged)
 * until it enters PE_SRC_Hard_Reset or PE_SRC_Hard_Reset_Received (USB PD R3.2 V1.1 §8.3.3.2,
 * §8.3.3.3). When the simulator reports per-port views itself, only this module changes.
 */
import type { Contract } from '../core/contract.ts';
import { decodeRdo } from '../pd/rdo.ts';
import type { SourcePdo } from '../pd/types.ts';
import { contractOf } from '../rules/contract-of.ts';
import type { SimulationResult } from '../sim/simulate.ts';
import type { Side } from '../sim/types.ts';
import { messageTypeOfHex } from './messages.ts';

export interface ContractChange {
  t: number;
  contract: Contract | null;
}

export interface PortView {
  side: Side;
  /** Each change of the contract this port believes in, in time order (starts with none at 0). */
  contracts: ContractChange[];
  /** The policy engine (or Type-C) state the port was in at the end. */
  finalState: string;
  /** Every state entered, with its time (µs). */
  states: { t: number; state: string }[];
}

export type PortViews = Record<Side, PortView>;

const SINK_LOSES = new Set(['PE_SNK_Discovery', 'PE_SNK_Transition_to_default']);
const SOURCE_LOSES = new Set(['PE_SRC_Hard_Reset', 'PE_SRC_Hard_Reset_Received', 'PE_SRC_Transition_to_default']);

type RunOutput = Pick<SimulationResult, 'lanes' | 'events' | 'contracts'>;

function rdoOf(hex: string): number {
  // Header (2 bytes) then the RDO, little-endian.
  const byte = (i: number) => Number.parseInt(hex.slice(4 + i * 2, 6 + i * 2), 16);
  return (byte(0) | (byte(1) << 8) | (byte(2) << 16) | (byte(3) << 24)) >>> 0;
}

/** The contract the source accepted: the last good Request it received before entering Transition_Accept. */
function requestContract(run: RunOutput, beforeUs: number, pdos: readonly SourcePdo[]): Contract | null {
  let found: Contract | null = null;
  for (const record of run.events) {
    if (record.t > beforeUs) break;
    if (!('msg' in record) || record.from !== 'sink' || record.crcOk === false) continue;
    if (messageTypeOfHex(record.msg) !== 'Request') continue;
    const raw = rdoOf(record.msg);
    const pdo = pdos[((raw >>> 28) & 0b1111) - 1];
    found = pdo ? contractOf(decodeRdo(raw, pdo), pdo) : null;
  }
  return found;
}

function statesOf(run: RunOutput, side: Side): { t: number; state: string }[] {
  return run.lanes.filter((lane) => lane.side === side).map(({ t, state }) => ({ t, state }));
}

function sinkView(run: RunOutput): PortView {
  const states = statesOf(run, 'sink');
  const changes: ContractChange[] = [{ t: 0, contract: null }];
  const marks = [
    ...run.contracts.map(({ t, ...contract }) => ({ t, contract: contract as Contract | null, order: 1 })),
    ...states.filter((s) => SINK_LOSES.has(s.state)).map((s) => ({ t: s.t, contract: null, order: 0 })),
  ].sort((a, b) => a.t - b.t || a.order - b.order);
  for (const mark of marks) changes.push({ t: mark.t, contract: mark.contract });
  return { side: 'sink', contracts: changes, finalState: states.at(-1)?.state ?? 'none', states };
}

function sourceView(run: RunOutput, pdos: readonly SourcePdo[]): PortView {
  const states = statesOf(run, 'source');
  const changes: ContractChange[] = [{ t: 0, contract: null }];
  let accepted: Contract | null = null;
  let previous = '';
  for (const { t, state } of states) {
    if (state === 'PE_SRC_Transition_Accept') accepted = requestContract(run, t, pdos);
    if (state === 'PE_SRC_Ready' && previous === 'PE_SRC_Transition_Supply') changes.push({ t, contract: accepted });
    if (SOURCE_LOSES.has(state)) changes.push({ t, contract: null });
    previous = state;
  }
  return { side: 'source', contracts: changes, finalState: states.at(-1)?.state ?? 'none', states };
}

/** Both ports' views of one run. `pdos` are the source's offers (to read the Request it accepted). */
export function portViews(run: RunOutput, pdos: readonly SourcePdo[]): PortViews {
  return { source: sourceView(run, pdos), sink: sinkView(run) };
}

/** The contract a view holds at `tUs` (the last change at or before it). */
export function contractAt(view: PortView, tUs: number): Contract | null {
  let contract: Contract | null = null;
  for (const change of view.contracts) {
    if (change.t > tUs) break;
    contract = change.contract;
  }
  return contract;
}

/** The state a view is in at `tUs`. */
export function stateAt(view: PortView, tUs: number): string {
  let state = 'none';
  for (const entry of view.states) {
    if (entry.t > tUs) break;
    state = entry.state;
  }
  return state;
}
