/** What a run hands to simulate.ts: the recorded data, the timer spans, the ports' views and the samples. */
import type { Contract } from '../core/contract.ts';
import type { TraceRecord } from '../trace/records.ts';
import type { PortViews } from './port-views.ts';
import type { RunRecord } from './run-record.ts';
import type { PackedSamples } from './sample-buffer.ts';
import type { LaneEntry, TimedContract, TimerSpan } from './types.ts';

export interface RunOutput {
  records: TraceRecord[];
  lanes: LaneEntry[];
  timers: TimerSpan[];
  contracts: TimedContract[];
  /** The contract the sink holds at the end, or null. */
  contract: Contract | null;
  ports: PortViews;
  samples?: PackedSamples;
  /** Simulated time reached (µs). */
  endUs: number;
  stopped: boolean;
}

export function runOutput(record: RunRecord, timers: TimerSpan[], contract: Contract | null, ports: PortViews, endUs: number, stopped: boolean, samples: PackedSamples | undefined): RunOutput {
  const output: RunOutput = { records: record.records, lanes: record.lanes, timers, contracts: record.contracts, contract, ports, endUs, stopped };
  if (samples) output.samples = samples;
  return output;
}
