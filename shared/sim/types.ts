/** Types shared by the simulator's actors and runner. */
import type { Contract } from '../core/contract.ts';

export type Side = 'source' | 'sink';

export function otherSide(side: Side): Side {
  return side === 'source' ? 'sink' : 'source';
}

/** A state-lane entry: the policy engine (or Type-C) state a side entered at `t` (µs). */
export interface LaneEntry {
  t: number;
  side: Side;
  state: string;
}

/** A timer span for the timeline: `expired` when it ran out, else it was stopped (or the run ended). */
export interface TimerSpan {
  name: string;
  side: Side;
  startUs: number;
  endUs: number;
  expired: boolean;
}

export type TimedContract = Contract & { t: number };
