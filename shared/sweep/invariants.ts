/**
 * The invariant library of a fault sweep: what every run must hold whatever single fault (or pair)
 * was injected. Each has a stable id (used in vectors' `expect.invariants`, JUnit and the UI) and
 * a one-sentence explanation. Checks are pure functions of one run.
 */
import type { Contract } from '../core/contract.ts';
import type { Finding } from '../core/finding.ts';
import { countersFor, timersPd3 } from '../core/timers.ts';
import type { SourcePdo } from '../pd/types.ts';
import type { Fault, Scenario } from '../sim/scenario.ts';
import type { SimulationResult } from '../sim/simulate.ts';
import { disagreements } from '../sim/port-views.ts';
import { contractVbusLimits, voltageOutside } from '../trace/vbus.ts';
import { messageTypeOfHex } from './messages.ts';
import { stateAt, type PortView, type PortViews } from './port-views.ts';

export interface RunUnderJudgement {
  scenario: Scenario;
  result: Pick<SimulationResult, 'events' | 'findings' | 'contracts' | 'endUs'>;
  views: PortViews;
  pdos: readonly SourcePdo[];
}

export interface Invariant {
  id: string;
  title: string;
  explanation: string;
  ref: string;
  /** Null when the run holds it, else one sentence saying how it broke. */
  check(run: RunUnderJudgement): string | null;
}

/**
 * How long the two ports may differ about the contract while one exchange is in flight (the sink
 * takes it on PS_RDY, the source once that PS_RDY's GoodCRC is back; a Hard Reset reaches the
 * partner a moment after it is sent): the shortest tSenderResponse, longer than any one exchange.
 */
export const AGREEMENT_GRACE_US = timersPd3.tSenderResponse.minUs;

export function describeContract(c: Contract | null): string {
  if (c === null) return 'no contract';
  return `${c.kind} ${(c.voltageMv / 1_000).toFixed(2).replace(/\.?0+$/, '')} V ${(c.currentMa / 1_000).toFixed(2).replace(/\.?0+$/, '')} A (position ${c.objectPosition})`;
}

const ms = (us: number) => `${(us / 1_000).toFixed(1)} ms`;

const agreement: Invariant = {
  id: 'contract.agreement',
  title: 'Both ports agree on the contract',
  explanation: 'Whenever either policy engine claims an explicit contract, and at the end, the source and the sink hold the same one (a difference may last only while one exchange is in flight).',
  ref: 'USB PD R3.2 V1.1 §8.3.2 (an Explicit Contract is one agreement of both Port Partners; from memory)',
  check({ views, result }) {
    const first = disagreements(views.sim, result.endUs, AGREEMENT_GRACE_US)[0];
    if (!first) return null;
    const untilEnd = first.endUs >= result.endUs;
    return `from ${ms(first.startUs)} the source holds ${describeContract(first.source)} while the sink holds ${describeContract(first.sink)} (for ${ms(first.endUs - first.startUs)}${untilEnd ? ', until the end' : ''})`;
  },
};

