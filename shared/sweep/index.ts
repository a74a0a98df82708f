/** Public entry of the fault sweep engine (shared/sweep). */
export { runMessages, messageTypeOfHex, type RunMessage } from './messages.ts';
export { portViews, contractAt, stateAt, type PortView, type PortViews, type ContractChange } from './port-views.ts';
export {
  generatePlacements,
  countPlacements,
  matrixColumns,
  delayEdgesMs,
  SWEEP_FAULT_KINDS,
  DEFAULT_FAULT_KINDS,
  FAULT_FREE_ID,
  type Placement,
  type SweepFaultKind,
  type TimerEdge,
} from './placements.ts';
export { sampleWithSeed, parseShard, shardOf, type Shard } from './select.ts';
export { INVARIANTS, INVARIANT_IDS, invariantById, judge, describeContract, type Invariant, type BrokenInvariant } from './invariants.ts';
export { OUTCOME_CLASSES, OUTCOME_LABELS, classifyOutcome, type OutcomeClass } from './outcome.ts';
export { runPlacement, scenarioFor, judgeScenario, type SweepRun, type Simulate, type RunEngine } from './run-placement.ts';
export { planSweep, MAX_PLACEMENTS, type SweepOptions, type SweepPlan } from './plan.ts';
export { runSlice, type RunSliceOptions } from './sweep.ts';
export { summarize, sweepMatrix, type SweepSummary, type OutcomeSummary, type BrokenRun, type MatrixCell } from './summary.ts';
export { shrinkScenario, sweepVector, breaks, describePlacement, type ShrinkResult } from './shrink.ts';
