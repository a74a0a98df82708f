/**
 * A server sweep's work, in its worker thread (./sweep-worker.mjs): plans the campaign, runs it in
 * chunks (progress after each), then keeps the broken runs' evidence and shrinks the first few
 * into `negotiation` vectors, as the Fault sweep page and `parley sweep` do.
 */
import { MAX_SWEEP_BROKEN_STORED, MAX_SWEEP_SHRUNK, type SweepRunOptions } from '../../../shared/api/index.ts';
import { parseScenario } from '../../../shared/sim/index.ts';
import { describePlacement, planSweep, runSlice, scenarioFor, shrinkScenario, summarize, sweepVector, type OutcomeSummary, type SweepRun } from '../../../shared/sweep/index.ts';

/** Runs between progress messages. */
const CHUNK_RUNS = 256;

export interface SweepTaskInput {
  scenario: unknown;
  options: SweepRunOptions;
}

/** What the run's results keep of one broken run. */
export interface BrokenEvidence {
  run: string;
  description: string;
  invariant: string;
  message: string;
  broken: SweepRun['broken'];
  outcome: SweepRun['outcome'];
  faults: SweepRun['faults'];
  timers?: SweepRun['timers'];
  contract: SweepRun['contract'];
  endStates: SweepRun['endStates'];
  /** The shrunk `negotiation` vector (the first few broken runs only). */
  vector?: Record<string, unknown>;
}

export type SweepTaskMessage =
  | { type: 'progress'; done: number; total: number; passed: number; failed: number }
  | { type: 'done'; total: number; outcomes: OutcomeSummary[]; brokenCount: number; broken: BrokenEvidence[] }
  | { type: 'error'; message: string };

export function runSweepTask(input: SweepTaskInput, post: (message: SweepTaskMessage) => void): void {
  const parsed = parseScenario(input.scenario);
  if (!parsed.ok) {
    post({ type: 'error', message: `scenario: ${parsed.error.message}` });
    return;
  }
  const planned = planSweep(parsed.scenario, input.options);
  if (!planned.ok) {
    post({ type: 'error', message: planned.error.message });
    return;
  }
  const { plan } = planned;
  const total = plan.placements.length;
  const runs: SweepRun[] = [];
  let failed = 0;
  for (let start = 0; start < total; start += CHUNK_RUNS) {
    const chunk = runSlice(plan, { start, end: start + CHUNK_RUNS }).runs;
    for (const run of chunk) {
      runs.push(run);
      if (run.broken.length > 0) failed++;
    }
    post({ type: 'progress', done: runs.length, total, passed: runs.length - failed, failed });
  }
  const summary = summarize(runs);
  const broken = runs
    .filter((run) => run.broken.length > 0)
    .slice(0, MAX_SWEEP_BROKEN_STORED)
    .map((run, index): BrokenEvidence => {
      const first = run.broken[0]!;
      const evidence: BrokenEvidence = {
        run: run.placement,
        description: describePlacement({ faults: run.faults, ...(run.timers ? { timers: run.timers } : {}) }),
        invariant: first.invariant,
        message: first.message,
        broken: run.broken,
        outcome: run.outcome,
        faults: run.faults,
        contract: run.contract,
        endStates: run.endStates,
      };
      if (run.timers) evidence.timers = run.timers;
      if (index < MAX_SWEEP_SHRUNK) {
        const shrunk = shrinkScenario(scenarioFor(parsed.scenario, run), first.invariant);
        evidence.vector = sweepVector(shrunk.scenario, first.invariant, { message: first.message });
      }
      return evidence;
    });
  post({ type: 'done', total, outcomes: summary.outcomes, brokenCount: summary.brokenCount, broken });
}
