/**
 * Runs a fault sweep in Web Workers (one per core, at most four): the first worker plans it and
 * gives the run count; Start splits the runs into contiguous slices, one per worker, and merges
 * the results. Progress, rate (runs/s) and cancel; the workers end with the page.
 */
import { useCallback, useEffect, useRef, useState } from 'react';
import { createEngineWorker, isCancelled, progress, type EngineWorker } from '../../../lib/engine-worker.ts';
import type { SweepOptions, SweepRun } from '../../../../shared/sweep/index.ts';
import type { SweepApi, SweepPlanOutput } from '../../../../workers/sweep.worker.ts';

type RunOutput = ReturnType<SweepApi['run']>;
type ShrinkOutput = ReturnType<SweepApi['shrink']>;

const newWorker = () => createEngineWorker<SweepApi>(() => new Worker(new URL('../../../../workers/sweep.worker.ts', import.meta.url), { type: 'module' }));

export type SweepState =
  | { phase: 'idle' }
  | { phase: 'running'; done: number; total: number; startedMs: number }
  | { phase: 'done'; runs: SweepRun[]; elapsedMs: number }
  | { phase: 'cancelled' }
  | { phase: 'failed'; message: string };

export function workerCount(): number {
  return Math.max(1, Math.min(4, navigator.hardwareConcurrency || 2));
}

export function useSweep() {
  const workers = useRef<EngineWorker<SweepApi>[]>([]);
  const [state, setState] = useState<SweepState>({ phase: 'idle' });

  const pool = useCallback((n: number) => {
    while (workers.current.length < n) workers.current.push(newWorker());
    return workers.current.slice(0, n);
  }, []);

  useEffect(
    () => () => {
      for (const w of workers.current) w.terminate();
    },
    [],
  );

  const plan = useCallback(async (input: unknown, options: SweepOptions): Promise<SweepPlanOutput> => pool(1)[0]!.run<SweepPlanOutput>((api) => api.plan(input, options)), [pool]);

  const start = useCallback(
    async (input: unknown, options: SweepOptions, total: number) => {
      const threads = pool(Math.min(workerCount(), Math.max(1, total)));
      const startedMs = performance.now();
      const doneBy = threads.map(() => 0);
      setState({ phase: 'running', done: 0, total, startedMs });
      const size = Math.ceil(total / threads.length);
      // Progress comes through its own channel and may arrive after the result: ignore it then.
      let finished = false;
      try {
        const parts = await Promise.all(
          threads.map((w, i) =>
            w.run<RunOutput>((api) =>
              api.run(
                input,
                options,
                i * size,
                Math.min(total, (i + 1) * size),
                progress((done: number) => {
                  doneBy[i] = done;
                  if (!finished) setState({ phase: 'running', done: doneBy.reduce((a, b) => a + b, 0), total, startedMs });
                }),
              ),
            ),
          ),
        );
        finished = true;
        const failed = parts.find((p) => !p.ok);
        if (failed && !failed.ok) return setState({ phase: 'failed', message: failed.error.message });
        setState({ phase: 'done', runs: parts.flatMap((p) => (p.ok ? p.runs : [])), elapsedMs: performance.now() - startedMs });
      } catch (error) {
        finished = true;
        setState(isCancelled(error) ? { phase: 'cancelled' } : { phase: 'failed', message: error instanceof Error ? error.message : String(error) });
      }
    },
    [pool],
  );

  const cancel = useCallback(() => {
    for (const w of workers.current) w.cancel();
  }, []);

  const shrink = useCallback(
    (input: unknown, run: SweepRun) => pool(1)[0]!.run<ShrinkOutput>((api) => api.shrink(input, { faults: run.faults, timers: run.timers }, run.broken[0]!.invariant, run.broken[0]!.message)),
    [pool],
  );

  return { state, plan, start, cancel, shrink };
}
