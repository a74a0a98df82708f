/**
 * Property vectors off the main thread (the Properties page). `check` validates the vector, runs it
 * through the vector runner (sucrase, then `fc.check` with the vector's runs and seed), reports
 * progress while fast-check runs and shrinks, and, when the shrunk counterexample is a Scenario,
 * simulates it with VBUS/IBUS samples for the page's timeline.
 *
 * The property code is evaluated with `new Function`: the server sends this worker's script with a
 * CSP that allows 'unsafe-eval' (server/app.ts, `propertyWorkerCsp`); the page's own CSP stays strict.
 * Cancelling is the page's job: it terminates this worker (src/lib/engine-worker.ts).
 */
import type { Result } from '../shared/core/result.ts';
import * as fc from 'fast-check';
import { exposeEngine } from './expose.ts';
import type { Contract } from '../shared/core/contract.ts';
import type { Finding } from '../shared/core/finding.ts';
import { expandSamples, parseScenario, simulate } from '../shared/sim/index.ts';
import { runVector, type VectorResult } from '../shared/vectors/run.ts';
import { describeZodError, vectorSchema } from '../shared/vectors/schema.ts';
import type { MessageRecord } from '../shared/trace/records.ts';

export type PropertyProgress = {
  /** Runs of the predicate before the first failure (at most `totalRuns`). */
  runs: number;
  totalRuns: number;
  /** Predicate runs spent shrinking after the first failure. */
  shrinkRuns: number;
  phase: 'running' | 'shrinking';
};

export type CounterexampleMessage = { t: number; from: string; messageType: string; hex: string; crcOk: boolean };

/** The counterexample scenario, simulated: what the page's timeline draws. */
export type CounterexampleRun = {
  contract: Contract | null;
  findings: Finding[];
  /** Interleaved `[tUs, vbusMv, ibusMa, sinkMv, …]`. */
  samples: number[];
  messages: CounterexampleMessage[];
  /** The message records with their decoded messages, for the timeline's message list and bit-field view. */
  messageRecords: MessageRecord[];
  /** Bus events (attach, Hard Reset, …) and the simulator's notes, each injected fault among them ("fault: …"). */
  events: ({ t: number; event: string; from?: string } | { t: number; note: string })[];
  lanes: { t: number; side: 'source' | 'sink'; state: string }[];
  endUs: number;
};

export type PropertyCheck = Result<{ result: VectorResult; counterexampleRun?: CounterexampleRun }>;

/** Progress messages to the page at most this often, so a fast property is not slowed by them. */
const REPORT_EVERY_MS = 80;

type Counter = { runs: number; totalRuns: number; shrinkRuns: number; failed: boolean; lastReportMs: number; report?: (progress: PropertyProgress) => void };
let counter: Counter | null = null;

function snapshot(c: Counter): PropertyProgress {
  return { runs: c.runs, totalRuns: c.totalRuns, shrinkRuns: c.shrinkRuns, phase: c.failed ? 'shrinking' : 'running' };
}

function count(outcome: unknown): void {
  const c = counter;
  if (!c) return;
  if (c.failed) c.shrinkRuns += 1;
  else c.runs += 1;
  // A PropertyFailure is `{ error }`; null is a pass and a PreconditionFailure (fc.pre) is an Error.
  if (outcome !== null && typeof outcome === 'object' && 'error' in outcome) c.failed = true;
  const nowMs = performance.now();
  if (c.report && nowMs - c.lastReportMs >= REPORT_EVERY_MS) {
    c.lastReportMs = nowMs;
    c.report(snapshot(c));
  }
}

// Every predicate run of every property passes through here (fast-check ≥ 4.10 plugins).
const countingPlugin: fc.Plugin<unknown> = () => ({
  decorateRun: (nestedRun) => (value) => {
    const outcome = nestedRun(value);
    if (outcome instanceof Promise) {
      return outcome.then((settled) => {
        count(settled);
        return settled;
      });
    }
    count(outcome);
    return outcome;
  },
});
fc.installGlobalPlugin(countingPlugin);

function simulateCounterexample(scenario: unknown): CounterexampleRun | undefined {
  const parsed = parseScenario(scenario);
  if (!parsed.ok) return undefined;
  // Counterexamples are short runs; keep about 2,000 samples whatever their length.
  const sampleEveryUs = Math.max(100, Math.ceil((parsed.scenario.durationMs * 1_000) / 2_000));
  const result = simulate(parsed.scenario, { samples: true, sampleEveryUs });
  const messages: CounterexampleMessage[] = [];
  const messageRecords: MessageRecord[] = [];
  const events: CounterexampleRun['events'] = [];
  for (const record of result.events) {
    if ('msg' in record) {
      messageRecords.push(record);
      messages.push({ t: record.t, from: record.from ?? 'source', messageType: record.message?.header.messageType ?? 'Unreadable', hex: record.msg, crcOk: record.crcOk !== false });
    } else if ('event' in record) {
      events.push({ t: record.t, event: record.event, ...(record.from ? { from: record.from } : {}) });
    } else if ('note' in record) {
      events.push({ t: record.t, note: record.note });
    }
  }
  return {
    contract: result.contract,
    findings: result.findings,
    samples: result.samples ? Array.from(expandSamples(result.samples)) : [],
    messages,
    messageRecords,
    events,
    lanes: result.lanes.filter((lane): lane is CounterexampleRun['lanes'][number] => lane.side === 'source' || lane.side === 'sink'),
    endUs: result.endUs,
  };
}

/** Checks a property vector (the whole file as JSON); never throws. */
async function check(vector: unknown, onProgress?: (progress: PropertyProgress) => void): Promise<PropertyCheck> {
  const parsed = vectorSchema.safeParse(vector);
  if (!parsed.success) return { ok: false, error: { code: 'vector.schema', message: describeZodError(parsed.error) } };
  if (parsed.data.kind !== 'property') return { ok: false, error: { code: 'vector.kind', message: `kind: expected "property", got "${parsed.data.kind}"` } };
  const c: Counter = { runs: 0, totalRuns: parsed.data.input.runs, shrinkRuns: 0, failed: false, lastReportMs: performance.now(), report: onProgress };
  counter = c;
  try {
    const result = await runVector(parsed.data);
    onProgress?.(snapshot(c));
    const scenario = result.property?.counterexampleScenario;
    const counterexampleRun = scenario === undefined ? undefined : simulateCounterexample(scenario);
    return counterexampleRun ? { ok: true, result, counterexampleRun } : { ok: true, result };
  } finally {
    counter = null;
  }
}

const api = { check };
exposeEngine(api);
export type PropertyApi = typeof api;
