/**
 * Fault sweeps off the main thread (the Fault sweep page). The page starts several of these, one
 * per core: each plans the same campaign (the plan is deterministic) and runs the slice it is
 * given, reporting progress through a comlink proxy. `shrink` turns a broken run into the
 * `negotiation` vector the page saves to the library.
 */
import { exposeEngine } from './expose.ts';
import { parseScenario } from '../shared/sim/index.ts';
import { planSweep, runSlice, scenarioFor, shrinkScenario, sweepVector, type SweepOptions, type SweepRun } from '../shared/sweep/index.ts';

export type SweepPlanOutput =
  | { ok: false; error: { code: string; message: string } }
  | { ok: true; runs: number; columns: string[]; messages: { index: number; t: number; from: string; messageType: string; nth: number }[]; reference: unknown };

function plan(input: unknown, options: SweepOptions): SweepPlanOutput {
  const parsed = parseScenario(input);
  if (!parsed.ok) return { ok: false, error: parsed.error };
  const planned = planSweep(parsed.scenario, options);
  if (!planned.ok) return { ok: false, error: planned.error };
  const { placements, columns, messages, reference } = planned.plan;
  return { ok: true, runs: placements.length, columns, messages: messages.map(({ index, t, from, messageType, nth }) => ({ index, t, from, messageType, nth })), reference };
}

function run(
  input: unknown,
  options: SweepOptions,
  start: number,
  end: number,
  onProgress?: (done: number) => void,
): { ok: true; runs: SweepRun[] } | { ok: false; error: { code: string; message: string } } {
  const parsed = parseScenario(input);
  if (!parsed.ok) return { ok: false, error: parsed.error };
  const planned = planSweep(parsed.scenario, options);
  if (!planned.ok) return { ok: false, error: planned.error };
  return { ok: true, runs: runSlice(planned.plan, { start, end, progressEvery: 16, onProgress: (done) => onProgress?.(done) }).runs };
}

/** The shrunk `negotiation` vector of one broken run. */
function shrink(
  input: unknown,
  broken: Pick<SweepRun, 'faults' | 'timers'>,
  invariant: string,
  message: string,
): { ok: true; vector: Record<string, unknown> } | { ok: false; error: { code: string; message: string } } {
  const parsed = parseScenario(input);
  if (!parsed.ok) return { ok: false, error: parsed.error };
  const shrunk = shrinkScenario(scenarioFor(parsed.scenario, broken), invariant);
  return { ok: true, vector: sweepVector(shrunk.scenario, invariant, { message }) };
}

const api = { plan, run, shrink };
exposeEngine(api);
export type SweepApi = typeof api;