const vbus: Invariant = {
  id: 'contract.vbus',
  title: 'VBUS at the sink matches the contract',
  explanation:
    "Once the sink has its PS_RDY, every VBUS reading until the next transition is within the contract's tolerance (fixed ±5 %, vSafe5V 4.75–5.5 V, programmable ±5 % of the request, variable and battery within the offer) less the cable's drop at the current drawn.",
  ref: 'USB PD R3.2 V1.1 §7.1 Source electrical parameters (vSafe5V, vSrcNew, vPpsNew; from memory)',
  check({ scenario, result, views, pdos }) {
    const sink = views.sink;
    const resistanceMohm = scenario.cable.resistanceMohm;
    let current: Contract | null = null;
    let change = 0;
    for (const record of result.events) {
      while (change < sink.contracts.length && sink.contracts[change]!.t <= record.t) current = sink.contracts[change++]!.contract;
      if (!('vbus' in record) || current === null) continue;
      // Between an Accept and its PS_RDY the old contract's VBUS is moving to the new one.
      if (stateAt(sink, record.t) === 'PE_SNK_Transition_Sink') continue;
      const pdo = pdos[current.objectPosition - 1];
      if (!pdo) continue;
      const limits = contractVbusLimits(current, pdo);
      const ma = record.vbus.ma ?? 0;
      const dropMv = Math.round((ma * resistanceMohm) / 1_000);
      const sinkMv = record.vbus.mv - dropMv;
      const outside = voltageOutside({ ...limits, minMv: limits.minMv - dropMv }, sinkMv, ma);
      if (outside)
        return `at ${ms(record.t)} VBUS at the sink reads ${sinkMv} mV (${record.vbus.mv} mV at the source, ${ma} mA) under ${describeContract(current)}, outside ${limits.minMv - dropMv}–${limits.maxMv} mV`;
    }
    return null;
  },
};

/** Where a policy engine may end: ready, or a give-up the specification allows. */
export const SETTLED_STATES: Record<'source' | 'sink', readonly string[]> = {
  // §8.3.3.2 PE_SRC_Ready, PE_SRC_Disabled; §8.3.3.3 PE_SNK_Ready; ErrorRecovery (USB Type-C R2.3 §4.5.2.2.2).
  source: ['PE_SRC_Ready', 'PE_SRC_Disabled', 'ErrorRecovery'],
  sink: ['PE_SNK_Ready', 'ErrorRecovery'],
};

function endState(view: PortView): string {
  return view.finalState;
}

const settled: Invariant = {
  id: 'port.ends-settled',
  title: 'Each port ends ready or in an allowed give-up',
  explanation: 'At the end of the run each policy engine is in its Ready state or has given up the way the specification allows (PE_SRC_Disabled, ErrorRecovery), not stuck half-way.',
  ref: 'USB PD R3.2 V1.1 §8.3.3.2 and §8.3.3.3 state diagrams; USB Type-C R2.3 §4.5.2.2.2 ErrorRecovery (from memory)',
  check({ views }) {
    const stuck = (['source', 'sink'] as const).filter((side) => !SETTLED_STATES[side].includes(endState(views[side])));
    if (stuck.length === 0) return null;
    return stuck.map((side) => `the ${side} ends in ${endState(views[side])}`).join(' and ');
  },
};

/** Hard Resets a side sends before it gives up: the first one and nHardResetCount more (§6.7.3.x HardResetCounter; from memory). */
export function hardResetLimit(revision: string): number {
  return countersFor(revision).nHardResetCount + 1;
}

export interface ResetCounts {
  hardResets: number;
  softResets: number;
  /** The most Hard Resets one side sent with no contract and no attach between them. */
  longestHardResetRun: number;
  /** The most Soft_Resets sent with no contract between them. */
  longestSoftResetRun: number;
}

/** Counts the resets of a run; a contract (the sink's PS_RDY) or a new attach ends a run of them. */
export function resetCounts(run: Pick<RunUnderJudgement, 'result'>): ResetCounts {
  const contractTimes = run.result.contracts.map((c) => c.t);
  let nextContract = 0;
  const hardRun = { source: 0, sink: 0 };
  let softRun = 0;
  const counts: ResetCounts = { hardResets: 0, softResets: 0, longestHardResetRun: 0, longestSoftResetRun: 0 };
  for (const record of run.result.events) {
    while (nextContract < contractTimes.length && contractTimes[nextContract]! <= record.t) {
      nextContract++;
      hardRun.source = hardRun.sink = softRun = 0;
    }
    if ('event' in record && record.event === 'attach') hardRun.source = hardRun.sink = softRun = 0;
    if ('event' in record && record.event === 'hard_reset' && (record.from === 'source' || record.from === 'sink')) {
      counts.hardResets++;
      counts.longestHardResetRun = Math.max(counts.longestHardResetRun, ++hardRun[record.from]);
    }
    if ('msg' in record && record.crcOk !== false && messageTypeOfHex(record.msg) === 'Soft_Reset') {
      counts.softResets++;
      counts.longestSoftResetRun = Math.max(counts.longestSoftResetRun, ++softRun);
    }
  }
  return counts;
}

