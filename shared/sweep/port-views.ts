/**
 * What each port's policy engine believes over time, as the sweep reads it: per side, each change
 * of its contract and of its state, and its final state. The one adapter between the sweep and
 * the simulator's per-port views (`simulate().ports`, shared/sim/port-views.ts).
 */
import type { Contract } from '../core/contract.ts';
import type { PortViews as SimPortViews } from '../sim/port-views.ts';
import type { Side } from '../sim/types.ts';

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

export type PortViews = Record<Side, PortView> & { sim: SimPortViews };

function viewOf(ports: SimPortViews, side: Side): PortView {
  const contracts: ContractChange[] = [{ t: 0, contract: null }];
  const states: { t: number; state: string }[] = [];
  for (const change of ports.changes) {
    if (change.side !== side) continue;
    if (change.contract !== contracts[contracts.length - 1]!.contract) contracts.push({ t: change.tUs, contract: change.contract });
    if (states[states.length - 1]?.state !== change.state) states.push({ t: change.tUs, state: change.state });
  }
  return { side, contracts, finalState: ports.final[side].state, states };
}

/** Both ports' views of one run. */
export function portViews(run: { ports: SimPortViews }): PortViews {
  return { source: viewOf(run.ports, 'source'), sink: viewOf(run.ports, 'sink'), sim: run.ports };
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
