/**
 * The simulator off the main thread (the Bench page). `run` validates the scenario, simulates it
 * with samples, reports progress through a comlink proxy and hands the samples back as the
 * simulator's steps (shared/sim/sample-buffer.ts) in one Int32Array that is transferred, not
 * copied, so the page never spends a long task deserialising hundreds of thousands of small arrays.
 * Cancelling is the page's job: it terminates this worker (src/lib/engine-worker.ts).
 */
import type { Result } from '../shared/core/result.ts';
import { transfer } from 'comlink';
import { exposeEngine } from './expose.ts';
import { parseScenario, simulate, type PackedSamples, type SimulationResult } from '../shared/sim/index.ts';

export type SimRunOptions = {
  /** Sample period, µs (default 1 ms, as `parley simulate --samples`). */
  sampleEveryUs?: number;
};

export type SimRunOutput = Result<{ samples: PackedSamples } & Omit<SimulationResult, 'samples'>>;

/** At most this many samples are taken (a ramp stores each: 5 × Int32, 2.4 M samples ≤ 48 MB). */
const MAX_SAMPLES = 2_400_000;

function run(input: unknown, onProgress?: (fraction: number) => void, options: SimRunOptions = {}): SimRunOutput {
  const parsed = parseScenario(input);
  if (!parsed.ok) return { ok: false, error: parsed.error };
  const durationUs = parsed.scenario.durationMs * 1_000;
  // Keep long runs within the sample budget by widening the period, never the other way.
  const minimumEveryUs = Math.ceil(durationUs / MAX_SAMPLES);
  const sampleEveryUs = Math.max(options.sampleEveryUs ?? 1_000, minimumEveryUs, 10);
  let lastReported = -1;
  const result = simulate(parsed.scenario, {
    samples: true,
    sampleEveryUs,
    onProgress(fraction) {
      // About a hundred calls a run; skip the repeats so each message to the page carries news.
      const percent = Math.floor(fraction * 100);
      if (percent === lastReported) return;
      lastReported = percent;
      onProgress?.(fraction);
    },
  });
  // The simulator already packs the samples into one Int32Array: hand it over as it is.
  const { samples: packed, ...rest } = result;
  const samples = packed ?? { data: new Int32Array(0), steps: 0, count: 0, everyUs: sampleEveryUs };
  return transfer({ ok: true as const, ...rest, samples }, [samples.data.buffer]);
}

const api = { run };
exposeEngine(api);
export type SimApi = typeof api;
