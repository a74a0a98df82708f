/**
 * The vector runner's fault-sweep parts: a `negotiation` vector's `expect.invariants` (the named
 * invariants hold for its run) and the `sweep` kind (a whole campaign, in this thread, must hold).
 */
import type { Scenario } from '../sim/scenario.ts';
import { resolveCaps } from '../sim/caps.ts';
import { judgeScenario } from '../sweep/run-placement.ts';
import { planSweep } from '../sweep/plan.ts';
import { runSlice } from '../sweep/sweep.ts';
import { summarize } from '../sweep/summary.ts';
import type { EngineFacade } from './engine-facade.ts';
import type { Mismatch } from './match.ts';
import type { Vector } from './schema.ts';

type SimResult = ReturnType<EngineFacade['sim']['simulate']>;

/** One mismatch per named invariant the run breaks. */
export function invariantMismatches(scenario: Scenario, result: SimResult, ids: readonly string[]): Mismatch[] {
  const caps = resolveCaps(scenario.source.caps);
  if (!caps.ok) return [{ path: 'expect.invariants', expected: ids, actual: undefined, message: `expect.invariants: source.caps: ${caps.error.message}` }];
  return judgeScenario(scenario, result, caps.pdos, ids).broken.map((broken) => ({
    path: `expect.invariants.${broken.invariant}`,
    expected: 'holds',
    actual: broken.message,
    message: `expect.invariants: ${broken.invariant} is broken: ${broken.message}`,
  }));
}

export function runSweepVector(vector: Extract<Vector, { kind: 'sweep' }>, engine: EngineFacade): { actual: unknown; mismatches: Mismatch[]; inputError?: string } {
  const { input, expect } = vector;
  const planned = planSweep(input.scenario, { kinds: input.faults, pairs: input.pairs, timerEdges: input.timers === 'edges', max: input.max, seed: input.seed, simulate: engine.sim.simulate });
  if (!planned.ok) return { actual: undefined, mismatches: [], inputError: `input.scenario: ${planned.error.message}` };
  const summary = summarize(runSlice(planned.plan, { simulate: engine.sim.simulate }).runs);
  const actual = { holds: summary.ok, runs: summary.runs, brokenCount: summary.brokenCount, outcomes: summary.outcomes, broken: summary.broken.slice(0, 20) };
  const mismatches: Mismatch[] = [];
  if (expect.holds !== summary.ok) {
    const first = summary.broken[0];
    const why = first ? `; run ${first.run} breaks ${first.invariant}: ${first.message}` : '';
    mismatches.push({
      path: 'expect.holds',
      expected: expect.holds,
      actual: summary.ok,
      message: `expect.holds: expected ${expect.holds}, got ${summary.ok} (${summary.brokenCount} of ${summary.runs} runs broken)${why}`,
    });
  }
  if (expect.minRuns !== undefined && summary.runs < expect.minRuns) {
    mismatches.push({ path: 'expect.minRuns', expected: expect.minRuns, actual: summary.runs, message: `expect.minRuns: expected at least ${expect.minRuns} runs, got ${summary.runs}` });
  }
  return { actual, mismatches };
}
