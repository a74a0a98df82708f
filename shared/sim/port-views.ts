/**
 * What each policy engine believes over time: its state and the contract it holds. The runner
 * records a change whenever a port's state or contract moves; `disagreements` compares the two
 * ports and returns every stretch where one claims a contract the other does not share.
 *
 * The two claims cannot switch at the same instant: the sink takes a new contract when PS_RDY
 * arrives, the source once the GoodCRC for that PS_RDY is back (USB PD R3.2 V1.1 §8.3.3.2.6,
 * §8.3.3.3.6), and a Hard Reset reaches the partner one signalling time later. `settleUs` (default
 * `CONTRACT_SETTLE_US`) is how long a difference may last before it counts.
 */
import type { Contract } from '../core/contract.ts';
import type { Side } from './types.ts';

/** One port's belief from `tUs` on. `side` names the port by its power role at attach. */
export interface PortView {
  tUs: number;
  side: Side;
  /** The policy engine's state (the specification's name), or a Type-C state before it starts. */
  state: string;
  /** The explicit contract this port holds, or null for none. */
  contract: Contract | null;
  /** The port is in EPR mode (USB PD R3.2 V1.1 §6.4.10). */
  eprMode: boolean;
}

export interface PortViews {
  /** Every change of either port, in time order. */
  changes: PortView[];
  /** Each port's belief when the run ended. */
  final: Record<Side, PortView>;
}

/** A message time, a GoodCRC and tTransmit with margin: 2 ms (common practice for the comparison). */
export const CONTRACT_SETTLE_US = 2_000;

export interface Disagreement {
  startUs: number;
  /** When they agreed again, or the end of the run. */
  endUs: number;
  source: Contract | null;
  sink: Contract | null;
}

export function sameContract(a: Contract | null, b: Contract | null): boolean {
  if (a === b) return true;
  if (!a || !b) return false;
  return a.kind === b.kind && a.objectPosition === b.objectPosition && a.voltageMv === b.voltageMv && a.currentMa === b.currentMa && a.powerMw === b.powerMw;
}

/**
 * Stretches longer than `settleUs` where the two ports' contracts differ (one holds none, or
 * they hold different ones), including a difference still open when the run ended at `endUs`.
 */
export function disagreements(views: PortViews, endUs: number, settleUs = CONTRACT_SETTLE_US): Disagreement[] {
  const held: Record<Side, Contract | null> = { source: null, sink: null };
  const found: Disagreement[] = [];
  let open: Disagreement | null = null;
  const close = (tUs: number) => {
    if (open && tUs - open.startUs > settleUs) found.push({ ...open, endUs: tUs });
    open = null;
  };
  const changes = views.changes;
  for (let i = 0; i < changes.length; i++) {
    const change = changes[i]!;
    held[change.side] = change.contract;
    // Apply every change of one instant before comparing.
    if (changes[i + 1]?.tUs === change.tUs) continue;
    if (sameContract(held.source, held.sink)) close(change.tUs);
    else if (!open || !sameContract(open.source, held.source) || !sameContract(open.sink, held.sink)) {
      const startUs: number = open?.startUs ?? change.tUs;
      open = { startUs, endUs: endUs, source: held.source, sink: held.sink };
    }
  }
  close(endUs);
  return found;
}
