/**
 * Runs scenarios in workers/sim.worker.ts: one worker for the page's life, progress as a fraction,
 * Cancel terminates the worker (the next run starts a fresh one).
 */
import { startTransition, useCallback, useEffect, useRef, useState } from 'react';
import { createEngineWorker, isCancelled, progress, type EngineWorker } from '../../../lib/engine-worker.ts';
import type { ScenarioInput } from '../../../../shared/sim/scenario.ts';
import type { SimApi, SimRunOutput } from '../../../../workers/sim.worker.ts';
import type { PackedSamples } from './samples.ts';

export type BenchRun = Omit<Extract<SimRunOutput, { ok: true }>, 'ok' | 'samples'> & {
  samples: PackedSamples;
  scenario: ScenarioInput;
  elapsedMs: number;
  finishedAt: string;
};

export type SimulationState = { status: 'idle' } | { status: 'running'; fraction: number } | { status: 'done'; run: BenchRun } | { status: 'cancelled' } | { status: 'failed'; message: string };

export function useSimulation() {
  const workerRef = useRef<EngineWorker<SimApi> | null>(null);
  const [state, setState] = useState<SimulationState>({ status: 'idle' });
  const [lastRun, setLastRun] = useState<BenchRun | null>(null);

  useEffect(() => {
    const worker = createEngineWorker<SimApi>(() => new Worker(new URL('../../../../workers/sim.worker.ts', import.meta.url), { type: 'module', name: 'parley-sim' }));
    workerRef.current = worker;
    return () => {
      worker.terminate();
      workerRef.current = null;
    };
  }, []);

  const start = useCallback(async (scenario: ScenarioInput) => {
    const worker = workerRef.current;
    if (!worker) return;
    if (worker.pending() > 0) worker.cancel();
    setState({ status: 'running', fraction: 0 });
    const started = performance.now();
    // Progress arrives asynchronously; one frame's worth of updates is plenty.
    let pending: number | null = null;
    let latest = 0;
    const onProgress = progress((fraction: number) => {
      latest = fraction;
      if (pending !== null) return;
      pending = requestAnimationFrame(() => {
        pending = null;
        setState((current) => (current.status === 'running' ? { status: 'running', fraction: latest } : current));
      });
    });
    try {
      // comlink types a union result as a union of promises; it is one promise of the union.
      const output = await worker.run<SimRunOutput>((api) => api.run(scenario, onProgress) as Promise<SimRunOutput>);
      if (!output.ok) {
        setState({ status: 'failed', message: output.error.message });
        return;
      }
      const { ok: _ok, samples, ...rest } = output;
      const run: BenchRun = {
        ...rest,
        samples,
        scenario,
        elapsedMs: Math.round(performance.now() - started),
        finishedAt: new Date().toISOString(),
      };
      // A transition lets React render the results in slices, so no single task blocks the page.
      startTransition(() => {
        setLastRun(run);
        setState({ status: 'done', run });
      });
    } catch (error) {
      if (isCancelled(error)) setState({ status: 'cancelled' });
      else setState({ status: 'failed', message: error instanceof Error ? error.message : String(error) });
    } finally {
      if (pending !== null) cancelAnimationFrame(pending);
    }
  }, []);

  const cancel = useCallback(() => {
    workerRef.current?.cancel();
  }, []);

  return { state, lastRun, start, cancel };
}