const noResetLoop: Invariant = {
  id: 'reset.no-loop',
  title: 'No reset loop',
  explanation: 'A side sends no more than nHardResetCount + 1 Hard Resets (and no more Soft_Resets than that) before a contract or a new attach; more is a reset loop.',
  ref: 'USB PD R3.2 V1.1 §6.7.3 HardResetCounter, Counter Values table (nHardResetCount = 2); from memory',
  check(run) {
    const limit = hardResetLimit(run.scenario.sink.specRevision === '2.0' || run.scenario.source.specRevision === '2.0' ? '2.0' : '3.0');
    const counts = resetCounts(run);
    if (counts.longestHardResetRun > limit) return `${counts.longestHardResetRun} Hard Resets from one side without a contract in between (at most ${limit})`;
    if (counts.longestSoftResetRun > limit) return `a Soft_Reset loop of ${counts.longestSoftResetRun} Soft_Resets without a contract (at most ${limit})`;
    return null;
  },
};

/**
 * The analyser's error rules a fault on the wire may cause: late or missing answers (timing.*),
 * retries, lost GoodCRCs, resets and out-of-turn messages (protocol.*), and a bad CRC when the
 * fault corrupts. Offers, Requests, VBUS and the trace's own shape are never a fault's doing.
 */
export function explainedBy(faults: readonly Fault[], rule: string): boolean {
  if (faults.length === 0) return false;
  if (rule.startsWith('timing.') || rule.startsWith('protocol.')) return true;
  return rule === 'decode.crc' && faults.some((fault) => fault.kind === 'corrupt');
}

const analyserExplained: Invariant = {
  id: 'analyser.explained',
  title: 'Every analyser error is explained by the injected fault',
  explanation:
    'The trace analyser reports no error the injected faults cannot cause: a fault on the wire may make answers late or missing and cause retries and resets, never bad offers, bad Requests or VBUS out of range; held timers at their edges are legal and explain nothing.',
  ref: 'docs/rules.md rule catalog; USB PD R3.2 V1.1 §6.6 timers (legal values cause no error)',
  check({ scenario, result }) {
    const unexplained: Finding[] = result.findings.filter((f) => f.severity === 'error' && !explainedBy(scenario.faults, f.rule));
    if (unexplained.length === 0) return null;
    const first = unexplained[0]!;
    const more = unexplained.length > 1 ? ` (and ${unexplained.length - 1} more)` : '';
    return `the analyser reports ${first.rule}${first.t === undefined ? '' : ` at ${ms(first.t)}`}: ${first.message}${more}`;
  },
};

/** Every invariant, in the order they are reported. */
export const INVARIANTS: readonly Invariant[] = [agreement, vbus, settled, noResetLoop, analyserExplained];

export const INVARIANT_IDS: readonly string[] = INVARIANTS.map((i) => i.id);

export function invariantById(id: string): Invariant | undefined {
  return INVARIANTS.find((i) => i.id === id);
}

export interface BrokenInvariant {
  invariant: string;
  message: string;
}

/** The invariants a run breaks (only those of `ids` when given). */
export function judge(run: RunUnderJudgement, ids?: readonly string[]): BrokenInvariant[] {
  const broken: BrokenInvariant[] = [];
  for (const invariant of INVARIANTS) {
    if (ids && !ids.includes(invariant.id)) continue;
    const message = invariant.check(run);
    if (message !== null) broken.push({ invariant: invariant.id, message });
  }
  return broken;
}
