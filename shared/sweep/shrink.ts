/**
 * Shrinking a broken run: the fewest faults and held timers, then the shortest duration, that
 * still break the same invariant; and the `negotiation` vector (tagged `sweep`) that keeps it.
 * The vector expects the invariant to hold, so it fails while the defect is there and passes
 * once it is fixed.
 */
import { resolveCaps } from '../sim/caps.ts';
import type { Fault, Scenario } from '../sim/scenario.ts';
import { simulate } from '../sim/simulate.ts';
import { analyseRecords } from '../trace/analyser.ts';
import { invariantById } from './invariants.ts';
import { judgeScenario, type Simulate } from './run-placement.ts';

/** Whether the scenario breaks the invariant (the whole check: simulation, views, analyser). */
export function breaks(scenario: Scenario, invariant: string, simulateRun: Simulate = simulate): boolean {
  const caps = resolveCaps(scenario.source.caps);
  if (!caps.ok) return false;
  const result = simulateRun(scenario, { decode: false, analyze: false });
  if (invariant === 'analyser.explained') result.findings = analyseRecords(result.events, { timelineLimit: 0 }).findings;
  return judgeScenario(scenario, result, caps.pdos, [invariant]).broken.length > 0;
}

/** Invariants about the end of a run: a shorter run would break them trivially, so their duration stays. */
const ABOUT_THE_END = new Set(['port.ends-settled']);
const DURATION_STEP_MS = 10;

export interface ShrinkResult {
  scenario: Scenario;
  /** Simulations tried. */
  attempts: number;
}

export function shrinkScenario(scenario: Scenario, invariant: string, options: { maxAttempts?: number; simulate?: Simulate } = {}): ShrinkResult {
  const maxAttempts = options.maxAttempts ?? 200;
  let current = scenario;
  let attempts = 0;
  const tryIt = (candidate: Scenario) => {
    attempts++;
    return breaks(candidate, invariant, options.simulate);
  };
  // 1. Fewest faults: drop one at a time while the run still breaks (greedy, to a fixpoint).
  let progress = true;
  while (progress && attempts < maxAttempts) {
    progress = false;
    for (let i = 0; i < current.faults.length && attempts < maxAttempts; i++) {
      const faults: Fault[] = current.faults.filter((_, j) => j !== i);
      const candidate = { ...current, faults };
      if (tryIt(candidate)) {
        current = candidate;
        progress = true;
        break;
      }
    }
  }
  // 2. Fewest held timers.
  for (const name of Object.keys(current.timers ?? {}) as (keyof NonNullable<Scenario['timers']>)[]) {
    if (attempts >= maxAttempts) break;
    const timers = { ...current.timers };
    delete timers[name];
    const candidate: Scenario = { ...current, timers };
    if (Object.keys(timers).length === 0) delete candidate.timers;
    if (tryIt(candidate)) current = candidate;
  }
  // 3. Shortest duration (binary search in 10 ms steps; the result is checked to break).
  if (!ABOUT_THE_END.has(invariant)) {
    let low = 0;
    let high = Math.ceil(current.durationMs / DURATION_STEP_MS);
    while (high - low > 1 && attempts < maxAttempts) {
      const mid = Math.floor((low + high) / 2);
      if (tryIt({ ...current, durationMs: mid * DURATION_STEP_MS })) high = mid;
      else low = mid;
    }
    const durationMs = Math.min(current.durationMs, high * DURATION_STEP_MS);
    if (durationMs !== current.durationMs && tryIt({ ...current, durationMs })) current = { ...current, durationMs };
  }
  return { scenario: current, attempts };
}

function slug(text: string): string {
  return (
    text
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-|-$/g, '') || 'run'
  );
}

function describeFault(fault: Fault): string {
  const what = [fault.kind, fault.from, fault.messageType, fault.nth === undefined ? undefined : `#${fault.nth}`, fault.delayMs === undefined ? undefined : `${fault.delayMs} ms`];
  return what.filter((part) => part !== undefined).join(' ');
}

export function describePlacement(scenario: Pick<Scenario, 'faults' | 'timers'>): string {
  const parts = [...scenario.faults.map(describeFault), ...Object.entries(scenario.timers ?? {}).map(([name, edge]) => `${name} at its ${edge === 'min' ? 'minimum' : 'maximum'}`)];
  return parts.length === 0 ? 'no fault' : parts.join(', ');
}

/** The `negotiation` vector of a shrunk broken run: its expectation is that the invariant holds. */
export function sweepVector(scenario: Scenario, invariant: string, options: { idPrefix?: string; message?: string } = {}): Record<string, unknown> {
  const definition = invariantById(invariant);
  const placement = describePlacement(scenario);
  const id = `${options.idPrefix ?? 'sweep'}/${slug(invariant)}/${slug(placement)}-${scenario.durationMs}ms`.slice(0, 180);
  return {
    vector: 1,
    id,
    title: `${definition?.title ?? invariant} (found by a fault sweep: ${placement})`,
    tags: ['sweep'],
    ref: `${definition?.ref ?? 'fault sweep invariant'}; shrunk from a fault sweep${options.message ? `, where ${options.message}` : ''}`.slice(0, 600),
    kind: 'negotiation',
    input: { scenario },
    expect: { invariants: [invariant] },
  };
}
