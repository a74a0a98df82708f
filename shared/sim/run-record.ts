/**
 * What a run writes down as it goes, as plain data: the trace records (trace.md), the state lanes,
 * every contract the sink took, and each change of what a port believes (port-views.ts).
 */
import type { TraceRecord } from '../trace/records.ts';
import type { SimClock } from './clock.ts';
import type { PortView } from './port-views.ts';
import type { LaneEntry, Side, TimedContract } from './types.ts';

export class RunRecord {
  readonly records: TraceRecord[] = [];
  readonly lanes: LaneEntry[] = [];
  readonly contracts: TimedContract[] = [];
  readonly portChanges: PortView[] = [];

  constructor(private readonly clock: SimClock) {}

  /** A side entered `state` now. */
  lane(side: Side, state: string): void {
    this.lanes.push({ t: this.clock.nowUs, side, state });
  }

  note(text: string): void {
    this.records.push({ t: this.clock.nowUs, note: text });
  }
}
