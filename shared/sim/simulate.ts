/**
 * `simulate(scenario, options)`: runs a negotiation scenario (vector.md) and returns the trace
 * (trace.md records, each message with its decoded form), VBUS/IBUS samples, state lanes, timer
 * spans, the contract and the findings of the trace analyser over the simulated trace — the same
 * checks that run on real captures.
 */
import type { Contract } from '../core/contract.ts';
import type { Finding } from '../core/finding.ts';
import { decodeMessage, parseHex } from '../pd/index.ts';
import type { Message, SourcePdo } from '../pd/types.ts';
import { analyseRecords } from '../trace/index.ts';
import type { TraceRecord } from '../trace/records.ts';
import type { Timeline } from '../trace/timeline.ts';
import type { PortViews } from './port-views.ts';
import type { PackedSamples } from './sample-buffer.ts';
import { resolveCaps } from './caps.ts';
import { runScenario } from './runner.ts';
import type { Scenario } from './scenario.ts';
import type { LaneEntry, TimedContract, TimerSpan } from './types.ts';

export interface SimulateOptions {
  /** Add `samples` (default every 1 ms). */
  samples?: boolean;
  sampleEveryUs?: number;
  /** Attach each message's decoded form as `message` (default true). */
  decode?: boolean;
  /** Run the trace analyser over the result (default true). */
  analyze?: boolean;
  /** Stop as soon as the first explicit contract is in place. */
  untilContract?: boolean;
  /** Called with the fraction of simulated time done, about a hundred times a run. */
  onProgress?(fraction: number): void;
  /** Checked every 256 events and at each percent of simulated time; true stops the run (a worker's cancel button). */
  shouldStop?(): boolean;
}

/** One sample row as the CLI prints it: `[t µs, mV at the source, mA, mV at the sink]`. */
export type Sample = [t: number, mv: number, ma: number, sinkMv: number];

export interface SimulationResult {
  /** The explicit contract in force at the end, or null. */
  contract: Contract | null;
  /** Every explicit contract reached, with the time (µs) the sink got its PS_RDY. */
  contracts: TimedContract[];
  /** What each policy engine believed over time, and at the end (port-views.ts). */
  ports: PortViews;
  events: TraceRecord[];
  findings: Finding[];
  /** The analyser's timeline of the simulated trace (absent with `analyze: false`). */
  timeline?: Timeline;
  /** VBUS/IBUS samples as steps of held values in one Int32Array (sample-buffer.ts; `sampleRows` gives one array a sample). */
  samples?: PackedSamples;
  lanes: LaneEntry[];
  timers: TimerSpan[];
  /** Simulated time reached, µs. */
  endUs: number;
  /** True when `shouldStop` ended the run early. */
  stopped: boolean;
}

function invalid(message: string): SimulationResult {
  const finding: Finding = { rule: 'sim.scenario', severity: 'error', message, ref: 'vector.md, Scenario' };
  const idle = (side: 'source' | 'sink') => ({ tUs: 0, side, state: side === 'source' ? 'Unattached.SRC' : 'Unattached.SNK', contract: null, eprMode: false });
  return {
    contract: null,
    contracts: [],
    ports: { changes: [], final: { source: idle('source'), sink: idle('sink') } },
    events: [],
    findings: [finding],
    lanes: [],
    timers: [],
    endUs: 0,
    stopped: false,
  };
}

/** Decoded forms, once per distinct hex and SOP (a run repeats few distinct messages). */
function decodeAll(records: TraceRecord[], pdos: SourcePdo[]): void {
  const cache = new Map<string, Message | null>();
  for (const record of records) {
    if (!('msg' in record)) continue;
    // SOP′ messages decode with the cable's layouts (a cable's ID Header is not a port's).
    const sop = record.sop ?? 'SOP';
    const key = sop === 'SOP' ? record.msg : `${sop} ${record.msg}`;
    let message = cache.get(key);
    if (message === undefined) {
      const bytes = parseHex(record.msg);
      const decoded = bytes.ok ? decodeMessage(bytes.bytes, { caps: pdos, sop }) : bytes;
      message = decoded.ok ? decoded.message : null;
      cache.set(key, message);
    }
    if (message) record.message = message;
  }
}

export function simulate(scenario: Scenario, options: SimulateOptions = {}): SimulationResult {
  const caps = resolveCaps(scenario.source.caps);
  if (!caps.ok) return invalid(`source.caps: ${caps.error.message}`);
  const run = runScenario(scenario, caps, {
    sampleEveryUs: options.samples ? Math.max(1, options.sampleEveryUs ?? 1_000) : undefined,
    untilContract: options.untilContract,
    onProgress: options.onProgress,
    shouldStop: options.shouldStop,
  });
  if (options.decode !== false) decodeAll(run.records, caps.pdos);
  const analysis = options.analyze === false ? undefined : analyseRecords(run.records);
  const result: SimulationResult = {
    contract: run.contract,
    contracts: run.contracts,
    ports: run.ports,
    events: run.records,
    findings: analysis?.findings ?? [],
    lanes: run.lanes,
    timers: run.timers,
    endUs: run.endUs,
    stopped: run.stopped,
  };
  if (analysis) result.timeline = analysis.timeline;
  if (run.samples) result.samples = run.samples;
  return result;
}
