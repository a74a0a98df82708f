/**
 * One truth between the simulator and the analyser: the contract the analyser reads from a trace,
 * at every instant, against what both simulated ports believe (shared/sim port views). The ports
 * take a contract at slightly different moments — the sink at PS_RDY, the source once its GoodCRC
 * is back (USB PD R3.2 V1.1 §8.3.3.2.6, §8.3.3.3.6) — so each stretch where the three are steady is
 * compared `settleUs` after it begins; a stretch shorter than that is skipped.
 */
import type { Contract } from '../core/contract.ts';
import type { TimelineContract } from './timeline.ts';

export interface PortBelief {
  tUs: number;
  side: 'source' | 'sink';
  contract: Contract | null;
}

export interface Mismatch {
  tUs: number;
  analyser: Contract | null;
  source: Contract | null;
  sink: Contract | null;
}

function same(a: Contract | null, b: Contract | null): boolean {
  if (a === b) return true;
  if (!a || !b) return false;
  return a.kind === b.kind && a.objectPosition === b.objectPosition && a.voltageMv === b.voltageMv && a.currentMa === b.currentMa;
}

/** The analyser's contract at `t` from its timeline (a contract runs from its PS_RDY to its end). */
function analyserAt(contracts: readonly TimelineContract[], t: number): Contract | null {
  let found: Contract | null = null;
  for (const c of contracts) if (c.startUs <= t && (c.endUs === undefined || t < c.endUs)) found = c.contract;
  return found;
}

/** Every steady stretch where the analyser's contract differs from either port's belief. */
export function contractMismatches(analyser: readonly TimelineContract[], ports: readonly PortBelief[], endUs: number, settleUs: number): Mismatch[] {
  const times = new Set<number>([0]);
  for (const c of analyser) {
    times.add(c.startUs);
    if (c.endUs !== undefined) times.add(c.endUs);
  }
  for (const p of ports) times.add(p.tUs);
  const sorted = [...times].filter((t) => t <= endUs).sort((a, b) => a - b);
  const out: Mismatch[] = [];
  const held: Record<'source' | 'sink', Contract | null> = { source: null, sink: null };
  let next = 0;
  for (let i = 0; i < sorted.length; i++) {
    const at = sorted[i]! + settleUs;
    const stretchEnd = sorted[i + 1] ?? endUs;
    if (at >= stretchEnd) continue;
    while (next < ports.length && ports[next]!.tUs <= at) {
      held[ports[next]!.side] = ports[next]!.contract;
      next++;
    }
    const mine = analyserAt(analyser, at);
    if (!same(mine, held.source) || !same(mine, held.sink)) out.push({ tUs: at, analyser: mine, source: held.source, sink: held.sink });
  }
  return out;
}
