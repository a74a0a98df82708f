/**
 * One run of a sweep: the scenario with a placement's faults and held timers added, simulated
 * (messages not decoded; the analyser runs for its invariant) and judged.
 */
import type { Contract } from '../core/contract.ts';
import type { Finding } from '../core/finding.ts';
import type { SourcePdo } from '../pd/types.ts';
import type { Fault, Scenario } from '../sim/scenario.ts';
import { simulate, type SimulationResult } from '../sim/simulate.ts';
import { analyserFindings, type FindingsMemo } from './analysis-memo.ts';
import { judge, resetCounts, type BrokenInvariant, type ResetCounts } from './invariants.ts';
import { classifyOutcome, type OutcomeClass } from './outcome.ts';
import type { Placement } from './placements.ts';
import { portViews } from './port-views.ts';

export interface SweepRun {
  placement: string;
  faults: Fault[];
  timers?: Placement['timers'];
  cell?: Placement['cell'];
  outcome: OutcomeClass;
  contract: Contract | null;
  broken: BrokenInvariant[];
  resets: ResetCounts;
  endStates: { source: string; sink: string };
}

/** The scenario a placement runs: the scenario's own faults first, then the placement's. */
export function scenarioFor(base: Scenario, placement: Pick<Placement, 'faults' | 'timers'>): Scenario {
  const timers = placement.timers ? { ...base.timers, ...placement.timers } : base.timers;
  const scenario: Scenario = { ...base, faults: [...base.faults, ...placement.faults] };
  if (timers !== undefined) scenario.timers = timers;
  return scenario;
}

/** Judges one simulated scenario (also what a vector's `expect.invariants` runs). */
export function judgeScenario(scenario: Scenario, result: SimulationResult, pdos: readonly SourcePdo[], invariantIds?: readonly string[]) {
  const views = portViews(result);
  const run = { scenario, result, views, pdos };
  return { views, broken: judge(run, invariantIds), resets: resetCounts(run) };
}

/** The simulator a sweep drives; a test may pass a deliberately broken one. */
export type Simulate = typeof simulate;

export interface RunEngine {
  simulate?: Simulate;
  /** The analyser's findings per distinct trace of a campaign (analysis-memo.ts). */
  memo?: FindingsMemo;
}

export function runPlacement(base: Scenario, placement: Placement, reference: Contract | null, pdos: readonly SourcePdo[], engine: RunEngine = {}): SweepRun {
  const scenario = scenarioFor(base, placement);
  const result = (engine.simulate ?? simulate)(scenario, { decode: false, analyze: false });
  // The analyser for its invariant (shared, read-only findings when the trace repeats an earlier run's).
  result.findings = analyserFindings(result.events, engine.memo) as Finding[];
  const { views, broken, resets } = judgeScenario(scenario, result, pdos);
  const run: SweepRun = {
    placement: placement.id,
    faults: placement.faults,
    outcome: classifyOutcome(result.contract, reference, resets),
    contract: result.contract,
    broken,
    resets,
    endStates: { source: views.source.finalState, sink: views.sink.finalState },
  };
  if (placement.timers) run.timers = placement.timers;
  if (placement.cell) run.cell = placement.cell;
  return run;
}
