/**
 * A sweep's plan: the fault-free run of the scenario, its messages, and the placements to run
 * (generated, then `max` sampled with the seed, then one shard). Pure and deterministic: the same
 * scenario and options give the same plan everywhere (CLI workers, browser workers, server).
 */
import type { Contract } from '../core/contract.ts';
import type { SourcePdo } from '../pd/types.ts';
import { resolveCaps } from '../sim/caps.ts';
import type { Scenario } from '../sim/scenario.ts';
import { simulate } from '../sim/simulate.ts';
import { fail, type Result } from '../core/result.ts';
import { runMessages, type RunMessage } from './messages.ts';
import { countPlacements, DEFAULT_FAULT_KINDS, generatePlacements, matrixColumns, type Placement, type SweepFaultKind } from './placements.ts';
import type { Simulate } from './run-placement.ts';
import { sampleWithSeed, shardOf, type Shard } from './select.ts';

export interface SweepOptions {
  kinds?: readonly SweepFaultKind[];
  pairs?: boolean;
  /** Each timer of the table at its minimum and its maximum. */
  timerEdges?: boolean;
  /** At most this many runs, sampled with `seed` (default the scenario's seed). */
  max?: number;
  seed?: number;
  shard?: Shard;
  /** Refuse, before building them, campaigns of more placements than this (before `max`); default `MAX_PLACEMENTS`. */
  maxPlacements?: number;
  /** The simulator (a test may plant a defect). */
  simulate?: Simulate;
}

/** The most placements a campaign may generate before sampling: pairs of a long run grow with the square and would exhaust memory. */
export const MAX_PLACEMENTS = 500_000;

export interface SweepPlan {
  scenario: Scenario;
  pdos: SourcePdo[];
  messages: RunMessage[];
  /** The sink's contract at the end of the fault-free run. */
  reference: Contract | null;
  columns: string[];
  /** Runs of the whole campaign (after `max`, before the shard). */
  campaignRuns: number;
  /** The runs of this shard. */
  placements: Placement[];
}

function revisionOf(scenario: Scenario): string {
  return scenario.source.specRevision === '2.0' || scenario.sink.specRevision === '2.0' ? '2.0' : '3.0';
}

export function planSweep(scenario: Scenario, options: SweepOptions = {}): Result<{ plan: SweepPlan }> {
  const caps = resolveCaps(scenario.source.caps);
  if (!caps.ok) return fail('sweep.scenario', `source.caps: ${caps.error.message}`);
  const baseline = (options.simulate ?? simulate)(scenario, { decode: false, analyze: false });
  const messages = runMessages(baseline.events);
  if (messages.length === 0) return fail('sweep.no-messages', 'the fault-free run has no messages to place faults on (is the duration long enough to attach?)');
  const kinds = options.kinds ?? DEFAULT_FAULT_KINDS;
  const revision = revisionOf(scenario);
  const placementOptions = { kinds, pairs: options.pairs, timerEdges: options.timerEdges, revision };
  const count = countPlacements(messages, placementOptions);
  const limit = options.maxPlacements ?? MAX_PLACEMENTS;
  if (count > limit)
    return fail(
      'sweep.too-many-runs',
      `this campaign has ${count.toLocaleString('en-US')} runs (${messages.length} messages${options.pairs ? ', every pair' : ''}); at most ${limit.toLocaleString('en-US')} are planned: drop pairs, shorten the scenario or split it with --shard`,
    );
  const all = generatePlacements(messages, placementOptions);
  const sampled = sampleWithSeed(all, options.max, options.seed ?? scenario.seed);
  return {
    ok: true,
    plan: {
      scenario,
      pdos: caps.pdos,
      messages,
      reference: baseline.contract,
      columns: matrixColumns(kinds, revision),
      campaignRuns: sampled.length,
      placements: shardOf(sampled, options.shard),
    },
  };
}
